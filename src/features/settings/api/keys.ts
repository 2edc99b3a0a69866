import { queryRoots } from '../../../lib/query-roots';

export const settingsKeys = {
  all: queryRoots.settings,
  current: () => [...settingsKeys.all, 'current'] as const,
  history: () => [...settingsKeys.all, 'history'] as const,
};
