/** Query keys for the approvals desk. Decisions also refresh the machine-profile and job caches. */
export const approvalsKeys = {
  all: ['approvals'] as const,
  versions: () => [...approvalsKeys.all, 'profile-versions'] as const,
  jobs: () => [...approvalsKeys.all, 'jobs'] as const,
};

/** Prefixes of other features' caches that show the same records (invalidated by prefix, not imported). */
export const RELATED_KEYS = [['machine-profiles'], ['jobs']] as const;
