import { type JobSafetyView } from '@kerfwright/contracts';
import { screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { renderWithProviders } from '../../../testing/render-app';
import { SafetyDialog } from './safety-dialog';

const jobId = '11111111-2222-3333-4444-555555555555';

// In the form of safety/notices/laser-classes.md: the body opens with the title as a heading.
const safety: JobSafetyView = {
  jobId,
  machineKind: 'co2-laser',
  materialFamily: 'acrylic',
  notices: [
    {
      id: 'laser-classes',
      version: 1,
      title: 'Laser hazard classes and what "class 1 enclosed" really means',
      appliesTo: { machineKinds: ['co2-laser'], materialFamilies: ['*'] },
      severity: 'danger',
      body: [
        '# Laser hazard classes and what "class 1 enclosed" really means',
        '',
        '- **Class 3B** covers continuous-wave lasers up to 0.5 W.',
        '- **Class 4** is everything above 0.5 W.',
        '',
        '| class | what it means |',
        '| --- | --- |',
        '| 4 | the beam burns skin |',
      ].join('\n'),
      sources: ['IEC 60825-1 (from memory)'],
    },
  ],
  localRules: {
    version: 2,
    body: '## Bay rules\n\n**Never** alone after 21:00.',
    authorName: null,
    updatedAt: '2026-01-01T00:00:00.000Z',
  },
  preparationId: '41',
  acknowledged: false,
  acknowledgedAt: null,
};

describe('safety dialog', () => {
  it('shows the notices and local rules as formatted text, the title once', async () => {
    stubFetch({ [`GET /api/jobs/${jobId}/safety`]: () => json(200, safety) });
    renderWithProviders(<SafetyDialog jobId={jobId} open onClose={() => undefined} />);
    const notices = await screen.findByTestId('safety-notices');
    expect(
      within(notices).getAllByText('Laser hazard classes and what "class 1 enclosed" really means'),
    ).toHaveLength(1);
    expect(within(notices).getByText('Class 3B').tagName).toBe('STRONG');
    expect(within(notices).getByRole('cell', { name: 'the beam burns skin' })).toBeInTheDocument();
    // Named for what it lists (WAI-ARIA 1.2: a region needs a name), not "Table" like every other one.
    expect(
      within(notices).getByRole('region', {
        name: 'Laser hazard classes and what "class 1 enclosed" really means: class, what it means',
      }),
    ).toBeInTheDocument();
    // The notices are the dialog's content: notes, not alerts announced all at once as it opens.
    expect(screen.queryAllByRole('alert')).toEqual([]);
    expect(within(notices).getAllByRole('note')).toHaveLength(1);
    const local = within(notices).getByTestId('local-rules');
    expect(within(local).getByRole('heading', { name: 'Bay rules' })).toBeInTheDocument();
    expect(within(local).getByText('Never').tagName).toBe('STRONG');
    expect(notices).not.toHaveTextContent(/[#|*]|---/);
    // The acknowledgement stays.
    expect(within(notices).getByLabelText(/I have read these notices/)).toBeInTheDocument();
  });

  it('puts the keyboard on Close once the notices are acknowledged and the button has gone', async () => {
    let acknowledged = false;
    stubFetch({
      [`GET /api/jobs/${jobId}/safety`]: () =>
        json(200, {
          ...safety,
          acknowledged,
          acknowledgedAt: acknowledged ? '2026-01-02T08:00:00.000Z' : null,
        }),
      [`POST /api/jobs/${jobId}/safety/acknowledge`]: () => {
        acknowledged = true;
        return json(201, { ...safety, acknowledged, acknowledgedAt: '2026-01-02T08:00:00.000Z' });
      },
    });
    const { user } = renderWithProviders(<SafetyDialog jobId={jobId} open onClose={() => undefined} />);
    await user.click(await screen.findByLabelText(/I have read these notices/));
    await user.click(screen.getByRole('button', { name: 'Acknowledge' }));
    await screen.findByTestId('safety-acknowledged');
    expect(screen.queryByRole('button', { name: 'Acknowledge' })).toBeNull();
    expect(screen.getByRole('button', { name: 'Close' })).toHaveFocus();
  });

  it('acknowledges for the preparation read, and shows the notices again when the job was prepared since', async () => {
    // The job is prepared again (on a router) while the dialog is open.
    let current: JobSafetyView = safety;
    const { calls } = stubFetch({
      [`GET /api/jobs/${jobId}/safety`]: () => json(200, current),
      [`POST /api/jobs/${jobId}/safety/acknowledge`]: () => {
        current = { ...safety, machineKind: 'cnc-router', materialFamily: 'plywood', preparationId: '42' };
        return json(409, {
          statusCode: 409,
          code: 'SAFETY.PREPARATION_CHANGED',
          message: 'This job was prepared again since you read its notices',
          details: { preparationId: '42' },
          requestId: 'r-1',
        });
      },
    });
    const { user } = renderWithProviders(<SafetyDialog jobId={jobId} open onClose={() => undefined} />);
    await user.click(await screen.findByLabelText(/I have read these notices/));
    await user.click(screen.getByRole('button', { name: 'Acknowledge' }));
    expect(calls.find((c) => c.method === 'POST')?.body).toEqual({
      notices: [{ id: 'laser-classes', version: 1 }],
      localRulesVersion: 2,
      preparationId: '41',
    });
    expect(await screen.findByRole('alert')).toHaveTextContent(/prepared again since you read its notices/);
    // The view is read again: the notices for the job as prepared now, to be ticked again.
    expect(await screen.findByText(/For plywood on a /)).toBeInTheDocument();
    expect(screen.getByLabelText(/I have read these notices/)).not.toBeChecked();
    expect(screen.getByRole('button', { name: 'Acknowledge' })).toBeDisabled();
  });

  it('shows a fabricator the notices to read, with no acknowledgement the server would refuse', async () => {
    stubFetch({ [`GET /api/jobs/${jobId}/safety`]: () => json(200, safety) });
    renderWithProviders(<SafetyDialog jobId={jobId} open onClose={() => undefined} canAcknowledge={false} />);
    const notices = await screen.findByTestId('safety-notices');
    expect(within(notices).getByTestId('safety-read-only')).toHaveTextContent(
      /An operator or a supervisor acknowledges these notices/,
    );
    expect(screen.queryAllByRole('alert')).toEqual([]);
    expect(within(notices).queryByLabelText(/I have read these notices/)).toBeNull();
    expect(screen.queryByRole('button', { name: 'Acknowledge' })).toBeNull();
  });
});
