import { screen, waitFor } from '@testing-library/react';
import { useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../testing/render-app';
import { RequestJobDialog } from './request-job-dialog';

describe('request a cut job dialog', () => {
  it('needs 1 to 100 whole copies and sends the numbers it was given', async () => {
    const onSubmit = vi.fn();
    const { user } = renderWithProviders(
      <RequestJobDialog open busy={false} error={null} onSubmit={onSubmit} onClose={() => undefined} />,
    );
    const copies = await screen.findByLabelText('Copies');
    await user.clear(copies);
    await user.type(copies, '0');
    await user.click(screen.getByRole('button', { name: 'Request the cut' }));
    expect(await screen.findByText('At least 1 copy')).toBeInTheDocument();
    await user.clear(copies);
    await user.type(copies, '101');
    await user.click(screen.getByRole('button', { name: 'Request the cut' }));
    expect(await screen.findByText('At most 100 copies')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();

    await user.clear(copies);
    await user.type(copies, '2');
    await user.type(screen.getByLabelText('Notes for the workshop'), 'Teal if possible');
    await user.click(screen.getByRole('button', { name: 'Request the cut' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(onSubmit.mock.calls[0]?.[0]).toEqual({ quantity: 2, notes: 'Teal if possible' });
  });

  it('puts the focus on Copies when it opens', async () => {
    const onSubmit = vi.fn();
    const { user } = renderWithProviders(
      <RequestJobDialog open busy={false} error={null} onSubmit={onSubmit} onClose={() => undefined} />,
    );
    const copies = await screen.findByLabelText('Copies');
    await waitFor(() => expect(copies).toHaveFocus());
    // Typing goes straight into Copies (jsdom selects no text in a number input, so the 1 is erased first).
    await user.keyboard('{Backspace}3');
    await user.click(screen.getByRole('button', { name: 'Request the cut' }));
    await waitFor(() => expect(onSubmit).toHaveBeenCalled());
    expect(onSubmit.mock.calls[0]?.[0]).toEqual({ quantity: 3, notes: '' });
  });

  it('opens again as a fresh request, not with what was typed and abandoned', async () => {
    function Harness() {
      const [open, setOpen] = useState(true);
      return (
        <>
          <button onClick={() => setOpen(true)}>Open it</button>
          <RequestJobDialog
            open={open}
            busy={false}
            error={null}
            onSubmit={() => undefined}
            onClose={() => setOpen(false)}
          />
        </>
      );
    }
    const { user } = renderWithProviders(<Harness />);
    const copies = await screen.findByLabelText('Copies');
    await user.clear(copies);
    await user.type(copies, '500');
    await user.type(screen.getByLabelText('Notes for the workshop'), 'Forget this');
    await user.click(screen.getByRole('button', { name: 'Request the cut' }));
    expect(await screen.findByText('At most 100 copies')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Cancel' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    await user.click(screen.getByRole('button', { name: 'Open it' }));
    expect(await screen.findByLabelText('Copies')).toHaveValue(1);
    expect(screen.getByLabelText('Notes for the workshop')).toHaveValue('');
    expect(screen.queryByText('At most 100 copies')).not.toBeInTheDocument();
  });
});
