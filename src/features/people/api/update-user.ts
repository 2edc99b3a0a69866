import { useMutation, useQueryClient } from '@tanstack/react-query';
import { meDto, type UserDto } from '../../../../shared/schemas/account';
import type { UpdateUserInput } from '../../../../shared/schemas/people';
import { apiClient } from '../../../lib/api-client';
import { authKeys } from '../../../lib/auth';
import { peopleKeys } from './keys';

export async function updateUser({ id, changes }: { id: string; changes: UpdateUserInput }): Promise<UserDto> {
  return meDto.parse(await apiClient.patch(`/api/users/${encodeURIComponent(id)}`, changes)).user;
}

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: async (user) => {
      // Show the change at once, then confirm against the server.
      queryClient.setQueryData<UserDto[]>(peopleKeys.list(), (users) =>
        users?.map((u) => (u.id === user.id ? user : u)),
      );
      const me = queryClient.getQueryData<UserDto>(authKeys.me());
      if (me?.id === user.id) queryClient.setQueryData(authKeys.me(), user);
      await queryClient.invalidateQueries({ queryKey: peopleKeys.lists() });
    },
  });
}
