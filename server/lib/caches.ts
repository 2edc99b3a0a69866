// What an app keeps in memory between requests, owned by its context (createApp builds them, or takes them from its
// deps). Each has a small interface with invalidate(), so a cluster can later clear them through the database.
import { LRUCache } from 'lru-cache';
import { createFleetSizeCache, type FleetSizeCache } from './fleet-size';
import { createCaseBaseCache, type CaseBaseCache } from './record/case-base';
import { createMonthlyTotalsVersion, type MonthlyTotalsVersion } from './record/monthly-totals';
import { createSettingsCache, type SettingsCache } from './settings';

export type FilterShareCache = {
  get(key: string): number | undefined;
  set(key: string, share: number): void;
  invalidate(): void;
};

/**
 * Share of the fleet a site / refrigerant / status / number-start filter keeps, kept for a few minutes (fleets change
 * slowly); bounded, since every number typed is a key.
 */
export function createFilterShareCache(ttlMs = 5 * 60_000): FilterShareCache {
  const lru = new LRUCache<string, number>({ max: 2000, ttl: ttlMs });
  return {
    get: (key) => lru.get(key),
    set: (key, share) => void lru.set(key, share),
    invalidate: () => lru.clear(),
  };
}

export type AppCaches = {
  /** The settings in force (a few seconds). */
  settings: SettingsCache;
  /** The forecast's case base (until a newer one is built). */
  caseBase: CaseBaseCache;
  /** The version of the monthly made-up totals the overview's cache is keyed by. */
  monthlyTotals: MonthlyTotalsVersion;
  /** The whole fleet's size (until units are added, a minute at most). */
  fleetSize: FleetSizeCache;
  /** Shares of the fleet the fleet table's filters keep (a few minutes). */
  filterShares: FilterShareCache;
};

export function createCaches(given: Partial<AppCaches> = {}): AppCaches {
  return {
    settings: given.settings ?? createSettingsCache(),
    caseBase: given.caseBase ?? createCaseBaseCache(),
    monthlyTotals: given.monthlyTotals ?? createMonthlyTotalsVersion(),
    fleetSize: given.fleetSize ?? createFleetSizeCache(),
    filterShares: given.filterShares ?? createFilterShareCache(),
  };
}
