import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { DataTable } from '../../../components/data-table/data-table';
import { materialFixture } from '../../../testing/fixtures';
import { renderWithProviders } from '../../../testing/render-app';
import { stubScreenWidth } from '../../../testing/screen-width';
import { materialColumns } from './materials-table';

function renderMaterials() {
  const onEdit = vi.fn();
  renderWithProviders(
    <DataTable
      label="Materials"
      columns={materialColumns(onEdit)}
      rows={[materialFixture({ measuredThicknessMm: 2.9 })]}
      rowKey={(m) => m.id}
      minWidth={900}
      emptyText="None."
      fetching={false}
      fetchingLabel="Loading materials"
      total={1}
      page={1}
      pageSize={25}
      pageSizes={[25]}
      onPage={vi.fn()}
      onPageSize={vi.fn()}
    />,
  );
  return { onEdit };
}

const headers = async () =>
  within(await screen.findByRole('table', { name: 'Materials' }))
    .getAllByRole('columnheader')
    .map((h) => h.textContent);

describe('the materials table', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('keeps the laser verdict and the Change button on a tablet (768 px), without the stock columns', async () => {
    stubScreenWidth(768);
    renderMaterials();
    expect(await headers()).toEqual(['Name', 'Thickness', 'Laser', 'Change']);
    expect(screen.getByText('3 mm (measured 2.9 mm)')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Change Cast acrylic 3 mm' })).toBeInTheDocument();
  });

  it('shows every column on a desktop (1280 px)', async () => {
    stubScreenWidth(1280);
    renderMaterials();
    expect(await headers()).toEqual([
      'Family',
      'Name',
      'Thickness',
      'Colours',
      'Stock sheets',
      'Laser',
      'Change',
    ]);
  });

  it('keeps name, laser verdict and Change on a phone (390 px), the thickness said under the name', async () => {
    stubScreenWidth(390);
    renderMaterials();
    expect(await headers()).toEqual(['Name', 'Laser', 'Change']);
    expect(screen.getByText('3 mm (measured 2.9 mm)')).toBeInTheDocument();
  });
});
