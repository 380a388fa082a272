import { screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../testing/render-app';
import { SendBackDialog } from './send-back-dialog';

const noop = () => undefined;

describe('send back dialog', () => {
  it('opens with the keyboard in the reason, so what is typed is the reason', async () => {
    const onSubmit = vi.fn();
    const { user } = renderWithProviders(
      <SendBackDialog
        open
        subject="the job Hexagon star"
        verb="Return"
        busy={false}
        error={null}
        onSubmit={onSubmit}
        onClose={noop}
      />,
    );
    const reason = await screen.findByRole('textbox', { name: /Reason/ });
    await waitFor(() => expect(reason).toHaveFocus());
    await user.keyboard('Slots too tight');
    expect(reason).toHaveValue('Slots too tight');
  });

  it('tells the supervisor returning a job what its requester can do with it: change the design, not the request', async () => {
    renderWithProviders(
      <SendBackDialog
        open
        subject="the job Hexagon star"
        verb="Return"
        busy={false}
        error={null}
        onSubmit={noop}
        onClose={noop}
      />,
    );
    const dialog = await screen.findByRole('dialog', { name: 'Return the job Hexagon star' });
    // As the API has it: a reopened job is a draft whose copies and notes can change, and requesting it again
    // copies the design's saved spec.
    expect(dialog).toHaveTextContent(
      'The job goes back to its requester with your reason. They can reopen it, change the number of ' +
        'copies and the notes, and request the cut again, which takes their design as saved by then (so ' +
        'they can change the design first).',
    );
    expect(dialog).not.toHaveTextContent(/change the request/);
    expect(dialog).not.toHaveTextContent(/answers with a changed version/);
  });

  it('tells the supervisor sending a version back that it returns to its author as a draft', async () => {
    renderWithProviders(
      <SendBackDialog
        open
        subject="version 2 of CO2 laser"
        busy={false}
        error={null}
        onSubmit={noop}
        onClose={noop}
      />,
    );
    const dialog = await screen.findByRole('dialog', { name: 'Send back version 2 of CO2 laser' });
    expect(dialog).toHaveTextContent(
      'The version goes back to its author as a draft with your reason; they can change it and submit it again.',
    );
  });
});
