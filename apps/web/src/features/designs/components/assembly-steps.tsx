import { type DesignReport } from '@kerfwright/contracts';
import { assemblyStepsOfReport, STRAIGHT_DEG } from '@kerfwright/geometry';
import Alert from '@mui/material/Alert';
import Chip from '@mui/material/Chip';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import { useMemo } from 'react';
import { useScrollFocus } from '../../../lib/use-scroll-focus';

/**
 * The suggested assembly order (the same as the cut pack's assembly guide): each step's new piece, the placed
 * pieces it slides onto, and for rigid stock how far apart its slots run when it engages several at once.
 */
export function AssemblySteps({
  report,
  onSelectPiece,
}: {
  report: DesignReport;
  onSelectPiece: (id: string) => void;
}) {
  const scrollFocus = useScrollFocus('Assembly order');
  const steps = useMemo(() => assemblyStepsOfReport(report), [report]);
  const rigid = !report.stock.flexible;
  const crooked = rigid ? steps.filter((s) => s.spreadDeg > STRAIGHT_DEG).length : 0;
  return (
    <Stack spacing={1}>
      <Alert severity={crooked > 0 ? 'warning' : 'info'} data-testid="assembly-summary">
        {crooked > 0
          ? `Rigid stock moves one way at a time: in ${crooked} of the ${steps.length} steps the new piece slides ` +
            'onto slots that run in different directions. Use a little flex, or leave the neighbouring joints ' +
            'part-way out until it is in.'
          : `Add the pieces in this order: each new piece is held by at least one piece already in place.`}
      </Alert>
      <TableContainer {...scrollFocus} sx={{ maxHeight: 360 }}>
        <Table size="small" stickyHeader aria-label="Assembly order">
          <TableHead>
            <TableRow>
              <TableCell>Step</TableCell>
              <TableCell>Piece</TableCell>
              <TableCell>Slides onto</TableCell>
              <TableCell align="right">Slots apart</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {steps.map((s, i) => (
              <TableRow key={s.piece}>
                <TableCell>{i + 1}</TableCell>
                <TableCell>
                  <Chip size="small" label={s.piece} onClick={() => onSelectPiece(s.piece)} />
                </TableCell>
                <TableCell>
                  {s.joins.length ? s.joins.map((j) => j.piece).join(', ') : 'first piece: hold it upright'}
                </TableCell>
                <TableCell align="right">
                  {rigid && s.spreadDeg > STRAIGHT_DEG ? `${Math.round(s.spreadDeg)}°` : '—'}
                </TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      </TableContainer>
    </Stack>
  );
}
