import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  sessionsListDto,
  type ChangePasswordInput,
  type EndMySessionsInput,
  type SessionDto,
} from '../../../../shared/schemas/account';
import { apiClient } from '../../../lib/api-client';
import { accountKeys } from './keys';

/** The signed-in person's own signed-in devices. */
export function mySessionsQuery() {
  return queryOptions({
    queryKey: accountKeys.sessions(),
    queryFn: async ({ signal }): Promise<SessionDto[]> =>
      sessionsListDto.parse(await apiClient.get('/api/account/sessions', { signal })).sessions,
  });
}
export const useMySessions = () => useQuery(mySessionsQuery());

/** Ends one of my other sessions, or all of them (no session id); asks for the password. */
export function useEndMySessions() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: EndMySessionsInput) =>
      apiClient.post<{ ended: number }>('/api/account/sessions/sign-out', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: accountKeys.sessions() }),
  });
}

export function useChangePassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ChangePasswordInput) =>
      apiClient.post<{ endedSessions: number }>('/api/account/password', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: accountKeys.sessions() }),
  });
}
