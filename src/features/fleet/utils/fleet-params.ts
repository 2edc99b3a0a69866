import {
  fleetFiltersSchema,
  fleetQuerySchema,
  type FleetFilters,
  type FleetQuery,
} from '../../../../shared/schemas/fleet';
import { toSearch } from '../../../lib/query-string';

export const FLEET_DEFAULTS = { sort: 'score', dir: 'desc', page: 1, pageSize: 25 } as const;

/** The fleet view in the address bar, read with the server's own schema; a hand-edited bad value falls back. */
export function readFleetParams(sp: URLSearchParams): FleetQuery {
  const raw = Object.fromEntries(sp.entries());
  const parsed = fleetQuerySchema.safeParse(raw);
  if (parsed.success) return { ...parsed.data, count: undefined };
  // Drop only the fields that failed.
  const bad = new Set(parsed.error.issues.map((i) => String(i.path[0])));
  const kept = Object.fromEntries(Object.entries(raw).filter(([k]) => !bad.has(k)));
  return { ...fleetQuerySchema.parse(kept), count: undefined };
}

export function filtersOf(q: FleetQuery): FleetFilters {
  const { sort: _s, dir: _d, page: _p, pageSize: _ps, count: _c, ...filters } = q;
  return fleetFiltersSchema.parse(
    Object.fromEntries(
      Object.entries(filters)
        .filter(([, v]) => v !== undefined && v !== false)
        .map(([k, v]) => [k, v === true ? '1' : String(v)]),
    ),
  );
}

export const fleetSearch = (q: Partial<FleetQuery>) => toSearch(q as Record<string, unknown>, FLEET_DEFAULTS);
export const filtersSearch = (f: FleetFilters) => toSearch(f as Record<string, unknown>);

export function activeFilterCount(f: FleetFilters): number {
  return Object.values(f).filter((v) => v !== undefined && v !== false && v !== '').length;
}
