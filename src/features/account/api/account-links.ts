import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { accountLinkResponseDto, type AccountLinkDto, meDto, type UserDto } from '../../../../shared/schemas/account';
import { apiClient } from '../../../lib/api-client';
import { meQuery } from '../../../lib/auth';
import { accountKeys, type AccountLinkPurpose } from './keys';

const base: Record<AccountLinkPurpose, string> = {
  invitation: '/api/invitations',
  password_reset: '/api/password-reset',
};
const url = (purpose: AccountLinkPurpose, token: string) => `${base[purpose]}/${encodeURIComponent(token)}`;

export async function getAccountLink(
  purpose: AccountLinkPurpose,
  token: string,
  signal?: AbortSignal,
): Promise<AccountLinkDto> {
  return accountLinkResponseDto.parse(await apiClient.get(url(purpose, token), { signal })).link;
}

export function accountLinkQuery(purpose: AccountLinkPurpose, token: string) {
  return queryOptions({
    queryKey: accountKeys.link(purpose, token),
    queryFn: ({ signal }) => getAccountLink(purpose, token, signal),
    // An expired or used link stays that way.
    retry: false,
    staleTime: Infinity,
  });
}

export function useAccountLink(purpose: AccountLinkPurpose, token: string) {
  return useQuery(accountLinkQuery(purpose, token));
}

/** Sets the password through the link; the server signs the person in. */
export function useCompleteAccountLink(purpose: AccountLinkPurpose, token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async (password: string): Promise<UserDto> =>
      meDto.parse(await apiClient.post(url(purpose, token), { password })).user,
    onSuccess: (user) => {
      queryClient.clear();
      queryClient.setQueryData(meQuery().queryKey, user);
    },
  });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: (email: string) => apiClient.post<{ ok: true }>('/api/password-reset', { email }) });
}

export function useResendInvitation() {
  return useMutation({
    mutationFn: (userId: string) =>
      apiClient.post<{ ok: true }>(`/api/users/${encodeURIComponent(userId)}/invitation`, {}),
  });
}
