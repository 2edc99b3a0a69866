import type { UseFormRegister } from 'react-hook-form';
import { Button } from '../../../../components/ui/button';
import { cx } from '../../../../components/ui/cx';
import type { VisitFormInput } from '../../hooks/use-visit-resolver';
import { toLocalInputValue } from '../../utils/visit-form-model';

/** When the work was done: now by default, earlier when recorded afterwards. */
export function WhenField({
  register,
  error,
  onNow,
}: {
  register: UseFormRegister<VisitFormInput>;
  error?: string;
  onNow: () => void;
}) {
  const max = toLocalInputValue(new Date());
  return (
    <div className="flex flex-col gap-1.5">
      <label htmlFor="visit-when" className="text-base font-semibold">
        When the work was done
      </label>
      <p id="visit-when-hint" className="text-sm text-ink-600">
        Now, unless you are recording it afterwards. The time it is entered is kept as well.
      </p>
      <div className="flex gap-2">
        <input
          id="visit-when"
          type="datetime-local"
          max={max}
          aria-invalid={error ? true : undefined}
          aria-describedby={cx('visit-when-hint', error && 'visit-when-error')}
          className={cx(
            'block min-h-touch-lg w-full min-w-0 flex-1 rounded-md border-2 bg-white px-3 text-lg tabular-nums',
            error ? 'border-alarm-700' : 'border-ink-400',
          )}
          {...register('occurredAt')}
        />
        <Button variant="secondary" onClick={onNow} className="min-h-touch-lg shrink-0">
          Now
        </Button>
      </div>
      {error && (
        <p id="visit-when-error" className="text-sm font-semibold text-alarm-700">
          {error}
        </p>
      )}
    </div>
  );
}
