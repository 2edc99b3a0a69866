import { keepPreviousData, useInfiniteQuery } from '@tanstack/react-query';
import type { RefrigerantLogDto, RefrigerantLogQuery } from '../../../../shared/schemas/refrigerant-log';
import { apiClient } from '../../../lib/api-client';
import { logKeys } from './keys';

const search = (q: Record<string, unknown>) => {
  const sp = new URLSearchParams();
  for (const [k, v] of Object.entries(q)) if (v !== undefined && v !== null && v !== '') sp.set(k, String(v));
  return sp.toString();
};

/** The log, newest first, a page at a time; totals come with the first page. */
export function useRefrigerantLog(q: Omit<RefrigerantLogQuery, 'before'>) {
  return useInfiniteQuery({
    queryKey: logKeys.list(q),
    queryFn: ({ pageParam, signal }) =>
      apiClient.get<RefrigerantLogDto>(`/api/refrigerant-log?${search({ ...q, before: pageParam })}`, { signal }),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextBefore ?? undefined,
    placeholderData: keepPreviousData,
  });
}

export const logExportHref = (q: Omit<RefrigerantLogQuery, 'before'>) => `/api/refrigerant-log/export.csv?${search(q)}`;
