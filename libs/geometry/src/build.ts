import type {
  DesignIssue,
  DesignReport,
  MachineSpec,
  ReportCrossing,
  ReportPiece,
} from '@kerfwright/contracts';
import { type Vec2, type Vec3, at, scale3 } from './math/vec';
import { type Polygon, signedArea } from './math/polygon';
import { type Solid } from './solids/polyhedron';
import { getSolid } from './solids/catalogue';
import { parseSolidText } from './solids/parse';
import { type PieceFrame, fromFrame, pieceFrames, suggestSizes, type SuggestedSizes } from './pieces/place';
import { starOutline } from './pieces/shape';
import { type Crossing, computeCrossings, crossingPoint } from './crossings/crossings';
import { type Slot, nominalSlotWidth, planSlots } from './slots/slots';
import { compensateKerf, dogBoneCentre, notchOutline } from './compensation/compensate';
import { slotInnerCorners } from './slots/slots';
import { type ResolvedSpec, SpecValidationError, validateSpec } from './spec/validate-spec';
import { IssueList, fitsBed, slotGap, slotWeb } from './validity/validity';

/** A slot as built into one piece (piece frame, mm). */
export interface BuiltSlot {
  crossing: number;
  /** Id of the piece this slot receives. */
  partner: string;
  /** Opening on the piece's edge, and the unit direction into the piece. */
  end: Vec2;
  axis: Vec2;
  depthMm: number;
  widthMm: number;
  drawnWidthMm: number;
}

/** One piece of the built model. All 2D geometry is in the piece's own frame (see PieceFrame), mm. */
export interface BuiltPiece {
  id: string;
  face: number;
  frame: PieceFrame;
  circumradiusMm: number;
  /** The piece shape before slotting, counter-clockwise. */
  shape: Vec2[];
  /** Nominal outline with slot notches (and router reliefs), counter-clockwise. */
  nominalOutline: Vec2[];
  /** Outline to cut after machine compensation, counter-clockwise. */
  outline: Vec2[];
  slots: BuiltSlot[];
  /** Dog-bone relief circles (router only). */
  reliefs: { centre: Vec2; radiusMm: number }[];
}

export interface BuiltModel {
  spec: ResolvedSpec;
  solid: Solid;
  mmPerUnit: number;
  pieces: BuiltPiece[];
  crossings: Crossing[];
  /** Whether the default slot-end rule made slots collide and the 2-SAT search chose the ends. */
  slotSearchUsed: boolean;
  report: DesignReport;
}

let uploadCache: { key: string; solid: Solid } | null = null;

/** The base solid a spec names (catalogue id or uploaded text; the last upload is cached). */
export function resolveSolid(spec: ResolvedSpec): Solid {
  if (typeof spec.solid === 'string') return getSolid(spec.solid);
  const key = `${spec.solid.format}\u0000${spec.solid.name ?? ''}\u0000${spec.solid.text}`;
  if (uploadCache?.key === key) return uploadCache.solid;
  const solid = parseSolidText(spec.solid.format, spec.solid.text, spec.solid.name);
  uploadCache = { key, solid };
  return solid;
}

/** Millimetres per model unit for a scale spec (see ScaleSpec in the contracts). */
export function scaleFactor(solid: Solid, spec: ResolvedSpec): number {
  const ds = solid.faces.map((f) => f.distance);
  const dMin = Math.min(...ds);
  const dMax = Math.max(...ds);
  switch (spec.scale.by) {
    case 'planeDistance':
      return spec.scale.mm / dMin;
    case 'diameter':
      return spec.scale.mm / (2 * dMax * Math.sqrt(1 + spec.piece.size ** 2));
    case 'pieceCircumradius':
      return spec.scale.mm / (spec.piece.size * dMax);
  }
}

const round = (x: number, digits = 6): number => {
  const k = 10 ** digits;
  return Math.round(x * k) / k;
};
const r3 = (v: Vec3): [number, number, number] => [round(v[0]), round(v[1]), round(v[2])];

const suggestionCache = new WeakMap<Solid, Map<string, SuggestedSizes>>();
/** Size suggestions depend on the solid and the shape, not on the size: cache them per solid object. */
function cachedSuggestions(solid: Solid, spec: ResolvedSpec): SuggestedSizes {
  let perSolid = suggestionCache.get(solid);
  if (!perSolid) {
    perSolid = new Map();
    suggestionCache.set(solid, perSolid);
  }
  const key = `${spec.piece.sides}/${spec.piece.step}@${spec.piece.rotationDeg}`;
  let hit = perSolid.get(key);
  if (!hit) {
    hit = suggestSizes(solid, spec.piece);
    if (perSolid.size > 100) perSolid.clear();
    perSolid.set(key, hit);
  }
  return hit;
}

/**
 * Builds a design: pieces, crossings, slot pairs, compensated outlines and the validity report. `input`
 * is any JSON value; invalid specs throw SpecValidationError, bad uploads throw SolidError.
 */
export function buildModel(input: unknown): BuiltModel {
  const v = validateSpec(input);
  if (!v.ok) throw new SpecValidationError(v.errors);
  const spec = v.spec;
  const solid = resolveSolid(spec);
  const mmPerUnit = scaleFactor(solid, spec);
  const frames = pieceFrames(solid, mmPerUnit);
  const { sides, step, rotationDeg, size } = spec.piece;
  const ids = frames.map((_, i) => `P${i + 1}`);
  const shapes = frames.map((f) => starOutline(sides, step, size * f.distance, rotationDeg));
  const crossings = computeCrossings(frames.map((frame, i) => ({ frame, outline: at(shapes, i) })));
  const t = spec.stock.thicknessMm;
  const widths = crossings.map((c) => nominalSlotWidth(t, c.angleDeg, spec.stock.flexible) + spec.fitMm);
  const issues = new IssueList();
  const machine: MachineSpec = spec.machine;
  const removed = machine.kind === 'laser' ? machine.kerfMm : 0;

  // Slots can only be planned with positive widths.
  const safeWidths = widths.map((w) => Math.max(w, 1e-3));
  const plan = planSlots({
    frames,
    outlines: shapes,
    crossings,
    widths: safeWidths,
    depthClearanceMm: spec.depthClearanceMm,
  });

  for (const c of crossings) {
    if (at(plan.options, c.index) === null) {
      const [a, b] = [at(ids, c.a), at(ids, c.b)];
      const inner = c.endOnA[0] && c.endOnA[1] ? b : a;
      issues.error(
        'CROSSING.NOT_ASSEMBLABLE',
        `${a} and ${b} cannot be slid together: both ends of their ${round(c.length, 2)} mm crossing lie on ` +
          `${inner === a ? b : a}'s edge, so ${inner} would need a closed hole`,
        [a, b],
      );
    }
  }
  for (const k of plan.collisions) {
    const [ci, cj] = k.crossings.map((i) => at(crossings, i));
    const other = (c: Crossing) => at(ids, c.a === k.piece ? c.b : c.a);
    issues.error(
      'SLOT.COLLISION',
      `in ${at(ids, k.piece)} the slots for ${other(ci as Crossing)} and ${other(cj as Crossing)} overlap, ` +
        'whichever ends the slots open from',
      [at(ids, k.piece), other(ci as Crossing), other(cj as Crossing)],
    );
  }
  if (crossings.length === 0) {
    issues.error('DESIGN.NO_CROSSINGS', 'no two pieces touch: make the pieces larger or turn them', []);
  }
  crossings.forEach((c, i) => {
    const w = at(widths, i);
    const pair = [at(ids, c.a), at(ids, c.b)];
    if (!(w > 0)) {
      issues.error(
        'SLOT.WIDTH_NOT_POSITIVE',
        `the fit allowance leaves the slot between ${pair.join(' and ')} no width`,
        pair,
      );
    } else if (machine.kind === 'laser' && w < machine.kerfMm) {
      issues.error(
        'SLOT.NARROWER_THAN_KERF',
        `the ${round(w, 3)} mm slot between ${pair.join(' and ')} is narrower than the ${machine.kerfMm} mm kerf`,
        pair,
      );
    } else if (machine.kind === 'router' && w < machine.toolDiameterMm) {
      issues.error(
        'SLOT.NARROWER_THAN_TOOL',
        `the ${round(w, 3)} mm slot between ${pair.join(' and ')} is narrower than the ${machine.toolDiameterMm} mm tool`,
        pair,
      );
    }
    if (c.length < w) {
      issues.warn(
        'CROSSING.SHORTER_THAN_SLOT',
        `the crossing of ${pair.join(' and ')} is ${round(c.length, 3)} mm long, shorter than its ${round(w, 3)} mm ` +
          'slot is wide: the slot would break through a tip',
        pair,
      );
    }
  });

  const reliefR = machine.kind === 'router' ? machine.toolDiameterMm / 2 : 0;
  const pieces: BuiltPiece[] = frames.map((frame, i) => {
    const shape = at(shapes, i);
    const slots: Slot[] = at(plan.slots, i);
    const notched = notchOutline(shape, slots, reliefR);
    const id = at(ids, i);
    if (notched.parts > 1 || notched.holes > 0 || notched.outline.length === 0) {
      issues.error('PIECE.CUT_APART', `the slots cut ${id} into ${notched.parts} parts`, [id]);
    }
    const comp = machine.kind === 'laser' ? compensateKerf(notched.outline, machine.kerfMm) : notched;
    for (const s of slots) {
      const web = slotWeb(shape, s);
      if (web < spec.minWebMm) {
        const partner = at(ids, s.partner);
        issues.warn(
          'SLOT.THIN_WEB',
          `the slot in ${id} for ${partner} leaves ${round(web, 2)} mm of material to the edge ` +
            `(minimum ${round(spec.minWebMm, 2)} mm)`,
          [id, partner],
        );
      }
    }
    for (let a = 0; a < slots.length; a++) {
      for (let b = a + 1; b < slots.length; b++) {
        const sa = slots[a] as Slot;
        const sb = slots[b] as Slot;
        const gap = slotGap(sa, sb, spec.minWebMm);
        if (gap > 1e-6 && gap < spec.minWebMm) {
          const [pa, pb] = [at(ids, sa.partner), at(ids, sb.partner)];
          const which = pa === pb ? `two slots for ${pa}` : `the slots for ${pa} and ${pb}`;
          issues.warn(
            'SLOT.THIN_WEB',
            `in ${id} ${which} leave ${round(gap, 2)} mm of material between them ` +
              `(minimum ${round(spec.minWebMm, 2)} mm)`,
            [...new Set([id, pa, pb])],
          );
        }
      }
    }
    if (spec.bed && comp.outline.length && !fitsBed(comp.outline, spec.bed.widthMm, spec.bed.heightMm)) {
      issues.error(
        'PIECE.LARGER_THAN_BED',
        `${id} does not fit the ${spec.bed.widthMm} × ${spec.bed.heightMm} mm bed in any orientation`,
        [id],
      );
    }
    return {
      id,
      face: frame.face,
      frame,
      circumradiusMm: size * frame.distance,
      shape,
      nominalOutline: notched.outline,
      outline: comp.outline,
      slots: slots.map((s) => ({
        crossing: s.crossing,
        partner: at(ids, s.partner),
        end: s.end,
        axis: s.axis,
        depthMm: s.depth,
        widthMm: s.width,
        drawnWidthMm: s.width - removed,
      })),
      reliefs:
        reliefR > 0
          ? slots.flatMap((s) =>
              slotInnerCorners(s).map((k) => ({
                centre: dogBoneCentre(k.corner, k.walls, reliefR),
                radiusMm: reliefR,
              })),
            )
          : [],
    };
  });

  const report = makeReport(spec, solid, mmPerUnit, pieces, crossings, plan.options, widths, removed, issues);
  return { spec, solid, mmPerUnit, pieces, crossings, slotSearchUsed: plan.searched, report };
}

function makeReport(
  spec: ResolvedSpec,
  solid: Solid,
  mmPerUnit: number,
  pieces: BuiltPiece[],
  crossings: Crossing[],
  options: readonly (0 | 1 | null)[],
  widths: readonly number[],
  removed: number,
  issues: IssueList,
): DesignReport {
  const dihedrals = [...new Set(solid.edges.map((e) => round(e.dihedralDeg, 4)))].sort((a, b) => a - b);
  const planeDistanceMm = Math.min(...pieces.map((p) => p.frame.distance));
  const diameterMm = 2 * Math.max(...pieces.map((p) => Math.hypot(p.frame.distance, p.circumradiusMm)));
  const pieceReports: ReportPiece[] = pieces.map((p) => ({
    id: p.id,
    face: p.face,
    normal: r3(p.frame.normal),
    centreMm: r3(p.frame.centre),
    frameX: r3(p.frame.x),
    frameY: r3(p.frame.y),
    firstVertexMm: r3(scale3(at(solid.vertices, at(at(solid.faces, p.face).vertices, 0)), mmPerUnit)),
    areaMm2: round(signedArea(p.outline), 4),
    nominalAreaMm2: round(signedArea(p.nominalOutline), 4),
    outline: p.outline.map((q) => [round(q[0]), round(q[1])] as [number, number]),
    slotCount: p.slots.length,
    slots: p.slots.map((s) => ({
      partner: s.partner,
      crossing: s.crossing,
      openingMm: [round(s.end[0]), round(s.end[1])] as [number, number],
      direction: [round(s.axis[0], 9), round(s.axis[1], 9)] as [number, number],
      depthMm: round(s.depthMm),
      widthMm: round(s.widthMm),
      drawnWidthMm: round(s.drawnWidthMm),
    })),
  }));
  const crossingReports: ReportCrossing[] = crossings.map((c, i) => {
    const o = at(options, i);
    const w = at(widths, i);
    const r: ReportCrossing = {
      a: at(pieces, c.a).id,
      b: at(pieces, c.b).id,
      angleDeg: round(c.angleDeg, 6),
      lengthMm: round(c.length),
      slotWidthMm: round(w),
      drawnSlotWidthMm: round(w - removed),
      slotDepthMm: round(c.length / 2 + spec.depthClearanceMm),
    };
    if (o !== null) {
      r.slotEndA = r3(crossingPoint(c, o === 1 ? c.t1 : c.t0));
      r.slotEndB = r3(crossingPoint(c, o === 1 ? c.t0 : c.t1));
    }
    return r;
  });
  const sugg = cachedSuggestions(solid, spec);
  const dedupe = (list: DesignIssue[]) => {
    const seen = new Set<string>();
    return list.filter((x) => {
      const k = `${x.code}|${x.message}`;
      if (seen.has(k)) return false;
      seen.add(k);
      return true;
    });
  };
  return {
    solid: {
      name: typeof spec.solid === 'string' ? solid.id : solid.name,
      faceCount: solid.faces.length,
      vertexCount: solid.vertices.length,
      edgeCount: solid.edges.length,
      dihedralAnglesDeg: dihedrals,
    },
    piece: { ...spec.piece },
    mmPerUnit: round(mmPerUnit, 9),
    planeDistanceMm: round(planeDistanceMm),
    diameterMm: round(diameterMm),
    suggestedSizes: {
      touch: sugg.touch === null ? null : round(sugg.touch, 6),
      overlap: sugg.overlap === null ? null : round(sugg.overlap, 6),
    },
    machine: spec.machine,
    stock: { ...spec.stock },
    pieces: pieceReports,
    crossings: crossingReports,
    errors: dedupe(issues.errors),
    warnings: dedupe(issues.warnings),
  };
}

/** A piece's outline as 3D points in model space, mm (for previews). */
export function pieceOutline3d(
  piece: BuiltPiece,
  which: 'outline' | 'nominalOutline' | 'shape' = 'outline',
): Vec3[] {
  return (piece[which] as Polygon).map((p) => fromFrame(piece.frame, p));
}
