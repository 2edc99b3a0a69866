import type { RefrigerantLogQuery } from '../../../../shared/schemas/refrigerant-log';
import { queryRoots } from '../../../lib/query-roots';

export const logKeys = {
  all: queryRoots.refrigerantLog,
  list: (q: Omit<RefrigerantLogQuery, 'before'>) => [...logKeys.all, q] as const,
};
