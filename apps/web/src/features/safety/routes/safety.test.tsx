import { type LocalRulesView, type MaterialHazard, type SafetyNotice } from '@kerfwright/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { userFixture } from '../../../testing/fixtures';
import { renderApp } from '../../../testing/render-app';

const notice: SafetyNotice = {
  id: 'never-unattended',
  version: 2,
  title: 'Never leave a running laser',
  appliesTo: { machineKinds: ['co2-laser'], materialFamilies: ['*'] },
  severity: 'danger',
  body: 'Stay with the machine for the whole job.',
  sources: ['common practice'],
};

// Rows in the spirit of published laser-safety material lists (PVC: chlorine gas, never on a laser — common practice).
const hazards: MaterialHazard[] = [
  {
    family: 'pvc',
    examples: ['PVC', 'vinyl'],
    laser: 'no',
    hazard: 'Releases chlorine gas.',
    source: 'common practice',
  },
  {
    family: 'acrylic',
    examples: ['cast acrylic'],
    laser: 'yes',
    hazard: 'Flammable.',
    source: 'common practice',
  },
  {
    family: 'abs',
    examples: ['ABS'],
    laser: 'conditional',
    hazard: 'Melts.',
    condition: 'small amounts',
    source: 'common practice',
  },
];

const rules: LocalRulesView = {
  version: 3,
  body: 'Book the laser on the board.',
  authorName: 'Ada Supervisor',
  updatedAt: '2026-01-01T00:00:00.000Z',
};

function stub(role: 'supervisor' | 'hobbyist') {
  return stubFetch({
    'GET /api/auth/me': () => json(200, userFixture(role)),
    'GET /api/safety/notices': () => json(200, [notice]),
    'GET /api/safety/hazards': () => json(200, hazards),
    'GET /api/safety/local-rules': () => json(200, rules),
    'PUT /api/safety/local-rules': (call) =>
      json(200, { ...rules, version: 4, body: (call.body as { body: string }).body }),
  });
}

describe('safety page', () => {
  it('shows the notices, the hazard table (filterable and sortable) and the local rules to everyone', async () => {
    stub('hobbyist');
    const { user } = renderApp('/safety', { token: 't' });
    expect(await screen.findByText('Never leave a running laser')).toBeInTheDocument();
    expect(await screen.findByText('Book the laser on the board.')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Edit the local rules' })).not.toBeInTheDocument();

    const table = await screen.findByRole('table', { name: 'Material hazards' });
    const families = () =>
      within(table)
        .getAllByRole('row')
        .slice(1)
        .map((r) => r.querySelector('td')?.textContent);
    expect(families()).toEqual(['abs', 'acrylic', 'pvc']);
    await user.click(within(table).getByRole('button', { name: 'Family' }));
    expect(families()).toEqual(['pvc', 'acrylic', 'abs']);
    await user.selectOptions(screen.getByLabelText('On a laser'), 'no');
    expect(families()).toEqual(['pvc']);
  });

  it('lets a supervisor save new local rules, and refuses empty ones', async () => {
    const { calls } = stub('supervisor');
    const { user } = renderApp('/safety', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Edit the local rules' }));
    const body = screen.getByLabelText('Local rules');
    await user.clear(body);
    await user.click(screen.getByRole('button', { name: 'Save as a new version' }));
    expect(await screen.findByText('Write the rules, or keep the current ones')).toBeInTheDocument();
    expect(calls.some((c) => c.method === 'PUT')).toBe(false);

    await user.type(body, 'Extraction on before the beam.');
    await user.click(screen.getByRole('button', { name: 'Save as a new version' }));
    await waitFor(() =>
      expect(calls.find((c) => c.method === 'PUT')?.body).toEqual({ body: 'Extraction on before the beam.' }),
    );
    expect(await screen.findByText('Extraction on before the beam.')).toBeInTheDocument();
    expect(screen.getByText(/^Version 4/)).toBeInTheDocument();
  });
});
