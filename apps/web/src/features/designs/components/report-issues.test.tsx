import { screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../../testing/render-app';
import { ReportIssues } from './report-issues';

const warning = (i: number) => ({ code: 'SLOT.THIN_WEB', message: `finding number ${i}`, pieces: [`P${i}`] });

describe('report findings', () => {
  it('shows the first findings of a long report and the rest on request', async () => {
    const onSelect = vi.fn();
    const warnings = Array.from({ length: 15 }, (_, i) => warning(i + 1));
    const { user } = renderWithProviders(
      <ReportIssues errors={[]} warnings={warnings} onSelectPiece={onSelect} limit={12} />,
    );
    expect(screen.getByText('finding number 12')).toBeInTheDocument();
    expect(screen.queryByText('finding number 13')).not.toBeInTheDocument();
    expect(screen.getByText('3 more findings are not shown.')).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Show all 15' }));
    expect(screen.getByText('finding number 15')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'P15' }));
    expect(onSelect).toHaveBeenCalledWith('P15');

    await user.click(screen.getByRole('button', { name: 'Show fewer' }));
    expect(screen.queryByText('finding number 15')).not.toBeInTheDocument();
  });

  it('says so when the engine found nothing', () => {
    renderWithProviders(<ReportIssues errors={[]} warnings={[]} onSelectPiece={() => undefined} />);
    expect(screen.getByTestId('report-valid')).toBeInTheDocument();
  });
});
