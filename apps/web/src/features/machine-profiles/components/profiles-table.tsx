import { type MachineProfileSummaryView, type ProfileSortField } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import { type DataTableColumn } from '../../../components/data-table/data-table';
import { RouterLink } from '../../../components/ui/router-link';
import { paths } from '../../../config/paths';
import { formatSheetSize, type LengthUnit } from '../../../lib/units';
import { KIND_LABELS } from './profile-labels';
import { VersionStateChip } from './version-state-chip';

/**
 * One row per machine profile: its kind, bed (in the reader's unit), the version jobs use now and the state of
 * the newest one.
 */
export const profileColumns = (
  unit: LengthUnit,
): readonly DataTableColumn<MachineProfileSummaryView, ProfileSortField>[] => [
  {
    id: 'name',
    header: 'Name',
    sortField: 'name',
    render: (p) => <RouterLink to={paths.machineProfile.getHref(p.id)}>{p.name}</RouterLink>,
  },
  { id: 'kind', header: 'Kind', sortField: 'kind', render: (p) => KIND_LABELS[p.kind] },
  {
    id: 'bed',
    hideOnTablet: true,
    header: 'Bed',
    cellSx: { whiteSpace: 'nowrap' },
    render: (p) => formatSheetSize({ widthMm: p.latest.bedWidthMm, heightMm: p.latest.bedHeightMm }, unit),
  },
  {
    id: 'current',
    header: 'In use for jobs',
    render: (p) => (p.currentApproved ? `Version ${p.currentApproved.number}` : 'None approved yet'),
  },
  {
    id: 'latest',
    hideOnPhone: true,
    header: 'Latest version',
    render: (p) => (
      <Box sx={{ display: 'flex', flexWrap: 'wrap', gap: 1, alignItems: 'center' }}>
        <span>Version {p.latest.number}</span>
        <VersionStateChip state={p.latest.state} />
      </Box>
    ),
  },
];
