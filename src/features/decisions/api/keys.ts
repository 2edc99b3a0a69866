import { queryRoots } from '../../../lib/query-roots';

export const decisionKeys = {
  all: queryRoots.decisions,
  unit: (id: number) => [...decisionKeys.all, 'unit', id] as const,
  candidates: (siteId?: number) => [...decisionKeys.all, 'candidates', siteId ?? null] as const,
};
