import { type UpdateUserRequest, type UserView } from '@kerfwright/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { usersKeys } from './users-keys';

export interface UpdateUserVariables {
  id: string;
  changes: UpdateUserRequest;
}

/** PATCH /api/users/:id { role?, active? } → UserView (supervisor only; not on one's own account). */
export function updateUser({ id, changes }: UpdateUserVariables): Promise<UserView> {
  return api.patch<UserView>(`/users/${encodeURIComponent(id)}`, changes);
}

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: usersKeys.lists() }),
  });
}
