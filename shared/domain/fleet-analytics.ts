import { dayOf, isoMonth, parseAsOf } from './dates';
import { prepareHistory, type UnitEvent } from './events';
import { roundTo } from './numbers';
import { getRefrigerant, type GwpBasis, type RefrigerantCode } from './refrigerants';
import type { LeakLocationId, RepairActionId } from './service-terms';
import type { Settings } from '../schemas/settings';
import { DEFAULT_SETTINGS } from '../schemas/settings';

export interface UnitHistory {
  unitId?: string | number;
  refrigerant: string;
  /** Fallback site when an event carries none. */
  site?: string | number | null;
  events: readonly UnitEvent[];
}

export interface RepairEffectivenessRow {
  location: LeakLocationId | null;
  action: RepairActionId | null;
  /** Repairs whose hold window has passed (or that already leaked again). */
  repairs: number;
  held: number;
  recurred: number;
  /** Repairs too recent to judge. */
  pending: number;
  /** held / repairs × 100; null with fewer repairs than the minimum (DOMAIN.md §10). */
  holdRatePct: number | null;
}

export interface RepairEffectiveness {
  /** By location × action. */
  rows: RepairEffectivenessRow[];
  /** By location, all actions together (what the repair-or-retire comparison uses). */
  byLocation: RepairEffectivenessRow[];
  holdDays: number;
  minRepairs: number;
}

/**
 * Repair effectiveness (DOMAIN.md §10, our definition): a repair held when no later visit within `repairHoldDays`
 * had made-up refrigerant or a found leak. Linear in the events of each unit (a backward scan finds the next
 * recurrence of every visit).
 */
export function repairEffectiveness(
  histories: readonly UnitHistory[],
  asOf: string,
  settings: Settings = DEFAULT_SETTINGS,
): RepairEffectiveness {
  const asOfMs = parseAsOf(asOf);
  const asOfDay = dayOf(asOfMs);
  const hold = settings.windows.repairHoldDays;
  const min = settings.economics.minRepairsForRate;
  const cells = new Map<string, RepairEffectivenessRow>();
  const locations = new Map<string, RepairEffectivenessRow>();
  const cell = (
    map: Map<string, RepairEffectivenessRow>,
    location: LeakLocationId | null,
    action: RepairActionId | null,
  ) => {
    const key = `${location ?? ''}|${action ?? ''}`;
    let row = map.get(key);
    if (!row) {
      row = { location, action, repairs: 0, held: 0, recurred: 0, pending: 0, holdRatePct: null };
      map.set(key, row);
    }
    return row;
  };

  for (const h of histories) {
    const history = prepareHistory(h.events, asOfMs);
    const { visits } = history;
    const nextRecurrence = new Float64Array(visits.length);
    let next = Number.POSITIVE_INFINITY;
    for (let i = visits.length - 1; i >= 0; i--) {
      nextRecurrence[i] = next;
      if (visits[i].madeUpKg > 0 || visits[i].leakFound) next = visits[i].day;
    }
    for (let k = 0; k < history.count; k++) {
      const e = history.source[history.order[k]];
      if (e.kind !== 'repair') continue;
      const vi = history.visitOf[k];
      const v = visits[vi];
      const recurred = nextRecurrence[vi] - v.day <= hold;
      const judged = recurred || asOfDay - v.day >= hold;
      for (const row of [
        cell(cells, e.location ?? null, e.action ?? null),
        cell(locations, e.location ?? null, null),
      ]) {
        if (!judged) row.pending++;
        else {
          row.repairs++;
          if (recurred) row.recurred++;
          else row.held++;
        }
      }
    }
  }
  return {
    rows: finishRepairRows(cells, min),
    byLocation: finishRepairRows(locations, min),
    holdDays: hold,
    minRepairs: min,
  };
}

/** The rows in the order they are shown (most repairs first), each with its hold rate, hidden below `minRepairs`. */
export function finishRepairRows(
  map: Map<string, RepairEffectivenessRow>,
  minRepairs: number,
): RepairEffectivenessRow[] {
  return [...map.values()]
    .map((row) => ({
      ...row,
      holdRatePct: row.repairs >= minRepairs ? roundTo((row.held / row.repairs) * 100, 1) : null,
    }))
    .sort(
      (a, b) =>
        b.repairs - a.repairs ||
        String(a.location).localeCompare(String(b.location)) ||
        String(a.action).localeCompare(String(b.action)),
    );
}

/** The fleet's repair record at one location, in the shape compareRepairOptions takes. */
export function fleetRepairsAt(
  result: RepairEffectiveness,
  location: LeakLocationId | null,
): { repairs: number; recurred: number } {
  const row = result.byLocation.find((r) => r.location === location);
  return { repairs: row?.repairs ?? 0, recurred: row?.recurred ?? 0 };
}

export interface EmissionsRow {
  /** YYYY-MM (UTC) */
  month: string;
  site: string | number | null;
  refrigerant: RefrigerantCode;
  madeUpKg: number;
  co2eTonnes: number;
}

/**
 * Emissions estimate (DOMAIN.md §10): made-up kg × GWP per month, site and refrigerant, AR4 unless told otherwise.
 * A visit counts at its first event's day and site.
 */
export function emissionsByMonth(
  histories: readonly UnitHistory[],
  opts: { basis?: GwpBasis; from?: string; to?: string } = {},
): EmissionsRow[] {
  const basis = opts.basis ?? 'AR4';
  const fromDay = opts.from ? dayOf(parseAsOf(opts.from)) : Number.NEGATIVE_INFINITY;
  const toMs = opts.to ? parseAsOf(opts.to) : Number.POSITIVE_INFINITY;
  const rows = new Map<
    string,
    { month: string; site: string | number | null; refrigerant: RefrigerantCode; kg: number; gwp: number }
  >();
  for (const h of histories) {
    const r = getRefrigerant(h.refrigerant);
    const g = basis === 'AR4' ? r.gwpAR4 : r.gwpAR5;
    for (const v of prepareHistory(h.events, toMs).visits) {
      if (v.madeUpKg <= 0 || v.day < fromDay) continue;
      const site = v.site ?? h.site ?? null;
      const month = isoMonth(v.day);
      const key = `${month}|${String(site)}|${r.code}`;
      const row = rows.get(key);
      if (row) row.kg += v.madeUpKg;
      else rows.set(key, { month, site, refrigerant: r.code, kg: v.madeUpKg, gwp: g });
    }
  }
  return [...rows.values()]
    .map((x) => ({
      month: x.month,
      site: x.site,
      refrigerant: x.refrigerant,
      madeUpKg: roundTo(x.kg, 3),
      co2eTonnes: roundTo((x.kg * x.gwp) / 1000, 4),
    }))
    .sort(
      (a, b) =>
        a.month.localeCompare(b.month) ||
        String(a.site).localeCompare(String(b.site)) ||
        a.refrigerant.localeCompare(b.refrigerant),
    );
}
