import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { sessionsListDto, type SessionDto } from '../../../../shared/schemas/account';
import { apiClient } from '../../../lib/api-client';
import { peopleKeys } from './keys';

const url = (userId: string) => `/api/users/${encodeURIComponent(userId)}/sessions`;

/** A person's signed-in devices, for an administrator. */
export function userSessionsQuery(userId: string) {
  return queryOptions({
    queryKey: peopleKeys.sessions(userId),
    queryFn: async ({ signal }): Promise<SessionDto[]> =>
      sessionsListDto.parse(await apiClient.get(url(userId), { signal })).sessions,
  });
}
export const useUserSessions = (userId: string, enabled = true) => useQuery({ ...userSessionsQuery(userId), enabled });

/** An administrator ends one session of a person, or all of them. */
export function useEndUserSessions(userId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (sessionId?: string) =>
      apiClient.delete<void>(sessionId ? `${url(userId)}/${encodeURIComponent(sessionId)}` : url(userId)),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.sessions(userId) }),
  });
}
