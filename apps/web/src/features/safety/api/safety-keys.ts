/** Query keys for the safety pages. */
export const safetyKeys = {
  all: ['safety'] as const,
  notices: () => [...safetyKeys.all, 'notices'] as const,
  hazards: () => [...safetyKeys.all, 'hazards'] as const,
  localRules: () => [...safetyKeys.all, 'local-rules'] as const,
};
