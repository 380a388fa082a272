import { render } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClient } from '@tanstack/react-query';
import { type ReactNode } from 'react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { AppProvider } from '../app/provider';
import { routes } from '../app/routes';
import { refetchWhileFailing } from '../lib/query-client';
import { TOKEN_STORAGE_KEY } from '../lib/token-store';

/** As the app's client (createQueryClient), less the retries and refetches on staleness that slow tests. */
function testQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: { retry: false, staleTime: Infinity, refetchInterval: refetchWhileFailing },
      mutations: { retry: false },
    },
  });
}

/** The whole app (real routes, providers and theme) at one address, optionally signed in with a token. */
export function renderApp(path: string, { token }: { token?: string } = {}) {
  if (token) window.localStorage.setItem(TOKEN_STORAGE_KEY, token);
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  const user = userEvent.setup();
  const queryClient = testQueryClient();
  const utils = render(
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...utils, router, user, queryClient };
}

/** One component with the app's providers and a router around it. */
export function renderWithProviders(ui: ReactNode, { path = '/' }: { path?: string } = {}) {
  const router = createMemoryRouter([{ path: '*', element: ui }], { initialEntries: [path] });
  const user = userEvent.setup();
  const utils = render(
    <AppProvider queryClient={testQueryClient()}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...utils, router, user };
}
