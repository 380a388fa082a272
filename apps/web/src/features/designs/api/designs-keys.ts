/** Query keys for designs: every list shares a prefix so one change refreshes them all. */
export const designsKeys = {
  all: ['designs'] as const,
  lists: () => [...designsKeys.all, 'list'] as const,
  list: (params: object) => [...designsKeys.lists(), params] as const,
  detail: (id: string) => [...designsKeys.all, 'detail', id] as const,
};
