import { dayOf, isoDateOf, isoToMs, parseIso } from './dates';
import { DomainError } from './errors';
import { isFiniteNumber } from './numbers';
import {
  isLeakLocation,
  isRepairAction,
  isSightGlassState,
  type LeakLocationId,
  type RefrigerantMovementKind,
  type RepairActionId,
  type SightGlassState,
} from './service-terms';
import { ABSOLUTE_ZERO_C, STANDARD_ATMOSPHERE_KPA } from './units';

interface EventBase {
  /** ISO date or timestamp of when it happened (a time without zone is read as UTC). */
  at: string;
  /** Events recorded together share a visit id; without one, a unit's events on one UTC day form a visit. */
  visitId?: string | null;
  /** Where it happened, for fleet emissions per site. */
  site?: string | number | null;
}

export interface RefrigerantMovementEvent extends EventBase {
  kind: RefrigerantMovementKind;
  kg: number;
  /** A retrofit charge or first fill: not made-up refrigerant (40 CFR 82.157(b)). */
  excluded?: boolean | null;
}

export interface LeakCheckEvent extends EventBase {
  kind: 'leak_check';
  leakFound: boolean;
  location?: LeakLocationId | null;
}

export interface RepairEvent extends EventBase {
  kind: 'repair';
  location?: LeakLocationId | null;
  action?: RepairActionId | null;
  verified: boolean;
}

export interface PressureEvent extends EventBase {
  kind: 'pressure';
  suctionKPaG?: number | null;
  dischargeKPaG?: number | null;
  ambientC?: number | null;
  sightGlass?: SightGlassState | null;
}

export interface PtiEvent extends EventBase {
  kind: 'pti';
  passed: boolean;
}

export type UnitEvent = RefrigerantMovementEvent | LeakCheckEvent | RepairEvent | PressureEvent | PtiEvent;

/** What one visit did, in kg; made-up follows DOMAIN.md §4. */
export interface Visit {
  readonly visitId: string | null;
  /** The `at` of the visit's first event, as given. */
  readonly at: string;
  /** UTC calendar day of the first event, YYYY-MM-DD. */
  readonly date: string;
  /** The same day as a number (days since 1970-01-01, UTC). */
  readonly day: number;
  site: string | number | null;
  toppedUpKg: number;
  rechargedKg: number;
  recoveredKg: number;
  /** Charge put in that does not count (retrofit, first fill). */
  excludedKg: number;
  /** Top-ups + max(0, recharged − recovered). */
  madeUpKg: number;
  /** Any refrigerant went in (including excluded fills): the system was full afterwards. */
  added: boolean;
  leakFound: boolean;
  /** Distinct locations of leaks found in this visit. */
  leakLocations: readonly LeakLocationId[];
  repaired: boolean;
  verifiedRepair: boolean;
}

/** A visit with its rates, as computeUnitStats returns it. */
export interface VisitStats extends Visit {
  /** Only for visits with made-up refrigerant. */
  annualizedRatePct: number | null;
  daysSincePreviousAddition: number | null;
  /** Rolling rate as of this visit's day. */
  rollingRatePct: number;
}

/**
 * A checked history in time order, as parallel arrays (no object per event): position k is the k-th event in time
 * order, `source[order[k]]` the event itself.
 */
export interface PreparedHistory {
  /** Events kept: known kinds, up to the "as of" moment. */
  readonly count: number;
  readonly source: readonly UnitEvent[];
  /** Input index of the k-th event in time order (ties keep input order). */
  readonly order: Uint32Array;
  readonly ms: Float64Array;
  readonly day: Int32Array;
  /** Visit index of the k-th event. */
  readonly visitOf: Int32Array;
  /** Created with the VisitStats fields empty, so computeUnitStats can fill them in without copying. */
  readonly visits: VisitStats[];
  /** Events dated after the "as of" moment, left out. */
  readonly afterAsOf: number;
  /** Events of other kinds (notes, status changes …), left out. */
  readonly ignored: number;
}

/** Masses are counted in whole grams: scales read no finer, and integer sums make recharge − recovered exact. */
function grams(kg: number): number {
  return Math.round(kg * 1000);
}

const VACUUM_KPAG = -STANDARD_ATMOSPHERE_KPA;

function optionalNumber(value: unknown): value is number | null | undefined {
  return value === undefined || value === null || isFiniteNumber(value);
}

function fail(e: UnitEvent, i: number, problem: string, field = ''): never {
  throw new DomainError(`Entry ${i + 1} (${String(e.kind).replace('_', ' ')}): ${problem}`, `events[${i}]${field}`);
}

/** Checks one event and throws a DomainError naming the entry and field; false for kinds the figures do not use. */
function checkEvent(e: UnitEvent, i: number): boolean {
  switch (e.kind) {
    case 'top_up':
    case 'recovery':
    case 'recharge':
      if (!(typeof e.kg === 'number' && e.kg >= 0 && e.kg < Number.POSITIVE_INFINITY)) {
        fail(e, i, `the amount must be 0 kg or more, not ${String(e.kg)}.`, '.kg');
      }
      return true;
    case 'leak_check':
      if (typeof e.leakFound !== 'boolean') fail(e, i, 'say whether a leak was found.', '.leakFound');
      if (e.location != null && !isLeakLocation(e.location))
        fail(e, i, `"${String(e.location)}" is not a known leak location.`, '.location');
      return true;
    case 'repair':
      if (e.location != null && !isLeakLocation(e.location))
        fail(e, i, `"${String(e.location)}" is not a known leak location.`, '.location');
      if (e.action != null && !isRepairAction(e.action))
        fail(e, i, `"${String(e.action)}" is not a known repair action.`, '.action');
      return true;
    case 'pressure': {
      const { suctionKPaG: suction, dischargeKPaG: discharge, ambientC: ambient } = e;
      if (!optionalNumber(suction) || !optionalNumber(discharge) || !optionalNumber(ambient)) {
        fail(e, i, 'pressures and temperatures must be numbers.');
      }
      if (suction != null && suction < VACUUM_KPAG - 1e-9) {
        fail(e, i, `a suction reading of ${suction} kPa(g) is below a perfect vacuum (−101.3 kPa(g)).`, '.suctionKPaG');
      }
      if (discharge != null && discharge < VACUUM_KPAG - 1e-9) {
        fail(
          e,
          i,
          `a discharge reading of ${discharge} kPa(g) is below a perfect vacuum (−101.3 kPa(g)).`,
          '.dischargeKPaG',
        );
      }
      if (ambient != null && ambient < ABSOLUTE_ZERO_C)
        fail(e, i, 'the ambient temperature is below absolute zero.', '.ambientC');
      if (e.sightGlass != null && !isSightGlassState(e.sightGlass))
        fail(e, i, `"${String(e.sightGlass)}" is not a sight-glass state.`, '.sightGlass');
      return true;
    }
    case 'pti':
      if (typeof e.passed !== 'boolean') fail(e, i, 'say whether the PTI passed.', '.passed');
      return true;
    default:
      return false;
  }
}

/**
 * Sorts input indices (given in input order) by time, ties in input order. When every time is a whole second, as
 * dates and ordinary timestamps are, (seconds since the first, position) packs exactly into one double and the native
 * numeric sort does the work, several times faster than a comparator; otherwise a stable comparator sort.
 */
function sortByTime(order: Uint32Array, msByInput: Float64Array): void {
  const n = order.length;
  let min = Number.POSITIVE_INFINITY;
  let max = Number.NEGATIVE_INFINITY;
  let wholeSeconds = true;
  for (let k = 0; k < n; k++) {
    const t = msByInput[order[k]];
    if (t < min) min = t;
    if (t > max) max = t;
    if (t % 1000 !== 0) wholeSeconds = false;
  }
  const shift = 2 ** Math.ceil(Math.log2(n + 1));
  if (wholeSeconds && ((max - min) / 1000 + 1) * shift < Number.MAX_SAFE_INTEGER) {
    const keys = new Float64Array(n);
    for (let k = 0; k < n; k++) keys[k] = ((msByInput[order[k]] - min) / 1000) * shift + k;
    keys.sort();
    const original = order.slice();
    for (let k = 0; k < n; k++) order[k] = original[keys[k] % shift];
    return;
  }
  order.sort((a, b) => msByInput[a] - msByInput[b] || a - b);
}

/**
 * Checks and orders a unit's events (the caller's order is not trusted) and groups them into visits: same visit id,
 * or failing that the same UTC calendar day. O(n) when already in time order, else one O(n log n) sort.
 */
export function prepareHistory(
  events: readonly UnitEvent[],
  asOfMs: number = Number.POSITIVE_INFINITY,
): PreparedHistory {
  if (!Array.isArray(events)) throw new DomainError('The service history must be a list of events.', 'events');
  const n = events.length;
  const msByInput = new Float64Array(n);
  const kept = new Uint32Array(n);
  let count = 0;
  let afterAsOf = 0;
  let ignored = 0;
  let sorted = true;
  let prevMs = Number.NEGATIVE_INFINITY;
  for (let i = 0; i < n; i++) {
    const e = events[i];
    if (e === null || typeof e !== 'object' || !checkEvent(e, i)) {
      ignored++;
      continue;
    }
    if (e.visitId != null && typeof e.visitId !== 'string') fail(e, i, 'the visit id must be text.', '.visitId');
    const ms = isoToMs(e.at);
    if (Number.isNaN(ms)) parseIso(e.at, `events[${i}].at`, `Entry ${i + 1} date`);
    if (ms > asOfMs) {
      afterAsOf++;
      continue;
    }
    if (ms < prevMs) sorted = false;
    prevMs = ms;
    msByInput[i] = ms;
    kept[count++] = i;
  }
  const order = kept.slice(0, count);
  if (!sorted) sortByTime(order, msByInput);
  const ms = new Float64Array(count);
  const day = new Int32Array(count);
  const visitOf = new Int32Array(count);

  const visits: VisitStats[] = [];
  const byId = new Map<string, number>();
  // In time order all id-less events of one day are consecutive among the id-less ones.
  let dayVisit = -1;
  let dayVisitDay = Number.NaN;
  for (let k = 0; k < count; k++) {
    const e = events[order[k]];
    const t = msByInput[order[k]];
    const d = dayOf(t);
    ms[k] = t;
    day[k] = d;
    const id = typeof e.visitId === 'string' && e.visitId !== '' ? e.visitId : null;
    let vi = id !== null ? byId.get(id) : d === dayVisitDay ? dayVisit : undefined;
    if (vi === undefined) {
      vi = visits.length;
      visits.push(newVisit(id, e.at, d));
      if (id !== null) byId.set(id, vi);
      else {
        dayVisit = vi;
        dayVisitDay = d;
      }
    }
    visitOf[k] = vi;
    const v = visits[vi];
    if (v.site === null && e.site != null) v.site = e.site;
    switch (e.kind) {
      case 'top_up':
      case 'recharge': {
        const g = grams(e.kg);
        if (e.excluded) v.excludedKg += g;
        else if (e.kind === 'top_up') v.toppedUpKg += g;
        else v.rechargedKg += g;
        if (g > 0) v.added = true;
        break;
      }
      case 'recovery':
        if (!e.excluded) v.recoveredKg += grams(e.kg);
        break;
      case 'leak_check':
        if (e.leakFound) {
          v.leakFound = true;
          if (e.location != null && !v.leakLocations.includes(e.location))
            v.leakLocations = [...v.leakLocations, e.location];
        }
        break;
      case 'repair':
        v.repaired = true;
        if (e.verified === true) v.verifiedRepair = true;
        break;
      default:
        break;
    }
  }
  // The sums above are whole grams, so the made-up rule is exact; back to kg here.
  for (const v of visits) {
    v.madeUpKg = madeUpRefrigerantKg(v) / 1000;
    v.toppedUpKg /= 1000;
    v.rechargedKg /= 1000;
    v.recoveredKg /= 1000;
    v.excludedKg /= 1000;
  }
  return { count, source: events, order, ms, day, visitOf, visits, afterAsOf, ignored };
}

const NO_LOCATIONS: readonly LeakLocationId[] = Object.freeze([]);

function newVisit(visitId: string | null, at: string, day: number): VisitStats {
  return {
    visitId,
    at,
    date: isoDateOf(at, day),
    day,
    site: null,
    toppedUpKg: 0,
    rechargedKg: 0,
    recoveredKg: 0,
    excludedKg: 0,
    madeUpKg: 0,
    added: false,
    leakFound: false,
    leakLocations: NO_LOCATIONS,
    repaired: false,
    verifiedRepair: false,
    annualizedRatePct: null,
    daysSincePreviousAddition: null,
    rollingRatePct: 0,
  };
}

/**
 * Made-up refrigerant of a visit = top-ups + max(0, charged after evacuation − recovered)
 * (DOMAIN.md §4, following the meaning of "refrigerant added" in 40 CFR 82.152).
 */
export function madeUpRefrigerantKg(visit: { toppedUpKg: number; rechargedKg: number; recoveredKg: number }): number {
  return visit.toppedUpKg + Math.max(0, visit.rechargedKg - visit.recoveredKg);
}

/** Public form of the visit rule: a unit's events grouped into visits in time order. */
export function groupVisits(events: readonly UnitEvent[]): Visit[] {
  return prepareHistory(events).visits;
}
