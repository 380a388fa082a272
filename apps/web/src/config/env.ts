/** Where the API lives. The built app is served by the API itself, so the default is the same origin. */
export const env = {
  apiBaseUrl: (import.meta.env.VITE_API_BASE_URL as string | undefined) ?? '/api',
  /** How often the home page asks for the service health, in milliseconds. */
  healthRefreshMs: 30_000,
} as const;
