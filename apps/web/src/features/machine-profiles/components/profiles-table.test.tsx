import { type MachineProfileSummaryView } from '@kerfwright/contracts';
import { cleanup, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { versionFixture } from '../../../testing/fixtures';
import { tableHeadersAt } from '../../../testing/table-headers';
import { profileColumns } from './profiles-table';

const profile: MachineProfileSummaryView = {
  id: 'p-1',
  name: 'Workshop CO2',
  kind: 'co2-laser',
  currentApproved: versionFixture(),
  latest: versionFixture({ id: 'v-2', number: 2, state: 'submitted' }),
  createdAt: '2026-01-01T00:00:00.000Z',
};

const headersAt = (px: number) =>
  tableHeadersAt(px, {
    label: 'Machine profiles',
    columns: profileColumns('mm'),
    rows: [profile],
    rowKey: (p) => p.id,
    minWidth: 760,
  });

describe('the machine profiles table', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('keeps the latest version and its state on a tablet (768 px); only the bed goes', async () => {
    expect(await headersAt(768)).toEqual(['Name', 'Kind', 'In use for jobs', 'Latest version']);
    expect(screen.getByTestId('version-state')).toHaveTextContent('Waiting for approval');
  });

  it('shows every column on a desktop (1280 px)', async () => {
    expect(await headersAt(1280)).toEqual(['Name', 'Kind', 'Bed', 'In use for jobs', 'Latest version']);
  });

  it('gives the bed in the unit the reader chose (24 × 16 in = 609.6 × 406.4 mm)', async () => {
    const bed = { bedWidthMm: 609.6, bedHeightMm: 406.4 };
    const wide = { ...profile, latest: { ...profile.latest, ...bed } };
    for (const [unit, text] of [
      ['mm', '609.6 × 406.4 mm'],
      ['in', '24.000 × 16.000 in'],
    ] as const) {
      await tableHeadersAt(1280, {
        label: 'Machine profiles',
        columns: profileColumns(unit),
        rows: [wide],
        rowKey: (p) => p.id,
        minWidth: 760,
      });
      expect(screen.getByRole('table', { name: 'Machine profiles' })).toHaveTextContent(text);
      cleanup();
    }
  });

  it('keeps name, kind and the version in use on a phone (390 px)', async () => {
    expect(await headersAt(390)).toEqual(['Name', 'Kind', 'In use for jobs']);
  });
});
