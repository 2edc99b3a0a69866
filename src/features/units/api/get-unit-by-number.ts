import { queryOptions } from '@tanstack/react-query';
import { unitResponseDto, type UnitDto } from '../../../../shared/schemas/units';
import { apiClient } from '../../../lib/api-client';
import { unitKeys } from './keys';

/** `containerNumber` as typed; the server normalises it and answers 400 naming the check digit when it is wrong. */
export async function getUnitByNumber(containerNumber: string, signal?: AbortSignal): Promise<UnitDto> {
  return unitResponseDto.parse(
    await apiClient.get(`/api/units/by-number/${encodeURIComponent(containerNumber)}`, { signal }),
  ).unit;
}

export function unitByNumberQuery(containerNumber: string) {
  return queryOptions({
    queryKey: unitKeys.byNumber(containerNumber),
    queryFn: ({ signal }) => getUnitByNumber(containerNumber, signal),
    retry: false,
  });
}
