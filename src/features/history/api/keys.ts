import { queryRoots } from '../../../lib/query-roots';

/** Query keys of a unit's service history. Everything of one unit sits under `unit(id)`, so one call refreshes it all. */
export const historyKeys = {
  all: queryRoots.history,
  unit: (unitId: number) => [...historyKeys.all, 'unit', unitId] as const,
  overview: (unitId: number) => [...historyKeys.unit(unitId), 'overview'] as const,
  events: (unitId: number) => [...historyKeys.unit(unitId), 'events'] as const,
  timeline: (unitId: number) => [...historyKeys.unit(unitId), 'timeline'] as const,
};
