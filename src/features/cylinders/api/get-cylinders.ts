import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CylinderListDto, CylinderListQuery } from '../../../../shared/schemas/cylinders';
import { apiClient } from '../../../lib/api-client';
import { cylinderKeys } from './keys';

export type CylinderFilters = {
  siteId?: number;
  kind?: CylinderListQuery['kind'];
  refrigerant?: string;
  usable?: boolean;
};

function search(f: CylinderFilters): string {
  const p = new URLSearchParams();
  if (f.siteId) p.set('siteId', String(f.siteId));
  if (f.kind) p.set('kind', f.kind);
  if (f.refrigerant) p.set('refrigerant', f.refrigerant);
  if (f.usable) p.set('usable', 'true');
  const s = p.toString();
  return s ? `?${s}` : '';
}

export function cylindersQuery(filters: CylinderFilters = {}) {
  return queryOptions({
    queryKey: cylinderKeys.list(filters),
    queryFn: ({ signal }) => apiClient.get<CylinderListDto>(`/api/cylinders${search(filters)}`, { signal }),
    staleTime: 30_000,
  });
}

export function useCylinders(filters: CylinderFilters = {}, enabled = true) {
  return useQuery({ ...cylindersQuery(filters), enabled });
}
