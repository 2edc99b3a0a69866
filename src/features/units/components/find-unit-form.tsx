import { useQueryClient } from '@tanstack/react-query';
import { useId, useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { normalizeContainerNumber, parseContainerNumber, wrongCheckDigitText } from '../../../../shared/domain';
import { unitByNumberQuery } from '../api/get-unit-by-number';
import { paths } from '../../../config/paths';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { SearchIcon } from '../../../components/ui/icons';
import { containerSearchInput } from './container-search';

/**
 * Find a unit by its ISO 6346 container number: a whole, valid number opens the unit itself; a wrong check digit says
 * which digit the number implies (the scan page's words); a start of a number lists the matches (/units?q=…).
 */
export function FindUnitForm({ defaultValue = '', className }: { defaultValue?: string; className?: string }) {
  const id = useId();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const [value, setValue] = useState(defaultValue);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const onSubmit = async (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const q = normalizeContainerNumber(value);
    if (!q) {
      setError('Enter a container number');
      return;
    }
    const wrongDigit = wrongCheckDigitText(q);
    if (wrongDigit) {
      setError(wrongDigit);
      return;
    }
    setError(null);
    if (parseContainerNumber(q).ok) {
      setBusy(true);
      try {
        const unit = await queryClient.fetchQuery(unitByNumberQuery(q));
        await navigate(paths.unit.getHref(unit.id));
        return;
      } catch {
        // Not registered (or no answer): the list says so and offers to register it.
      } finally {
        setBusy(false);
      }
    }
    await navigate(paths.units.getHref(q));
  };

  return (
    <form
      role="search"
      aria-label="Find a unit"
      onSubmit={(e) => void onSubmit(e)}
      noValidate
      className={cx('flex flex-col gap-2', className)}
    >
      <label htmlFor={id} className="text-lg font-semibold">
        Container number
      </label>
      <p id={`${id}-hint`} className="text-sm text-ink-600">
        Four letters and seven digits, as painted on the unit — or just the start of it, for example HRLU 1000.
      </p>
      <div className="mt-1 flex flex-col gap-3 sm:flex-row">
        <input
          id={id}
          {...containerSearchInput}
          value={value}
          onChange={(e) => setValue(e.target.value)}
          placeholder="HRLU 100001 6"
          aria-invalid={error ? true : undefined}
          aria-describedby={cx(`${id}-hint`, error && `${id}-error`)}
          className={cx(
            'min-h-16 w-full min-w-0 flex-1 rounded-md border-2 bg-white px-4 text-figure font-semibold uppercase tabular-nums',
            'placeholder:font-normal placeholder:text-ink-300 focus-visible:border-ink-950',
            error ? 'border-alarm-700' : 'border-ink-950',
          )}
        />
        <Button type="submit" size="lg" className="min-h-16 sm:px-8" pending={busy} pendingLabel="Finding…">
          <SearchIcon />
          Find unit
        </Button>
      </div>
      {error && (
        <p id={`${id}-error`} role="alert" className="text-sm font-semibold text-alarm-700">
          {error}
        </p>
      )}
    </form>
  );
}
