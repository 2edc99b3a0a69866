import { queryRoots } from '../../../lib/query-roots';

export const importKeys = {
  all: queryRoots.imports,
  detail: (key: string) => [...importKeys.all, key] as const,
};
