import { screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderWithProviders } from '../../testing/render-app';
import { stubScreenWidth } from '../../testing/screen-width';
import { DataTable, type DataTableColumn } from './data-table';

interface Row {
  id: string;
  name: string;
  count: number;
}

const columns: DataTableColumn<Row, 'name' | 'count'>[] = [
  { id: 'name', header: 'Name', sortField: 'name', render: (r) => r.name },
  { id: 'count', header: 'Count', sortField: 'count', align: 'right', render: (r) => r.count },
  { id: 'note', header: 'Note', hideOnPhone: true, render: () => '—' },
  { id: 'extra', header: 'Extra', hideOnTablet: true, render: () => '…' },
];

function renderTable(props: { sort: string; rows?: Row[]; page?: number; minWidth?: number }) {
  const handlers = { onSort: vi.fn(), onPage: vi.fn(), onPageSize: vi.fn() };
  const utils = renderWithProviders(
    <DataTable
      label="Things"
      columns={columns}
      rows={props.rows}
      rowKey={(r) => r.id}
      emptyText="Nothing here."
      fetching={false}
      fetchingLabel="Loading things"
      total={60}
      page={props.page ?? 1}
      pageSize={25}
      pageSizes={[10, 25, 50]}
      sort={props.sort}
      minWidth={props.minWidth}
      {...handlers}
    />,
  );
  return { ...utils, ...handlers };
}

describe('the shared data table', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('sorts by a header, and a second click on the sorted header reverses the order', async () => {
    const { user, onSort } = renderTable({ sort: 'name', rows: [{ id: '1', name: 'Alpha', count: 3 }] });
    const table = await screen.findByRole('table', { name: 'Things' });
    await user.click(within(table).getByRole('button', { name: 'Name' }));
    expect(onSort).toHaveBeenLastCalledWith('-name');
    await user.click(within(table).getByRole('button', { name: 'Count' }));
    expect(onSort).toHaveBeenLastCalledWith('count');
    // Only columns with a sort field are sortable.
    expect(within(table).queryByRole('button', { name: 'Note' })).not.toBeInTheDocument();
    expect(within(table).getByText('Alpha')).toBeInTheDocument();
  });

  it('pages with the API’s 1-based page numbers and says when a page is empty', async () => {
    const { user, onPage } = renderTable({ sort: '-count', rows: [], page: 2 });
    expect(await screen.findByText('Nothing here.')).toBeInTheDocument();
    expect(screen.getByText('26–50 of 60')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Go to next page' }));
    expect(onPage).toHaveBeenCalledWith(3);
  });

  it('leaves the secondary columns out on a phone-wide screen, and keeps them on a wider one', async () => {
    const rows = [{ id: '1', name: 'Alpha', count: 3 }];
    stubScreenWidth(390);
    const phone = renderTable({ sort: 'name', rows });
    const narrow = await screen.findByRole('table', { name: 'Things' });
    expect(
      within(narrow)
        .getAllByRole('columnheader')
        .map((h) => h.textContent),
    ).toEqual(['Name', 'Count']);
    expect(within(narrow).getAllByRole('cell')).toHaveLength(2);
    phone.unmount();
    stubScreenWidth(1280);
    renderTable({ sort: 'name', rows });
    const wide = await screen.findByRole('table', { name: 'Things' });
    expect(
      within(wide)
        .getAllByRole('columnheader')
        .map((h) => h.textContent),
    ).toEqual(['Name', 'Count', 'Note', 'Extra']);
  });

  it('fits a tablet-wide screen: its secondary columns go and it has no minimum width there', async () => {
    const rows = [{ id: '1', name: 'Alpha', count: 3 }];
    const headers = (table: HTMLElement) =>
      within(table)
        .getAllByRole('columnheader')
        .map((h) => h.textContent);
    // 768 px: a tablet held upright, below the theme's md (900 px).
    stubScreenWidth(768);
    const tablet = renderTable({ sort: 'name', rows, minWidth: 900 });
    const middle = await screen.findByRole('table', { name: 'Things' });
    expect(headers(middle)).toEqual(['Name', 'Count', 'Note']);
    expect(getComputedStyle(middle).minWidth).not.toBe('900px');
    tablet.unmount();
    stubScreenWidth(1280);
    renderTable({ sort: 'name', rows, minWidth: 900 });
    const wide = await screen.findByRole('table', { name: 'Things' });
    expect(headers(wide)).toEqual(['Name', 'Count', 'Note', 'Extra']);
    expect(getComputedStyle(wide).minWidth).toBe('900px');
  });
});
