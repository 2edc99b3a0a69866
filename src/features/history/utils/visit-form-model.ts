// The record-a-visit form's values (what was typed, in the units it was typed in) and their conversion to the API's
// input (SI: kg, kPa gauge, °C). Field names match the API's, so an error at `events.2.kg` — from the shared schema,
// the plausibility rules or the server — lands on the field the person typed into.
import type { Control } from 'react-hook-form';
import { z } from 'zod';
import {
  convertMass,
  convertPressure,
  convertTemperature,
  isDomainError,
  type MassUnit,
} from '../../../../shared/domain';
import {
  recordVisitSchema,
  type RecordVisitInput,
  type VisitEventInput,
  type VisitEventKind,
} from '../../../../shared/schemas/history';
import type { UnitPrefs } from './unit-prefs';

export type EntryDraft = {
  kind: VisitEventKind;
  note: string;
  // leak check
  method: string;
  leakFound: '' | 'yes' | 'no';
  location: string;
  locationOther: string;
  // repair
  action: string;
  actionOther: string;
  verified: boolean;
  // part replaced, status change, PTI
  component: string;
  status: string;
  passed: '' | 'pass' | 'fail';
  // refrigerant movements: `kg` holds the figure as typed, in `massUnit`
  kg: string;
  massUnit: MassUnit;
  cylinder: string;
  /** The register's cylinder picked for this movement (the picker also fills `cylinder` with its number). */
  cylinderId: number | null;
  reusedRecovered: boolean;
  excludedFromLeakRate: boolean;
  // pressure reading: pressures as typed in `pressureUnit` (gauge), temperatures in `temperatureUnit`
  suctionKPaG: string;
  dischargeKPaG: string;
  pressureUnit: UnitPrefs['pressure'];
  ambientC: string;
  setPointC: string;
  supplyAirC: string;
  returnAirC: string;
  temperatureUnit: UnitPrefs['temperature'];
  sightGlass: string;
};

export type VisitFormValues = {
  /** `datetime-local` value, local time. */
  occurredAt: string;
  events: EntryDraft[];
};

export function emptyEntry(kind: VisitEventKind, prefs: UnitPrefs): EntryDraft {
  return {
    kind,
    note: '',
    method: '',
    leakFound: '',
    location: '',
    locationOther: '',
    action: '',
    actionOther: '',
    verified: false,
    component: '',
    status: '',
    passed: '',
    kg: '',
    massUnit: prefs.mass,
    cylinder: '',
    cylinderId: null,
    reusedRecovered: false,
    excludedFromLeakRate: false,
    suctionKPaG: '',
    dischargeKPaG: '',
    pressureUnit: prefs.pressure,
    ambientC: '',
    setPointC: '',
    supplyAirC: '',
    returnAirC: '',
    temperatureUnit: prefs.temperature,
    sightGlass: '',
  };
}

/** `yyyy-MM-ddTHH:mm` in local time, for a datetime-local input. */
export function toLocalInputValue(d: Date): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

/** A typed number: blank → undefined, a decimal comma is accepted, anything else → NaN (the schema says what to type). */
export function parseTyped(value: string): number | undefined {
  const t = value
    .trim()
    .replace(/\s+/g, '')
    .replace(/^([+-−]?\d*),(\d+)$/, '$1.$2')
    .replace(/^−/, '-');
  if (t === '') return undefined;
  return /^[+-]?(\d+\.?\d*|\.\d+)$/.test(t) ? Number(t) : Number.NaN;
}

const optionalText = (v: string) => (v.trim() === '' ? undefined : v.trim());

/** Gauge pressure typed in `unit` → kPa gauge. Below a perfect vacuum stays below it, so the schema says so. */
export function toKPaG(typed: number | undefined, unit: UnitPrefs['pressure']): number | undefined {
  if (typed === undefined || Number.isNaN(typed)) return typed;
  try {
    return convertPressure(typed, { unit, ref: 'gauge' }, { unit: 'kPa', ref: 'gauge' });
  } catch (e) {
    if (isDomainError(e)) return -102;
    throw e;
  }
}

export function toCelsius(typed: number | undefined, unit: UnitPrefs['temperature']): number | undefined {
  if (typed === undefined || Number.isNaN(typed)) return typed;
  try {
    return convertTemperature(typed, unit, 'C');
  } catch (e) {
    if (isDomainError(e)) return -274;
    throw e;
  }
}

function toKg(typed: number | undefined, unit: MassUnit): number | undefined {
  if (typed === undefined || Number.isNaN(typed) || typed < 0) return typed;
  return convertMass(typed, unit, 'kg');
}

const round = (v: number | undefined, digits: number) =>
  v === undefined || Number.isNaN(v) ? v : Math.round(v * 10 ** digits) / 10 ** digits;

/** One drafted entry → the API's event (SI units; `enteredAs` keeps what was typed). */
export function toVisitEvent(d: EntryDraft): VisitEventInput {
  const note = optionalText(d.note);
  switch (d.kind) {
    case 'pti':
      return {
        kind: 'pti',
        passed: d.passed === 'pass' ? true : d.passed === 'fail' ? false : (undefined as never),
        note,
      };
    case 'leak_check': {
      const leakFound = d.leakFound === 'yes' ? true : d.leakFound === 'no' ? false : (undefined as never);
      return {
        kind: 'leak_check',
        method: (d.method || undefined) as never,
        leakFound,
        location: leakFound ? ((d.location || undefined) as never) : undefined,
        locationOther: leakFound && d.location === 'other' ? optionalText(d.locationOther) : undefined,
        note,
      };
    }
    case 'repair':
      return {
        kind: 'repair',
        location: (d.location || undefined) as never,
        locationOther: d.location === 'other' ? optionalText(d.locationOther) : undefined,
        action: (d.action || undefined) as never,
        actionOther: d.action === 'other' ? optionalText(d.actionOther) : undefined,
        verified: d.verified,
        note,
      };
    case 'component_replacement':
      return { kind: 'component_replacement', component: d.component, note };
    case 'status_change':
      return { kind: 'status_change', status: (d.status || undefined) as never, note };
    case 'note':
      return { kind: 'note', note: d.note };
    case 'top_up':
    case 'recovery':
    case 'recharge': {
      const typed = parseTyped(d.kg);
      // Stored to the gram; what was typed is kept beside it.
      const kg = round(toKg(typed, d.massUnit), 4) as number;
      const enteredAs = typed !== undefined && !Number.isNaN(typed) ? { value: typed, unit: d.massUnit } : undefined;
      const cylinder = d.cylinder.trim();
      const cylinderId = d.cylinderId ?? undefined;
      if (d.kind === 'recovery') return { kind: 'recovery', kg, enteredAs, cylinder, cylinderId, note };
      if (d.kind === 'top_up')
        return { kind: 'top_up', kg, enteredAs, cylinder, cylinderId, reusedRecovered: d.reusedRecovered, note };
      return {
        kind: 'recharge',
        kg,
        enteredAs,
        cylinder,
        cylinderId,
        reusedRecovered: d.reusedRecovered,
        excludedFromLeakRate: d.excludedFromLeakRate,
        note,
      };
    }
    case 'pressure': {
      const t = (v: string) => round(toCelsius(parseTyped(v), d.temperatureUnit), 2);
      const p = (v: string) => round(toKPaG(parseTyped(v), d.pressureUnit), 2);
      return {
        kind: 'pressure',
        suctionKPaG: p(d.suctionKPaG),
        dischargeKPaG: p(d.dischargeKPaG),
        ambientC: t(d.ambientC),
        setPointC: t(d.setPointC),
        supplyAirC: t(d.supplyAirC),
        returnAirC: t(d.returnAirC),
        sightGlass: (d.sightGlass || undefined) as never,
        enteredAs: { pressureUnit: d.pressureUnit, temperatureUnit: d.temperatureUnit },
        note,
      };
    }
  }
}

/** The visit as the API takes it, minus the idempotency key, which is made once per submission. */
export type VisitSubmission = Omit<RecordVisitInput, 'idempotencyKey'>;

export type VisitControl = Control<VisitFormValues, unknown, VisitSubmission>;

/**
 * The form's schema: the typed values, converted, then checked by the shared `recordVisitSchema` (the same rules the
 * server applies), so the paths of its errors are the form's field names.
 */
export function visitFormSchema(unitId: number) {
  const apiSchema = recordVisitSchema.omit({ idempotencyKey: true });
  return z
    .object({ occurredAt: z.string(), events: z.array(z.custom<EntryDraft>()) })
    .transform((v) => ({
      unitId,
      occurredAt:
        v.occurredAt && !Number.isNaN(new Date(v.occurredAt).getTime()) ? new Date(v.occurredAt).toISOString() : '',
      events: v.events.map(toVisitEvent),
    }))
    .pipe(apiSchema);
}

/** The fields each kind shows, so an error from the server can be put on the right one. */
export const FIELDS_BY_KIND: Record<VisitEventKind, readonly (keyof EntryDraft)[]> = {
  pti: ['passed', 'note'],
  leak_check: ['method', 'leakFound', 'location', 'locationOther', 'note'],
  repair: ['location', 'locationOther', 'action', 'actionOther', 'verified', 'note'],
  component_replacement: ['component', 'note'],
  status_change: ['status', 'note'],
  note: ['note'],
  top_up: ['kg', 'cylinder', 'cylinderId', 'reusedRecovered', 'note'],
  recovery: ['kg', 'cylinder', 'cylinderId', 'note'],
  recharge: ['kg', 'cylinder', 'cylinderId', 'reusedRecovered', 'excludedFromLeakRate', 'note'],
  pressure: ['suctionKPaG', 'dischargeKPaG', 'ambientC', 'setPointC', 'supplyAirC', 'returnAirC', 'sightGlass', 'note'],
};
