import { useMutation, useQueryClient } from '@tanstack/react-query';
import { unitResponseDto, type UnitDto } from '../../../../shared/schemas/units';
import { apiClient } from '../../../lib/api-client';
import { unitKeys } from '../../units/api/keys';

export async function reissueQrToken(id: number): Promise<UnitDto> {
  return unitResponseDto.parse(await apiClient.post(`/api/units/${id}/qr-token`)).unit;
}

export function useReissueQrToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: reissueQrToken,
    onSuccess: async (unit) => {
      queryClient.setQueryData(unitKeys.detail(unit.id), unit);
      // The old label's code no longer opens anything.
      queryClient.removeQueries({ queryKey: [...unitKeys.all, 'by-token'] });
      await queryClient.invalidateQueries({ queryKey: unitKeys.changes(unit.id) });
    },
  });
}
