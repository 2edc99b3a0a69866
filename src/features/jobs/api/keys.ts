import { queryRoots } from '../../../lib/query-roots';

export const jobKeys = {
  all: queryRoots.jobs,
  detail: (id: number) => [...jobKeys.all, id] as const,
};
