import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo, useState } from 'react';
import { useForm, type FieldErrors } from 'react-hook-form';
import { z } from 'zod';
import { compareRepairOptions, LEAK_LOCATIONS, termLabel, type RepairOptionsResult } from '../../../../shared/domain';
import {
  DECISION_CHOICE_LABELS,
  DECISION_CHOICES,
  DECISION_OPTION,
  decisionInputsSchema,
  economicsSchema,
  type DecisionChoice,
  type UnitDecisionDto,
} from '../../../../shared/schemas/decisions';
import { DEFAULT_SETTINGS } from '../../../../shared/schemas/settings';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';
import { Panel } from '../../../components/ui/page';
import { useRecordDecision } from '../api/record-decision';
import { OptionsGrid } from './options-grid';
import { fmtDay, fmtMoney } from '../../../lib/format';

const formSchema = z.object({
  economics: economicsSchema,
  inputs: decisionInputsSchema,
  choice: z.enum(DECISION_CHOICES),
  note: z.string().trim().max(2000).optional(),
});
type FormValues = z.infer<typeof formSchema>;
type FormInput = z.input<typeof formSchema>;

const round = (v: number | null, d: number) => (v === null ? null : Math.round(v * 10 ** d) / 10 ** d);
const num = (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(String(v).replace(',', '.')));
const input = 'block w-full min-h-touch rounded-md border-2 bg-white px-3 text-base text-ink-950 tabular-nums';

const choiceOf = (id: RepairOptionsResult['cheapestId']): DecisionChoice =>
  (Object.entries(DECISION_OPTION).find(([, o]) => o === id)?.[0] as DecisionChoice) ?? 'keep';

function errorAt(errors: FieldErrors<FormInput>, path: string): string | undefined {
  let node: unknown = errors;
  for (const k of path.split('.')) node = (node as Record<string, unknown> | undefined)?.[k];
  return (node as { message?: string } | undefined)?.message;
}

/** The options of one unit, recomputed in the browser with the same engine as the server while assumptions change. */
export function DecisionWorkbench({ data, keyFor }: { data: UnitDecisionDto; keyFor: () => string }) {
  const record = useRecordDecision(data.unit.id);
  const [key, setKey] = useState(keyFor);
  const form = useForm<FormInput, unknown, FormValues>({
    resolver: zodResolver(formSchema),
    mode: 'onChange',
    defaultValues: {
      economics: data.economics,
      inputs: {
        // Shown rounded (days to 0.1, kg to grams); the server prices exactly what is submitted.
        topUpIntervalDays: round(data.engineInput.topUpIntervalDays, 1),
        madeUpKgPerVisit: round(data.engineInput.madeUpKgPerVisit, 3),
        leakLocation: data.engineInput.leakLocation ?? 'other',
      },
      choice: choiceOf(data.result.cheapestId),
      note: '',
    },
  });
  const values = form.watch();
  const { errors } = form.formState;

  // Recomputed on every keystroke with the shared engine; a half-typed field falls back to the saved settings' figures.
  const live = useMemo(() => {
    const e = economicsSchema.safeParse(values.economics);
    const i = decisionInputsSchema.safeParse(values.inputs);
    if (!e.success || !i.success) return null;
    try {
      return compareRepairOptions({ ...data.engineInput, ...i.data }, { ...DEFAULT_SETTINGS, economics: e.data });
    } catch {
      return null;
    }
  }, [JSON.stringify(values.economics), JSON.stringify(values.inputs), data.engineInput]); // eslint-disable-line react-hooks/exhaustive-deps
  const result = live ?? data.result;
  const cheapest = result.options.find((o) => o.cheapest)!;
  const keep = result.options[0];
  const c = result.currency;
  const code = data.unit.refrigerant as keyof FormValues['economics']['refrigerantPricePerKg'];
  const location = values.inputs?.leakLocation ?? 'other';

  const field = (path: string, label: string, opts: { hint?: string; step?: string; nullable?: boolean } = {}) => {
    const err = errorAt(errors, path);
    return (
      <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
        {label}
        <input
          type="number"
          inputMode="decimal"
          step={opts.step ?? 'any'}
          className={cx(input, err ? 'border-alarm-700' : 'border-ink-400')}
          aria-invalid={err ? true : undefined}
          {...form.register(path as never, { setValueAs: opts.nullable ? num : (v) => num(v) ?? NaN })}
        />
        {opts.hint && <span className="text-xs font-normal text-ink-600">{opts.hint}</span>}
        {err && <span className="text-sm text-alarm-700">{err}</span>}
      </label>
    );
  };

  const onSubmit = form.handleSubmit((v) =>
    record.mutate(
      { choice: v.choice, economics: v.economics, inputs: v.inputs, note: v.note || undefined, idempotencyKey: key },
      { onSuccess: () => setKey(keyFor()) },
    ),
  );

  return (
    <div className="flex flex-col gap-5">
      <section aria-labelledby="recommendation" className="rounded-lg border-2 border-okay-700 bg-okay-50 p-4">
        <h2 id="recommendation" className="text-sm font-semibold tracking-wide text-okay-700 uppercase">
          Cheapest over the remaining {result.assumptions.remainingYears} years
        </h2>
        <p className="mt-1 text-xl font-bold" data-testid="recommendation">
          {cheapest.label} — {fmtMoney(cheapest.eac, c)} a year
        </p>
        {cheapest.id !== keep.id && (
          <p className="text-base text-ink-800">
            {fmtMoney(keep.eac - cheapest.eac, c)} a year less than keeping on topping up ({fmtMoney(keep.eac, c)}).
          </p>
        )}
        {!live && (
          <p className="mt-1 text-sm font-semibold text-alarm-700">
            Some assumptions are not valid; the figures shown use the saved settings until they are.
          </p>
        )}
      </section>

      <OptionsGrid result={result} />

      <form onSubmit={onSubmit} className="grid gap-5 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]" noValidate>
        <Panel aria-labelledby="assumptions">
          <h2 id="assumptions" className="text-xl font-bold">
            Assumptions
          </h2>
          <p className="mt-1 text-base text-ink-700">
            Change any of them: the options above follow at once. The settings are not changed.
          </p>
          <fieldset className="mt-4">
            <legend className="mb-2 text-base font-bold">This unit</legend>
            <div className="grid gap-3 sm:grid-cols-3">
              {field('inputs.topUpIntervalDays', 'Days between top-ups', {
                nullable: true,
                hint:
                  data.sources.interval === 'forecast'
                    ? 'The forecast’s median: from the last top-up to its median next date'
                    : 'No leak evidence: leave empty',
              })}
              {field('inputs.madeUpKgPerVisit', 'kg per top-up', {
                nullable: true,
                hint: data.sources.interval === 'forecast' ? 'Typical made-up kg of its recent top-ups' : undefined,
              })}
              <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
                Leak to repair
                <select className={cx(input, 'border-ink-400')} {...form.register('inputs.leakLocation')}>
                  {LEAK_LOCATIONS.map((l) => (
                    <option key={l.id} value={l.id}>
                      {l.label}
                    </option>
                  ))}
                </select>
                <span className="text-xs font-normal text-ink-600">
                  {
                    {
                      open_leak: 'The open leak',
                      last_leak_found: 'Where the last leak was found',
                      last_repair: 'Where it was last repaired',
                      none: 'No leak location recorded',
                    }[data.sources.leakLocation]
                  }
                </span>
              </label>
            </div>
          </fieldset>
          <fieldset className="mt-5">
            <legend className="mb-2 text-base font-bold">Prices ({c})</legend>
            <div className="grid gap-3 sm:grid-cols-3">
              {field(`economics.refrigerantPricePerKg.${code}`, `${data.unit.refrigerant} per kg`)}
              {field('economics.labourPerVisit', 'Labour per visit')}
              {field('economics.downtimePerVisit', 'Downtime per visit')}
              {field(
                `economics.repairCostByLocation.${location}`,
                `Repair at ${termLabel(LEAK_LOCATIONS, location).toLowerCase()}`,
              )}
              {field('economics.machineryCost', 'New machinery')}
              {field('economics.newUnitCost', 'New unit')}
              {field('economics.residualValue', 'Residual value now')}
            </div>
          </fieldset>
          <fieldset className="mt-5">
            <legend className="mb-2 text-base font-bold">Money and time</legend>
            <div className="grid gap-3 sm:grid-cols-3">
              {field('economics.discountRatePct', 'Discount rate (%)')}
              {field('economics.designLifeYears', 'Design life (years)', { step: '1' })}
              {field('economics.defaultRecurrence', 'Leaks again after repair (0–1)', {
                hint:
                  result.assumptions.recurrenceSource === 'fleet'
                    ? 'The fleet’s own record is used here'
                    : 'Used while the fleet has too few repairs here',
              })}
            </div>
          </fieldset>
          <ul className="mt-4 list-disc pl-5 text-sm text-ink-700">
            <li>
              Unit age {Math.max(0, result.assumptions.designLifeYears - result.assumptions.remainingYears)} years of{' '}
              {result.assumptions.designLifeYears}; {result.assumptions.visitsPerYear} top-ups a year.
            </li>
            <li>
              Chance the repair leaks again: {Math.round(result.assumptions.recurrence * 100)} % (
              {result.assumptions.recurrenceSource === 'fleet'
                ? 'from the fleet’s repairs at this location'
                : 'default: fewer than 5 fleet repairs here'}
              ).
            </li>
            {result.assumptions.notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        </Panel>

        <Panel aria-labelledby="record-decision" className="self-start">
          <h2 id="record-decision" className="text-xl font-bold">
            Record the decision
          </h2>
          <p className="mt-1 text-base text-ink-700">
            Saved in the unit's history with the figures and assumptions above.
          </p>
          <fieldset className="mt-3 flex flex-col gap-2">
            <legend className="sr-only">Decision</legend>
            {DECISION_CHOICES.map((ch) => (
              <label
                key={ch}
                className="flex min-h-touch cursor-pointer items-center gap-3 rounded-md border-2 border-ink-200 px-3 has-checked:border-fjord-700 has-checked:bg-fjord-50"
              >
                <input type="radio" value={ch} className="size-5 accent-fjord-700" {...form.register('choice')} />
                <span className="font-semibold">{DECISION_CHOICE_LABELS[ch]}</span>
                {DECISION_OPTION[ch] === result.cheapestId && (
                  <span className="ml-auto text-sm text-okay-700">cheapest</span>
                )}
              </label>
            ))}
          </fieldset>
          <label className="mt-3 flex flex-col gap-1 text-sm font-semibold text-ink-700">
            Note (optional)
            <textarea
              rows={3}
              className="rounded-md border-2 border-ink-400 bg-white px-3 py-2 text-base text-ink-950"
              {...form.register('note')}
            />
          </label>
          {record.isError && (
            <Alert tone="alarm" className="mt-3">
              {record.error.message}
            </Alert>
          )}
          {record.isSuccess && (
            <Alert tone="okay" className="mt-3" title="Decision recorded">
              {DECISION_CHOICE_LABELS[record.data.decision.choice]}, by {record.data.decision.by.name}.
            </Alert>
          )}
          <Button
            type="submit"
            size="lg"
            className="mt-4 w-full"
            pending={record.isPending}
            pendingLabel="Saving…"
            disabled={!live}
          >
            Record decision
          </Button>
          {data.decisions.length > 0 && (
            <div className="mt-5">
              <h3 className="text-base font-bold">Earlier decisions</h3>
              <ul className="mt-1 divide-y divide-ink-100 text-sm">
                {data.decisions.map((d) => (
                  <li key={d.eventId} className="py-2">
                    <span className="font-semibold">{DECISION_CHOICE_LABELS[d.choice]}</span> · {fmtDay(d.at)} ·{' '}
                    {d.by.name}
                    {d.note && <span className="block text-ink-700">{d.note}</span>}
                  </li>
                ))}
              </ul>
            </div>
          )}
        </Panel>
      </form>
    </div>
  );
}
