import type { FleetFilters, FleetOverviewQuery, FleetQuery, TraceQuery } from '../../../../shared/schemas/fleet';

export const fleetKeys = {
  all: ['fleet'] as const,
  lists: () => [...fleetKeys.all, 'list'] as const,
  list: (q: FleetQuery) => [...fleetKeys.lists(), q] as const,
  // Keyed by the filters alone: a new page or sort reuses the count.
  count: (f: FleetFilters) => [...fleetKeys.all, 'count', f] as const,
  overview: (q: FleetOverviewQuery) => [...fleetKeys.all, 'overview', q] as const,
  traces: () => [...fleetKeys.all, 'trace'] as const,
  trace: (q: TraceQuery) => [...fleetKeys.traces(), q] as const,
  sites: () => [...fleetKeys.all, 'sites'] as const,
};
