import type { TraceQuery } from '../../../../shared/schemas/trace';
import { queryRoots } from '../../../lib/query-roots';

export const traceKeys = {
  all: queryRoots.trace,
  result: (q: TraceQuery) => [...traceKeys.all, q] as const,
};
