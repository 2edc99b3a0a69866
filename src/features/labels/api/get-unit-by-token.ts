import { queryOptions, useQuery } from '@tanstack/react-query';
import { unitResponseDto, type UnitDto } from '../../../../shared/schemas/units';
import { apiClient } from '../../../lib/api-client';
import { labelKeys } from './keys';

export async function getUnitByToken(token: string, signal?: AbortSignal): Promise<UnitDto> {
  return unitResponseDto.parse(await apiClient.get(`/api/units/by-token/${encodeURIComponent(token)}`, { signal }))
    .unit;
}

export function unitByTokenQuery(token: string) {
  return queryOptions({
    queryKey: labelKeys.byToken(token),
    queryFn: ({ signal }) => getUnitByToken(token, signal),
    // A label read twice in a row opens the same unit without a second round trip; a re-issued label is rare.
    staleTime: 60_000,
  });
}

export function useUnitByToken(token: string) {
  return useQuery(unitByTokenQuery(token));
}
