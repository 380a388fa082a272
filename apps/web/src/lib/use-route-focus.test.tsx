import { act, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useEffect, useRef, useState } from 'react';
import { createMemoryRouter, Link, Outlet, RouterProvider, useNavigate } from 'react-router-dom';
import { describe, expect, it } from 'vitest';
import { useRouteFocus } from './use-route-focus';

function Layout() {
  useRouteFocus('main');
  return (
    <>
      <nav>
        <Link to="/a">Page A</Link>
        <Link to="/slow">Slow page</Link>
        <Link to="/form">Form page</Link>
        <Link to="/changing">Changing page</Link>
      </nav>
      <main id="main" tabIndex={-1}>
        <Outlet />
      </main>
    </>
  );
}

function PageA() {
  const navigate = useNavigate();
  return (
    <>
      <h1>Page A</h1>
      {/* A button that goes with its page, as "Request the cut" goes with the studio. */}
      <button onClick={() => void navigate('/b')}>Open page B</button>
      <button onClick={() => void navigate('/b', { replace: true })}>Redirect to page B</button>
    </>
  );
}

/** A page whose heading comes once its data has loaded. */
function SlowPage() {
  const [loaded, setLoaded] = useState(false);
  useEffect(() => {
    const timer = setTimeout(() => setLoaded(true), 50);
    return () => clearTimeout(timer);
  }, []);
  return loaded ? <h1>Slow page</h1> : <p>Loading…</p>;
}

/** A page that opens with the keyboard in its first field. */
function FormPage() {
  const field = useRef<HTMLInputElement>(null);
  useEffect(() => field.current?.focus(), []);
  return (
    <>
      <h1>Form page</h1>
      <label>
        Name <input ref={field} />
      </label>
    </>
  );
}

/** A page whose button is named anew on every visit, as a list changed by others since would be. */
let visits = 0;
function ChangingPage() {
  const navigate = useNavigate();
  const [visit] = useState(() => ++visits);
  return (
    <>
      <h1>Changing page</h1>
      <button onClick={() => void navigate('/b')}>{`Visit ${visit}: open page B`}</button>
    </>
  );
}

/** A page outside the layout that hands on to one inside it, as signing in does. */
function SignInPage() {
  const navigate = useNavigate();
  return (
    <main>
      <h1>Sign in</h1>
      <button onClick={() => void navigate('/a', { replace: true })}>Sign in</button>
    </main>
  );
}

function renderRoutes(start = '/a') {
  visits = 0;
  const router = createMemoryRouter(
    [
      { path: '/sign-in', element: <SignInPage /> },
      {
        element: <Layout />,
        children: [
          { path: '/a', element: <PageA /> },
          { path: '/b', element: <h1>Page B</h1> },
          { path: '/slow', element: <SlowPage /> },
          { path: '/form', element: <FormPage /> },
          { path: '/changing', element: <ChangingPage /> },
        ],
      },
    ],
    { initialEntries: [start] },
  );
  render(<RouterProvider router={router} />);
  return { user: userEvent.setup(), router };
}

describe('focus on a move to another page', () => {
  it('leaves the first page alone, then puts the keyboard on the heading of each page moved to', async () => {
    const { user, router } = renderRoutes();
    await screen.findByRole('heading', { name: 'Page A' });
    expect(document.activeElement).toBe(document.body);
    // The button that moved on goes with its page: the keyboard is on the new page's heading, not the body.
    await user.click(screen.getByRole('button', { name: 'Open page B' }));
    await waitFor(() => expect(screen.getByRole('heading', { name: 'Page B' })).toHaveFocus());
    // A link followed in the navigation, and Back, alike.
    await user.click(screen.getByRole('link', { name: 'Page A' }));
    await waitFor(() => expect(screen.getByRole('heading', { name: 'Page A' })).toHaveFocus());
    await act(() => router.navigate(-1));
    await waitFor(() => expect(screen.getByRole('heading', { name: 'Page B' })).toHaveFocus());
  });

  it('puts the keyboard back on the control it left a page from, on Back and on Forward', async () => {
    const { user, router } = renderRoutes();
    await user.click(await screen.findByRole('button', { name: 'Open page B' }));
    await waitFor(() => expect(screen.getByRole('heading', { name: 'Page B' })).toHaveFocus());
    // Back to where the reader was: the button they pressed, not the heading at the top of the page.
    await act(() => router.navigate(-1));
    await waitFor(() => expect(screen.getByRole('button', { name: 'Open page B' })).toHaveFocus());
    // Forward to page B, where the keyboard was last on its heading.
    await act(() => router.navigate(1));
    await waitFor(() => expect(screen.getByRole('heading', { name: 'Page B' })).toHaveFocus());
    // A page entered afresh by a link starts at its heading, wherever the keyboard was on it before.
    await user.click(screen.getByRole('link', { name: 'Page A' }));
    await waitFor(() => expect(screen.getByRole('heading', { name: 'Page A' })).toHaveFocus());
  });

  it('puts the keyboard on the heading on Back when the control it left from is gone', async () => {
    const { user, router } = renderRoutes();
    await user.click(await screen.findByRole('link', { name: 'Changing page' }));
    await user.click(await screen.findByRole('button', { name: 'Visit 1: open page B' }));
    await waitFor(() => expect(screen.getByRole('heading', { name: 'Page B' })).toHaveFocus());
    await act(() => router.navigate(-1));
    // The page has changed since: no control of that name is left, so the keyboard starts at the heading.
    expect(await screen.findByRole('button', { name: 'Visit 2: open page B' })).toBeInTheDocument();
    await waitFor(() => expect(screen.getByRole('heading', { name: 'Changing page' })).toHaveFocus());
  });

  it('puts the keyboard on the heading of the page a reader signed in to, the sign-in button being gone', async () => {
    const { user } = renderRoutes('/sign-in');
    await user.click(await screen.findByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(screen.getByRole('heading', { name: 'Page A' })).toHaveFocus());
  });

  it('waits for the heading of a page still loading', async () => {
    const { user } = renderRoutes();
    await user.click(await screen.findByRole('link', { name: 'Slow page' }));
    expect(screen.getByText('Loading…')).toBeInTheDocument();
    await waitFor(() => expect(screen.getByRole('heading', { name: 'Slow page' })).toHaveFocus());
  });

  it("keeps the page's own choice, and leaves a replaced address to its page", async () => {
    const { user } = renderRoutes();
    await user.click(await screen.findByRole('link', { name: 'Form page' }));
    await waitFor(() => expect(screen.getByLabelText('Name')).toHaveFocus());
    await user.click(screen.getByRole('link', { name: 'Page A' }));
    await waitFor(() => expect(screen.getByRole('heading', { name: 'Page A' })).toHaveFocus());
    // A replaced address is no page the reader moved to (a page saved under its new address, say): the page
    // places the keyboard itself.
    await user.click(screen.getByRole('button', { name: 'Redirect to page B' }));
    await screen.findByRole('heading', { name: 'Page B' });
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(screen.getByRole('heading', { name: 'Page B' })).not.toHaveFocus();
  });
});
