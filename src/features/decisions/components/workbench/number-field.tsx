import type { UseFormReturn } from 'react-hook-form';
import { cx } from '../../../../components/ui/cx';
import { errorAt, type DecisionFormInput, type DecisionFormValues } from '../../hooks/use-decision-form';

export const inputClass =
  'block w-full min-h-touch rounded-md border-2 bg-white px-3 text-base text-ink-950 tabular-nums';
const num = (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(String(v).replace(',', '.')));

/** A figure of the assumptions; a decimal comma is read as a point, an empty field as "none" where that is allowed. */
export function NumberField({
  form,
  path,
  label,
  hint,
  step,
  nullable,
}: {
  form: UseFormReturn<DecisionFormInput, unknown, DecisionFormValues>;
  path: string;
  label: string;
  hint?: string;
  step?: string;
  nullable?: boolean;
}) {
  const err = errorAt(form.formState.errors, path);
  return (
    <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
      {label}
      <input
        type="number"
        inputMode="decimal"
        step={step ?? 'any'}
        className={cx(inputClass, err ? 'border-alarm-700' : 'border-ink-400')}
        aria-invalid={err ? true : undefined}
        {...form.register(path as never, { setValueAs: nullable ? num : (v) => num(v) ?? NaN })}
      />
      {hint && <span className="text-xs font-normal text-ink-600">{hint}</span>}
      {err && <span className="text-sm text-alarm-700">{err}</span>}
    </label>
  );
}
