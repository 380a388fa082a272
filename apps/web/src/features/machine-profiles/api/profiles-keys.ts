/** Query keys for machine profiles: lists share a prefix, so a version change refreshes them all. */
export const profilesKeys = {
  all: ['machine-profiles'] as const,
  lists: () => [...profilesKeys.all, 'list'] as const,
  list: (params: object) => [...profilesKeys.lists(), params] as const,
  detail: (id: string) => [...profilesKeys.all, 'detail', id] as const,
  kerfRecords: (id: string) => [...profilesKeys.all, 'kerf-records', id] as const,
  materials: () => [...profilesKeys.all, 'material-choices'] as const,
};
