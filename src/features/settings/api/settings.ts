import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  JobDto,
  SettingsDto,
  SettingsHistoryDto,
  UpdateSettingsBody,
} from '../../../../shared/schemas/settings-api';
import { apiClient } from '../../../lib/api-client';

export const settingsKeys = {
  all: ['settings'] as const,
  current: () => [...settingsKeys.all, 'current'] as const,
  history: () => [...settingsKeys.all, 'history'] as const,
  job: (id: number) => ['jobs', id] as const,
};

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

/** Follows a running job once a second; when it ends, everything that shows unit figures is fetched again. */
export function useJob(job: JobDto | null) {
  const queryClient = useQueryClient();
  return useQuery({
    queryKey: settingsKeys.job(job?.id ?? 0),
    queryFn: async ({ signal }) => {
      const { job: next } = await apiClient.get<{ job: JobDto }>(`/api/jobs/${job!.id}`, { signal });
      if (next.status !== 'running') {
        void queryClient.invalidateQueries({ queryKey: ['fleet'] });
        void queryClient.invalidateQueries({ queryKey: settingsKeys.current() });
      }
      return next;
    },
    enabled: job !== null && job.status === 'running',
    initialData: job ?? undefined,
    refetchInterval: (q) => (q.state.data?.status === 'running' ? 1000 : false),
  });
}
