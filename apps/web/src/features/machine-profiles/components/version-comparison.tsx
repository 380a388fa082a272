import { type MachineProfileVersionView } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { Fragment } from 'react';
import { type LengthUnit } from '../../../lib/units';
import { versionRows } from '../utils/version-rows';
import { VersionStateChip } from './version-state-chip';
import { SCREEN_READER_ONLY } from '../../../components/ui/screen-reader-only';

/**
 * Versions side by side: one column per version (oldest on the left), one row per value. A cell that
 * differs from the version to its left is highlighted, so a change shows where it was made.
 */
export function VersionComparison({
  versions,
  unit,
}: {
  versions: readonly MachineProfileVersionView[];
  unit: LengthUnit;
}) {
  const ordered = [...versions].sort((a, b) => a.number - b.number);
  const rows = versionRows(ordered, unit);
  let section = '';
  return (
    // Positioned, so the hidden "(changed)" texts (absolutely placed) stay inside the scrolling box: otherwise
    // they escape it and widen a phone-width page. Nothing in it takes the focus, so the box does: the arrow
    // keys scroll it to the later versions (WCAG 2.1, 2.1.1).
    <TableContainer
      tabIndex={0}
      role="region"
      aria-label="Versions side by side"
      sx={{ overflowX: 'auto', position: 'relative' }}
    >
      <Table size="small" aria-label="Versions side by side" data-testid="version-comparison">
        <TableHead>
          <TableRow>
            <TableCell sx={{ minWidth: 160 }}>Setting</TableCell>
            {ordered.map((v) => (
              <TableCell key={v.id} sx={{ minWidth: 150 }}>
                <Box sx={{ display: 'flex', alignItems: 'center', gap: 1, flexWrap: 'wrap' }}>
                  <strong>Version {v.number}</strong>
                  <VersionStateChip state={v.state} />
                </Box>
              </TableCell>
            ))}
          </TableRow>
        </TableHead>
        <TableBody>
          {rows.map((row) => {
            const header = row.section !== section;
            section = row.section;
            return (
              <Fragment key={row.key}>
                {header ? (
                  <TableRow>
                    <TableCell colSpan={ordered.length + 1} sx={{ bgcolor: 'action.hover' }}>
                      <Typography variant="subtitle2" component="span">
                        {row.section}
                      </Typography>
                    </TableCell>
                  </TableRow>
                ) : null}
                <TableRow>
                  <TableCell component="th" scope="row">
                    {row.label}
                  </TableCell>
                  {row.values.map((value, i) => {
                    const changed = i > 0 && row.stored[i] !== row.stored[i - 1];
                    return (
                      <TableCell
                        key={ordered[i]!.id}
                        data-changed={changed ? 'true' : undefined}
                        sx={
                          changed
                            ? { bgcolor: 'rgba(237, 108, 2, 0.16)', fontWeight: 600 }
                            : { color: value === null ? 'text.disabled' : undefined }
                        }
                      >
                        {value === null ? '—' : value || '—'}
                        {changed ? (
                          <Box component="span" sx={SCREEN_READER_ONLY}>
                            {' '}
                            (changed)
                          </Box>
                        ) : null}
                      </TableCell>
                    );
                  })}
                </TableRow>
              </Fragment>
            );
          })}
        </TableBody>
      </Table>
      {/* With one version there is nothing to its left: no cell is highlighted, and no key is needed. */}
      {ordered.length > 1 ? (
        <Typography variant="body2" color="text.secondary" sx={{ mt: 1, px: 2, pb: 1 }}>
          Highlighted: changed from the version to its left.
        </Typography>
      ) : null}
    </TableContainer>
  );
}
