import { keepPreviousData, useInfiniteQuery } from '@tanstack/react-query';
import type { RefrigerantLogDto, RefrigerantLogQuery } from '../../../../shared/schemas/refrigerant-log';
import { apiClient } from '../../../lib/api-client';
import { toSearch } from '../../../lib/query-string';
import { logKeys } from './keys';

/** The log, newest first, a page at a time; totals come with the first page. */
export function useRefrigerantLog(q: Omit<RefrigerantLogQuery, 'before'>) {
  return useInfiniteQuery({
    queryKey: logKeys.list(q),
    queryFn: ({ pageParam, signal }) =>
      apiClient.get<RefrigerantLogDto>(`/api/refrigerant-log?${toSearch({ ...q, before: pageParam })}`, { signal }),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextBefore ?? undefined,
    placeholderData: keepPreviousData,
  });
}

export const logExportHref = (q: Omit<RefrigerantLogQuery, 'before'>) =>
  `/api/refrigerant-log/export.csv?${toSearch(q)}`;
