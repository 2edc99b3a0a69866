import { useId, type ComponentProps } from 'react';
import {
  containerCheckDigit,
  formatContainerNumber,
  normalizeContainerNumber,
  parseContainerNumber,
  wrongCheckDigitText,
} from '../../../shared/domain';
import { cx } from './cx';

type Hint = { tone: 'okay' | 'alarm' | 'info'; text: string } | null;

/** Keeps a number on one line inside a wrapping message. */
const unbroken = (s: string) => s.replace(/ /g, '\u00a0');

/** What the typed characters say so far: the check digit the first ten imply, a wrong one, or a valid number. */
export function containerNumberHint(input: string): Hint {
  const s = normalizeContainerNumber(input);
  if (s.length === 10 && /^[A-Z]{3}[UJZ]\d{6}$/.test(s)) {
    return {
      tone: 'info',
      text: `The check digit for ${unbroken(`${s.slice(0, 4)} ${s.slice(4)}`)} is ${containerCheckDigit(s)}.`,
    };
  }
  if (s.length < 11) return null;
  const r = parseContainerNumber(s);
  if (r.ok) return { tone: 'okay', text: `Valid ISO 6346 number: ${unbroken(formatContainerNumber(r.value))}` };
  const wrongDigit = wrongCheckDigitText(s);
  if (wrongDigit) return { tone: 'alarm', text: wrongDigit };
  return { tone: 'alarm', text: r.error };
}

type Props = Omit<ComponentProps<'input'>, 'id' | 'value'> & {
  label: string;
  value: string;
  /** A server or schema error; shown instead of the live hint. */
  error?: string;
  scale?: 'lg' | 'xl';
};

/** The container number as painted on the unit, in large type, with ISO 6346 check-digit feedback while typing. */
export function ContainerNumberField({ label, value, error, scale = 'lg', className, ...props }: Props) {
  const id = useId();
  const hint = error ? null : containerNumberHint(value);
  const hintTone = { okay: 'text-okay-700', alarm: 'text-alarm-700', info: 'text-fjord-900' } as const;
  return (
    <div className={cx('flex flex-col gap-1.5', className)}>
      <label htmlFor={id} className="text-base font-semibold text-ink-950">
        {label}
      </label>
      <p id={`${id}-format`} className="text-sm text-ink-600">
        Owner code and U, six digits, check digit — for example HRLU 100001 6. Spaces do not matter.
      </p>
      <input
        id={id}
        value={value}
        autoComplete="off"
        autoCapitalize="characters"
        autoCorrect="off"
        spellCheck={false}
        maxLength={20}
        aria-invalid={error || hint?.tone === 'alarm' ? true : undefined}
        aria-describedby={cx(`${id}-format`, `${id}-status`)}
        className={cx(
          'w-full min-w-0 rounded-md border-2 bg-white px-4 font-semibold uppercase tabular-nums tracking-wide',
          'placeholder:font-normal placeholder:normal-case placeholder:text-ink-300 focus-visible:border-ink-950',
          // A whole number in the largest type still fits a 360 px phone's box.
          scale === 'xl' ? 'min-h-18 text-2xl sm:text-3xl' : 'min-h-touch-lg text-figure',
          error || hint?.tone === 'alarm' ? 'border-alarm-700' : 'border-ink-950',
        )}
        {...props}
      />
      <p
        id={`${id}-status`}
        aria-live="polite"
        className={cx('min-h-6 text-base font-semibold', error ? 'text-alarm-700' : hint ? hintTone[hint.tone] : '')}
      >
        {error ?? hint?.text ?? ''}
      </p>
    </div>
  );
}
