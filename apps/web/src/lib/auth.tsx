/**
 * Who is signed in. The token lives in the token store; the user comes from GET /api/auth/me and is kept in
 * the query cache under `authKeys.me`, so every part of the app reads the same answer.
 */
import { type UserView } from '@kerfwright/contracts';
import Button from '@mui/material/Button';
import { queryOptions, useQuery, useQueryClient } from '@tanstack/react-query';
import { createContext, type ReactNode, useCallback, useContext, useEffect } from 'react';
import { Navigate, useLocation, useNavigate } from 'react-router-dom';
import { paths } from '../config/paths';
import { FullPageProgress } from '../components/ui/full-page-progress';
import { ErrorPanel } from '../components/errors/error-panel';
import { api } from './api-client';
import { clearAccessToken, getAccessToken, useAccessToken } from './token-store';

export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};

export function getMe(signal?: AbortSignal): Promise<UserView> {
  return api.get<UserView>('/auth/me', undefined, signal);
}

export function meQueryOptions() {
  return queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 5 * 60_000,
  });
}

/** How often a signed-in page asks the API again who is signed in. */
export const ME_REFRESH_MS = 60_000;

/** Set by `RequireAuth` once the API has confirmed who is signed in. */
const CurrentUserContext = createContext<UserView | null>(null);

/**
 * The signed-in user. Only call below `RequireAuth`, which renders its children only while it has one
 * (on sign-out it stops rendering them before the cache is cleared, so this never sees a half-state).
 */
export function useUser(): UserView {
  const user = useContext(CurrentUserContext);
  if (!user) throw new Error('useUser needs a signed-in user: render it inside RequireAuth');
  return user;
}

/** Navigation state that asks the sign-in page to end the session: see `useSignOut`. */
const SIGN_OUT_STATE = { signOut: true } as const;

function isSignOut(state: unknown): boolean {
  return typeof state === 'object' && state !== null && (state as { signOut?: unknown }).signOut === true;
}

/**
 * Signs out: opens the sign-in page, without a page to come back to (on a shared workshop PC the next person
 * to sign in would land on this user's page), and the session ends there (`useEndSessionOnArrival`). Being a
 * navigation first, it is held like any other by a page that guards unsaved edits; once it goes through, the
 * page it leaves is gone, so the token's going cannot send it back to sign-in with a `redirectTo` of its own.
 */
export function useSignOut(): () => void {
  const navigate = useNavigate();
  return useCallback(() => {
    void navigate(paths.signIn.getHref(), { replace: true, state: SIGN_OUT_STATE });
  }, [navigate]);
}

/**
 * On the sign-in page: ends the session a sign-out navigated here for, forgetting the token and everything
 * cached for this user, then drops the request from the history entry (Back or a reload must not repeat it).
 * True until then, while the token is still there.
 */
export function useEndSessionOnArrival(): boolean {
  const location = useLocation();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const signingOut = isSignOut(location.state);
  useEffect(() => {
    if (!signingOut) return;
    // The API ends the token too (a copy kept on a shared PC opens nothing); it is sent with the token before
    // the token is forgotten here, and signing out goes on whether or not the API answers.
    if (getAccessToken()) api.post<void>('/auth/sign-out', {}).catch(() => undefined);
    clearAccessToken();
    queryClient.clear();
    void navigate(paths.signIn.getHref(), { replace: true });
  }, [signingOut, queryClient, navigate]);
  return signingOut;
}

/** Renders its children for a signed-in user whose token the API still accepts; otherwise opens sign-in. */
export function RequireAuth({ children }: { children: ReactNode }) {
  const token = useAccessToken();
  const location = useLocation();
  // Asked again every minute: an account deactivated or given another role elsewhere changes this page too,
  // idle as it may be (the API already refuses its requests).
  const me = useQuery({ ...meQueryOptions(), enabled: token !== null, refetchInterval: ME_REFRESH_MS });
  const signOut = useSignOut();

  if (!token) {
    return <Navigate to={paths.signIn.getHref(location.pathname + location.search)} replace />;
  }
  if (me.isPending) return <FullPageProgress label="Checking your sign-in…" />;
  // A check that failed once the account was known (the API down for a moment) keeps the page.
  if (me.isError && me.data === undefined) {
    return (
      <ErrorPanel title="We could not load your account" error={me.error} onRetry={() => void me.refetch()}>
        <Button variant="outlined" onClick={signOut}>
          Sign out
        </Button>
      </ErrorPanel>
    );
  }
  return <CurrentUserContext.Provider value={me.data}>{children}</CurrentUserContext.Provider>;
}
