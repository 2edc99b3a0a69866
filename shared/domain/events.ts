import { dayOf, isoDate, parseIso } from './dates';
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

/** An event after checking, with its time, UTC day and visit. */
export interface ParsedEvent {
  readonly event: UnitEvent;
  readonly ms: number;
  readonly day: number;
  /** Position in the caller's array (ties keep input order). */
  readonly index: number;
  visit: number;
}

/** What one visit did, in kg; made-up follows DOMAIN.md §4. */
export interface Visit {
  /** Index in time order. */
  readonly index: number;
  readonly visitId: string | null;
  /** The `at` of the visit's first event, as given. */
  readonly at: string;
  readonly ms: number;
  readonly day: number;
  readonly date: string;
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
  leakLocations: LeakLocationId[];
  repaired: boolean;
  verifiedRepair: boolean;
}

export interface PreparedHistory {
  /** Events up to the "as of" moment, in time order. */
  readonly events: ParsedEvent[];
  readonly visits: Visit[];
  /** Events dated after the "as of" moment, left out. */
  readonly afterAsOf: number;
  /** Events of other kinds (notes, status changes …), left out. */
  readonly ignored: number;
}

/** Masses are counted in whole grams: scales read no finer, and integer sums make recharge − recovered exact. */
function grams(kg: number): number {
  return Math.round(kg * 1000);
}

const MOVEMENT: Record<string, true> = { top_up: true, recovery: true, recharge: true };
const VACUUM_KPAG = -STANDARD_ATMOSPHERE_KPA;

function optionalNumber(value: unknown): value is number | null | undefined {
  return value === undefined || value === null || isFiniteNumber(value);
}

/** Checks one event; throws a DomainError that names the entry and the field. */
function checkEvent(e: UnitEvent, i: number): void {
  const where = `events[${i}]`;
  const label = `Entry ${i + 1} (${String(e.kind).replace('_', ' ')})`;
  if (e.visitId !== undefined && e.visitId !== null && typeof e.visitId !== 'string') {
    throw new DomainError(`${label}: the visit id must be text.`, `${where}.visitId`);
  }
  switch (e.kind) {
    case 'top_up':
    case 'recovery':
    case 'recharge':
      if (!isFiniteNumber(e.kg) || e.kg < 0) {
        throw new DomainError(`${label}: the amount must be 0 kg or more, not ${String(e.kg)}.`, `${where}.kg`);
      }
      return;
    case 'leak_check':
      if (typeof e.leakFound !== 'boolean') throw new DomainError(`${label}: say whether a leak was found.`, `${where}.leakFound`);
      if (e.location != null && !isLeakLocation(e.location)) {
        throw new DomainError(`${label}: "${String(e.location)}" is not a known leak location.`, `${where}.location`);
      }
      return;
    case 'repair':
      if (e.location != null && !isLeakLocation(e.location)) {
        throw new DomainError(`${label}: "${String(e.location)}" is not a known leak location.`, `${where}.location`);
      }
      if (e.action != null && !isRepairAction(e.action)) {
        throw new DomainError(`${label}: "${String(e.action)}" is not a known repair action.`, `${where}.action`);
      }
      return;
    case 'pressure':
      if (!optionalNumber(e.suctionKPaG) || !optionalNumber(e.dischargeKPaG) || !optionalNumber(e.ambientC)) {
        throw new DomainError(`${label}: pressures and temperatures must be numbers.`, where);
      }
      for (const side of ['suctionKPaG', 'dischargeKPaG'] as const) {
        const v = e[side];
        if (v != null && v < VACUUM_KPAG - 1e-9) {
          throw new DomainError(
            `${label}: a ${side === 'suctionKPaG' ? 'suction' : 'discharge'} reading of ${v} kPa(g) is below a perfect vacuum (−101.3 kPa(g)).`,
            `${where}.${side}`,
          );
        }
      }
      if (e.ambientC != null && e.ambientC < ABSOLUTE_ZERO_C) {
        throw new DomainError(`${label}: the ambient temperature is below absolute zero.`, `${where}.ambientC`);
      }
      if (e.sightGlass != null && !isSightGlassState(e.sightGlass)) {
        throw new DomainError(`${label}: "${String(e.sightGlass)}" is not a sight-glass state.`, `${where}.sightGlass`);
      }
      return;
    case 'pti':
      if (typeof e.passed !== 'boolean') throw new DomainError(`${label}: say whether the PTI passed.`, `${where}.passed`);
      return;
  }
}

const KNOWN_KINDS: Record<string, true> = { ...MOVEMENT, leak_check: true, repair: true, pressure: true, pti: true };

/**
 * Checks and orders a unit's events (a sorted copy; the caller's order is not trusted) and groups them into
 * visits: same visit id, or failing that the same UTC calendar day. O(n) when already in order, else O(n log n).
 */
export function prepareHistory(events: readonly UnitEvent[], asOfMs: number = Number.POSITIVE_INFINITY): PreparedHistory {
  if (!Array.isArray(events)) throw new DomainError('The service history must be a list of events.', 'events');
  const parsed: ParsedEvent[] = [];
  let afterAsOf = 0;
  let ignored = 0;
  let sorted = true;
  let prevMs = Number.NEGATIVE_INFINITY;
  for (let i = 0; i < events.length; i++) {
    const e = events[i];
    if (e === null || typeof e !== 'object' || !KNOWN_KINDS[(e as { kind?: unknown }).kind as string]) {
      ignored++;
      continue;
    }
    const ms = parseIso(e.at, `events[${i}].at`, `Entry ${i + 1} date`);
    checkEvent(e, i);
    if (ms > asOfMs) {
      afterAsOf++;
      continue;
    }
    if (ms < prevMs) sorted = false;
    prevMs = ms;
    parsed.push({ event: e, ms, day: dayOf(ms), index: i, visit: -1 });
  }
  if (!sorted) parsed.sort((a, b) => a.ms - b.ms || a.index - b.index);

  const visits: Visit[] = [];
  const byId = new Map<string, number>();
  const byDay = new Map<number, number>();
  for (const p of parsed) {
    const e = p.event;
    const id = typeof e.visitId === 'string' && e.visitId !== '' ? e.visitId : null;
    let vi = id !== null ? byId.get(id) : byDay.get(p.day);
    if (vi === undefined) {
      vi = visits.length;
      visits.push({
        index: vi,
        visitId: id,
        at: e.at,
        ms: p.ms,
        day: p.day,
        date: isoDate(p.day),
        site: null,
        toppedUpKg: 0,
        rechargedKg: 0,
        recoveredKg: 0,
        excludedKg: 0,
        madeUpKg: 0,
        added: false,
        leakFound: false,
        leakLocations: [],
        repaired: false,
        verifiedRepair: false,
      });
      if (id !== null) byId.set(id, vi);
      else byDay.set(p.day, vi);
    }
    p.visit = vi;
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
          if (e.location != null && !v.leakLocations.includes(e.location)) v.leakLocations.push(e.location);
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
  return { events: parsed, visits, afterAsOf, ignored };
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
