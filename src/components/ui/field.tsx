import { useCallback, useId, useState, type ChangeEvent, type ComponentProps, type ReactNode, type Ref } from 'react';
import { fmtDateTime, fmtDay } from '../../lib/format';
import { cx } from './cx';

const controlClasses = cx(
  'block w-full min-h-touch-lg rounded-md border-2 bg-white px-3 text-base text-ink-950',
  'placeholder:text-ink-400 disabled:bg-ink-50 disabled:text-ink-600',
  'focus-visible:border-ink-950',
);

function describedBy(...ids: Array<string | false | undefined>) {
  const joined = ids.filter(Boolean).join(' ');
  return joined || undefined;
}

type FieldShellProps = {
  id: string;
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  optional?: boolean;
  children: ReactNode;
  className?: string;
};

/** A field's label, with "(optional)" when it may stay empty, and its hint below it (`${id}-hint`). */
export function FieldLabel({ id, label, hint, optional }: Pick<FieldShellProps, 'id' | 'label' | 'hint' | 'optional'>) {
  return (
    <>
      <label htmlFor={id} className="text-base font-semibold text-ink-950">
        {label}
        {optional && <span className="ml-2 text-sm font-normal text-ink-600">(optional)</span>}
      </label>
      {hint && (
        <p id={`${id}-hint`} className="text-sm text-ink-600">
          {hint}
        </p>
      )}
    </>
  );
}

function FieldShell({ id, label, hint, error, optional, children, className }: FieldShellProps) {
  return (
    <div className={cx('flex flex-col gap-1.5', className)}>
      <FieldLabel id={id} label={label} hint={hint} optional={optional} />
      {children}
      {error && (
        <p id={`${id}-error`} className="flex items-start gap-1.5 text-sm font-semibold text-alarm-700">
          <svg viewBox="0 0 20 20" aria-hidden="true" className="mt-0.5 size-4 shrink-0 fill-current">
            <path d="M10 1.5 19 18H1L10 1.5Zm-1 6v5h2v-5H9Zm0 6.5v2h2v-2H9Z" />
          </svg>
          {error}
        </p>
      )}
    </div>
  );
}

type TextFieldProps = Omit<ComponentProps<'input'>, 'id'> & {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  optional?: boolean;
  /** Trailing control inside the field (e.g. the show-password toggle). */
  trailing?: (inputId: string) => ReactNode;
  inputClassName?: string;
};

export function TextField({
  label,
  hint,
  error,
  optional,
  trailing,
  className,
  inputClassName,
  ...props
}: TextFieldProps) {
  const id = useId();
  const echo = useDateEcho(props);
  const input = (
    <input
      id={id}
      aria-invalid={error ? true : undefined}
      aria-describedby={describedBy(hint !== undefined && `${id}-hint`, error && `${id}-error`)}
      className={cx(controlClasses, error ? 'border-alarm-700' : 'border-ink-400', trailing && 'pr-24', inputClassName)}
      {...props}
      {...echo.inputProps}
    />
  );
  const shownHint = echo.text ? (
    <>
      {hint}
      {hint ? ' ' : null}
      <span data-testid="date-echo">Reads {echo.text}.</span>
    </>
  ) : (
    hint
  );
  return (
    <FieldShell id={id} label={label} hint={shownHint} error={error} optional={optional} className={className}>
      {trailing ? (
        <div className="relative">
          {input}
          <div className="absolute inset-y-0 right-0 flex items-center">{trailing(id)}</div>
        </div>
      ) : (
        input
      )}
    </FieldShell>
  );
}

/**
 * A date box shows the date in the browser's own format; under the label it reads in Tightloop's ("12 Mar 2014",
 * "7 Mar 2026, 14:05"), so a person sees which day was meant whatever the phone's settings. Works for controlled
 * inputs and for react-hook-form's registered ones (whose value is set through the ref).
 */
function useDateEcho(props: Omit<ComponentProps<'input'>, 'id'>) {
  const kind = props.type === 'date' || props.type === 'datetime-local' ? props.type : null;
  const { onChange, ref } = props as {
    onChange?: (e: ChangeEvent<HTMLInputElement>) => void;
    ref?: Ref<HTMLInputElement>;
  };
  const [typed, setTyped] = useState<string | null>(null);
  const setRef = useCallback(
    (el: HTMLInputElement | null) => {
      if (typeof ref === 'function') ref(el);
      else if (ref) ref.current = el;
      if (el && kind) queueMicrotask(() => setTyped(el.value));
    },
    [ref, kind],
  );
  if (!kind) return { text: null, inputProps: {} };
  const value = props.value !== undefined ? String(props.value) : (typed ?? String(props.defaultValue ?? ''));
  let text: string | null = null;
  if (value && !Number.isNaN(Date.parse(value))) text = kind === 'date' ? fmtDay(value) : fmtDateTime(value);
  return {
    text,
    inputProps: {
      ref: setRef,
      onChange: (e: ChangeEvent<HTMLInputElement>) => {
        setTyped(e.target.value);
        onChange?.(e);
      },
    },
  };
}

type PasswordFieldProps = Omit<TextFieldProps, 'type' | 'trailing'>;

export function PasswordField(props: PasswordFieldProps) {
  const [visible, setVisible] = useState(false);
  return (
    <TextField
      {...props}
      type={visible ? 'text' : 'password'}
      autoCapitalize="none"
      autoCorrect="off"
      spellCheck={false}
      trailing={(inputId) => (
        <button
          type="button"
          aria-controls={inputId}
          aria-pressed={visible}
          onClick={() => setVisible((v) => !v)}
          className="m-1 h-12 min-w-20 rounded-sm px-3 text-sm font-semibold text-fjord-700 hover:bg-fjord-50"
        >
          {/* Visible text, not aria-label, so "Password" stays the only label of the input. */}
          {visible ? 'Hide' : 'Show'}
          <span className="sr-only"> password</span>
        </button>
      )}
    />
  );
}

type SelectFieldProps = Omit<ComponentProps<'select'>, 'id'> & {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  optional?: boolean;
};

export function SelectField({ label, hint, error, optional, className, children, ...props }: SelectFieldProps) {
  const id = useId();
  return (
    <FieldShell id={id} label={label} hint={hint} error={error} optional={optional} className={className}>
      <select
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(hint !== undefined && `${id}-hint`, error && `${id}-error`)}
        className={cx(controlClasses, 'appearance-auto pr-8', error ? 'border-alarm-700' : 'border-ink-400')}
        {...props}
      >
        {children}
      </select>
    </FieldShell>
  );
}
