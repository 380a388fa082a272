import { type KerfRecordView } from '@kerfwright/contracts';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import { countOf } from '../../../lib/plural';
import { formatKerf, type LengthUnit, MM_PER_INCH } from '../../../lib/units';
import { useElementWidth } from '../../../lib/use-element-width';

/** A reference line: the kerf (or tool diameter) a profile version holds for the material. */
export interface KerfReference {
  label: string;
  valueMm: number;
  colour: string;
  dashed?: boolean;
}

interface KerfHistoryChartProps {
  records: readonly KerfRecordView[];
  references: readonly KerfReference[];
  /** What the values are ("kerf" or "cut width"), for the labels. */
  quantity: string;
  /** The unit the axis and the labels give the values in. */
  unit: LengthUnit;
  /** The drawing's width in CSS pixels; by default the width it is given on the page, up to 720. */
  width?: number;
  height?: number;
}

/** Below this width the reference lines' labels go inside the plot, over their lines, not in a margin. */
export const NARROW_CHART_PX = 480;
const WIDEST_CHART_PX = 720;
const NARROWEST_CHART_PX = 280;

const dateFormat = new Intl.DateTimeFormat(undefined, { day: 'numeric', month: 'short' });
const timeFormat = new Intl.DateTimeFormat(undefined, { hour: '2-digit', minute: '2-digit' });
const secondsFormat = new Intl.DateTimeFormat(undefined, {
  hour: '2-digit',
  minute: '2-digit',
  second: '2-digit',
});
const TWO_DAYS_MS = 2 * 24 * 3600 * 1000;
const TEN_MINUTES_MS = 10 * 60 * 1000;
const fullDate = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/**
 * A time axis label: the day over a long span; over a short one the time of day, with the day at the first
 * tick and wherever the day changes, so the axis always says when.
 */
export function timeTickLabel(t: number, previous: number | undefined, spanMs: number): string {
  if (spanMs >= TWO_DAYS_MS) return dateFormat.format(new Date(t));
  // Measurements minutes apart: ticks closer than a minute would all read the same minute without seconds.
  const time = (spanMs < TEN_MINUTES_MS ? secondsFormat : timeFormat).format(new Date(t));
  const sameDay = previous !== undefined && new Date(previous).toDateString() === new Date(t).toDateString();
  return sameDay ? time : `${dateFormat.format(new Date(t))}, ${time}`;
}

/** Round steps for an axis: 1, 2 or 5 × a power of ten, giving about `count` ticks. */
function niceTicks(min: number, max: number, count: number): number[] {
  const span = max - min || Math.abs(max) || 1;
  const raw = span / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? raw;
  const ticks: number[] = [];
  for (let t = Math.floor(min / step) * step; t <= max + step / 2; t += step) {
    ticks.push(Number(t.toFixed(6)));
  }
  return ticks;
}

/** Decimals that tell every tick of a step apart (0.005 → 3), at least 2 as kerfs are given. */
export function tickDecimals(ticks: readonly number[]): number {
  const step = ticks.length > 1 ? Math.abs(ticks[1]! - ticks[0]!) : 0;
  if (!(step > 0)) return 2;
  return Math.min(6, Math.max(2, Math.ceil(-Math.log10(step) - 1e-9)));
}

const LABEL_GAP = 15;

/**
 * The y of each reference line's label: at its line, but pushed apart so that no two are closer than one line
 * of text (two versions with close values would print over each other), and kept inside the plot.
 */
export function spreadLabels(ys: readonly number[], top: number, bottom: number, gap = LABEL_GAP): number[] {
  const order = ys.map((y, i) => ({ y, i })).sort((a, b) => a.y - b.y);
  const placed = order.map((o) => o.y);
  for (let k = 1; k < placed.length; k++) placed[k] = Math.max(placed[k]!, placed[k - 1]! + gap);
  // Too low at the bottom: shift the run up, never above the top.
  const overflow = (placed[placed.length - 1] ?? bottom) - bottom;
  if (overflow > 0) for (let k = 0; k < placed.length; k++) placed[k] = placed[k]! - overflow;
  for (let k = 0; k < placed.length; k++) {
    placed[k] = Math.max(placed[k]!, k === 0 ? top : placed[k - 1]! + gap);
  }
  const out = new Array<number>(ys.length);
  order.forEach((o, k) => (out[o.i] = placed[k]!));
  return out;
}

/**
 * Measured kerfs of one machine and material over time (dots, oldest left) against the values the profile
 * holds (horizontal lines). Plain SVG: scales grow to include every point and line, with a little headroom.
 */
export function KerfHistoryChart({
  records,
  references,
  quantity,
  unit,
  width: fixedWidth,
  height = 280,
}: KerfHistoryChartProps) {
  // Drawn at the width it has, so its text keeps its size: a 720-wide drawing shrunk onto a phone printed its
  // labels five pixels high.
  const box = useElementWidth();
  const width =
    fixedWidth ?? Math.min(WIDEST_CHART_PX, Math.max(NARROWEST_CHART_PX, box.width ?? WIDEST_CHART_PX));
  const narrow = width < NARROW_CHART_PX;
  const pad = { left: 56, right: narrow ? 12 : 150, top: narrow ? 22 : 16, bottom: 36 };
  const innerW = width - pad.left - pad.right;
  const innerH = height - pad.top - pad.bottom;
  // Plotted in the reader's unit, so the axis's round steps are round in it.
  const inUnit = (mm: number) => (unit === 'in' ? mm / MM_PER_INCH : mm);
  const kerf = (mm: number) => formatKerf(mm, unit);
  const values = [...records.map((r) => inUnit(r.kerfMm)), ...references.map((r) => inUnit(r.valueMm))];
  if (values.length === 0) {
    return <Typography color="text.secondary">No measured values yet for this material.</Typography>;
  }
  const lo = Math.min(...values);
  const hi = Math.max(...values);
  // Headroom of at least a hundredth of a millimetre (in the unit drawn), so one value is not a flat line.
  const margin = (hi - lo) * 0.15 || Math.max(hi * 0.1, inUnit(0.01));
  const ticks = niceTicks(Math.max(0, lo - margin), hi + margin, 5);
  const yMin = ticks[0]!;
  const yMax = ticks[ticks.length - 1]!;
  const times = records.map((r) => Date.parse(r.createdAt));
  const tMin = Math.min(...times);
  const tMax = Math.max(...times);
  const x = (t: number) => pad.left + (tMax === tMin ? innerW / 2 : ((t - tMin) / (tMax - tMin)) * innerW);
  const yOf = (v: number) => pad.top + innerH - ((v - yMin) / (yMax - yMin || 1)) * innerH;
  const y = (mm: number) => yOf(inUnit(mm));
  const xTicks = records.length > 0 ? (tMax === tMin ? [tMin] : [tMin, (tMin + tMax) / 2, tMax]) : [];
  const decimals = tickDecimals(ticks);
  const labelYs = spreadLabels(
    references.map((ref) => y(ref.valueMm)),
    pad.top + 4,
    height - 4,
  );
  const mean = records.length > 0 ? records.reduce((s, r) => s + r.kerfMm, 0) / records.length : null;

  return (
    <Box ref={box.ref}>
      <svg
        viewBox={`0 0 ${width} ${height}`}
        width="100%"
        role="img"
        aria-label={`Measured ${quantity} over time: ${countOf(records.length, 'measurement')}`}
        data-testid="kerf-chart"
        style={{ maxWidth: width, fontFamily: 'inherit', fontSize: 12 }}
      >
        {ticks.map((t) => (
          <g key={t}>
            <line x1={pad.left} x2={pad.left + innerW} y1={yOf(t)} y2={yOf(t)} stroke="#e0e0e0" />
            <text x={pad.left - 8} y={yOf(t) + 4} textAnchor="end" fill="#555" data-testid="kerf-tick">
              {t.toFixed(decimals)}
            </text>
          </g>
        ))}
        <text transform={`translate(14 ${pad.top + innerH / 2}) rotate(-90)`} textAnchor="middle" fill="#555">
          {quantity} ({unit})
        </text>
        <line x1={pad.left} x2={pad.left} y1={pad.top} y2={pad.top + innerH} stroke="#9e9e9e" />
        <line
          x1={pad.left}
          x2={pad.left + innerW}
          y1={pad.top + innerH}
          y2={pad.top + innerH}
          stroke="#9e9e9e"
        />
        {xTicks.map((t, i) => (
          <text key={t} x={x(t)} y={height - 12} textAnchor="middle" fill="#555" data-testid="kerf-time-tick">
            {timeTickLabel(t, xTicks[i - 1], tMax - tMin)}
          </text>
        ))}
        {references.map((ref, i) => (
          <g key={ref.label} data-testid="kerf-reference">
            <line
              x1={pad.left}
              x2={pad.left + innerW}
              y1={y(ref.valueMm)}
              y2={y(ref.valueMm)}
              stroke={ref.colour}
              strokeWidth={2}
              strokeDasharray={ref.dashed ? '6 4' : undefined}
            />
            <text
              x={narrow ? pad.left + innerW - 4 : pad.left + innerW + 6}
              y={narrow ? labelYs[i]! - 5 : labelYs[i]! + 4}
              textAnchor={narrow ? 'end' : undefined}
              fill={ref.colour}
              data-testid="kerf-reference-label"
            >
              {ref.label}: {kerf(ref.valueMm)}
            </text>
          </g>
        ))}
        {records.length > 1 ? (
          <polyline
            points={records.map((r, i) => `${x(times[i]!)},${y(r.kerfMm)}`).join(' ')}
            fill="none"
            stroke="#5c6bc0"
            strokeOpacity={0.5}
          />
        ) : null}
        {records.map((r, i) => (
          <circle
            key={r.id}
            cx={x(times[i]!)}
            cy={y(r.kerfMm)}
            r={5}
            fill={r.adoptedVersionId ? '#2e7d32' : '#3949ab'}
            data-testid="kerf-point"
          >
            <title>{`${kerf(r.kerfMm)}, ${fullDate.format(new Date(r.createdAt))}${r.notes ? ` — ${r.notes}` : ''}`}</title>
          </circle>
        ))}
      </svg>
      {mean !== null ? (
        <Typography variant="body2" color="text.secondary">
          {countOf(records.length, 'measurement')}; mean {kerf(mean)}. Green dots were adopted into a version.
        </Typography>
      ) : null}
    </Box>
  );
}
