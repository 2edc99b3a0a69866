import { finishRepairRows, type RepairEffectiveness, type RepairEffectivenessRow } from './fleet-analytics';
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
  return {
    rows: finishRepairRows(cells, min),
    byLocation: finishRepairRows(locations, min),
    holdDays: settings.windows.repairHoldDays,
    minRepairs: min,
  };
}
