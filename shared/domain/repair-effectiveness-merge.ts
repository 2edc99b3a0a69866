import { roundTo } from './numbers';
import type { RepairEffectiveness, RepairEffectivenessRow } from './fleet-analytics';
import type { Settings } from '../schemas/settings';
import { DEFAULT_SETTINGS } from '../schemas/settings';

/**
 * Adds up repair effectiveness computed over separate groups of units (DOMAIN.md §10, our definition): each unit's
 * repairs are judged on its own history, so the counts of disjoint groups simply add, and the hold rate is
 * held / repairs × 100 again, hidden below the minimum number of repairs. Lets a job read the fleet in chunks.
 */
export function mergeRepairEffectiveness(
  parts: readonly RepairEffectiveness[],
  settings: Settings = DEFAULT_SETTINGS,
): RepairEffectiveness {
  const min = settings.economics.minRepairsForRate;
  const add = (map: Map<string, RepairEffectivenessRow>, r: RepairEffectivenessRow) => {
    const key = `${r.location ?? ''}|${r.action ?? ''}`;
    const row = map.get(key) ?? {
      location: r.location,
      action: r.action,
      repairs: 0,
      held: 0,
      recurred: 0,
      pending: 0,
      holdRatePct: null,
    };
    row.repairs += r.repairs;
    row.held += r.held;
    row.recurred += r.recurred;
    row.pending += r.pending;
    map.set(key, row);
  };
  const cells = new Map<string, RepairEffectivenessRow>();
  const locations = new Map<string, RepairEffectivenessRow>();
  for (const p of parts) {
    for (const r of p.rows) add(cells, r);
    for (const r of p.byLocation) add(locations, r);
  }
  const finish = (map: Map<string, RepairEffectivenessRow>) =>
    [...map.values()]
      .map((row) => ({ ...row, holdRatePct: row.repairs >= min ? roundTo((row.held / row.repairs) * 100, 1) : null }))
      .sort(
        (a, b) =>
          b.repairs - a.repairs ||
          String(a.location).localeCompare(String(b.location)) ||
          String(a.action).localeCompare(String(b.action)),
      );
  return {
    rows: finish(cells),
    byLocation: finish(locations),
    holdDays: settings.windows.repairHoldDays,
    minRepairs: min,
  };
}
