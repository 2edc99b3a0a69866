import type { UseFormReturn } from 'react-hook-form';
import { LEAK_LOCATIONS, termLabel, type RepairOptionsResult } from '../../../../../shared/domain';
import { DECISION_ASSUMPTION_WORDS as W, RECURRENCE_SOURCE_WORDS } from '../../../../../shared/domain/words';
import type { UnitDecisionDto } from '../../../../../shared/schemas/decisions';
import { cx } from '../../../../components/ui/cx';
import { Panel } from '../../../../components/ui/page';
import { fmtPct } from '../../../../lib/format';
import type { DecisionFormInput, DecisionFormValues } from '../../hooks/use-decision-form';
import { inputClass as input, NumberField } from './number-field';

const LEAK_LOCATION_SOURCES = {
  open_leak: 'The open leak',
  last_leak_found: 'Where the last leak was found',
  last_repair: 'Where it was last repaired',
  none: 'No leak location recorded',
} as const;

/** The unit's figures, the prices and the money-and-time assumptions; the options above follow every change. */
export function AssumptionsPanel({
  form,
  data,
  result,
  location,
}: {
  form: UseFormReturn<DecisionFormInput, unknown, DecisionFormValues>;
  data: UnitDecisionDto;
  result: RepairOptionsResult;
  location: NonNullable<DecisionFormValues['inputs']['leakLocation']>;
}) {
  const c = result.currency;
  const code = data.unit.refrigerant as keyof DecisionFormValues['economics']['refrigerantPricePerKg'];
  const numberField = (
    path: string,
    label: string,
    opts: { hint?: string; step?: string; nullable?: boolean } = {},
  ) => <NumberField form={form} path={path} label={label} {...opts} />;
  return (
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
          {numberField('inputs.topUpIntervalDays', 'Days between top-ups', {
            nullable: true,
            hint:
              data.sources.interval === 'forecast'
                ? 'The forecast’s median: from the last top-up to its median next date'
                : 'No leak evidence: leave empty',
          })}
          {numberField('inputs.madeUpKgPerVisit', `${W.madeUpKgPerVisit} (kg)`, {
            nullable: true,
            hint: data.sources.interval === 'forecast' ? 'Typical made-up kg of its recent top-ups' : undefined,
          })}
          <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
            {W.leakLocation}
            <select className={cx(input, 'border-ink-400')} {...form.register('inputs.leakLocation')}>
              {LEAK_LOCATIONS.map((l) => (
                <option key={l.id} value={l.id}>
                  {l.label}
                </option>
              ))}
            </select>
            <span className="text-xs font-normal text-ink-600">{LEAK_LOCATION_SOURCES[data.sources.leakLocation]}</span>
          </label>
        </div>
      </fieldset>
      <fieldset className="mt-5">
        <legend className="mb-2 text-base font-bold">Prices ({c})</legend>
        <div className="grid gap-3 sm:grid-cols-3">
          {numberField(`economics.refrigerantPricePerKg.${code}`, `${data.unit.refrigerant} per kg`)}
          {numberField('economics.labourPerVisit', W.labourPerVisit)}
          {numberField('economics.downtimePerVisit', W.downtimePerVisit)}
          {numberField(
            `economics.repairCostByLocation.${location}`,
            `${W.repairCost} at ${termLabel(LEAK_LOCATIONS, location).toLowerCase()}`,
          )}
          {numberField('economics.machineryCost', W.machineryCost)}
          {numberField('economics.newUnitCost', W.newUnitCost)}
          {numberField('economics.residualValue', W.residualValue)}
        </div>
      </fieldset>
      <fieldset className="mt-5">
        <legend className="mb-2 text-base font-bold">Money and time</legend>
        <div className="grid gap-3 sm:grid-cols-3">
          {numberField('economics.discountRatePct', `${W.discountRatePct} (%)`)}
          {numberField('economics.designLifeYears', `${W.designLifeYears} (years)`, { step: '1' })}
          {numberField('economics.defaultRecurrence', `${W.recurrence} (0–1)`, {
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
          Chance the repair leaks again: {fmtPct(result.assumptions.recurrence * 100)} (
          {RECURRENCE_SOURCE_WORDS[result.assumptions.recurrenceSource]}
          ).
        </li>
        {result.assumptions.notes.map((n) => (
          <li key={n}>{n}</li>
        ))}
      </ul>
    </Panel>
  );
}
