import type { FleetFilters, FleetOverviewQuery, FleetQuery } from '../../../../shared/schemas/fleet';
import { queryRoots } from '../../../lib/query-roots';

export const fleetKeys = {
  all: queryRoots.fleet,
  lists: () => [...fleetKeys.all, 'list'] as const,
  list: (q: FleetQuery) => [...fleetKeys.lists(), q] as const,
  // Keyed by the filters alone: a new page or sort reuses the count.
  count: (f: FleetFilters) => [...fleetKeys.all, 'count', f] as const,
  overviews: () => [...fleetKeys.all, 'overview'] as const,
  overview: (q: FleetOverviewQuery) => [...fleetKeys.overviews(), q] as const,
};
