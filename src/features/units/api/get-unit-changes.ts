import { queryOptions, useQuery } from '@tanstack/react-query';
import { unitChangesDto, type UnitChangeDto } from '../../../../shared/schemas/units';
import { apiClient } from '../../../lib/api-client';
import { unitKeys } from './keys';

export async function getUnitChanges(id: number, signal?: AbortSignal): Promise<UnitChangeDto[]> {
  return unitChangesDto.parse(await apiClient.get(`/api/units/${id}/changes`, { signal })).changes;
}

export function unitChangesQuery(id: number) {
  return queryOptions({
    queryKey: unitKeys.changes(id),
    queryFn: ({ signal }) => getUnitChanges(id, signal),
  });
}

export function useUnitChanges(id: number, enabled = true) {
  return useQuery({ ...unitChangesQuery(id), enabled });
}
