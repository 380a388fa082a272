import { type ReportCrossing } from '@kerfwright/contracts';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableContainer from '@mui/material/TableContainer';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';

/** Every crossing of the model: the two pieces, the angle between their planes, its length and slot widths. */
export function CrossingTable({
  crossings,
  pieceId,
  formatLength,
}: {
  crossings: readonly ReportCrossing[];
  /** When set, only the crossings of this piece. */
  pieceId?: string;
  formatLength: (mm: number) => string;
}) {
  const rows = crossings
    .map((c, index) => ({ c, index }))
    .filter(({ c }) => !pieceId || c.a === pieceId || c.b === pieceId);
  return (
    // The rows scroll inside the box: it takes the keyboard's focus, so the arrow keys scroll it (WCAG 2.1, 2.1.1).
    <TableContainer tabIndex={0} role="region" aria-label="Crossings" sx={{ maxHeight: 320 }}>
      <Table size="small" stickyHeader aria-label="Crossings">
        <TableHead>
          <TableRow>
            <TableCell>#</TableCell>
            <TableCell>Pieces</TableCell>
            <TableCell align="right">Angle</TableCell>
            <TableCell align="right">Length</TableCell>
            <TableCell align="right">Slot width</TableCell>
            <TableCell align="right">Drawn width</TableCell>
            <TableCell align="right">Slot depth</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {rows.map(({ c, index }) => (
            <TableRow key={index}>
              <TableCell>{index + 1}</TableCell>
              <TableCell>{`${c.a} × ${c.b}`}</TableCell>
              <TableCell align="right">{`${c.angleDeg.toFixed(1)}°`}</TableCell>
              <TableCell align="right">{formatLength(c.lengthMm)}</TableCell>
              <TableCell align="right">{formatLength(c.slotWidthMm)}</TableCell>
              <TableCell align="right">{formatLength(c.drawnSlotWidthMm)}</TableCell>
              <TableCell align="right">{formatLength(c.slotDepthMm)}</TableCell>
            </TableRow>
          ))}
        </TableBody>
      </Table>
    </TableContainer>
  );
}
