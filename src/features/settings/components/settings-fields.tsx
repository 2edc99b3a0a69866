import {
  useFieldArray,
  type Control,
  type FieldErrors,
  type UseFormRegister,
  type UseFormWatch,
} from 'react-hook-form';
import type { z } from 'zod';
import { LEAK_LOCATIONS, REFRIGERANT_CODES } from '../../../../shared/domain';
import type { settingsSchema } from '../../../../shared/schemas/settings';
import { Button } from '../../../components/ui/button';
import { cx } from '../../../components/ui/cx';

export type SettingsInput = z.input<typeof settingsSchema>;
type Input = SettingsInput;
type Reg = UseFormRegister<Input>;

const control =
  'block w-full min-h-touch rounded-md border-2 bg-white px-3 text-base text-ink-950 disabled:bg-ink-50 disabled:text-ink-700';

export function errorAt(errors: FieldErrors<Input>, path: string): string | undefined {
  let node: unknown = errors;
  for (const k of path.split('.')) node = (node as Record<string, unknown> | undefined)?.[k];
  const n = node as { message?: string; root?: { message?: string } } | undefined;
  return n?.message ?? n?.root?.message;
}

function Num({
  reg,
  errors,
  path,
  label,
  hint,
  disabled,
  step = 'any',
}: {
  reg: Reg;
  errors: FieldErrors<Input>;
  path: string;
  label: string;
  hint?: string;
  disabled: boolean;
  step?: string;
}) {
  const err = errorAt(errors, path);
  return (
    <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
      {label}
      <input
        type="number"
        step={step}
        inputMode="decimal"
        disabled={disabled}
        aria-invalid={err ? true : undefined}
        className={cx(control, err ? 'border-alarm-700' : 'border-ink-400')}
        {...reg(path as never, { valueAsNumber: true })}
      />
      {hint && <span className="text-xs font-normal text-ink-600">{hint}</span>}
      {err && <span className="text-sm text-alarm-700">{err}</span>}
    </label>
  );
}

/** What every field of a section needs: the form's register, its errors and whether it may be changed now. */
export type FieldProps = { reg: Reg; errors: FieldErrors<Input>; disabled: boolean };

/** The leak-check policy: EU, US or custom charge bands, and the GWP basis. */
export function PolicyFields({
  p,
  formControl,
  watch,
}: {
  p: FieldProps;
  formControl: Control<Input>;
  watch: UseFormWatch<Input>;
}) {
  const { reg: register, errors, disabled } = p;
  const bands = useFieldArray({ control: formControl, name: 'customLeakCheck.bands' });
  return (
    <>
      <p className="text-base text-ink-700">
        Which rule sets the leak-check interval of each unit from its charge in CO2 equivalent.
      </p>
      <div className="grid gap-3 sm:grid-cols-2">
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
          Policy
          <select className={cx(control, 'border-ink-400')} disabled={disabled} {...register('policy')}>
            <option value="EU">EU: Regulation (EU) 2024/573 intervals</option>
            <option value="US">US: 40 CFR 82 reference thresholds</option>
            <option value="custom">Custom charge bands</option>
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
          GWP basis
          <select className={cx(control, 'border-ink-400')} disabled={disabled} {...register('gwpBasis')}>
            <option value="AR4">AR4 (EU legal basis)</option>
            <option value="AR5">AR5</option>
          </select>
        </label>
      </div>
      {watch('policy') === 'custom' && (
        <fieldset className="flex flex-col gap-2">
          <legend className="mb-1 text-base font-bold">Charge bands</legend>
          {bands.fields.map((f, i) => (
            <div key={f.id} className="grid grid-cols-[1fr_1fr_auto] items-end gap-2">
              <Num {...p} path={`customLeakCheck.bands.${i}.fromTCO2e`} label="From t CO2e" />
              <Num {...p} path={`customLeakCheck.bands.${i}.months`} label="Every (months)" step="1" />
              <Button variant="quiet" disabled={disabled || bands.fields.length <= 1} onClick={() => bands.remove(i)}>
                Remove
              </Button>
            </div>
          ))}
          {errorAt(errors, 'customLeakCheck.bands') && (
            <p className="text-sm text-alarm-700">{errorAt(errors, 'customLeakCheck.bands')}</p>
          )}
          <Button
            variant="secondary"
            className="self-start"
            disabled={disabled}
            onClick={() => bands.append({ fromTCO2e: 1000, months: 1 })}
          >
            Add a band
          </Button>
        </fieldset>
      )}
    </>
  );
}

/** Alert threshold, score bands and weights, windows, pressure and forecast tuning. */
export function ThresholdsFields({ p }: { p: FieldProps }) {
  const { errors } = p;
  return (
    <>
      <div className="grid gap-3 sm:grid-cols-3">
        <Num
          {...p}
          path="leakRateThresholdPct"
          label="Alert at rolling leak rate (%)"
          hint="20 % is the US commercial-refrigeration threshold"
        />
        <Num {...p} path="score.rateCapPct" label="Leak rate for a full rate factor (%)" />
        <Num {...p} path="score.watchFrom" label="“Slipping” from score" step="1" />
        <Num {...p} path="score.chronicFrom" label="“Repeat leaker” from score" step="1" />
      </div>
      <fieldset>
        <legend className="mb-2 text-base font-bold">Score weights (add up to 1)</legend>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
          <Num {...p} path="score.weights.rate" label="Leak rate" />
          <Num {...p} path="score.weights.count" label="Repeat top-ups" />
          <Num {...p} path="score.weights.afterRepair" label="Leak after repair" />
          <Num {...p} path="score.weights.sameSpot" label="Same spot again" />
        </div>
        {errorAt(errors, 'score.weights') && (
          <p className="mt-1 text-sm text-alarm-700">{errorAt(errors, 'score.weights')}</p>
        )}
      </fieldset>
      <fieldset>
        <legend className="mb-2 text-base font-bold">Windows (days)</legend>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
          <Num {...p} path="windows.rollingDays" label="Rolling window" step="1" />
          <Num {...p} path="windows.afterRepairDays" label="Recurrence counts in full" step="1" />
          <Num {...p} path="windows.sameSpotDays" label="Same spot window" step="1" />
          <Num {...p} path="windows.repairHoldDays" label="A repair held after" step="1" />
        </div>
      </fieldset>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <Num {...p} path="pressure.baselineWindowDays" label="Pressure baseline window (days)" step="1" />
        <Num {...p} path="pressure.driftFlagK" label="Low-charge drift flag (K)" />
        <Num
          {...p}
          path="forecast.neighbours"
          label="Forecast: similar past cases"
          step="1"
          hint="The next top-up is learned from this many (10 to 1,000)"
        />
      </div>
      <fieldset>
        <legend className="mb-2 text-base font-bold">Cylinder register</legend>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
          <Num
            {...p}
            path="cylinders.toleranceKg"
            label="Flag a difference beyond (kg)"
            hint="Visits against the weighed loss"
          />
          <Num {...p} path="cylinders.nearFullPct" label="Recovery cylinder near full at (%)" step="1" />
        </div>
      </fieldset>
    </>
  );
}

/** How long a passed PTI stays valid. */
export function PtiFields({ p }: { p: FieldProps }) {
  return (
    <div className="grid gap-3 sm:grid-cols-3">
      <Num {...p} path="ptiValidityDays" label="A passed PTI stays valid for (days)" step="1" hint="30 to 365 days" />
      <Num {...p} path="rechecks.afterTopUpDays" label="Re-check after a top-up (days)" step="1" hint="0 to 60" />
      <Num
        {...p}
        path="rechecks.afterRepairDays"
        label="Re-check after a repair (days)"
        step="1"
        hint="EU 2024/573: within a month"
      />
    </div>
  );
}

/** The starting assumptions of every repair-or-retire comparison. */
export function EconomicsFields({ p }: { p: FieldProps }) {
  const { reg: register, disabled } = p;
  return (
    <>
      <p className="text-base text-ink-700">
        The starting assumptions of every repair-or-retire comparison. Refrigerant, labour, downtime and repair prices
        are invented demo figures until you set yours.
      </p>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-700">
          Currency
          <input
            className={cx(control, 'border-ink-400 uppercase')}
            maxLength={3}
            disabled={disabled}
            {...register('economics.currency')}
          />
        </label>
        <Num {...p} path="economics.discountRatePct" label="Discount rate (%)" />
        <Num {...p} path="economics.designLifeYears" label="Design life (years)" step="1" />
        <Num {...p} path="economics.newUnitCost" label="New unit" />
        <Num {...p} path="economics.machineryCost" label="New machinery" />
        <Num {...p} path="economics.residualValue" label="Residual value" />
        <Num {...p} path="economics.labourPerVisit" label="Labour per visit" />
        <Num {...p} path="economics.downtimePerVisit" label="Downtime per visit" />
        <Num {...p} path="economics.defaultRecurrence" label="Default recurrence (0–1)" />
        <Num {...p} path="economics.minRepairsForRate" label="Fleet repairs before using their rate" step="1" />
      </div>
      <fieldset>
        <legend className="mb-2 text-base font-bold">Refrigerant per kg</legend>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6">
          {REFRIGERANT_CODES.map((r) => (
            <Num key={r} {...p} path={`economics.refrigerantPricePerKg.${r}`} label={r} />
          ))}
        </div>
      </fieldset>
      <fieldset>
        <legend className="mb-2 text-base font-bold">Repair cost by leak location</legend>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
          {LEAK_LOCATIONS.map((l) => (
            <Num key={l.id} {...p} path={`economics.repairCostByLocation.${l.id}`} label={l.label} />
          ))}
        </div>
      </fieldset>
    </>
  );
}
