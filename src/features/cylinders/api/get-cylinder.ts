import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CylinderDetailDto, CylinderDto } from '../../../../shared/schemas/cylinders';
import { apiClient } from '../../../lib/api-client';
import { cylinderKeys } from './keys';

export function cylinderQuery(id: number) {
  return queryOptions({
    queryKey: cylinderKeys.detail(id),
    queryFn: ({ signal }) => apiClient.get<CylinderDetailDto>(`/api/cylinders/${id}`, { signal }),
  });
}

export function useCylinder(id: number) {
  return useQuery(cylinderQuery(id));
}

/** The cylinder whose label carries this number (typed, or read from its QR code). */
export async function findCylinderByCode(code: string): Promise<CylinderDto> {
  const res = await apiClient.get<{ cylinder: CylinderDto }>(`/api/cylinders/by-code/${encodeURIComponent(code)}`);
  return res.cylinder;
}

/** The number in a cylinder label's address (`…/c/<number>`), or the text itself when it is a number. */
export function cylinderCodeFrom(scanned: string): string {
  const m = /\/c\/([^/?#]+)/.exec(scanned);
  return decodeURIComponent(m ? m[1] : scanned)
    .trim()
    .toUpperCase();
}
