import { type Role } from '@kerfwright/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { json, stubFetch } from '../testing/fetch-stub';
import { userFixture } from '../testing/fixtures';
import { renderApp } from '../testing/render-app';
import { getAccessToken } from '../lib/token-store';
import { ME_REFRESH_MS } from '../lib/auth';

const healthy = { status: 'ok', database: 'up', redis: 'up', version: '0.1.0' };

function signedInAs(role: Role) {
  const me = userFixture(role);
  const stub = stubFetch({
    'GET /api/auth/me': () => json(200, me),
    'GET /api/health': () => json(200, healthy),
    'GET /api/users': () => json(200, { items: [me], total: 1, page: 1, pageSize: 25 }),
  });
  return { me, ...stub };
}

describe('navigation per role', () => {
  it('shows the supervisor every page, People, Approvals and the audit trail included', async () => {
    signedInAs('supervisor');
    renderApp('/', { token: 't' });
    const nav = await screen.findByRole('navigation', { name: 'Main' });
    const links = within(nav)
      .getAllByRole('link')
      .map((a) => a.textContent);
    expect(links).toEqual([
      'Home',
      'Designs',
      'Jobs',
      'Release desk',
      'Safety',
      'Materials',
      'Machine profiles',
      'Approvals',
      'People',
      'Audit trail',
    ]);
    expect(within(nav).getByRole('link', { name: 'People' })).toHaveAttribute('href', '/people');
  });

  it('shows the fabricator Materials and Machine profiles but no supervisor pages', async () => {
    signedInAs('fabricator');
    renderApp('/', { token: 't' });
    const nav = await screen.findByRole('navigation', { name: 'Main' });
    expect(
      within(nav)
        .getAllByRole('link')
        .map((a) => a.textContent),
    ).toEqual(['Home', 'Designs', 'Jobs', 'Safety', 'Materials', 'Machine profiles']);
  });

  it.each([
    ['hobbyist', ['Home', 'Designs', 'Jobs', 'Safety']],
    ['operator', ['Home', 'Designs', 'Jobs', 'Release desk', 'Safety']],
  ] as const)('shows the %s its pages and no People', async (role, expected) => {
    signedInAs(role);
    renderApp('/', { token: 't' });
    const nav = await screen.findByRole('navigation', { name: 'Main' });
    expect(
      within(nav)
        .getAllByRole('link')
        .map((a) => a.textContent),
    ).toEqual(expected);
    expect(screen.queryByRole('link', { name: 'People' })).not.toBeInTheDocument();
  });

  it("shows the user's name and role in the app bar and marks the current page", async () => {
    const { me } = signedInAs('fabricator');
    renderApp('/', { token: 't' });
    const bar = await screen.findByTestId('signed-in-user');
    expect(bar).toHaveTextContent(me.displayName);
    expect(bar).toHaveTextContent('Fabricator');
    const nav = screen.getByRole('navigation', { name: 'Main' });
    expect(within(nav).getByRole('link', { name: 'Home' })).toHaveAttribute('aria-current', 'page');
  });
});

describe('home page', () => {
  it.each(['hobbyist', 'fabricator', 'operator', 'supervisor'] as const)(
    'greets the %s, says what the role does and shows the service health',
    async (role) => {
      const { me } = signedInAs(role);
      renderApp('/', { token: 't' });
      const home = await screen.findByTestId(`home-${role}`);
      expect(within(home).getByRole('heading', { level: 1 })).toHaveTextContent(/home$/);
      expect(home).toHaveTextContent(`Welcome, ${me.displayName}.`);
      expect(within(home).getByRole('heading', { name: 'Your part in the workshop' })).toBeInTheDocument();
      const health = within(home).getByTestId('service-health');
      expect(await within(health).findByText('Kerfwright is running normally.')).toBeInTheDocument();
      expect(health).toHaveTextContent('Version 0.1.0');
    },
  );

  it('shows a degraded service from the 503 body instead of an error', async () => {
    const me = userFixture('operator');
    const degraded = { status: 'degraded', database: 'up', redis: 'down', version: '0.1.0' };
    stubFetch({
      'GET /api/auth/me': () => json(200, me),
      'GET /api/health': () =>
        json(503, {
          statusCode: 503,
          code: 'SERVICE.DEGRADED',
          message: 'A backing service is down',
          details: degraded,
          requestId: 'r',
        }),
    });
    renderApp('/', { token: 't' });
    const health = await screen.findByTestId('service-health');
    expect(await within(health).findByText(/Part of the service is down/)).toBeInTheDocument();
    expect(within(health).getByText('Down')).toBeInTheDocument();
  });
});

describe('protected routes', () => {
  afterEach(() => vi.useRealTimers());

  it('sends a visitor without a token to sign-in, remembering the page', async () => {
    const { fetchMock } = stubFetch({});
    const { router } = renderApp('/people');
    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(router.state.location.search).toBe('?redirectTo=%2Fpeople');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  it('signs out and returns to sign-in when the API rejects the stored token', async () => {
    stubFetch({
      'GET /api/auth/me': () =>
        json(401, {
          statusCode: 401,
          code: 'AUTH.UNAUTHENTICATED',
          message: 'Sign in first',
          requestId: 'r',
        }),
    });
    const { router } = renderApp('/', { token: 'expired' });
    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(getAccessToken()).toBeNull();
    // It says why: nobody asked to sign out. Once: a later visit to sign-in does not say it again.
    expect(screen.getByTestId('session-ended')).toHaveTextContent(
      'You were signed out: your session has ended.',
    );
    await router.navigate('/register');
    await waitFor(() => expect(screen.queryByTestId('session-ended')).not.toBeInTheDocument());
    await router.navigate('/sign-in');
    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(screen.queryByTestId('session-ended')).not.toBeInTheDocument();
  });

  it('explains a failed account check and still offers a way out', async () => {
    stubFetch({
      'GET /api/auth/me': () =>
        json(500, { statusCode: 500, code: 'INTERNAL', message: 'Something broke', requestId: 'req-500' }),
    });
    const { user, router } = renderApp('/', { token: 't' });
    expect(await screen.findByText('We could not load your account')).toBeInTheDocument();
    expect(screen.getByText('req-500')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Sign out' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    expect(getAccessToken()).toBeNull();
  });

  it('tells a hobbyist that People is not part of their role', async () => {
    const { calls } = signedInAs('hobbyist');
    renderApp('/people', { token: 't' });
    expect(await screen.findByText('This page is not part of your role')).toBeInTheDocument();
    expect(calls.some((c) => c.url.pathname === '/api/users')).toBe(false);
  });

  it('signs out from the app bar: token and cache gone, back at sign-in with no page to return to', async () => {
    // On a shared workshop PC the next person to sign in must not land on this user's page.
    const { me, calls } = signedInAs('supervisor');
    const { user, router, queryClient } = renderApp('/people', { token: 't' });
    await screen.findByText(me.email);
    await user.click(screen.getByRole('button', { name: 'Sign out' }));
    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    await waitFor(() => expect(getAccessToken()).toBeNull());
    // The API is told to end the token, sent with it once (a copy kept on the PC then opens nothing).
    const signOuts = calls.filter((c) => c.method === 'POST' && c.url.pathname === '/api/auth/sign-out');
    expect(signOuts).toHaveLength(1);
    expect(signOuts[0]!.headers.get('Authorization')).toBe('Bearer t');
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(router.state.location.search).toBe('');
    expect(router.state.location.state).toBeNull();
    expect(queryClient.getQueryCache().getAll()).toEqual([]);
    // Signed out on purpose: no word of a session that ended.
    expect(screen.queryByTestId('session-ended')).not.toBeInTheDocument();
  });

  it('notices within a minute that the account was deactivated, on a page nobody touches', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    const me = userFixture('operator');
    let active = true;
    stubFetch({
      'GET /api/auth/me': () =>
        active
          ? json(200, me)
          : json(401, {
              statusCode: 401,
              code: 'AUTH.UNAUTHENTICATED',
              message: 'Sign in first',
              requestId: 'r',
            }),
      'GET /api/health': () => json(200, healthy),
    });
    const { router } = renderApp('/', { token: 't' });
    await screen.findByText(me.email);
    active = false;
    await vi.advanceTimersByTimeAsync(ME_REFRESH_MS + 100);
    expect(await screen.findByTestId('session-ended')).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
  });

  it('keeps the page when a later check of the account fails for a moment (the API briefly down)', async () => {
    vi.useFakeTimers({ shouldAdvanceTime: true });
    const me = userFixture('operator');
    let up = true;
    stubFetch({
      'GET /api/auth/me': () =>
        up
          ? json(200, me)
          : json(503, { statusCode: 503, code: 'UNAVAILABLE', message: 'Down', requestId: 'r' }),
      'GET /api/health': () => json(200, healthy),
    });
    renderApp('/', { token: 't' });
    await screen.findByText(me.email);
    up = false;
    await vi.advanceTimersByTimeAsync(ME_REFRESH_MS * 4);
    expect(screen.queryByText('We could not load your account')).not.toBeInTheDocument();
    expect(screen.getByText(me.email)).toBeInTheDocument();
  });

  it('remembers the page when the session ends by itself', async () => {
    stubFetch({
      'GET /api/auth/me': () =>
        json(401, {
          statusCode: 401,
          code: 'AUTH.UNAUTHENTICATED',
          message: 'Sign in first',
          requestId: 'r',
        }),
    });
    const { router } = renderApp('/people', { token: 'expired' });
    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(router.state.location.search).toBe('?redirectTo=%2Fpeople');
  });

  it('opens the page asked for after signing in', async () => {
    const supervisor = userFixture('supervisor');
    stubFetch({
      'POST /api/auth/login': () => json(200, { accessToken: 'jwt', user: supervisor }),
      'GET /api/auth/me': () => json(200, supervisor),
      'GET /api/users': () => json(200, { items: [supervisor], total: 1, page: 1, pageSize: 25 }),
    });
    const { user, router } = renderApp('/sign-in?redirectTo=%2Fpeople');
    await user.type(await screen.findByLabelText(/E-mail/), supervisor.email);
    await user.type(screen.getByLabelText(/Password/), 'kerfwright-demo');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/people'));
    expect(await screen.findByRole('heading', { level: 1, name: 'People' })).toBeInTheDocument();
  });
});

describe('unknown addresses', () => {
  it('shows the 404 page with a way home, signed in or not', async () => {
    stubFetch({});
    renderApp('/no/such/page');
    expect(await screen.findByRole('heading', { name: 'Page not found' })).toBeInTheDocument();
    expect(screen.getByText('/no/such/page')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Go to your home page' })).toHaveAttribute('href', '/');
  });
});
