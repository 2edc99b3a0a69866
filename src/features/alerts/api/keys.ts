import { queryRoots } from '../../../lib/query-roots';

export const alertKeys = {
  all: queryRoots.alerts,
  subscriptions: () => [...alertKeys.all, 'subscriptions'] as const,
};
