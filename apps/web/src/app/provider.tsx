import CssBaseline from '@mui/material/CssBaseline';
import { ThemeProvider } from '@mui/material/styles';
import { type QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { type ReactNode, useEffect, useState } from 'react';
import { theme } from '../config/theme';
import { createQueryClient } from '../lib/query-client';
import { getAccessToken, subscribeAccessToken } from '../lib/token-store';

/** Forget every cached answer when the token goes away (sign-out, a 401, or sign-out in another tab). */
function useClearCacheOnSignOut(queryClient: QueryClient): void {
  useEffect(
    () =>
      subscribeAccessToken(() => {
        if (getAccessToken() === null) queryClient.clear();
      }),
    [queryClient],
  );
}

export function AppProvider({ children, queryClient }: { children: ReactNode; queryClient?: QueryClient }) {
  const [client] = useState(() => queryClient ?? createQueryClient());
  useClearCacheOnSignOut(client);
  return (
    <ThemeProvider theme={theme}>
      <CssBaseline />
      <QueryClientProvider client={client}>{children}</QueryClientProvider>
    </ThemeProvider>
  );
}
