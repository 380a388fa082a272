/** Every page of the app and how to link to it. Routes and links read these; no path is typed twice. */

function safeRedirect(target: string | null | undefined): string | undefined {
  // Only same-app paths: "/people" is fine, "//elsewhere.example" and "https://…" are not.
  if (!target || !target.startsWith('/') || target.startsWith('//')) return undefined;
  return target;
}

export const paths = {
  home: { path: '/', getHref: () => '/' },
  people: { path: '/people', getHref: () => '/people' },
  designs: { path: '/designs', getHref: () => '/designs' },
  designNew: { path: '/designs/new', getHref: () => '/designs/new' },
  design: { path: '/designs/:designId', getHref: (id: string) => `/designs/${encodeURIComponent(id)}` },
  jobs: { path: '/jobs', getHref: () => '/jobs' },
  safety: { path: '/safety', getHref: () => '/safety' },
  releaseDesk: { path: '/release-desk', getHref: () => '/release-desk' },
  job: { path: '/jobs/:jobId', getHref: (id: string) => `/jobs/${encodeURIComponent(id)}` },
  materials: { path: '/materials', getHref: () => '/materials' },
  machineProfiles: { path: '/machine-profiles', getHref: () => '/machine-profiles' },
  machineProfile: {
    path: '/machine-profiles/:profileId',
    getHref: (id: string) => `/machine-profiles/${encodeURIComponent(id)}`,
  },
  approvals: { path: '/approvals', getHref: () => '/approvals' },
  audit: { path: '/audit', getHref: () => '/audit' },
  signIn: {
    path: '/sign-in',
    getHref: (redirectTo?: string | null) => {
      const target = safeRedirect(redirectTo);
      return target && target !== '/' ? `/sign-in?redirectTo=${encodeURIComponent(target)}` : '/sign-in';
    },
  },
  register: { path: '/register', getHref: () => '/register' },
} as const;

/** The page to open after signing in: the `redirectTo` query value if it is a path inside the app. */
export function redirectTarget(search: URLSearchParams): string {
  return safeRedirect(search.get('redirectTo')) ?? paths.home.getHref();
}
