/**
 * Design spec and design report: the shapes the geometry CLI reads and writes and the API takes.
 * Lengths are millimetres, angles degrees, unless a name says otherwise.
 */

/** Upload formats accepted for a base solid. */
export const SOLID_TEXT_FORMATS = ['obj', 'off'] as const;
export type SolidTextFormat = (typeof SOLID_TEXT_FORMATS)[number];

/** An uploaded convex solid: the text of a Wavefront OBJ or OFF file. */
export interface UploadedSolid {
  format: SolidTextFormat;
  text: string;
  /** Optional display name; defaults to "uploaded-obj" / "uploaded-off". */
  name?: string;
}

/**
 * Piece shape {sides/step}: a regular polygon (step 1) or regular star polygon.
 * `size` is the piece circumradius divided by the distance from the solid's centre to the piece's plane.
 */
export interface PieceShapeSpec {
  sides: number;
  /** Defaults to 1 (a convex regular polygon). */
  step?: number;
  /** In-plane rotation, degrees counter-clockwise seen from outside the solid. Defaults to 0. */
  rotationDeg?: number;
  size: number;
}

export const SCALE_BY = ['planeDistance', 'diameter', 'pieceCircumradius'] as const;
export type ScaleBy = (typeof SCALE_BY)[number];

/**
 * How the scale-free design maps to millimetres:
 * - `planeDistance`: the distance from the centre to the nearest piece plane is `mm`;
 * - `diameter`: twice the largest distance of any piece vertex from the centre is `mm`;
 * - `pieceCircumradius`: the largest piece circumradius is `mm`.
 */
export interface ScaleSpec {
  by: ScaleBy;
  mm: number;
}

export interface StockSpec {
  thicknessMm: number;
  /** Flexible stock (card): slots are thickness + fit wide whatever the crossing angle. Defaults to false. */
  flexible?: boolean;
}

export interface LaserMachineSpec {
  kind: 'laser';
  kerfMm: number;
}

export interface RouterMachineSpec {
  kind: 'router';
  toolDiameterMm: number;
}

export type MachineSpec = LaserMachineSpec | RouterMachineSpec;
export const MACHINE_KINDS = ['laser', 'router'] as const;
export type MachineKind = (typeof MACHINE_KINDS)[number];

export interface BedSpec {
  widthMm: number;
  heightMm: number;
}

/** A complete design: base solid, piece shape, scale, stock and machine. */
export interface DesignSpec {
  /** A catalogue id (see the geometry library's listSolids()) or an uploaded solid. */
  solid: string | UploadedSolid;
  piece: PieceShapeSpec;
  scale: ScaleSpec;
  stock: StockSpec;
  machine: MachineSpec;
  /** Fit allowance added to every slot width; negative = press fit. Defaults to 0. */
  fitMm?: number;
  /** Extra slot depth beyond the crossing midpoint, per slot. Defaults to 0. */
  depthClearanceMm?: number;
  /** Least material to leave between a slot and the piece's edge. Defaults to 2 × thickness. */
  minWebMm?: number;
  /** Machine bed; when given, every piece must fit on it. */
  bed?: BedSpec;
}

/** One finding of the validity check. Errors block files; warnings do not. */
export interface DesignIssue {
  /** AREA.REASON, for example `CROSSING.NOT_ASSEMBLABLE`. */
  code: string;
  message: string;
  /** Ids of the pieces concerned (may be empty). */
  pieces: string[];
}

export interface ReportSolid {
  name: string;
  faceCount: number;
  vertexCount: number;
  edgeCount: number;
  /** Distinct dihedral angles of the base solid, ascending, degrees. */
  dihedralAnglesDeg: number[];
}

export interface ReportPiece {
  id: string;
  /** Face index in the base solid. */
  face: number;
  /** Outward unit normal of the piece's plane. */
  normal: [number, number, number];
  /** Piece centre in model space, mm (the foot of the perpendicular from the solid's centre). */
  centreMm: [number, number, number];
  /** The piece's 2D frame in model space: unit x and y axes (x × y = normal). */
  frameX: [number, number, number];
  frameY: [number, number, number];
  /** The face's first vertex in model space, mm: frameX points from the centre toward it. */
  firstVertexMm: [number, number, number];
  /** Area of the compensated outline, mm². */
  areaMm2: number;
  /** Area of the nominal (uncompensated) outline with its slots, mm². */
  nominalAreaMm2: number;
  /** Compensated outline in the piece's 2D frame, mm, one closed counter-clockwise contour. */
  outline: [number, number][];
  slotCount: number;
  /** The piece's slots in its 2D frame (mm): opening point on the edge, unit direction inward, sizes. */
  slots?: ReportSlot[];
}

export interface ReportSlot {
  /** Id of the piece this slot receives. */
  partner: string;
  /** Index into the report's crossings. */
  crossing: number;
  openingMm: [number, number];
  direction: [number, number];
  depthMm: number;
  widthMm: number;
  drawnWidthMm: number;
}

export interface ReportCrossing {
  /** Piece ids. */
  a: string;
  b: string;
  /** Acute angle between the two planes. */
  angleDeg: number;
  /** Length of the overlap along the planes' intersection line. */
  lengthMm: number;
  /** Nominal slot width plus fit allowance. */
  slotWidthMm: number;
  /** Slot width as drawn after machine compensation. */
  drawnSlotWidthMm: number;
  /** Depth of each of the two slots (half the crossing plus depth clearance). */
  slotDepthMm: number;
  /** Ends of the crossing in model space, mm; `a`'s slot opens at `slotEndA`, `b`'s at `slotEndB`. */
  slotEndA?: [number, number, number];
  slotEndB?: [number, number, number];
}

export interface DesignReport {
  solid: ReportSolid;
  piece: { sides: number; step: number; rotationDeg: number; size: number };
  /** Millimetres per model unit of the base solid. */
  mmPerUnit: number;
  planeDistanceMm: number;
  diameterMm: number;
  /** Sizes (scale-free) worth offering: first contact with a neighbour's plane, and first overlap. */
  suggestedSizes: { touch: number | null; overlap: number | null };
  machine: MachineSpec;
  stock: { thicknessMm: number; flexible: boolean };
  pieces: ReportPiece[];
  crossings: ReportCrossing[];
  errors: DesignIssue[];
  warnings: DesignIssue[];
}
