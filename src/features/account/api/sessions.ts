import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  sessionsListDto,
  type ChangePasswordInput,
  type EndMySessionsInput,
  type SessionDto,
} from '../../../../shared/schemas/account';
import { apiClient } from '../../../lib/api-client';
import { userKeys } from '../../people/api/keys';

const url = (userId: string | 'me') =>
  userId === 'me' ? '/api/account/sessions' : `/api/users/${encodeURIComponent(userId)}/sessions`;

/** Signed-in devices of the person (`'me'`) or, for an administrator, of anyone. */
export function sessionsQuery(userId: string | 'me') {
  return queryOptions({
    queryKey: userKeys.sessions(userId),
    queryFn: async ({ signal }): Promise<SessionDto[]> =>
      sessionsListDto.parse(await apiClient.get(url(userId), { signal })).sessions,
  });
}
export const useSessions = (userId: string | 'me', enabled = true) => useQuery({ ...sessionsQuery(userId), enabled });

/** Ends one of my other sessions, or all of them (no session id); asks for the password. */
export function useEndMySessions() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: EndMySessionsInput) =>
      apiClient.post<{ ended: number }>('/api/account/sessions/sign-out', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.sessions('me') }),
  });
}

/** An administrator ends one session of a person, or all of them. */
export function useEndUserSessions(userId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (sessionId?: string) =>
      apiClient.delete<void>(sessionId ? `${url(userId)}/${encodeURIComponent(sessionId)}` : url(userId)),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.sessions(userId) }),
  });
}

export function useChangePassword() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ChangePasswordInput) =>
      apiClient.post<{ endedSessions: number }>('/api/account/password', input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.sessions('me') }),
  });
}
