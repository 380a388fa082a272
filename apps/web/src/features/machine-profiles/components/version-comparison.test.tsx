import { type MachineProfileVersionView } from '@kerfwright/contracts';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { VersionComparison } from './version-comparison';
import { versionFixture } from '../../../testing/fixtures';

const version = versionFixture();

const KEY = 'Highlighted: changed from the version to its left.';

describe('versions side by side', () => {
  it('heads the column of setting names "Setting", and has no key for highlights with one version', () => {
    render(<VersionComparison versions={[version]} unit="mm" />);
    const table = screen.getByRole('table', { name: 'Versions side by side' });
    expect(within(table).getAllByRole('columnheader')[0]).toHaveTextContent(/^Setting$/);
    expect(screen.queryByText(KEY)).not.toBeInTheDocument();
  });

  it('explains the highlights once a second version stands beside the first', () => {
    const v2 = {
      ...version,
      id: 'v-2',
      number: 2,
      state: 'draft',
      rapidSpeedMmS: 350,
    } as MachineProfileVersionView;
    render(<VersionComparison versions={[version, v2]} unit="mm" />);
    expect(screen.getByText(KEY)).toBeInTheDocument();
  });

  it('scrolls in a named region the keyboard can focus, as nothing inside it takes the focus', async () => {
    const v2 = { ...version, id: 'v-2', number: 2, state: 'draft' } as MachineProfileVersionView;
    render(<VersionComparison versions={[version, v2]} unit="mm" />);
    const region = screen.getByRole('region', { name: 'Versions side by side' });
    expect(region).toContainElement(screen.getByRole('table', { name: 'Versions side by side' }));
    // Wider than a phone, the box scrolls: the arrow keys reach the later versions once it has the focus
    // (WCAG 2.1, 2.1.1; axe-core rule "scrollable-region-focusable").
    await userEvent.setup().tab();
    expect(region).toHaveFocus();
  });
});
