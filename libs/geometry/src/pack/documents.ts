/** Content of the setup sheet and the assembly guide (see pdf.ts for drawing helpers). */
import type { CutPackEstimate, CutPackInput } from '@kerfwright/contracts';
import { type BuiltModel, pieceOutline3d } from '../build';
import { type AssemblyStep, STRAIGHT_DEG } from './assembly';
import { type Coupon } from './coupon';
import { type Pdf, PAGE, drawFlat, drawProjected, ensureRoom, heading, renderPdf, rows } from './pdf';
import { type SheetDrawing } from './sheet-drawing';
import { unitLengthText, unitSizeText } from '../math/length-text';

/** The sentence every safety section ends with. */
export const SAFETY_DEFERRAL =
  "Local codes, the machine maker's manual, the material's safety data sheet and your workshop's own rules come first.";

const f1 = (x: number) => (Math.round(x * 10) / 10).toFixed(1);
const f2 = (x: number) => (Math.round(x * 100) / 100).toFixed(2);
const money = (x: number, cur: string) => `${f2(x)} ${cur}`;

export function setupSheetPdf(args: {
  input: CutPackInput;
  model: BuiltModel;
  sheets: readonly SheetDrawing[];
  estimate: CutPackEstimate;
  coupon: Coupon;
  warnings: readonly string[];
}): Promise<Uint8Array> {
  const { input, model, sheets, estimate, coupon } = args;
  const m = input.machine;
  const spec = model.spec;
  // Every length below is given in mm; in an inch pack it prints in inches with the mm beside it.
  const units = input.units;
  const len = (mm: number, mmText?: (mm: number) => string) => unitLengthText(mm, units, mmText);
  // A length set off in a sentence: in brackets in mm, after a comma in inches (whose text has brackets), and
  // before one unless the sentence ends there.
  const aside = (mm: number, end = false) =>
    units === 'in' ? `, ${len(mm)}${end ? '' : ','}` : ` (${len(mm)})`;
  const unitsLine =
    input.units === 'in'
      ? 'inches (DXF $INSUNITS 1; SVG width and height in in)'
      : 'millimetres (DXF $INSUNITS 4; SVG width and height in mm)';
  return renderPdf(
    { title: `Setup sheet: ${input.job.title}`, subject: 'Kerfwright cut pack', createdAt: input.createdAt },
    (doc) => {
      doc.font('Helvetica-Bold').fontSize(16).text(`Setup sheet: ${input.job.title}`);
      doc
        .font('Helvetica')
        .fontSize(9)
        .text(`Job ${input.job.id}, requested by ${input.job.requester}; files built ${input.createdAt}`);
      heading(doc, 'Material and stock');
      rows(doc, [
        ['Material', `${input.material.name} (${input.material.family})`],
        ['Thickness', `${len(input.material.thicknessMm)}${spec.stock.flexible ? ', flexible' : ''}`],
        [
          'Sheet',
          `${unitSizeText(input.sheet.widthMm, input.sheet.heightMm, units)}, margin ${len(input.marginMm)}, gap ${len(input.gapMm)}`,
        ],
        ['Colours', input.colours.join(', ') + (input.colourRule ? ` (rule: ${input.colourRule})` : '')],
        ['Sheet count', `${sheets.length} (copies of the model: ${input.quantity})`],
        ['Sheets per colour', countsPerColour(sheets)],
      ]);
      heading(doc, 'Machine settings');
      rows(doc, [
        ['Profile', `${m.profileName} v${m.profileVersion} (${m.kind})`],
        ['Bed', unitSizeText(m.bedWidthMm, m.bedHeightMm, units, f1)],
        [
          spec.machine.kind === 'laser' ? 'Kerf' : 'Tool diameter',
          spec.machine.kind === 'laser'
            ? len(spec.machine.kerfMm)
            : len(spec.machine.toolDiameterMm) +
              (units === 'in' ? '; dog-bone reliefs in slot corners' : ' (dog-bone reliefs in slot corners)'),
        ],
        [
          'Compensation',
          spec.machine.kind === 'laser'
            ? `Built into the files: every cut line is already offset outward by half the kerf` +
              `${aside(spec.machine.kerfMm / 2, true)}. Cut on the line; set no kerf offset in the machine software.`
            : `Not in the files: cut lines are the nominal outlines. Set an outside tool offset of the bit's ` +
              `radius${aside(spec.machine.toolDiameterMm / 2)} in the machine software.`,
        ],
        ['Cut speed', `${f1(m.cutSpeedMmS)} mm/s, ${m.passes} pass${m.passes === 1 ? '' : 'es'}`],
        ['Mark speed', `${f1(m.markSpeedMmS)} mm/s`],
        spec.machine.kind === 'laser'
          ? ['Power', m.powerPct === undefined ? 'as the profile sets' : `${f1(m.powerPct)} %`]
          : [
              'Spindle',
              m.spindleRpm === undefined ? 'as the profile sets' : `${Math.round(m.spindleRpm)} rpm`,
            ],
        [spec.machine.kind === 'laser' ? 'Pierce time' : 'Plunge time', `${f2(m.pierceTimeS)} s`],
        ['Rapid speed', `${f1(m.rapidSpeedMmS)} mm/s`],
      ]);
      heading(doc, 'Files and scale');
      rows(doc, [
        ['Units', unitsLine],
        [
          'Layers',
          'cut: contours to cut, inner contours first; mark: labels and the scale mark, engraved first',
        ],
        [
          'Scale check',
          'Every sheet carries a labelled scale bar on the mark layer. Measure it in the machine software before cutting: ' +
            sheets.map((s) => `${s.name} ${s.scale.label}`).join(', '),
        ],
        [
          'Fit-test coupon',
          `Cut coupon.dxf first. C1 (${f1(coupon.strips[0].angleDeg)} deg) slots ${coupon.strips[0].seriesMm.map(f2).join(' / ')} mm; ` +
            `C2 (${f1(coupon.strips[1].angleDeg)} deg) slots ${coupon.strips[1].seriesMm.map(f2).join(' / ')} mm. ` +
            "Slide the other strip's key slot into each graded slot at the engraved angle and record the best fit." +
            (units === 'in'
              ? ' These widths are in millimetres in this inch pack too, as engraved on the coupon (its strip ' +
                'labels end in MM): note the best fit in mm.'
              : ''),
        ],
      ]);
      heading(doc, 'Estimates');
      rows(doc, [
        ['Cut length', len(estimate.cutLengthMm, f1)],
        ['Mark length', len(estimate.markLengthMm, f1)],
        ['Pierces', String(estimate.pierces)],
        ['Rapid travel', len(estimate.travelMm, f1)],
        ['Machine time', `${f1(estimate.minutes)} min (uncalibrated; compare with recorded cuts)`],
        ['Machine cost', money(estimate.machineCost, m.currency)],
        [
          'Material cost',
          estimate.materialCost === null
            ? `not priced (no price for this sheet size in ${input.material.currency})`
            : money(estimate.materialCost, input.material.currency),
        ],
      ]);
      heading(doc, 'Safety notices');
      doc.font('Helvetica').fontSize(9.5);
      if (input.notices.length === 0)
        doc.text(
          'No safety notices were attached to this pack (packs made outside a Kerfwright job carry none). ' +
            'Before cutting, read the notices that apply to this machine and material: the Safety page of ' +
            "Kerfwright, the files in the repository's safety/notices, and your workshop's own.",
        );
      for (const n of input.notices) {
        ensureRoom(doc, 14);
        doc.text(`${n.id} v${n.version}: ${n.title} (${n.severity})`);
      }
      if (input.localRulesVersion !== null)
        doc.text(`Workshop rules version ${input.localRulesVersion} apply.`);
      doc.moveDown(0.3).font('Helvetica-Bold').text(SAFETY_DEFERRAL).font('Helvetica');
      if (args.warnings.length) {
        heading(doc, 'Warnings');
        for (const w of args.warnings) {
          ensureRoom(doc, 14);
          doc.text(w);
        }
      }
      doc.addPage();
      doc.font('Helvetica-Bold').fontSize(12).text('Sheets');
      const cols = 2;
      const bw = (PAGE.width - 2 * PAGE.margin - 20) / cols;
      const bh = bw * 0.75;
      let y = doc.y + 8;
      sheets.forEach((s, i) => {
        const col = i % cols;
        if (col === 0 && i > 0) y += bh + 34;
        if (y + bh + 30 > PAGE.height - PAGE.margin) {
          doc.addPage();
          y = PAGE.margin;
        }
        const x = PAGE.margin + col * (bw + 20);
        doc.font('Helvetica-Bold').fontSize(9).text(`${s.title}`, x, y, { width: bw, lineBreak: false });
        doc
          .font('Helvetica')
          .fontSize(8)
          .text(`${s.parts.length} pieces, ${f1(s.estimate.seconds / 60)} min, file ${s.name}`, x, y + 11, {
            width: bw,
            lineBreak: false,
          });
        const minY = Math.min(0, s.scale.from[1] - 1);
        drawFlat(doc, { x, y: y + 24, w: bw, h: bh }, [0, minY, s.widthMm, s.heightMm], s.cut, s.mark);
      });
    },
  );
}

function countsPerColour(sheets: readonly SheetDrawing[]): string {
  const counts = new Map<string, number>();
  for (const s of sheets) counts.set(s.colourName, (counts.get(s.colourName) ?? 0) + 1);
  return [...counts].map(([c, n]) => `${c}: ${n}`).join(', ');
}

const SHADES = ['#f2d39b', '#a9cbe8', '#c8e0b4', '#e8b4b4', '#d6c3e6', '#f0e6a8', '#b8e0dc', '#e0c8a8'];

export function assemblyGuidePdf(args: {
  input: CutPackInput;
  model: BuiltModel;
  pieceColour: Record<string, number>;
  steps: readonly AssemblyStep[];
}): Promise<Uint8Array> {
  const { input, model, steps } = args;
  const colourOf = (id: string) => input.colours[args.pieceColour[id] ?? 0] ?? input.colours[0] ?? 'natural';
  return renderPdf(
    {
      title: `Assembly guide: ${input.job.title}`,
      subject: 'Kerfwright cut pack',
      createdAt: input.createdAt,
    },
    (doc: Pdf) => {
      doc.font('Helvetica-Bold').fontSize(16).text(`Assembly guide: ${input.job.title}`);
      doc
        .font('Helvetica')
        .fontSize(9)
        .text(
          `${model.pieces.length} pieces, ${model.crossings.length} crossings; each crossing is a slot pair: ` +
            'the two pieces slide into each other, slot into slot, until their edges are flush.',
        );
      heading(doc, 'Pieces by colour');
      const byColour = new Map<string, string[]>();
      for (const p of model.pieces) {
        const c = colourOf(p.id);
        byColour.set(c, [...(byColour.get(c) ?? []), p.id]);
      }
      rows(
        doc,
        [...byColour].map(([c, ids]) => [c, ids.join(', ')] as [string, string]),
      );
      heading(doc, 'Illustration');
      const top = doc.y + 4;
      const colourIndex = (id: string) => args.pieceColour[id] ?? 0;
      drawProjected(
        doc,
        { x: PAGE.margin + 40, y: top, w: PAGE.width - 2 * PAGE.margin - 80, h: 300 },
        model.pieces.map((p) => ({
          id: p.id,
          points: pieceOutline3d(p, 'nominalOutline'),
          centre: p.frame.centre,
          shade: SHADES[colourIndex(p.id) % SHADES.length]!,
        })),
        [0.9, 0.55, 0.75],
      );
      doc.y = top + 308;
      doc.x = PAGE.margin;
      doc
        .font('Helvetica')
        .fontSize(8)
        .text('Orthographic view of the assembled model; shading by stock colour.');
      const rigid = !model.spec.stock.flexible;
      heading(doc, 'Suggested order');
      doc
        .font('Helvetica')
        .fontSize(9)
        .text(
          'Start with the piece that crosses the most others, then add at each step ' +
            (rigid
              ? 'a piece whose slots all run one way if there is one, and among those the piece that crosses the most '
              : 'the piece that crosses the most ') +
            'pieces already in place, so every new piece is held by at least one placed piece. Slide each slot fully home ' +
            'before the next step. The number engraved beside each slot names the piece that goes into it.',
        );
      const crooked = steps.filter((s) => s.spreadDeg > STRAIGHT_DEG);
      if (rigid && crooked.length > 0) {
        doc.moveDown(0.3);
        doc.text(
          `Rigid stock moves one way at a time: in ${crooked.length} of the ${steps.length} steps below the new piece ` +
            'slides onto slots that run in different directions (the angle is given). Push it onto them together with ' +
            'a little flex, or leave the neighbouring joints part-way out until it is in, then seat them all.',
        );
      }
      doc.moveDown(0.4);
      steps.forEach((s, i) => {
        ensureRoom(doc, 14);
        const joins = s.joins.length
          ? joinPhrases(
              s.piece,
              s.joins.map((j) => j.piece),
            ).join('; ')
          : 'hold it upright: it is the first piece';
        const spread =
          rigid && s.spreadDeg > STRAIGHT_DEG
            ? ` (these slots run up to ${Math.round(s.spreadDeg)}° apart)`
            : '';
        doc.text(`${i + 1}. ${s.piece} (${colourOf(s.piece)}): ${joins}${spread}.`);
      });
    },
  );
}

/**
 * The joins of one step in words, one phrase per partner: two pieces that cross twice (stars whose arms
 * cross on both sides of the centre) slide together on both pairs of slots at once.
 */
export function joinPhrases(piece: string, partners: readonly string[]): string[] {
  const counts = new Map<string, number>();
  for (const p of partners) counts.set(p, (counts.get(p) ?? 0) + 1);
  return [...counts].map(([p, n]) =>
    n === 1
      ? `its slot for ${p} onto ${p}'s slot for ${piece}`
      : `its ${n} slots for ${p} onto ${p}'s ${n} slots for ${piece}, together`,
  );
}
