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

/** Scales that search for the largest model that fits the stock (see the geometry library's README). */
export const FIT_SCALE_BY = ['fitSheets', 'fitBed'] as const;
export type FitScaleBy = (typeof FIT_SCALE_BY)[number];

/**
 * Scaling to stock: `fitSheets` — the largest model whose layout needs at most `sheets` sheets of
 * `stock.sheet` (found by a search over the layout); `fitBed` — the largest model whose biggest piece fits
 * `bed` in some orientation.
 */
export type FitScaleSpec = { by: 'fitSheets'; sheets: number } | { by: 'fitBed' };

/** Every scale a spec may give: a fixed size or a fit to the stock. */
export type AnyScaleSpec = ScaleSpec | FitScaleSpec;

export interface StockSpec {
  thicknessMm: number;
  /** Flexible stock (card): slots are thickness + fit wide whatever the crossing angle. Defaults to false. */
  flexible?: boolean;
  /** Sheet size of the stock; when given, the layout reports how many sheets the model needs. */
  sheet?: SheetSpec;
  /** Margin kept free along the sheet's edges. Defaults to 5 mm. */
  marginMm?: number;
  /** Gap between pieces on a sheet. Defaults to 3 mm. */
  gapMm?: number;
}

export interface SheetSpec {
  widthMm: number;
  heightMm: number;
}

/** Colour rules for sharing pieces among stock colours (same names as COLOUR_RULES in jobs). */
export const COLOUR_PLAN_RULES = ['neighbour-distinct', 'vertex-distinct', 'opposite-match'] as const;
export type ColourPlanRule = (typeof COLOUR_PLAN_RULES)[number];

/** How many colours of stock the model is cut from, and the rule that assigns pieces to them. */
export interface ColoursSpec {
  /** Number of colours (1–12). May be left out when `names` is given. */
  count?: number;
  /** Defaults to `neighbour-distinct`. */
  rule?: ColourPlanRule;
  /** Colour names in order (for file names and labels); their number must match `count`. */
  names?: string[];
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
  /** Colours of stock; when given, the report carries a colour plan. */
  colours?: ColoursSpec;
}

/**
 * What the geometry library accepts: a DesignSpec whose scale may also be a fit to the stock
 * (`fitSheets`, `fitBed`). A fit resolves to a fixed diameter (see DesignReport.scale).
 */
export interface DesignSpecInput extends Omit<DesignSpec, 'scale'> {
  scale: AnyScaleSpec;
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
  /** True when the default slot-end rule made slots collide and a search chose the ends instead. */
  slotEndsSearched?: boolean;
  /** How the size was reached (always present from the geometry library). */
  scale?: ReportScale;
  /** Present when the spec gives `colours`. */
  colourPlan?: ReportColourPlan;
  /** Sheets of `stock.sheet` the layout uses (only from a build with layout, when the sheet is given). */
  sheetCount?: number;
  errors: DesignIssue[];
  warnings: DesignIssue[];
}

/** How a build reached its size. Lengths in mm. */
export interface ReportScale {
  method: ScaleBy | FitScaleBy;
  /** The resulting overall diameter (as DesignReport.diameterMm). */
  diameterMm: number;
  /** The same size as a fixed scale: build with `{ by: 'diameter', mm: diameterMm }` to reproduce it. */
  mmPerUnit: number;
  /** fitSheets: the most sheets asked for. */
  sheets?: number;
  /** fitSheets: false when the size is only the upper bound (a build without layout). */
  resolved?: boolean;
  /** Builds (fitBed) or layouts (fitSheets) the search evaluated. */
  evaluations?: number;
  /** fitSheets: the search stops when the largest fitting and the smallest failing size differ by this fraction. */
  tolerance?: number;
}

export interface ReportColourPlan {
  rule: ColourPlanRule;
  count: number;
  feasible: boolean;
  /** Colour index (0 … count − 1) per piece id; empty when no plan exists. */
  assignment: Record<string, number>;
  /** Colour counts are as equal as the piece count allows. */
  balanced: boolean;
  /** Pieces per colour. */
  colourCounts: number[];
  /** Plans up to renaming of colours, counted up to a small cap. */
  distinctPlans?: number;
  /** True when counting stopped at the cap. */
  distinctPlansCapped?: boolean;
  /** When no plan exists: the fewest colours with which the rule can be met. */
  fewestColours?: number;
  message?: string;
}
