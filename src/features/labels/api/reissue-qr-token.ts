import { useMutation, useQueryClient } from '@tanstack/react-query';
import { unitResponseDto, type UnitDto } from '../../../../shared/schemas/units';
import { apiClient } from '../../../lib/api-client';
import { queryRoots } from '../../../lib/query-roots';
import { labelKeys } from './keys';

export async function reissueQrToken(id: number): Promise<UnitDto> {
  return unitResponseDto.parse(await apiClient.post(`/api/units/${id}/qr-token`)).unit;
}

export function useReissueQrToken() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: reissueQrToken,
    onSuccess: async () => {
      // The old label's code no longer opens anything; the unit (its token, its list of changes) is fetched again.
      queryClient.removeQueries({ queryKey: labelKeys.tokens() });
      await queryClient.invalidateQueries({ queryKey: queryRoots.units });
    },
  });
}
