import Box from '@mui/material/Box';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { memo } from 'react';
import {
  formatLength,
  formatMinutes,
  formatMoney,
  formatPercent,
  formatRunLength,
  formatSheetSize,
  type LengthUnit,
} from '../../../lib/units';
import { cutFigures, type SheetView } from '../lib/sheet-views';
import { stockColour } from './piece-colours';
import { countOf } from '../../../lib/plural';

/** Time and cost of a job's layout (from the geometry library's estimates). */
export interface LayoutEstimateView {
  cutLengthMm: number;
  pierces: number;
  minutes: number;
  machineCost: number;
  /** Null when the stock sheet has no price for this size. */
  materialCost: number | null;
  currency: string;
}

interface SheetLayoutViewProps {
  sheets: readonly SheetView[];
  unit: LengthUnit;
  /** Time and cost when a machine and a material price are known; without, cut length and pierces only. */
  estimate?: LayoutEstimateView | null;
}

/**
 * Every sheet of a layout drawn to scale (SVG), its pieces in their stock colours with their ids, each
 * sheet's utilisation, the sheet count and the estimates. Every length follows `unit`.
 */
export const SheetLayoutView = memo(function SheetLayoutView({
  sheets,
  unit,
  estimate,
}: SheetLayoutViewProps) {
  const fmt = (mm: number) => formatLength(mm, unit);
  const figures = estimate ?? cutFigures(sheets);
  const areaUsed = sheets.reduce((s, sh) => s + sh.utilisation * sh.widthMm * sh.heightMm, 0);
  const areaAll = sheets.reduce((s, sh) => s + sh.widthMm * sh.heightMm, 0);
  const first = sheets[0];
  return (
    <Box data-testid="sheet-layout">
      <Stack
        direction="row"
        spacing={3}
        sx={{ mb: 2, flexWrap: 'wrap' }}
        useFlexGap
        data-testid="layout-facts"
      >
        <Figure label="Sheets" value={String(sheets.length)} />
        {first ? <Figure label="Sheet size" value={formatSheetSize(first, unit)} /> : null}
        <Figure label="Utilisation" value={areaAll > 0 ? formatPercent(areaUsed / areaAll) : '—'} />
        <Figure label="Cut length" value={formatRunLength(figures.cutLengthMm, unit)} />
        <Figure label="Pierces" value={String(figures.pierces)} />
        {estimate ? (
          <>
            <Figure label="Machine time" value={formatMinutes(estimate.minutes)} />
            {estimate.materialCost !== null ? (
              <Figure
                label="Cost"
                value={formatMoney(estimate.machineCost + estimate.materialCost, estimate.currency)}
              />
            ) : null}
            <Figure label="Machine" value={formatMoney(estimate.machineCost, estimate.currency)} />
            <Figure
              label="Material"
              value={
                estimate.materialCost === null
                  ? 'no price for this sheet size'
                  : formatMoney(estimate.materialCost, estimate.currency)
              }
            />
          </>
        ) : null}
      </Stack>
      <Box
        sx={{
          display: 'grid',
          gap: 2,
          gridTemplateColumns: { xs: '1fr', sm: 'repeat(auto-fill, minmax(260px, 1fr))' },
        }}
      >
        {sheets.map((sheet, i) => (
          <SheetDrawing key={i} sheet={sheet} index={i} count={sheets.length} formatLength={fmt} />
        ))}
      </Box>
    </Box>
  );
});

function Figure({ label, value }: { label: string; value: string }) {
  return (
    <Box>
      <Typography variant="caption" color="text.secondary" component="div">
        {label}
      </Typography>
      <Typography variant="body2" sx={{ fontWeight: 500 }}>
        {value}
      </Typography>
    </Box>
  );
}

function SheetDrawing({
  sheet,
  index,
  count,
  formatLength: fmt,
}: {
  sheet: SheetView;
  index: number;
  count: number;
  formatLength: (mm: number) => string;
}) {
  const { widthMm: w, heightMm: h } = sheet;
  const colour = sheet.colourName ?? `colour ${sheet.colourIndex + 1}`;
  const title = `Sheet ${index + 1} of ${count}`;
  const stroke = Math.max(w, h) / 500;
  // Sheet coordinates have y up; the SVG's y goes down, so y is drawn as h − y.
  const path = (outline: readonly [number, number][]) =>
    `M ${outline.map(([x, y]) => `${x.toFixed(2)} ${(h - y).toFixed(2)}`).join(' L ')} Z`;
  return (
    <Box component="figure" sx={{ m: 0 }} data-testid="layout-sheet">
      <Box
        component="svg"
        role="img"
        aria-label={`${title}, ${colour}, ${fmt(w)} by ${fmt(h)}, ${countOf(sheet.pieces.length, 'piece')}, ${formatPercent(sheet.utilisation)} used`}
        viewBox={`${-stroke * 2} ${-stroke * 2} ${w + stroke * 4} ${h + stroke * 4}`}
        sx={{ width: '100%', height: 'auto', display: 'block' }}
      >
        <rect x={0} y={0} width={w} height={h} fill="#fbfaf7" stroke="#2d3b45" strokeWidth={stroke} />
        {sheet.marginMm > 0 ? (
          <rect
            x={sheet.marginMm}
            y={sheet.marginMm}
            width={Math.max(0, w - 2 * sheet.marginMm)}
            height={Math.max(0, h - 2 * sheet.marginMm)}
            fill="none"
            stroke="#9aa5ad"
            strokeDasharray={`${stroke * 6} ${stroke * 4}`}
            strokeWidth={stroke / 2}
          />
        ) : null}
        {sheet.pieces.map((piece, j) => {
          const xs = piece.outline.map((p) => p[0]);
          const ys = piece.outline.map((p) => p[1]);
          const minX = Math.min(...xs);
          const maxX = Math.max(...xs);
          const minY = Math.min(...ys);
          const maxY = Math.max(...ys);
          const font = Math.max(Math.min(maxX - minX, maxY - minY) / 5, Math.max(w, h) / 120);
          return (
            <g key={`${piece.id}-${j}`}>
              <path
                d={path(piece.outline)}
                fill={stockColour(sheet.colourName, piece.colourIndex)}
                fillOpacity={0.7}
                stroke="#2d3b45"
                strokeWidth={stroke}
              />
              <text
                x={(minX + maxX) / 2}
                y={h - (minY + maxY) / 2}
                fontSize={font}
                textAnchor="middle"
                dominantBaseline="central"
                fill="#1d262c"
                fontWeight={700}
              >
                {piece.id}
              </text>
            </g>
          );
        })}
      </Box>
      <Typography component="figcaption" variant="body2" sx={{ mt: 0.5 }}>
        {`${title} · ${colour} · ${countOf(sheet.pieces.length, 'piece')} · ${formatPercent(sheet.utilisation)} used`}
      </Typography>
    </Box>
  );
}
