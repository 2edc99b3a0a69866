import { useMutation, useQueryClient } from '@tanstack/react-query';
import { unitResponseDto, type UnitDto, type UpdateUnitInput } from '../../../../shared/schemas/units';
import { apiClient } from '../../../lib/api-client';
import { queryRoots } from '../../../lib/query-roots';
import { unitKeys } from './keys';

export async function updateUnit({ id, changes }: { id: number; changes: UpdateUnitInput }): Promise<UnitDto> {
  return unitResponseDto.parse(await apiClient.patch(`/api/units/${id}`, changes)).unit;
}

export function useUpdateUnit() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUnit,
    onSuccess: async (unit) => {
      queryClient.setQueryData(unitKeys.detail(unit.id), unit);
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: unitKeys.changes(unit.id) }),
        queryClient.invalidateQueries({ queryKey: unitKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: queryRoots.sites }),
      ]);
    },
  });
}
