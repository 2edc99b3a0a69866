import { queryOptions, useMutation, useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import { useNavigate } from 'react-router-dom';
import { meDto, type SignInInput, type UserDto } from '../../shared/schemas/account';
import { paths } from '../config/paths';
import { apiClient } from './api-client';
import { forgetPersistedQueries } from './persist-queries';

export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};

async function getMe(signal?: AbortSignal): Promise<UserDto> {
  return meDto.parse(await apiClient.get('/api/auth/me', { signal })).user;
}

export function meQuery() {
  return queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 5 * 60_000,
    // A 401 is an answer, not a hiccup.
    retry: false,
  });
}

/** The signed-in user. Only inside the protected layout, whose loader has already put it in the cache. */
export function useUser(): UserDto {
  return useSuspenseQuery(meQuery()).data;
}

async function signIn(input: SignInInput): Promise<UserDto> {
  return meDto.parse(await apiClient.post('/api/auth/sign-in', input)).user;
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: async (user) => {
      // Whatever an earlier session left in the cache, or on the phone, is not this user's to see.
      await forgetPersistedQueries();
      queryClient.clear();
      queryClient.setQueryData(meQuery().queryKey, user);
    },
  });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  return useMutation({
    mutationFn: () => apiClient.post<void>('/api/auth/sign-out'),
    onSuccess: async () => {
      // The phone's copy goes first, so a reload or the next start cannot bring the session's answers back.
      await forgetPersistedQueries();
      // Leave the protected pages first; clearing the cache under them would make them fetch again and get 401s.
      await navigate(paths.signIn.getHref(), { replace: true });
      queryClient.clear();
    },
  });
}
