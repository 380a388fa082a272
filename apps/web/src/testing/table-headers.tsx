import { screen, within } from '@testing-library/react';
import { vi } from 'vitest';
import { DataTable, type DataTableColumn } from '../components/data-table/data-table';
import { renderWithProviders } from './render-app';
import { stubScreenWidth } from './screen-width';

/**
 * One page of a list's table at a screen width, as the list renders it, and the names of the columns shown
 * (for checks of what a phone, a tablet and a desktop keep).
 */
export async function tableHeadersAt<T>(
  px: number,
  table: {
    label: string;
    columns: readonly DataTableColumn<T, string>[];
    rows: T[];
    rowKey: (row: T) => string;
    minWidth: number;
  },
): Promise<(string | null)[]> {
  stubScreenWidth(px);
  renderWithProviders(
    <DataTable
      label={table.label}
      columns={table.columns}
      rows={table.rows}
      rowKey={table.rowKey}
      minWidth={table.minWidth}
      emptyText="None."
      fetching={false}
      fetchingLabel={`Loading ${table.label}`}
      total={table.rows.length}
      page={1}
      pageSize={25}
      pageSizes={[25]}
      onPage={vi.fn()}
      onPageSize={vi.fn()}
    />,
  );
  return within(await screen.findByRole('table', { name: table.label }))
    .getAllByRole('columnheader')
    .map((h) => h.textContent);
}
