import { screen, waitFor } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { renderWithProviders } from '../../testing/render-app';
import { NotFoundPage } from './not-found-page';

describe('NotFoundPage', () => {
  it('says what is not there, why, and links back to the list, with no retry', async () => {
    const { user, router } = renderWithProviders(
      <NotFoundPage
        title="No such sheet"
        backTo="/sheets"
        backLabel="Back to the sheets"
        testId="no-such-sheet"
      >
        The link may be mistyped.
      </NotFoundPage>,
      { path: '/sheets/42' },
    );
    expect(screen.getByTestId('no-such-sheet')).toBeInTheDocument();
    expect(screen.getByRole('heading', { level: 1, name: 'No such sheet' })).toBeInTheDocument();
    expect(screen.getByText('The link may be mistyped.')).toBeInTheDocument();
    await waitFor(() => expect(document.title).toBe('No such sheet · Kerfwright'));
    expect(screen.queryByRole('button', { name: 'Try again' })).not.toBeInTheDocument();
    const back = screen.getByRole('link', { name: 'Back to the sheets' });
    expect(back).toHaveAttribute('href', '/sheets');
    await user.click(back);
    expect(router.state.location.pathname).toBe('/sheets');
  });
});
