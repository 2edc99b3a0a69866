import { queryOptions, useQuery } from '@tanstack/react-query';
import { unitResponseDto, type UnitDto } from '../../../../shared/schemas/units';
import { apiClient } from '../../../lib/api-client';
import { unitKeys } from './keys';

export async function getUnit(id: number, signal?: AbortSignal): Promise<UnitDto> {
  return unitResponseDto.parse(await apiClient.get(`/api/units/${id}`, { signal })).unit;
}

export function unitQuery(id: number) {
  return queryOptions({
    queryKey: unitKeys.detail(id),
    queryFn: ({ signal }) => getUnit(id, signal),
  });
}

export function useUnit(id: number) {
  return useQuery(unitQuery(id));
}
