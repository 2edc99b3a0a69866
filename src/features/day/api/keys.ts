import { queryRoots } from '../../../lib/query-roots';

// Under the history root: every recorded visit or void (which invalidates the history) changes what My day and a
// unit's depot state say.
export const dayKeys = {
  all: [...queryRoots.history, 'day'] as const,
  day: (siteId: number | null) => [...dayKeys.all, 'list', siteId] as const,
  unit: (unitId: number) => [...dayKeys.all, 'unit', unitId] as const,
};
