import { queryRoots } from '../../../lib/query-roots';

export const siteKeys = {
  all: queryRoots.sites,
  list: () => [...siteKeys.all, 'list'] as const,
};
