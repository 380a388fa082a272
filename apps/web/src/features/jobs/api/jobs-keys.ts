/** Query keys for jobs: lists share a prefix, so a transition refreshes every list at once. */
export const jobsKeys = {
  all: ['jobs'] as const,
  lists: () => [...jobsKeys.all, 'list'] as const,
  list: (params: object) => [...jobsKeys.lists(), params] as const,
  detail: (id: string) => [...jobsKeys.all, 'detail', id] as const,
  safety: (id: string) => [...jobsKeys.all, 'safety', id] as const,
  exports: (id: string) => [...jobsKeys.all, 'exports', id] as const,
  materials: () => ['jobs', 'materials'] as const,
  profiles: () => ['jobs', 'machine-profiles'] as const,
};
