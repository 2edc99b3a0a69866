// Gloved-hand controls for the visit form: big choice chips instead of selects, big toggles, decimal fields with
// steppers and the phone's number pad. All tied to react-hook-form by field name.
import { createContext, useContext, useId, type ReactNode } from 'react';
import { get, useController, useFormState, type FieldPath } from 'react-hook-form';
import { cx } from '../../../components/ui/cx';
import { FieldLabel } from '../../../components/ui/field';
import type { VisitControl, VisitFormValues } from '../utils/visit-form-model';

type Name = FieldPath<VisitFormValues>;

/** Plausibility warnings shown live before the visit is sent (same rules the server applies), by field path. */
export const PreviewContext = createContext<Record<string, string>>({});

function useFieldMessage(control: VisitControl, name: Name): { error?: string; warning?: string } {
  const { errors } = useFormState({ control, name });
  const preview = useContext(PreviewContext);
  const error = (get(errors, name) as { message?: string } | undefined)?.message;
  return error ? { error } : { warning: preview[name] };
}

function FieldMessage({ id, error, warning }: { id: string; error?: string; warning?: string }) {
  if (!error && !warning) return null;
  return (
    <p
      id={id}
      className={cx('flex items-start gap-1.5 text-sm font-semibold', error ? 'text-alarm-700' : 'text-heed-800')}
    >
      <svg viewBox="0 0 20 20" aria-hidden="true" className="mt-0.5 size-4 shrink-0 fill-current">
        <path d="M10 1.5 19 18H1L10 1.5Zm-1 6v5h2v-5H9Zm0 6.5v2h2v-2H9Z" />
      </svg>
      <span>
        {!error && <span className="sr-only">Check: </span>}
        {error ?? warning}
      </span>
    </p>
  );
}

export type Choice = { value: string; label: ReactNode };

const chip = cx(
  'relative flex min-h-touch cursor-pointer items-center gap-2 rounded-md border-2 border-ink-400 bg-white px-3 py-2',
  'text-base font-semibold text-ink-950 select-none hover:border-ink-950',
  'has-checked:border-fjord-700 has-checked:bg-fjord-700 has-checked:text-white',
  'has-focus-visible:outline-3 has-focus-visible:outline-offset-2 has-focus-visible:outline-ink-950',
);

function Check() {
  return (
    <svg
      viewBox="0 0 20 20"
      aria-hidden="true"
      className="hidden size-5 shrink-0 fill-none stroke-current stroke-[2.5] peer-checked:block"
    >
      <path d="m4 10.5 4 4 8-9" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

/** One of a few: a row (or grid) of large radio chips. */
export function ChoiceChips({
  control,
  name,
  legend,
  choices,
  columns = 2,
  hint,
  optional,
}: {
  control: VisitControl;
  name: Name;
  legend: ReactNode;
  choices: readonly Choice[];
  columns?: 1 | 2 | 3 | 4;
  hint?: ReactNode;
  optional?: boolean;
}) {
  const { field } = useController({ control, name });
  const { error, warning } = useFieldMessage(control, name);
  const id = useId();
  const cols = { 1: 'grid-cols-1', 2: 'grid-cols-2', 3: 'grid-cols-3', 4: 'grid-cols-2 sm:grid-cols-4' }[columns];
  return (
    <fieldset
      className="flex min-w-0 flex-col gap-2"
      aria-describedby={cx(hint ? `${id}-hint` : null, error || warning ? `${id}-msg` : null) || undefined}
      aria-invalid={error ? true : undefined}
    >
      <legend className="mb-2 text-base font-semibold">
        {legend}
        {optional && <span className="ml-2 text-sm font-normal text-ink-600">(optional)</span>}
      </legend>
      {hint && (
        <p id={`${id}-hint`} className="-mt-1 text-sm text-ink-600">
          {hint}
        </p>
      )}
      <div className={cx('grid gap-2', cols)}>
        {choices.map((c) => (
          <label key={c.value} className={chip}>
            <input
              type="radio"
              className="peer sr-only"
              name={field.name}
              value={c.value}
              checked={field.value === c.value}
              onChange={() => field.onChange(c.value)}
              onBlur={field.onBlur}
              ref={field.value === c.value || (!field.value && c === choices[0]) ? field.ref : undefined}
            />
            <Check />
            <span className="min-w-0 leading-snug">{c.label}</span>
          </label>
        ))}
      </div>
      <FieldMessage id={`${id}-msg`} error={error} warning={warning} />
    </fieldset>
  );
}

/** A yes/no statement as a big tickable row. */
export function Toggle({
  control,
  name,
  label,
  hint,
}: {
  control: VisitControl;
  name: Name;
  label: ReactNode;
  hint?: ReactNode;
}) {
  const { field } = useController({ control, name });
  const id = useId();
  return (
    <label
      className={cx(
        'flex min-h-touch cursor-pointer items-start gap-3 rounded-md border-2 border-ink-300 bg-white px-3 py-3',
        'has-checked:border-fjord-700 has-checked:bg-fjord-50',
        'has-focus-visible:outline-3 has-focus-visible:outline-offset-2 has-focus-visible:outline-ink-950',
      )}
    >
      <input
        type="checkbox"
        ref={field.ref}
        name={field.name}
        checked={Boolean(field.value)}
        onChange={(e) => field.onChange(e.target.checked)}
        onBlur={field.onBlur}
        aria-describedby={hint ? `${id}-hint` : undefined}
        className="mt-0.5 size-7 shrink-0 accent-fjord-700"
      />
      <span className="flex flex-col">
        <span className="text-base font-semibold">{label}</span>
        {hint && (
          <span id={`${id}-hint`} className="text-sm text-ink-600">
            {hint}
          </span>
        )}
      </span>
    </label>
  );
}

/** A unit switch (kg | lb, psi | bar | kPa, °C | °F): a segmented control of 48 px buttons. */
export function UnitSwitch<U extends string>({
  label,
  value,
  units,
  onChange,
  display = (u) => u,
}: {
  label: string;
  value: U;
  units: readonly U[];
  onChange: (u: U) => void;
  display?: (u: U) => string;
}) {
  return (
    <div role="group" aria-label={label} className="inline-flex rounded-md border-2 border-ink-950 bg-white p-0.5">
      {units.map((u) => (
        <button
          key={u}
          type="button"
          aria-pressed={u === value}
          onClick={() => onChange(u)}
          className={cx(
            'min-h-12 min-w-12 rounded-sm px-3 text-base font-semibold',
            u === value ? 'bg-ink-950 text-white' : 'text-ink-800 hover:bg-ink-50',
          )}
        >
          {display(u)}
        </button>
      ))}
    </div>
  );
}

/** A decimal figure with the phone's number pad, its unit beside it and, optionally, big − / + steppers. */
export function DecimalField({
  control,
  name,
  label,
  unit,
  step,
  hint,
  optional,
  allowNegative = false,
  aside,
  big = false,
  labelAside,
}: {
  control: VisitControl;
  name: Name;
  label: ReactNode;
  unit: ReactNode;
  step?: number;
  hint?: ReactNode;
  optional?: boolean;
  allowNegative?: boolean;
  /** Under the field: e.g. the live saturation temperature. */
  aside?: ReactNode;
  big?: boolean;
  /** Beside the label: e.g. the unit switch. */
  labelAside?: ReactNode;
}) {
  const { field } = useController({ control, name });
  const { error, warning } = useFieldMessage(control, name);
  const id = useId();
  const value = typeof field.value === 'string' ? field.value : '';
  const bump = (dir: 1 | -1) => {
    if (!step) return;
    const current = Number(value.replace(',', '.').replace('−', '-'));
    const base = Number.isFinite(current) ? current : 0;
    let next = Math.round((base + dir * step) / step) * step;
    if (!allowNegative && next < 0) next = 0;
    const decimals = String(step).split('.')[1]?.length ?? 0;
    field.onChange(next.toFixed(decimals));
  };
  // Phone number pads often have no minus key: set points and suction in vacuum need one.
  const flipSign = () => {
    const v = value.trim();
    if (v.startsWith('-') || v.startsWith('−')) field.onChange(v.slice(1));
    else field.onChange(`-${v}`);
  };
  const describedBy = cx(
    hint ? `${id}-hint` : null,
    error || warning ? `${id}-msg` : null,
    aside ? `${id}-aside` : null,
  );
  return (
    <div className="flex min-w-0 flex-col gap-1.5">
      <div className="flex flex-wrap items-end justify-between gap-2">
        <label htmlFor={id} className="text-base font-semibold">
          {label}
          {optional && <span className="ml-2 text-sm font-normal text-ink-600">(optional)</span>}
        </label>
        {labelAside}
      </div>
      {hint && (
        <p id={`${id}-hint`} className="text-sm text-ink-600">
          {hint}
        </p>
      )}
      <div className="flex items-stretch gap-2">
        {allowNegative && !step && (
          <button
            type="button"
            onClick={flipSign}
            className="min-h-touch-lg w-12 shrink-0 rounded-md border-2 border-ink-400 bg-white text-xl font-bold hover:border-ink-950"
            aria-label="Change the sign (plus or minus)"
          >
            ±
          </button>
        )}
        {step && (
          <button
            type="button"
            onClick={() => bump(-1)}
            className="min-h-touch-lg w-14 shrink-0 rounded-md border-2 border-ink-950 bg-white text-2xl font-bold hover:bg-ink-50 active:bg-ink-100"
            aria-label={`Less (−${step})`}
          >
            −
          </button>
        )}
        <div className="relative min-w-0 flex-1">
          <input
            id={id}
            ref={field.ref}
            name={field.name}
            value={value}
            onChange={(e) => field.onChange(e.target.value)}
            onBlur={field.onBlur}
            inputMode="decimal"
            autoComplete="off"
            enterKeyHint="next"
            aria-invalid={error ? true : undefined}
            aria-describedby={describedBy || undefined}
            className={cx(
              'block min-h-touch-lg w-full min-w-0 rounded-md border-2 bg-white py-2 pl-3 tabular-nums',
              typeof unit === 'string' && unit.length <= 2 ? 'pr-10' : 'pr-14',
              'placeholder:text-ink-300 focus-visible:border-ink-950',
              big ? 'text-figure font-semibold' : 'text-lg font-semibold',
              error ? 'border-alarm-700' : warning ? 'border-heed-800' : 'border-ink-400',
            )}
          />
          <span
            aria-hidden="true"
            className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-base font-semibold text-ink-600"
          >
            {unit}
          </span>
        </div>
        {step && (
          <button
            type="button"
            onClick={() => bump(1)}
            className="min-h-touch-lg w-14 shrink-0 rounded-md border-2 border-ink-950 bg-white text-2xl font-bold hover:bg-ink-50 active:bg-ink-100"
            aria-label={`More (+${step})`}
          >
            +
          </button>
        )}
      </div>
      {aside && <div id={`${id}-aside`}>{aside}</div>}
      <FieldMessage id={`${id}-msg`} error={error} warning={warning} />
    </div>
  );
}

/** Free text (cylinder number, part name, other location) or a note. */
export function TextInput({
  control,
  name,
  label,
  hint,
  optional,
  multiline = false,
  placeholder,
  autoCapitalize,
}: {
  control: VisitControl;
  name: Name;
  label: ReactNode;
  hint?: ReactNode;
  optional?: boolean;
  multiline?: boolean;
  placeholder?: string;
  autoCapitalize?: 'characters' | 'sentences' | 'none';
}) {
  const { field } = useController({ control, name });
  const { error, warning } = useFieldMessage(control, name);
  const id = useId();
  const value = typeof field.value === 'string' ? field.value : '';
  const common = {
    id,
    name: field.name,
    value,
    onBlur: field.onBlur,
    placeholder,
    'aria-invalid': error ? true : undefined,
    'aria-describedby': cx(hint ? `${id}-hint` : null, error || warning ? `${id}-msg` : null) || undefined,
    className: cx(
      'block w-full rounded-md border-2 bg-white px-3 text-base placeholder:text-ink-400 focus-visible:border-ink-950',
      error ? 'border-alarm-700' : 'border-ink-400',
      multiline ? 'min-h-24 py-2' : 'min-h-touch-lg',
    ),
  };
  return (
    <div className="flex min-w-0 flex-col gap-1.5">
      <FieldLabel id={id} label={label} hint={hint} optional={optional} />
      {multiline ? (
        <textarea {...common} ref={field.ref} rows={3} onChange={(e) => field.onChange(e.target.value)} />
      ) : (
        <input
          {...common}
          ref={field.ref}
          autoComplete="off"
          autoCapitalize={autoCapitalize}
          spellCheck={autoCapitalize === 'characters' ? false : undefined}
          onChange={(e) => field.onChange(e.target.value)}
        />
      )}
      <FieldMessage id={`${id}-msg`} error={error} warning={warning} />
    </div>
  );
}
