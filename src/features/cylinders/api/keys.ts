import type { CylinderListQuery } from '../../../../shared/schemas/cylinders';
import { queryRoots } from '../../../lib/query-roots';

export const cylinderKeys = {
  all: queryRoots.cylinders,
  list: (filters: Partial<CylinderListQuery> = {}) => [...queryRoots.cylinders, 'list', filters] as const,
  detail: (id: number) => [...queryRoots.cylinders, 'detail', id] as const,
};
