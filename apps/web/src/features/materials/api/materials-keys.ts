/** Query keys for the materials library: every list shares a prefix so one change refreshes them all. */
export const materialsKeys = {
  all: ['materials'] as const,
  lists: () => [...materialsKeys.all, 'list'] as const,
  list: (params: object) => [...materialsKeys.lists(), params] as const,
  hazards: () => [...materialsKeys.all, 'hazard-table'] as const,
};
