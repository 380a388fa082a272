import { screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { materialFixture } from '../../../testing/fixtures';
import { tableHeadersAt } from '../../../testing/table-headers';
import { materialColumns } from './materials-table';

const headersAt = (px: number) =>
  tableHeadersAt(px, {
    label: 'Materials',
    columns: materialColumns('mm', vi.fn()),
    rows: [materialFixture({ measuredThicknessMm: 2.9 })],
    rowKey: (m) => m.id,
    minWidth: 900,
  });

describe('the materials table', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('keeps the laser verdict and the Change button on a tablet (768 px), without the stock columns', async () => {
    expect(await headersAt(768)).toEqual(['Name', 'Thickness', 'Laser', 'Change']);
    expect(screen.getByText('3 mm (measured 2.9 mm)')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Change Cast acrylic 3 mm' })).toBeInTheDocument();
  });

  it('shows every column on a desktop (1280 px)', async () => {
    expect(await headersAt(1280)).toEqual([
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
    expect(await headersAt(390)).toEqual(['Name', 'Laser', 'Change']);
    expect(screen.getByText('3 mm (measured 2.9 mm)')).toBeInTheDocument();
  });

  it('gives a sheet price as money is given on every page, thousands grouped', async () => {
    await tableHeadersAt(1280, {
      label: 'Materials',
      columns: materialColumns('mm', vi.fn()),
      rows: [
        materialFixture({
          stockSheets: [{ widthMm: 3050, heightMm: 1525, pricePerSheet: 1250, currency: 'EUR' }],
        }),
      ],
      rowKey: (m) => m.id,
      minWidth: 900,
    });
    expect(screen.getByText('3050 × 1525 mm · 1,250.00 EUR')).toBeInTheDocument();
  });

  it('gives thicknesses and sheet sizes in the unit the reader chose (1 in = 25.4 mm exactly)', async () => {
    await tableHeadersAt(1280, {
      label: 'Materials',
      columns: materialColumns('in', vi.fn()),
      rows: [materialFixture({ measuredThicknessMm: 2.9 })],
      rowKey: (m) => m.id,
      minWidth: 900,
    });
    const table = screen.getByRole('table', { name: 'Materials' });
    // 3 mm = 0.118 in, 2.9 mm = 0.114 in; a 600 × 400 mm sheet is 23.622 × 15.748 in.
    expect(table).toHaveTextContent('0.118 in (measured 0.114 in)');
    expect(table).toHaveTextContent('23.622 × 15.748 in · 14.50 EUR');
  });
});
