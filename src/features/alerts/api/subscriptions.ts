import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  subscriptionsDto,
  type PutSubscriptionsInput,
  type SubscriptionsDto,
  type UnsubscribeInput,
} from '../../../../shared/schemas/alerts';
import { apiClient } from '../../../lib/api-client';
import { alertKeys } from './keys';

export async function getSubscriptions(signal?: AbortSignal): Promise<SubscriptionsDto> {
  return subscriptionsDto.parse(await apiClient.get('/api/alerts/subscriptions', { signal }));
}

export function subscriptionsQuery() {
  return queryOptions({ queryKey: alertKeys.subscriptions(), queryFn: ({ signal }) => getSubscriptions(signal) });
}

export function useSubscriptions() {
  return useQuery(subscriptionsQuery());
}

export function useSaveSubscriptions() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (input: PutSubscriptionsInput) =>
      subscriptionsDto.parse(await apiClient.put('/api/alerts/subscriptions', input)),
    onSuccess: (saved) => queryClient.setQueryData(alertKeys.subscriptions(), saved),
  });
}

export function useUnsubscribe() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UnsubscribeInput) =>
      apiClient.post<{ kind: string; removed: number }>('/api/alerts/unsubscribe', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: alertKeys.subscriptions() }),
  });
}
