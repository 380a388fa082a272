import { type GetUsersParams } from './get-users';

/** Query keys for people: every list shares a prefix so one change refreshes them all. */
export const usersKeys = {
  all: ['users'] as const,
  lists: () => [...usersKeys.all, 'list'] as const,
  list: (params: GetUsersParams) => [...usersKeys.lists(), params] as const,
};
