import { type DesignSummary } from '@kerfwright/contracts';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Box from '@mui/material/Box';
import { Link } from 'react-router-dom';
import { RouterLink } from '../../../components/ui/router-link';
import { paths } from '../../../config/paths';
import { DataTable, type DataTableColumn } from '../../../components/data-table/data-table';
import { SearchFilter } from '../../../components/data-table/filter-bar';
import { useTableSearchParams } from '../../../components/data-table/use-table-search-params';
import { ListPage } from '../../../components/layouts/list-page';
import { DESIGN_SORT_FIELDS, type DesignSortField, useDesigns } from '../api/get-designs';
import { countOf } from '../../../lib/plural';
import { solidName } from '../lib/solid-name';
import { formatDateTime } from '../../../lib/dates';

const PAGE_SIZES = [10, 25, 50] as const;

const COLUMNS: readonly DataTableColumn<DesignSummary, DesignSortField>[] = [
  {
    id: 'name',
    header: 'Name',
    sortField: 'name',
    render: (d) => <RouterLink to={paths.design.getHref(d.id)}>{d.name}</RouterLink>,
  },
  { id: 'owner', header: 'Owner', render: (d) => d.ownerName },
  { id: 'solid', hideOnPhone: true, header: 'Solid', render: (d) => d.solidFileName ?? solidName(d.solid) },
  { id: 'pieces', hideOnPhone: true, header: 'Pieces', align: 'right', render: (d) => d.preview.pieceCount },
  {
    id: 'check',
    header: 'Check',
    render: (d) =>
      d.preview.valid ? (
        <Chip size="small" color="success" label="valid" />
      ) : (
        <Chip size="small" color="error" label={countOf(d.preview.errors.length, 'error')} />
      ),
  },
  {
    id: 'updated',
    hideOnPhone: true,
    header: 'Updated',
    sortField: 'updatedAt',
    render: (d) => formatDateTime(d.updatedAt),
  },
];

/** Saved designs (a hobbyist sees their own, staff everyone's): search, sort and page kept in the address. */
export function DesignsRoute() {
  const { params, set, tableProps } = useTableSearchParams({
    sortFields: DESIGN_SORT_FIELDS,
    defaultSort: '-updatedAt',
    pageSizes: PAGE_SIZES,
    defaultPageSize: 25,
  });
  const designs = useDesigns(params);

  return (
    <ListPage
      title="Designs"
      action={
        <Button variant="contained" component={Link} to="/designs/new">
          New design
        </Button>
      }
      intro="Saved designs. Open one in the studio to change it, copy it or request a cut."
      query={designs}
      errorTitle="The designs could not be loaded"
      filters={
        <Box sx={{ mb: 2 }}>
          <SearchFilter
            id="designs-search"
            label="Search name or description"
            value={params.q ?? ''}
            onSearch={(q) => set({ q })}
          />
        </Box>
      }
      table={
        <DataTable
          label="Designs"
          columns={COLUMNS}
          rows={designs.data?.items}
          rowKey={(d) => d.id}
          emptyText={
            params.q?.trim()
              ? `No designs match “${params.q.trim()}”.`
              : 'No designs yet. Start one with New design: pick a solid and a piece shape, then save it.'
          }
          fetching={designs.isFetching}
          fetchingLabel="Loading designs"
          total={designs.data?.total ?? 0}
          {...tableProps}
        />
      }
    />
  );
}
