import {
  type KerfRecordView,
  type MachineProfileDetailView,
  type MachineProfileVersionView,
} from '@kerfwright/contracts';
import { render, screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { json, stubFetch } from '../../../testing/fetch-stub';
import { renderWithProviders } from '../../../testing/render-app';
import { KerfHistoryChart, spreadLabels, tickDecimals, timeTickLabel } from './kerf-history-chart';
import { KerfHistoryPanel } from './kerf-history-panel';
import { VersionComparison } from './version-comparison';
import { versionFixture } from '../../../testing/fixtures';

const record = (id: string, kerfMm: number, day: number): KerfRecordView => ({
  id,
  profileId: 'p-1',
  materialId: 'm-acrylic',
  materialName: 'Cast acrylic 3 mm',
  kerfMm,
  jobId: null,
  notes: '',
  recordedBy: 'Amara Osei',
  adoptedVersionId: null,
  createdAt: `2026-01-${String(day).padStart(2, '0')}T10:00:00.000Z`,
});

// Kerfs a few thousandths apart, as a CO2 laser gives in 3 mm acrylic (about 0.08 mm, common practice).
const records = [record('k-1', 0.078, 1), record('k-2', 0.165, 3), record('k-3', 0.084, 5)];

describe('kerf history chart', () => {
  it('labels the value axis with as many decimals as its steps need, each label once', () => {
    render(
      <KerfHistoryChart
        records={[record('k-1', 0.078, 1), record('k-2', 0.081, 3), record('k-3', 0.084, 5)]}
        references={[]}
        quantity="kerf"
        unit="mm"
      />,
    );
    const labels = screen.getAllByTestId('kerf-tick').map((t) => t.textContent);
    expect(labels.length).toBeGreaterThan(2);
    expect(new Set(labels).size).toBe(labels.length);
    expect(labels).toContain('0.080');
  });

  it('spans the same kerfs in inches as in millimetres, its headroom converted too', () => {
    const ticksIn = (unit: 'mm' | 'in') => {
      const { unmount } = render(
        <KerfHistoryChart
          records={[record('k-1', 0.08, 1)]}
          references={[{ label: 'Approved v1', valueMm: 0.08, colour: '#2e7d32' }]}
          quantity="kerf"
          unit={unit}
        />,
      );
      const ticks = screen.getAllByTestId('kerf-tick').map((t) => Number(t.textContent));
      unmount();
      return ticks;
    };
    const mm = ticksIn('mm');
    // 1 in = 25.4 mm exactly: the inch axis covers the millimetre axis's span, converted, give or take a step.
    const inches = ticksIn('in').map((t) => t * 25.4);
    expect(Math.min(...inches)).toBeGreaterThan(Math.min(...mm) - 0.01);
    expect(Math.max(...inches)).toBeLessThan(Math.max(...mm) + 0.01);
  });

  it('keeps the labels of close reference lines apart', () => {
    render(
      <KerfHistoryChart
        records={records}
        references={[
          { label: 'Approved v1', valueMm: 0.08, colour: '#2e7d32' },
          { label: 'Draft v2', valueMm: 0.081, colour: '#ed6c02', dashed: true },
        ]}
        quantity="kerf"
        unit="mm"
      />,
    );
    const [approved, draft] = screen.getAllByTestId('kerf-reference-label');
    expect(approved).toHaveTextContent('Approved v1: 0.08 mm');
    expect(draft).toHaveTextContent('Draft v2: 0.081 mm');
    // One line of 12 px text needs at least 12 px.
    const gap = Math.abs(Number(approved!.getAttribute('y')) - Number(draft!.getAttribute('y')));
    expect(gap).toBeGreaterThanOrEqual(12);
  });

  it('counts the measurements in words, one or many', () => {
    const { unmount } = render(
      <KerfHistoryChart records={[record('k-1', 0.078, 1)]} references={[]} quantity="kerf" unit="mm" />,
    );
    expect(screen.getByRole('img', { name: 'Measured kerf over time: 1 measurement' })).toBeInTheDocument();
    expect(screen.getByText(/^1 measurement; mean 0\.078 mm\./)).toBeInTheDocument();
    unmount();
    render(<KerfHistoryChart records={records} references={[]} quantity="kerf" unit="mm" />);
    expect(screen.getByRole('img', { name: 'Measured kerf over time: 3 measurements' })).toBeInTheDocument();
    expect(screen.getByText(/^3 measurements; mean/)).toBeInTheDocument();
    expect(screen.queryByText(/\(s\)/)).not.toBeInTheDocument();
  });

  it('says the day on a time axis of a few hours: at its first tick and where the day changes', () => {
    const at = (h: number) => new Date(2026, 11, 5, h, 0).getTime();
    const day = (h: number) =>
      new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short' }).format(at(h));
    const hours = 3 * 3600 * 1000;
    expect(timeTickLabel(at(1), undefined, hours)).toMatch(new RegExp(`^${day(1)}, `));
    expect(timeTickLabel(at(2), at(1), hours)).not.toContain(day(2));
    expect(timeTickLabel(at(24), at(23), hours)).toMatch(new RegExp(`^${day(24)}, `));
    // Over weeks, the day alone.
    expect(timeTickLabel(at(1), undefined, 20 * 24 * hours)).toBe(day(1));
    // Over a few minutes, ticks half a minute apart differ by their seconds.
    const t0 = at(2);
    const a = timeTickLabel(t0, t0 - 30_000, 3 * 60_000);
    const b = timeTickLabel(t0 + 30_000, t0, 3 * 60_000);
    expect(a).not.toBe(b);
  });

  it('moves labels only as far as needed, inside the plot', () => {
    expect(spreadLabels([100, 200], 0, 300)).toEqual([100, 200]);
    expect(spreadLabels([100, 101], 0, 300)).toEqual([100, 115]);
    expect(spreadLabels([299, 298], 0, 300)).toEqual([300, 285]);
    expect(tickDecimals([0.07, 0.075, 0.08])).toBe(3);
    expect(tickDecimals([0, 0.5, 1])).toBe(2);
  });
});

const version = versionFixture();

const profile = {
  id: 'p-1',
  name: 'CO2 laser, 60 W',
  kind: 'co2-laser',
  currentApproved: version,
  latest: version,
  versions: [version],
  createdAt: '2026-01-01T00:00:00.000Z',
} as unknown as MachineProfileDetailView;

describe('kerf history panel', () => {
  it('keeps its table of measurements inside a phone-width page (it scrolls in its own box)', async () => {
    stubFetch({
      'GET /api/machine-profiles/p-1/kerf-records': () =>
        json(200, { items: records, total: records.length, page: 1, pageSize: 1000 }),
    });
    renderWithProviders(<KerfHistoryPanel profile={profile} unit="mm" onAdopted={() => undefined} />);
    const table = await screen.findByRole('table', { name: 'Measured kerfs' });
    expect(within(table).getByText('0.165 mm')).toBeInTheDocument();
    expect(getComputedStyle(table.parentElement!).overflowX).toBe('auto');
  });
});

// 1 in = 25.4 mm exactly (international yard and pound agreement, 1959).
describe('kerf history panel in inches', () => {
  it('gives the measurements, the chart and the adopted value in inches', async () => {
    let adopted = false;
    stubFetch({
      'GET /api/machine-profiles/p-1/kerf-records': () =>
        json(200, { items: records, total: records.length, page: 1, pageSize: 1000 }),
      'POST /api/machine-profiles/p-1/kerf-records/k-2/adopt': () => {
        adopted = true;
        return json(201, version);
      },
    });
    const notices: string[] = [];
    const { user } = renderWithProviders(
      <KerfHistoryPanel profile={profile} unit="in" onAdopted={(m) => notices.push(m)} />,
    );
    const table = await screen.findByRole('table', { name: 'Measured kerfs' });
    // 0.165 mm = 0.0064961 in, read 0.0065 in (0.1651 mm); 0.078 mm = 0.0030709 in, read 0.00307 in, as 0.0031 in
    // would be 0.07874 mm.
    expect(within(table).getByText('0.0065 in')).toBeInTheDocument();
    expect(within(table).getByText('0.00307 in')).toBeInTheDocument();
    expect(within(table).queryByText(/mm/)).not.toBeInTheDocument();
    expect(screen.getByTestId('kerf-chart')).toHaveTextContent('kerf (in)');
    // The approved version's 0.08 mm is 0.00315 in.
    expect(screen.getByTestId('kerf-reference-label')).toHaveTextContent('Approved v1: 0.00315 in');
    await user.click(screen.getByRole('button', { name: 'Adopt 0.0065 in' }));
    await waitFor(() => expect(notices).toEqual(['0.0065 in is in draft version 1.']));
    expect(adopted).toBe(true);
  });
});

describe('kerf history panel, adopting', () => {
  it('keeps the keyboard on the row adopted, where its button was', async () => {
    let adopted = false;
    stubFetch({
      'GET /api/machine-profiles/p-1/kerf-records': () =>
        json(200, {
          items: records.map((r) => (adopted && r.id === 'k-2' ? { ...r, adoptedVersionId: version.id } : r)),
          total: records.length,
          page: 1,
          pageSize: 1000,
        }),
      'POST /api/machine-profiles/p-1/kerf-records/k-2/adopt': () => {
        adopted = true;
        return json(201, version);
      },
    });
    const { user } = renderWithProviders(
      <KerfHistoryPanel profile={profile} unit="mm" onAdopted={() => undefined} />,
    );
    await user.click(await screen.findByRole('button', { name: 'Adopt 0.165 mm' }));
    const done = await screen.findByText(`Adopted into version ${version.number}`);
    await waitFor(() => expect(done).toHaveFocus());
  });
});

describe('versions side by side', () => {
  it('keeps its hidden "(changed)" texts inside its scrolling box, so a phone-width page stays narrow', () => {
    const v2 = {
      ...version,
      id: 'v-2',
      number: 2,
      state: 'draft',
      settings: [{ ...version.settings[0]!, kerfMm: 0.082 }],
    } as MachineProfileVersionView;
    render(<VersionComparison versions={[v2, version]} unit="mm" />);
    const table = screen.getByRole('table', { name: 'Versions side by side' });
    expect(within(table).getByText('(changed)', { exact: false })).toBeInTheDocument();
    // The hidden texts are placed absolutely: a box that is not positioned would not clip them.
    const box = getComputedStyle(table.parentElement!);
    expect(box.overflowX).toBe('auto');
    expect(box.position).toBe('relative');
  });
});
