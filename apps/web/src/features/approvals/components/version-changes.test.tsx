import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../testing/render-app';
import { VersionChanges } from './version-changes';
import { stubScreenWidth } from '../../../testing/screen-width';
import { versionFixture } from '../../../testing/fixtures';

const approved = versionFixture({
  profileId: 'p-laser',
  settings: [{ ...versionFixture().settings[0]!, kerfMm: 0.18 }],
});

const NOTES =
  'Kerf measured on three coupons cut from the new acrylic batch, at the same speed and power as before; the lens was cleaned first.';

const waiting = versionFixture({
  ...approved,
  id: 'v-2',
  number: 2,
  state: 'submitted',
  settings: [{ ...approved.settings[0]!, kerfMm: 0.16 }],
  notes: NOTES,
});

afterEach(() => vi.unstubAllGlobals());

describe('changes of a waiting version', () => {
  it('on a phone, gives each setting a block of its own with the old and the new value under its name', () => {
    stubScreenWidth(390);
    renderWithProviders(<VersionChanges approved={approved} waiting={waiting} unit="mm" />);
    // No five-column table to run off the screen's edge.
    expect(screen.queryByRole('table')).not.toBeInTheDocument();
    const list = screen.getByRole('list', { name: 'Changes in version 2' });
    const changes = within(list).getAllByTestId('version-change');
    expect(changes).toHaveLength(2);
    const kerf = changes.find((c) => c.textContent?.startsWith('Cast acrylic'))!;
    expect(kerf).toHaveTextContent('Cast acrylic 3 mm · Kerf');
    expect(within(kerf).getByText('Approved (version 1)')).toBeInTheDocument();
    expect(within(kerf).getByText('0.18 mm')).toBeInTheDocument();
    expect(within(kerf).getByText('Version 2')).toBeInTheDocument();
    expect(within(kerf).getByText('0.16 mm')).toBeInTheDocument();
    // The long notes wrap across the block's width.
    const notes = changes.find((c) => c.textContent?.startsWith('Machine · Notes'))!;
    expect(getComputedStyle(within(notes).getByText(NOTES)).overflowWrap).toBe('anywhere');
  });

  it('on a wide screen, heads the column of setting names "Setting"', () => {
    stubScreenWidth(1280);
    renderWithProviders(<VersionChanges approved={approved} waiting={waiting} unit="mm" />);
    const table = screen.getByRole('table', { name: 'Changes in version 2' });
    const headers = within(table)
      .getAllByRole('columnheader')
      .map((h) => h.textContent);
    expect(headers).toEqual(['Material or machine', 'Setting', 'Approved (version 1)', 'Version 2']);
    expect(within(table).getAllByTestId('version-change')).toHaveLength(2);
  });
});
