import { useMutation, useQueryClient, type QueryKey } from '@tanstack/react-query';
import type { EventDto, UnitOverviewDto, UnitStatsDto } from '../../../../shared/schemas/history';
import { apiClient } from '../../../lib/api-client';
import { historyKeys } from './keys';

export async function voidEvent({ eventId, reason }: { eventId: number; reason: string }) {
  return apiClient.post<{ event: EventDto; stats: UnitStatsDto }>(`/api/events/${eventId}/void`, { reason });
}

/** Voids an entry (a correction: the entry stays, struck through, with who and why); the figures follow. */
export function useVoidEvent(unitId: number, options: { alsoInvalidate?: QueryKey[] } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    // Offline, fail at once with a message instead of waiting silently.
    networkMode: 'always',
    mutationFn: voidEvent,
    onSuccess: async ({ stats }) => {
      queryClient.setQueryData<UnitOverviewDto>(historyKeys.overview(unitId), (old) => (old ? { ...old, stats } : old));
      // Awaited: the dialog closes once the list shows the entry struck through.
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: historyKeys.unit(unitId) }),
        ...(options.alsoInvalidate ?? []).map((queryKey) => queryClient.invalidateQueries({ queryKey })),
      ]);
    },
  });
}
