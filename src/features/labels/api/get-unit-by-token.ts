import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UnitOverviewDto } from '../../../../shared/schemas/history';
import { unitResponseDto, type UnitDto } from '../../../../shared/schemas/units';
import { apiClient } from '../../../lib/api-client';
import { labelKeys } from './keys';

export async function getUnitByToken(token: string, signal?: AbortSignal): Promise<UnitDto> {
  return unitResponseDto.parse(await apiClient.get(`/api/units/by-token/${encodeURIComponent(token)}`, { signal }))
    .unit;
}

/** The figures and first page of history of a label's unit, asked for alongside the unit itself (same answer as
 * /api/units/:id/overview), so a scan costs one round trip instead of two. */
export async function getOverviewByToken(token: string, signal?: AbortSignal): Promise<UnitOverviewDto> {
  return apiClient.get<UnitOverviewDto>(`/api/units/by-token/${encodeURIComponent(token)}/overview`, { signal });
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
