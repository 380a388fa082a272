import { type ReportPiece } from '@kerfwright/contracts';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import { pieceColour } from '../../layout/components/piece-colours';
import { countOf } from '../../../lib/plural';
import { pieceHasShape } from './piece-slab';

interface PieceView2dProps {
  piece: ReportPiece;
  colourIndex: number | undefined;
  /** Ids of pieces that an error or warning names: drawn with a red edge. */
  flagged: boolean;
  formatLength: (mm: number) => string;
}

/**
 * One piece in its own 2D frame: the compensated outline, each slot with the id of the piece it receives and
 * its width, and the overall dimensions. y points up as in the piece's frame (the SVG is flipped).
 */
export function PieceView2d({ piece, colourIndex, flagged, formatLength }: PieceView2dProps) {
  if (!pieceHasShape(piece)) {
    return (
      <Alert severity="warning" data-testid="piece-2d-empty">
        {`Piece ${piece.id} has no outline left at this size: its slots take up the whole piece. Make the model larger or the stock thinner.`}
      </Alert>
    );
  }
  const xs = piece.outline.map((p) => p[0]);
  const ys = piece.outline.map((p) => p[1]);
  const minX = Math.min(...xs);
  const maxX = Math.max(...xs);
  const minY = Math.min(...ys);
  const maxY = Math.max(...ys);
  const w = maxX - minX;
  const h = maxY - minY;
  // A sliver of a piece is still drawn at a visible scale: the frame never collapses to zero.
  const span = Math.max(w, h, 1e-3);
  const pad = span * 0.14;
  const font = span / 34;
  const path = `M ${piece.outline.map(([x, y]) => `${x} ${-y}`).join(' L ')} Z`;
  return (
    <Box
      component="svg"
      data-testid="piece-2d"
      role="img"
      aria-label={`Piece ${piece.id}, ${formatLength(w)} by ${formatLength(h)}, ${countOf(piece.slotCount, 'slot')}`}
      viewBox={`${minX - pad} ${-maxY - pad} ${w + 2 * pad} ${h + 2 * pad}`}
      sx={{ width: '100%', height: 360, bgcolor: '#fbfaf7', borderRadius: 1 }}
    >
      <path
        d={path}
        fill={pieceColour(colourIndex)}
        fillOpacity={0.55}
        stroke={flagged ? '#b3261e' : '#2d3b45'}
        strokeWidth={span / 400}
      />
      {(piece.slots ?? []).filter(slotIsFinite).map((slot, i) => {
        const [ox, oy] = slot.openingMm;
        const [dx, dy] = slot.direction;
        const lx = ox + dx * slot.depthMm * 0.5;
        const ly = oy + dy * slot.depthMm * 0.5;
        return (
          <g key={`${slot.partner}-${i}`}>
            <line
              x1={ox}
              y1={-oy}
              x2={ox + dx * slot.depthMm}
              y2={-(oy + dy * slot.depthMm)}
              stroke="#b8643a"
              strokeDasharray={`${font / 2} ${font / 3}`}
              strokeWidth={span / 500}
            />
            <text x={lx} y={-ly} fontSize={font} fill="#5a2a10" textAnchor="middle">
              {`${slot.partner} · ${formatLength(slot.widthMm)}`}
            </text>
          </g>
        );
      })}
      <text x={0} y={font / 2} fontSize={font * 1.6} textAnchor="middle" fill="#2d3b45" fontWeight={700}>
        {piece.id}
      </text>
      <text x={(minX + maxX) / 2} y={-minY + pad * 0.7} fontSize={font} textAnchor="middle" fill="#2d3b45">
        {`width ${formatLength(w)}`}
      </text>
      <text
        x={maxX + pad * 0.6}
        y={-(minY + maxY) / 2}
        fontSize={font}
        textAnchor="middle"
        fill="#2d3b45"
        transform={`rotate(-90 ${maxX + pad * 0.6} ${-(minY + maxY) / 2})`}
      >
        {`height ${formatLength(h)}`}
      </text>
    </Box>
  );
}

type Slot = NonNullable<ReportPiece['slots']>[number];

/** A slot whose numbers are all finite (one that is not is left out rather than drawn with NaN). */
function slotIsFinite(slot: Slot): boolean {
  return [...slot.openingMm, ...slot.direction, slot.depthMm].every(Number.isFinite);
}
