import type { UnitListFilters } from '../../../../shared/schemas/units';
import { queryRoots } from '../../../lib/query-roots';

export const unitKeys = {
  all: queryRoots.units,
  lists: () => [...unitKeys.all, 'list'] as const,
  list: (filters: UnitListFilters) => [...unitKeys.lists(), filters] as const,
  details: () => [...unitKeys.all, 'detail'] as const,
  detail: (id: number) => [...unitKeys.details(), id] as const,
  byNumbers: () => [...unitKeys.all, 'by-number'] as const,
  byNumber: (containerNumber: string) => [...unitKeys.byNumbers(), containerNumber] as const,
  changes: (id: number) => [...unitKeys.detail(id), 'changes'] as const,
};
