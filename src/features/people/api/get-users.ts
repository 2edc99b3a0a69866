import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UserDto } from '../../../../shared/schemas/account';
import { usersListDto } from '../../../../shared/schemas/people';
import { apiClient } from '../../../lib/api-client';
import { peopleKeys } from './keys';

export async function getUsers(signal?: AbortSignal): Promise<UserDto[]> {
  return usersListDto.parse(await apiClient.get('/api/users', { signal })).users;
}

export function usersQuery() {
  return queryOptions({
    queryKey: peopleKeys.list(),
    queryFn: ({ signal }) => getUsers(signal),
  });
}

export function useUsers() {
  return useQuery(usersQuery());
}
