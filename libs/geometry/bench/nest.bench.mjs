// Nesting bench: true-shape nesting (bottom-left fill over no-fit polygons + lattice pattern pass with a
// double-lattice search) against a bounding-box rectangle packer from npm (maxrects-packer 2.7.4) on the same
// designs, side by side.
// Run after `npm run build -w @kerfwright/geometry`:  node libs/geometry/bench/nest.bench.mjs
import { spawnSync } from 'node:child_process';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { MaxRectsPacker } from 'maxrects-packer/dist/maxrects-packer.mjs';
import { nestParts } from '../dist/nest/index.js';
import { densestDoubleLattice } from '../dist/nest/double-lattice.js';
import { solveColourPlan } from '../dist/colour/index.js';
import geometry from '../dist/index.js';
import { MODEL_DESIGNS } from './model-designs.mjs';

const here = path.dirname(fileURLToPath(import.meta.url));

const { buildModel, layoutModel } = geometry;

const SHEET = { widthMm: 600, heightMm: 400 };
const GAP = 3;
const RUNS = 3;

// ---------- Shapes (our own designs) ----------
function regular(n, R, startDeg = 90) {
  return Array.from({ length: n }, (_, i) => {
    const a = ((startDeg + (360 * i) / n) * Math.PI) / 180;
    return [R * Math.cos(a), R * Math.sin(a)];
  });
}
function star(n, k, R) {
  const inner = (R * Math.cos((Math.PI * k) / n)) / Math.cos((Math.PI * (k - 1)) / n);
  return Array.from({ length: 2 * n }, (_, i) => {
    const r = i % 2 === 0 ? R : inner;
    const a = Math.PI / 2 + (Math.PI * i) / n;
    return [r * Math.cos(a), r * Math.sin(a)];
  });
}
/** A slot of width w and depth d cut from vertex `tip` toward the centre (vertex must be convex). */
function withSlot(outline, tip, w, d) {
  const n = outline.length;
  const t = outline[tip];
  const prev = outline[(tip - 1 + n) % n];
  const next = outline[(tip + 1) % n];
  const r = Math.hypot(t[0], t[1]);
  const u = [-t[0] / r, -t[1] / r];
  const side = [-u[1], u[0]];
  const unit = (p) => {
    const l = Math.hypot(p[0] - t[0], p[1] - t[1]);
    return [(p[0] - t[0]) / l, (p[1] - t[1]) / l];
  };
  const up = unit(prev);
  const un = unit(next);
  const along = w / 2 / Math.abs(up[0] * u[1] - up[1] * u[0]);
  const sgn = up[0] * side[0] + up[1] * side[1] > 0 ? 1 : -1;
  const deep = (s) => [t[0] + u[0] * d + side[0] * s * (w / 2), t[1] + u[1] * d + side[1] * s * (w / 2)];
  return [
    ...outline.slice(0, tip),
    [t[0] + up[0] * along, t[1] + up[1] * along],
    deep(sgn),
    deep(-sgn),
    [t[0] + un[0] * along, t[1] + un[1] * along],
    ...outline.slice(tip + 1),
  ];
}
function area(poly) {
  let s = 0;
  for (let i = 0; i < poly.length; i++) {
    const a = poly[i];
    const b = poly[(i + 1) % poly.length];
    s += a[0] * b[1] - b[0] * a[1];
  }
  return Math.abs(s) / 2;
}

// Density bounds for the area lower bound (REFERENCES "Packing"): tiles 1; pentagon (5 − √5)/3; decagon lattice
// 0.9137; anything else 1 (the trivial bound).
const PENTAGON = (5 - Math.sqrt(5)) / 3;
// Slots are cut from the highest vertex index down, so earlier indices stay valid.
const slottedHex = withSlot(withSlot(regular(6, 50, 0), 3, 3, 18), 0, 3, 18);
const designs = [
  {
    name: 'triangles side 100 ×60',
    density: 1,
    parts: [{ id: 'tri', outline: regular(3, 100 / Math.sqrt(3)), quantity: 60 }],
  },
  {
    name: 'squares side 80 ×40',
    density: 1,
    rect: true,
    parts: [{ id: 'sq', outline: regular(4, 80 / Math.SQRT2, 45), quantity: 40 }],
  },
  {
    name: 'pentagons R50 ×40',
    density: PENTAGON,
    parts: [{ id: 'pent', outline: regular(5, 50), quantity: 40 }],
  },
  { name: 'hexagons R45 ×40', density: 1, parts: [{ id: 'hex', outline: regular(6, 45, 0), quantity: 40 }] },
  {
    name: 'decagons R60 ×30',
    density: 0.9137,
    parts: [{ id: 'dec', outline: regular(10, 60), quantity: 30 }],
  },
  {
    name: '{5/2} stars R60, 2 slots ×40',
    density: 1,
    parts: [{ id: 's52', outline: withSlot(withSlot(star(5, 2, 60), 4, 3, 15), 0, 3, 15), quantity: 40 }],
  },
  {
    name: '{8/3} stars R70, 2 slots ×24',
    density: 1,
    parts: [{ id: 's83', outline: withSlot(withSlot(star(8, 3, 70), 8, 3, 20), 0, 3, 20), quantity: 24 }],
  },
  {
    name: 'mixed: tri/hex/pent, 3 sizes ×54',
    density: 1,
    parts: [
      { id: 'tri-l', outline: regular(3, 70), quantity: 12 },
      { id: 'hex-m', outline: regular(6, 40, 0), quantity: 18 },
      { id: 'pent-s', outline: regular(5, 28), quantity: 24 },
    ],
  },
];

// ---------- Bounding-box baseline ----------
function bboxPack(design) {
  const packer = new MaxRectsPacker(SHEET.widthMm, SHEET.heightMm, GAP, {
    smart: false,
    pot: false,
    square: false,
    allowRotation: true,
    border: 0,
  });
  for (const p of design.parts) {
    const xs = p.outline.map((q) => q[0]);
    const ys = p.outline.map((q) => q[1]);
    const w = Math.max(...xs) - Math.min(...xs);
    const h = Math.max(...ys) - Math.min(...ys);
    for (let i = 0; i < p.quantity; i++) packer.add(w, h, { a: area(p.outline) });
  }
  const perSheet = packer.bins.map(
    (b) => b.rects.reduce((s, r) => s + r.data.a, 0) / (SHEET.widthMm * SHEET.heightMm),
  );
  return {
    sheets: packer.bins.length,
    firstCount: packer.bins[0]?.rects.length ?? 0,
    best: Math.max(...perSheet),
  };
}

function median(xs) {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

const rows = [];
const perPartMs = [];
const perPartCpu = [];
/** CPU time (user + system) since c0, ms: steadier than wall time when other work shares the cores. */
function cpuMs(c0) {
  const d = process.cpuUsage(c0);
  return (d.user + d.system) / 1000;
}
/** Runs fn `runs` times: the last result, the wall times and the CPU times (ms). */
function timeRuns(fn, runs = RUNS) {
  const wall = [];
  const cpu = [];
  let result;
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    result = fn();
    wall.push(performance.now() - t0);
    cpu.push(cpuMs(c0));
  }
  return { result, wall, cpu };
}
for (const d of designs) {
  const input = { sheet: SHEET, marginMm: 0, gapMm: GAP, parts: d.parts };
  const { result: r, wall: times, cpu: cpuTimes } = timeRuns(() => nestParts(input));
  if (!r.ok) throw new Error(`${d.name}: ${r.error.message}`);
  const { wall: tsTimes, cpu: tsCpu } = timeRuns(() => nestParts({ ...input, method: 'true-shape' }));
  const pieces = d.parts.reduce((s, p) => s + p.quantity, 0);
  // Bottom-left fill runs twice per call (left- and right-edge rules): per placement = time ÷ (2 × pieces).
  const msPerPart = median(tsTimes) / (2 * pieces);
  const cpuPerPart = median(tsCpu) / (2 * pieces);
  perPartMs.push(msPerPart);
  perPartCpu.push(cpuPerPart);
  const partArea = d.parts.reduce((s, p) => s + area(p.outline) * p.quantity, 0);
  const lower = Math.ceil(partArea / (SHEET.widthMm * SHEET.heightMm * d.density));
  const best = Math.max(...r.sheets.map((s) => s.utilisation));
  const bb = bboxPack(d);
  rows.push({
    design: d.name,
    sheets: r.totals.sheetCount,
    lowerBound: lower,
    atBound: r.totals.sheetCount === lower ? 'yes' : 'no',
    firstSheet: r.sheets[0].placements.length,
    bestUtil: best.toFixed(3),
    totalUtil: r.totals.utilisation.toFixed(3),
    bboxSheets: bb.sheets,
    bboxFirst: bb.firstCount,
    bboxBestUtil: bb.best.toFixed(3),
    ratio: d.rect ? `${(best / bb.best).toFixed(2)} (rect)` : (best / bb.best).toFixed(2),
    medianMs: median(times).toFixed(0),
    cpuMs: median(cpuTimes).toFixed(0),
    blMsPerPart: msPerPart.toFixed(1),
    blCpuPerPart: cpuPerPart.toFixed(1),
    method: r.totals.groups[0].method,
  });
}
console.table(rows);

// ---------- 60 pieces, 3 colours: colour plan + nesting ----------
// An abstract 60-face input (a closed band of 60 faces, each sharing an edge with the next) for the colour plan;
// a real solid comes from the solids module.
const faces = Array.from({ length: 60 }, (_, i) => [2 * i, 2 * i + 1, (2 * i + 2) % 120, (2 * i + 3) % 120]);
for (const [label, outline] of [
  ['slotted hexagons', slottedHex],
  ['slotted {5/2} stars', withSlot(withSlot(star(5, 2, 60), 4, 3, 15), 0, 3, 15)],
]) {
  const {
    result: layout,
    wall: t60,
    cpu: c60,
  } = timeRuns(() => {
    const plan = solveColourPlan({
      faceCount: 60,
      faceVertices: faces,
      rule: 'neighbour-distinct',
      count: 3,
      countCap: 0,
    });
    const byColour = [0, 1, 2].map((c) => Object.values(plan.assignment).filter((x) => x === c).length);
    return nestParts({
      sheet: SHEET,
      marginMm: 5,
      gapMm: GAP,
      parts: byColour.map((q, c) => ({ id: `piece-${c}`, outline, quantity: q, group: `colour-${c}` })),
    });
  });
  console.log(
    `60 ${label} in 3 colours: ${layout.ok ? layout.totals.sheetCount : 'failed'} sheets,` +
      ` median ${median(t60).toFixed(0)} ms wall, ${median(c60).toFixed(0)} ms CPU over ${RUNS} runs (wall ${t60.map((t) => t.toFixed(0)).join(', ')})`,
  );
}

// ---------- Finely sampled outlines ----------
// Curves arrive as many short edges: a wavy disc of 384 vertices (192 reflex corners) and a 96-vertex rounded
// L, 14 and 10 off. Their no-fit polygons are built on containing outlines of at most NFP_MAX_REFLEX reflex
// corners (variants.ts); before that bound one pair of the wavy disc took minutes.
{
  const wavyDisc = Array.from({ length: 384 }, (_, i) => {
    const t = (2 * Math.PI * i) / 384;
    const r = 55 * (1 + 0.15 * Math.sin(12 * t));
    return [r * Math.cos(t), r * Math.sin(t)];
  });
  const roundedL = [];
  const arc = (cx, cy, r, a0) => {
    for (let i = 0; i <= 23; i++) {
      const a = ((a0 + (90 * i) / 23) * Math.PI) / 180;
      roundedL.push([cx + r * Math.cos(a), cy + r * Math.sin(a)]);
    }
  };
  arc(110, 10, 10, 270);
  arc(110, 30, 10, 0);
  arc(50, 70, 10, 0);
  arc(10, 70, 10, 90);
  roundedL.splice(0, 0, [10, 0]);
  const input = {
    sheet: SHEET,
    marginMm: 5,
    gapMm: GAP,
    parts: [
      { id: 'wavy', outline: wavyDisc, quantity: 14 },
      { id: 'L', outline: roundedL, quantity: 10 },
    ],
  };
  const { result: r, wall: times, cpu: cpuTimes } = timeRuns(() => nestParts(input));
  const { wall: tsTimes } = timeRuns(() => nestParts({ ...input, method: 'true-shape' }));
  console.log(
    `finely sampled outlines (384-vertex wavy disc ×14, 96-vertex rounded L ×10): ` +
      `${r.ok ? `${r.totals.sheetCount} sheets, ${r.sheets[0].placements.length} on the first` : r.error.message}; ` +
      `median ${median(times).toFixed(0)} ms wall, ${median(cpuTimes).toFixed(0)} ms CPU; bottom-left alone ` +
      `${(median(tsTimes) / 48).toFixed(1)} ms per placement`,
  );
}

// ---------- Many different parts ----------
// 150 random convex-ish outlines (5–12 vertices, radius 12–40 mm, seeded), one of each: no two share a kept
// feasible region, so every placement searches afresh. The free-space windows (bottom-left.ts) bound that
// search to the parts near the fill front; 'whole sheet' is the same fill without them.
{
  let seed = 150;
  const rnd = () => (seed = (seed * 1664525 + 1013904223) % 4294967296) / 4294967296;
  const parts = Array.from({ length: 150 }, (_, k) => {
    const n = 5 + Math.floor(rnd() * 8);
    const R = 12 + rnd() * 28;
    const outline = Array.from({ length: n }, (_, i) => {
      const t = (2 * Math.PI * i) / n;
      const r = R * (0.5 + 0.5 * rnd());
      return [r * Math.cos(t), r * Math.sin(t)];
    });
    return { id: `d${k}`, outline, quantity: 1 };
  });
  const input = { sheet: SHEET, marginMm: 5, gapMm: 2, parts, method: 'true-shape' };
  const { result: r, wall: times, cpu: cpuTimes } = timeRuns(() => nestParts(input));
  const placed = r.ok ? r.sheets.reduce((a, s) => a + s.placements.length, 0) : 0;
  console.log(
    `150 different random parts, one of each: ${r.ok ? `${r.totals.sheetCount} sheets` : r.error.message}; ` +
      `median ${median(times).toFixed(0)} ms wall, ${median(cpuTimes).toFixed(0)} ms CPU, ` +
      `${(median(times) / Math.max(placed, 1)).toFixed(1)} ms per part`,
  );
}

/**
 * Random star-shaped outlines, the same for a seed (a linear congruential generator, Numerical Recipes'
 * constants): 5–12 vertices each, radius 20 to 20 + spanMm mm, each vertex at 60–100 % of it.
 */
function seededOutlines({ seed, kinds, spanMm, prefix, quantity }) {
  const rnd = () => (seed = (seed * 1664525 + 1013904223) % 4294967296) / 4294967296;
  return Array.from({ length: kinds }, (_, k) => {
    const n = 5 + Math.floor(rnd() * 8);
    const R = 20 + rnd() * spanMm;
    const outline = Array.from({ length: n }, (_, i) => {
      const t = (2 * Math.PI * i) / n;
      const r = R * (0.6 + 0.4 * rnd());
      return [r * Math.cos(t), r * Math.sin(t)];
    });
    return { id: `${prefix}${k}`, outline, quantity };
  });
}

// ---------- Many kinds in quantity ----------
// A cutting service's mixed order: 40 different random outlines (5–12 vertices, radius 20–80 mm, seeded), 50 of
// each, on 2440 × 1220 mm sheets (margin 10, gap 3): about 400 parts a sheet, copies of a few parts at a time.
// Run once (it takes seconds); the figure to watch is ms per part.
{
  const parts = seededOutlines({ seed: 40, kinds: 40, spanMm: 60, prefix: 'k', quantity: 50 });
  const input = { sheet: { widthMm: 2440, heightMm: 1220 }, marginMm: 10, gapMm: 3, parts };
  const {
    result: r,
    wall: [wall],
    cpu: [cpu],
  } = timeRuns(() => nestParts(input), 1);
  console.log(
    `40 kinds × 50 on 2440 × 1220: ${r.ok ? `${r.totals.sheetCount} sheets, utilisation ${r.totals.utilisation.toFixed(3)}` : r.error.message}; ` +
      `${wall.toFixed(0)} ms wall, ${cpu.toFixed(0)} ms CPU, ${(wall / 2000).toFixed(1)} ms per part (one run)`,
  );
}

// ---------- Along a roll ----------
// A 10 m roll, 600 mm wide (margin 5, gap 3): 60 different random outlines (5–12 vertices, radius 20–70 mm,
// seeded), 15 of each, about 8 m of it used. Clipper sweeps along y, so on a roll every scanline used to cross
// every part along it; the regions are now clipped across the short side (differenceAcross). Run once.
{
  const parts = seededOutlines({ seed: 7, kinds: 60, spanMm: 50, prefix: 'r', quantity: 15 });
  const input = { sheet: { widthMm: 10_000, heightMm: 600 }, marginMm: 5, gapMm: 3, parts };
  const {
    result: r,
    wall: [wall],
    cpu: [cpu],
  } = timeRuns(() => nestParts(input), 1);
  console.log(
    `60 kinds × 15 along a 10,000 × 600 roll: ${r.ok ? `${r.totals.sheetCount} sheet(s), ${r.sheets[0].usedLengthMm.toFixed(1)} mm used, utilisation ${r.totals.utilisation.toFixed(3)}` : r.error.message}; ` +
      `${wall.toFixed(0)} ms wall, ${cpu.toFixed(0)} ms CPU (one run)`,
  );
}

// ---------- Large quantities ----------
// A production run of one small part: 20,000 regular pentagons (R 30) on 600 × 400, margin 5, gap 2. Full
// sheets repeat the first sheet's layout, so the time should hardly grow with the quantity.
{
  const pent = Array.from({ length: 5 }, (_, i) => {
    const t = Math.PI / 2 + (2 * Math.PI * i) / 5;
    return [30 * Math.cos(t), 30 * Math.sin(t)];
  });
  const line = [];
  for (const quantity of [2_000, 20_000]) {
    const input = { sheet: SHEET, marginMm: 5, gapMm: 2, parts: [{ id: 'pent', outline: pent, quantity }] };
    const { result: r, wall, cpu } = timeRuns(() => nestParts(input));
    line.push(
      `${quantity} copies: ${r.ok ? `${r.totals.sheetCount} sheets` : r.error.message}, ` +
        `median ${median(wall).toFixed(0)} ms wall, ${median(cpu).toFixed(0)} ms CPU`,
    );
  }
  console.log(`one part in large quantities (pentagons R30): ${line.join('; ')}`);
  // Thousands to a sheet: 20,000 small triangles on 2440 × 1220 (8,512 to a sheet), in a process of its own
  // for its peak memory. The lattice search weighs dozens of lattices; before it laid out only the ones it
  // checked, this took 6.4 s and 1 GB (5 Dec 2026).
  const child = `
    const { nestParts } = require(${JSON.stringify(path.resolve(here, '../dist/nest/index.js'))});
    const input = { sheet: { widthMm: 2440, heightMm: 1220 }, marginMm: 5, gapMm: 1,
      parts: [{ id: 'tri', outline: [[0, 0], [30, 0], [5, 20]], quantity: 20000 }] };
    const t0 = performance.now();
    const r = nestParts(input);
    console.log(JSON.stringify({ sheets: r.ok ? r.totals.sheetCount : r.error.message,
      ms: performance.now() - t0, peakMb: process.resourceUsage().maxRSS / 1024 }));`;
  const out = spawnSync(process.execPath, ['-e', child], { encoding: 'utf8' });
  const t = JSON.parse(out.stdout || '{}');
  console.log(
    `thousands to a sheet (20,000 triangles 30 × 20 on 2440 × 1220): ${t.sheets} sheets, ` +
      `${t.ms?.toFixed(0)} ms wall (one run), peak memory of its process ${t.peakMb?.toFixed(0)} MB`,
  );
}

// ---------- Decagons on a larger sheet ----------
// 15 decagons fit a 600 × 400 sheet either way (REFERENCES), so they are compared on a 1220 × 2440 sheet too.
// Estimate (not a bound): on an unbounded sheet the decagon lattice density 0.9137 (REFERENCES) applied to the
// gap-grown decagon, against a square grid of gap-grown bounding boxes, gives a ratio of about 1.18; finite
// sheets move it either way through edge losses.
{
  const big = { widthMm: 1220, heightMm: 2440 };
  const dec = designs.find((d) => d.name.startsWith('decagons'));
  const many = { ...dec.parts[0], quantity: 260 };
  const {
    result: r,
    wall: [ms],
    cpu: [cpu],
  } = timeRuns(() => nestParts({ sheet: big, marginMm: 0, gapMm: GAP, parts: [many] }), 1);
  const xs = many.outline.map((q) => q[0]);
  const ys = many.outline.map((q) => q[1]);
  const packer = new MaxRectsPacker(big.widthMm, big.heightMm, GAP, {
    smart: false,
    pot: false,
    square: false,
    allowRotation: true,
    border: 0,
  });
  for (let i = 0; i < many.quantity; i++)
    packer.add(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys), {});
  const ours = r.ok ? r.sheets[0].placements.length : 0;
  const theirs = packer.bins[0]?.rects.length ?? 0;
  console.log(
    `decagons R60 on ${big.widthMm} × ${big.heightMm}: first sheet ${ours} (${r.ok ? r.totals.groups[0].method : 'failed'})` +
      ` vs bounding boxes ${theirs}: ratio ${(ours / theirs).toFixed(2)}, ${ms.toFixed(0)} ms wall, ${cpu.toFixed(0)} ms CPU`,
  );
}

// ---------- Densest double lattices on the unbounded plane, no gap, against published values ----------
// REFERENCES "Packing": pentagon (5 − √5)/3 (Kuperberg & Kuperberg 1990), heptagon ≈ 0.8927 (best known double
// lattice), octagon (4 + 4√2)/(5 + 4√2) and decagon ≈ 0.9137 (lattices), triangle and hexagon 1 (tilings).
{
  const refs = [
    ['triangle', 3, 120, 1],
    ['pentagon', 5, 72, (5 - Math.sqrt(5)) / 3],
    ['hexagon', 6, 60, 1],
    ['heptagon', 7, 360 / 7, 0.8927],
    ['octagon', 8, 45, (4 + 4 * Math.SQRT2) / (5 + 4 * Math.SQRT2)],
    ['decagon', 10, 36, 0.9137],
  ];
  const parts = [];
  for (const [name, n, period, ref] of refs) {
    const c0 = process.cpuUsage();
    const lat = densestDoubleLattice(regular(n, 50), 0, period);
    parts.push(`${name} ${lat.density.toFixed(5)} (ref ${ref.toFixed(4)}, ${cpuMs(c0).toFixed(0)} ms CPU)`);
  }
  console.log(`densest double lattice found, plane: ${parts.join('; ')}`);
}

// ---------- Models of our own, as a job lays them out: per colour, on 600 × 400 with margin 5 and gap 3 ----------
{
  const modelRows = [];
  for (const m of MODEL_DESIGNS) {
    const { colours, stock, ...rest } = m.spec;
    const model = buildModel({ ...rest, stock: { thicknessMm: stock.thicknessMm } });
    const options = {
      sheet: stock.sheet,
      marginMm: stock.marginMm,
      gapMm: stock.gapMm,
      colours: { count: colours.count, rule: colours.rule },
      quantity: m.quantity,
    };
    const { result: lay, wall } = timeRuns(() => layoutModel(model, options));
    if (!lay.ok) throw new Error(`${m.name}: ${lay.message}`);
    let lower = 0;
    let boxes = 0;
    for (let c = 0; c < colours.count; c++) {
      const pieces = model.pieces.filter((p) => lay.pieceColour[p.id] === c);
      const a = pieces.reduce((s, p) => s + area(p.outline) * m.quantity, 0);
      lower += Math.ceil(a / (stock.sheet.widthMm * stock.sheet.heightMm));
      const packer = new MaxRectsPacker(
        stock.sheet.widthMm - 2 * stock.marginMm,
        stock.sheet.heightMm - 2 * stock.marginMm,
        lay.gapMm,
        { smart: true, pot: false, square: false, allowRotation: true, border: 0 },
      );
      for (const p of pieces) {
        const xs = p.outline.map((q) => q[0]);
        const ys = p.outline.map((q) => q[1]);
        for (let i = 0; i < m.quantity; i++)
          packer.add(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys), {});
      }
      boxes += packer.bins.length;
    }
    modelRows.push({
      model: m.name,
      sheets: lay.totals.sheetCount,
      lowerBound: lower,
      atBound: lay.totals.sheetCount === lower ? 'yes' : 'no',
      bboxSheets: boxes,
      // Same pieces either way: the utilisation ratio is the inverse ratio of sheet counts.
      ratio: (boxes / lay.totals.sheetCount).toFixed(2),
      medianMs: median(wall).toFixed(0),
    });
  }
  console.table(modelRows);
  console.log(
    `models at the area lower bound (density 1): ${modelRows.filter((r) => r.atBound === 'yes').length} of ` +
      `${modelRows.length}; sheets against bounding boxes: ratio ${modelRows.map((r) => r.ratio).join(', ')}`,
  );
}

const nonRect = rows.filter((r, i) => !designs[i].rect);
const ratios = nonRect.map((r) => Number(r.ratio));
console.log(
  `utilisation ratio true-shape ÷ bounding-box (non-rectangles): median ${median(ratios).toFixed(2)}, min ${Math.min(...ratios).toFixed(2)}`,
);
console.log(
  `designs at the area lower bound: ${rows.filter((r) => r.atBound === 'yes').length} of ${rows.length}`,
);
const mean = (xs) => xs.reduce((a, b) => a + b, 0) / xs.length;
console.log(
  `bottom-left placement per part: wall median ${median(perPartMs).toFixed(1)} ms, mean ${mean(perPartMs).toFixed(1)},` +
    ` max ${Math.max(...perPartMs).toFixed(1)}; CPU median ${median(perPartCpu).toFixed(1)} ms,` +
    ` mean ${mean(perPartCpu).toFixed(1)}, max ${Math.max(...perPartCpu).toFixed(1)}`,
);
const cpus = os.cpus();
console.log(
  `machine: ${cpus[0]?.model ?? 'unknown'} × ${cpus.length}, node ${process.version},` +
    ` load average ${os
      .loadavg()
      .map((x) => x.toFixed(1))
      .join(' ')}`,
);
