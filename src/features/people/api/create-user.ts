import { useMutation, useQueryClient } from '@tanstack/react-query';
import { meDto, type UserDto } from '../../../../shared/schemas/account';
import type { CreateUserInput } from '../../../../shared/schemas/people';
import { apiClient } from '../../../lib/api-client';
import { peopleKeys } from './keys';

export async function createUser(input: CreateUserInput): Promise<UserDto> {
  // `{ user }` — the same envelope as /api/auth/me.
  return meDto.parse(await apiClient.post('/api/users', input)).user;
}

export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.lists() }),
  });
}
