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
  {
    family: 'glue-backed',
    examples: ['self-adhesive sheet'],
    laser: 'no',
    hazard: 'The glue is often unknown.',
    source: 'common practice',
  },
  {
    family: 'carbon-fibre',
    examples: ['CFRP plate'],
    laser: 'no',
    hazard: 'Fine fibres and resin fumes.',
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

// Shaped like the notices in safety/notices: a title heading repeated in the body, bold, a list and a table.
const markdownNotice: SafetyNotice = {
  id: 'laser-never-cut',
  version: 1,
  title: 'Materials that never go on the laser',
  appliesTo: { machineKinds: ['co2-laser'], materialFamilies: ['*'] },
  severity: 'danger',
  body: [
    '# Materials that never go on the laser',
    '',
    'A **Class 4** source sits inside',
    'every workshop laser.',
    '',
    '| material | why it is refused |',
    '| --- | --- |',
    '| PVC | gives off hydrogen chloride |',
    '',
    '1. Know what your sheet is.',
    '2. Ask the supervisor when in doubt.',
    '',
    '<script>window.hacked = true</script><img src="x" onerror="window.hacked = true">',
  ].join('\n'),
  sources: ['common practice'],
};

describe('safety page', () => {
  it('shows notices and local rules as formatted text, without repeating the title or rendering HTML', async () => {
    stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('hobbyist')),
      'GET /api/safety/notices': () => json(200, [markdownNotice]),
      'GET /api/safety/hazards': () => json(200, hazards),
      'GET /api/safety/local-rules': () =>
        json(200, { ...rules, body: '## Millbrook local rules\n\n1. Induction first.\n2. Book the laser.' }),
    });
    renderApp('/safety', { token: 't' });
    const notices = await screen.findByTestId('notices');
    await within(notices).findByRole('table');
    expect(within(notices).getAllByText('Materials that never go on the laser')).toHaveLength(1);
    expect(within(notices).getByText('Class 4').tagName).toBe('STRONG');
    // Lines wrapped in the file join into one paragraph.
    expect(within(notices).getByText(/every workshop laser\.$/)).toHaveTextContent(
      'A Class 4 source sits inside every workshop laser.',
    );
    const table = within(notices).getByRole('table');
    expect(within(table).getByRole('columnheader', { name: 'why it is refused' })).toBeInTheDocument();
    expect(within(table).getByRole('cell', { name: 'gives off hydrogen chloride' })).toBeInTheDocument();
    // Its scrolling box is named for what the table lists, not just "Table".
    expect(
      within(notices).getByRole('region', {
        name: 'Materials that never go on the laser: material, why it is refused',
      }),
    ).toContainElement(table);
    // Static notices are notes, not live alerts announced all at once on load (WAI-ARIA 1.2, alert role).
    expect(screen.queryAllByRole('alert')).toEqual([]);
    expect(within(notices).getAllByRole('note')).toHaveLength(1);
    expect(within(notices).getAllByRole('listitem')).toHaveLength(2);
    // ("*" alone is the notice's "every material" in its Applies to line.)
    expect(notices).not.toHaveTextContent(/#|\||\*\*|---|<script|onerror/);
    expect(notices.querySelector('script, img')).toBeNull();
    expect((window as { hacked?: boolean }).hacked).toBeUndefined();

    const local = screen.getByTestId('local-rules');
    expect(within(local).getByRole('heading', { name: 'Millbrook local rules' })).toBeInTheDocument();
    expect(
      within(local)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual(['Induction first.', 'Book the laser.']);
    expect(local).not.toHaveTextContent('##');
  });

  it('shows the notices, the hazard table (filterable and sortable) and the local rules to everyone', async () => {
    stub('hobbyist');
    const { user } = renderApp('/safety', { token: 't' });
    expect(await screen.findByText('Never leave a running laser')).toBeInTheDocument();
    expect(await screen.findByText('Book the laser on the board.')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Edit the local rules' })).not.toBeInTheDocument();

    const table = await screen.findByRole('table', { name: 'Material hazards' });
    // At phone width (375 px) the five columns scroll inside their own box instead of widening the page.
    expect(getComputedStyle(table.parentElement!).overflowX).toBe('auto');
    const families = () =>
      within(table)
        .getAllByRole('row')
        .slice(1)
        .map((r) => r.querySelector('td')?.textContent);
    // Families by the names people read, never their codes.
    expect(families()).toEqual(['ABS', 'Acrylic', 'Carbon fibre', 'Glue-backed sheet', 'PVC / vinyl']);
    await user.click(within(table).getByRole('button', { name: 'Family' }));
    expect(families()).toEqual(['PVC / vinyl', 'Glue-backed sheet', 'Carbon fibre', 'Acrylic', 'ABS']);
    await user.selectOptions(screen.getByLabelText('On a laser'), 'no');
    expect(families()).toEqual(['PVC / vinyl', 'Glue-backed sheet', 'Carbon fibre']);
    // The name shown is what a search finds.
    await user.type(screen.getByLabelText('Search materials'), 'carbon fibre');
    expect(families()).toEqual(['Carbon fibre']);
  });

  it("shows another supervisor's rules saved meanwhile, and replaces them only when saved again", async () => {
    const theirs = {
      ...rules,
      version: 4,
      body: 'Ear defenders at the router.',
      authorName: 'Bo Supervisor',
    };
    let current: LocalRulesView = rules;
    const { calls } = stubFetch({
      'GET /api/auth/me': () => json(200, userFixture('supervisor')),
      'GET /api/safety/notices': () => json(200, [notice]),
      'GET /api/safety/hazards': () => json(200, hazards),
      'GET /api/safety/local-rules': () => json(200, current),
      'PUT /api/safety/local-rules': (call) => {
        const sent = call.body as { body: string; version: number };
        if (sent.version !== current.version)
          return json(409, {
            statusCode: 409,
            code: 'SAFETY.STALE_RULES',
            message: 'The local rules changed since you opened them',
            requestId: 'r',
          });
        current = { ...current, version: current.version + 1, body: sent.body };
        return json(200, current);
      },
    });
    const { user } = renderApp('/safety', { token: 't' });
    await user.click(await screen.findByRole('button', { name: 'Edit the local rules' }));
    // Another supervisor saves while this one writes.
    current = theirs;
    const body = screen.getByLabelText('Local rules');
    await user.clear(body);
    await user.type(body, 'Goggles on at the laser.');
    await user.click(screen.getByRole('button', { name: 'Save as a new version' }));
    const shown = await screen.findByTestId('local-rules-theirs');
    expect(shown).toHaveTextContent('Bo Supervisor saved version 4 while you were writing');
    expect(shown).toHaveTextContent('Ear defenders at the router.');
    expect(screen.getByLabelText('Local rules')).toHaveValue('Goggles on at the laser.');
    // Saved again, over version 4, knowingly.
    await user.click(screen.getByRole('button', { name: 'Save as a new version' }));
    expect(await screen.findByText('Goggles on at the laser.')).toBeInTheDocument();
    expect(
      calls.filter((c) => c.method === 'PUT').map((c) => (c.body as { version: number }).version),
    ).toEqual([3, 4]);
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
      expect(calls.find((c) => c.method === 'PUT')?.body).toEqual({
        body: 'Extraction on before the beam.',
        version: 3,
      }),
    );
    expect(await screen.findByText('Extraction on before the beam.')).toBeInTheDocument();
    expect(screen.getByText(/^Version 4/)).toBeInTheDocument();
    // Saved: the keyboard is back on the button that opened the editor.
    const edit = screen.getByRole('button', { name: 'Edit the local rules' });
    await waitFor(() => expect(edit).toHaveFocus());

    // The editor opens with the keyboard in the rules, at their end; Escape leaves it while unchanged.
    await user.keyboard('{Enter}');
    const again = await screen.findByLabelText('Local rules');
    expect(again).toHaveFocus();
    expect((again as HTMLTextAreaElement).selectionStart).toBe((again as HTMLTextAreaElement).value.length);
    await user.keyboard('{Escape}');
    await waitFor(() => expect(screen.queryByLabelText('Local rules')).not.toBeInTheDocument());
    expect(screen.getByRole('button', { name: 'Edit the local rules' })).toHaveFocus();
  });
});
