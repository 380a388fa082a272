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

function renderRoutes() {
  const router = createMemoryRouter(
    [
      {
        element: <Layout />,
        children: [
          { path: '/a', element: <PageA /> },
          { path: '/b', element: <h1>Page B</h1> },
          { path: '/slow', element: <SlowPage /> },
          { path: '/form', element: <FormPage /> },
        ],
      },
    ],
    { initialEntries: ['/a'] },
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
