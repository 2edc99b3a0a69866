import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { SettingsDto, SettingsHistoryDto, UpdateSettingsBody } from '../../../../shared/schemas/settings';
import { apiClient } from '../../../lib/api-client';
import { settingsKeys } from './keys';

export function settingsQuery() {
  return queryOptions({
    queryKey: settingsKeys.current(),
    queryFn: ({ signal }) => apiClient.get<SettingsDto>('/api/settings', { signal }),
  });
}
export const useSettings = () => useQuery(settingsQuery());

export function useSettingsHistory() {
  return useQuery({
    queryKey: settingsKeys.history(),
    queryFn: ({ signal }) => apiClient.get<SettingsHistoryDto>('/api/settings/history', { signal }),
  });
}

export function useSaveSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateSettingsBody) =>
      apiClient.put<SettingsDto & { changedSections: string[] }>('/api/settings', body),
    onSuccess: async (saved) => {
      queryClient.setQueryData(settingsKeys.current(), saved);
      await queryClient.invalidateQueries({ queryKey: settingsKeys.history() });
    },
  });
}
