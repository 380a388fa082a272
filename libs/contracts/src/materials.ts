/**
 * Materials library: request and response shapes of /api/materials, and the limits both the API and
 * the web forms check. Lengths in mm.
 */
import type { MaterialFamily } from './workshop';

/** Sane ranges for the numbers of a material (inclusive). */
export const MATERIAL_LIMITS = {
  thicknessMm: { min: 0.05, max: 50 },
  sheetSideMm: { min: 1, max: 5000 },
  pricePerSheet: { min: 0, max: 100000 },
  nameLength: 120,
  colourLength: 40,
  maxColours: 40,
  maxStockSheets: 20,
  hazardNoteLength: 2000,
  notesLength: 4000,
} as const;

/** Fields GET /api/materials can sort by; prefix with '-' for descending order. */
export const MATERIAL_SORT_FIELDS = [
  'name',
  'family',
  'nominalThicknessMm',
  'createdAt',
  'updatedAt',
] as const;
export type MaterialSortField = (typeof MATERIAL_SORT_FIELDS)[number];

/** One stock sheet size of a material, with its price. */
export interface StockSheet {
  widthMm: number;
  heightMm: number;
  pricePerSheet: number;
  /** ISO 4217 code, e.g. EUR. */
  currency: string;
}

export interface MaterialView {
  id: string;
  name: string;
  family: MaterialFamily;
  nominalThicknessMm: number;
  /** Thickness measured on the stock on hand (callipers); null when not measured. */
  measuredThicknessMm: number | null;
  /** Flexible stock (card, felt): slots may be thickness + fit wide whatever the crossing angle. */
  flexible: boolean;
  /** Colours the material is offered in. */
  colours: string[];
  stockSheets: StockSheet[];
  /** False for materials that must never go on a laser (the reason is in hazardNote). */
  laserAllowed: boolean;
  hazardNote: string;
  notes: string;
  /** Optimistic-locking version: send it back with PATCH. */
  version: number;
  createdAt: string;
  updatedAt: string;
}

/** The material's stock sheet of that size (either way round), if it lists one: its price and currency. */
export function stockSheetOf(
  material: Pick<MaterialView, 'stockSheets'>,
  sheet: { widthMm: number; heightMm: number },
): StockSheet | undefined {
  const { widthMm: w, heightMm: h } = sheet;
  return (
    material.stockSheets.find((s) => s.widthMm === w && s.heightMm === h) ??
    material.stockSheets.find((s) => s.widthMm === h && s.heightMm === w)
  );
}

/**
 * The price of one sheet in the machine's currency, for an estimate; null when the material lists no such
 * size or prices it in another currency (the two costs are not added up then). Preparation keeps it with the
 * job, and the studio and job pages price their sheets the same way.
 */
export function pricedSheet(
  material: Pick<MaterialView, 'stockSheets'>,
  sheet: { widthMm: number; heightMm: number },
  currency: string,
): number | null {
  const stock = stockSheetOf(material, sheet);
  return stock && stock.currency === currency ? stock.pricePerSheet : null;
}

/** Body of POST /api/materials. */
export interface CreateMaterialRequest {
  name: string;
  family: MaterialFamily;
  nominalThicknessMm: number;
  measuredThicknessMm?: number | null;
  flexible?: boolean;
  colours?: string[];
  stockSheets?: StockSheet[];
  /** Defaults to whether the hazard table allows the family on a laser. */
  laserAllowed?: boolean;
  /** Defaults to the hazard table's reason when the family is refused for lasers. */
  hazardNote?: string;
  notes?: string;
}

/** Body of PATCH /api/materials/:id: the fields to change and the version the client read. */
export interface UpdateMaterialRequest extends Partial<CreateMaterialRequest> {
  version: number;
}

/** Query of GET /api/materials. */
export interface ListMaterialsQuery {
  page?: number;
  pageSize?: number;
  sort?: MaterialSortField | `-${MaterialSortField}`;
  family?: MaterialFamily;
  /** Text searched in the name and the notes. */
  q?: string;
  laserAllowed?: boolean;
}

/** The thickness to design with: the measured one when known, else the nominal one. */
export function effectiveThicknessMm(
  m: Pick<MaterialView, 'nominalThicknessMm' | 'measuredThicknessMm'>,
): number {
  return m.measuredThicknessMm ?? m.nominalThicknessMm;
}
