import { type MaterialSortField, type MaterialView } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Typography from '@mui/material/Typography';
import { type DataTableColumn } from '../../../components/data-table/data-table';
import { PhoneOnly } from '../../../components/ui/phone-only';
import { formatMoney, formatSheetSize, formatStockThickness, type LengthUnit } from '../../../lib/units';
import { FAMILY_LABELS } from './material-labels';

type Column = DataTableColumn<MaterialView, MaterialSortField>;

function thickness(m: MaterialView, unit: LengthUnit): string {
  const nominal = formatStockThickness(m.nominalThicknessMm, unit);
  return m.measuredThicknessMm === null
    ? nominal
    : `${nominal} (measured ${formatStockThickness(m.measuredThicknessMm, unit)})`;
}

function sheets(m: MaterialView, unit: LengthUnit) {
  if (m.stockSheets.length === 0) return '—';
  return m.stockSheets.map((s, i) => (
    <Box key={i} sx={{ whiteSpace: 'nowrap' }}>
      {`${formatSheetSize(s, unit)} · ${formatMoney(s.pricePerSheet, s.currency)}`}
    </Box>
  ));
}

const columnsIn = (unit: LengthUnit): readonly Column[] => [
  {
    id: 'family',
    hideOnTablet: true,
    header: 'Family',
    sortField: 'family',
    render: (m) => FAMILY_LABELS[m.family],
  },
  {
    id: 'name',
    header: 'Name',
    sortField: 'name',
    render: (m) => (
      <>
        {m.name}
        {m.flexible ? (
          <Typography component="span" color="text.secondary" sx={{ fontSize: 'inherit' }}>
            {' '}
            (flexible)
          </Typography>
        ) : null}
        {/* On a phone the Thickness column goes: the thickness is said under the name. */}
        <PhoneOnly>{thickness(m, unit)}</PhoneOnly>
      </>
    ),
  },
  {
    id: 'thickness',
    hideOnPhone: true,
    header: 'Thickness',
    sortField: 'nominalThicknessMm',
    cellSx: { whiteSpace: 'nowrap' },
    render: (m) => thickness(m, unit),
  },
  { id: 'colours', hideOnTablet: true, header: 'Colours', render: (m) => m.colours.join(', ') || '—' },
  {
    id: 'sheets',
    hideOnTablet: true,
    header: 'Stock sheets',
    cellSx: { fontSize: '0.8125rem' },
    render: (m) => sheets(m, unit),
  },
  {
    id: 'laser',
    header: 'Laser',
    cellSx: { maxWidth: 320, minWidth: { xs: 120, sm: 0 }, overflowWrap: 'anywhere' },
    render: (m) =>
      m.laserAllowed ? (
        <>
          <Chip size="small" color="success" variant="outlined" label="Allowed" />
          {/* A family a laser cuts only on a condition (felt, an unlisted material) carries it in its note. */}
          {m.hazardNote ? (
            <Typography variant="body2" color="text.secondary" sx={{ mt: 0.5 }} data-testid="laser-note">
              {m.hazardNote}
            </Typography>
          ) : null}
        </>
      ) : (
        <>
          <Chip size="small" color="error" label="Not for lasers" />
          <Typography variant="body2" color="error" sx={{ mt: 0.5 }} data-testid="laser-refusal-reason">
            {m.hazardNote}
          </Typography>
        </>
      ),
  },
];

/**
 * One row per material (a material kept off the laser says so in red, with its reason), its thickness and
 * sheet sizes in the reader's unit, with a Change
 * button per row for those who may edit.
 */
export function materialColumns(
  unit: LengthUnit,
  onEdit?: (material: MaterialView) => void,
): readonly Column[] {
  const columns = columnsIn(unit);
  if (!onEdit) return columns;
  return [
    ...columns,
    {
      id: 'change',
      header: 'Change',
      align: 'right',
      cellSx: { px: { xs: 1, sm: 2 } },
      render: (m) => (
        <Button size="small" onClick={() => onEdit(m)} aria-label={`Change ${m.name}`}>
          Change
        </Button>
      ),
    },
  ];
}

/** A material kept off the laser: its row is tinted red. */
export const materialRowSx = (m: MaterialView) =>
  m.laserAllowed ? undefined : { bgcolor: 'rgba(211, 47, 47, 0.06)' };
