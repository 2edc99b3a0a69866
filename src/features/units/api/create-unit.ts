import { useMutation, useQueryClient } from '@tanstack/react-query';
import { unitResponseDto, type CreateUnitInput, type UnitDto } from '../../../../shared/schemas/units';
import { apiClient } from '../../../lib/api-client';
import { queryRoots } from '../../../lib/query-roots';
import { unitKeys } from './keys';

export async function createUnit(input: CreateUnitInput): Promise<UnitDto> {
  return unitResponseDto.parse(await apiClient.post('/api/units', input)).unit;
}

export function useCreateUnit() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUnit,
    onSuccess: async (unit) => {
      queryClient.setQueryData(unitKeys.detail(unit.id), unit);
      // A scan or search that found nothing may now find this unit; sites show unit counts.
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: unitKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: unitKeys.byNumbers() }),
        queryClient.invalidateQueries({ queryKey: queryRoots.sites }),
      ]);
    },
  });
}
