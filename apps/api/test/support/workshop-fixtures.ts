import { randomUUID } from 'node:crypto';
import { type TestContext } from './test-app';

export interface WorkshopFixture {
  acrylicId: string;
  pvcId: string;
  cardId: string;
  laserProfileId: string;
  laserVersionId: string;
  draftVersionId: string;
}

/** Hazard rows the fixtures rely on (the real table is seeded from safety/material-hazards.json). */
async function ensureHazards(ctx: TestContext): Promise<void> {
  await ctx.db.query(
    `INSERT INTO material_hazards (family, examples, laser, hazard, source) VALUES
       ('acrylic', '["cast acrylic"]', 'yes', 'irritant fumes; flames', 'university EHS lists'),
       ('card', '["card stock"]', 'yes', 'ignites easily', 'university EHS lists'),
       ('pvc', '["PVC", "vinyl"]', 'no', 'releases hydrogen chloride, which harms people and corrodes the machine', 'university EHS lists')
     ON CONFLICT (family) DO NOTHING`,
  );
}

/**
 * A material library and an approved laser profile written straight to the database, so job tests do not
 * depend on the materials and profiles routes (which have suites of their own).
 */
export async function createWorkshop(ctx: TestContext): Promise<WorkshopFixture> {
  await ensureHazards(ctx);
  const tag = randomUUID().slice(0, 8);
  const sheets = JSON.stringify([{ widthMm: 600, heightMm: 400, pricePerSheet: 18, currency: 'EUR' }]);
  const material = async (
    name: string,
    family: string,
    t: number,
    flexible: boolean,
    laserAllowed: boolean,
  ) => {
    const rows: { id: string }[] = await ctx.db.query(
      `INSERT INTO materials (name, family, nominal_thickness_mm, flexible, colours, stock_sheets, laser_allowed, hazard_note)
       VALUES ($1, $2, $3, $4, $5, $6, $7, $8) RETURNING id`,
      [
        `${name} ${tag}`,
        family,
        t,
        flexible,
        JSON.stringify(['clear', 'smoke', 'amber']),
        sheets,
        laserAllowed,
        laserAllowed ? '' : 'releases hydrogen chloride when cut with a beam',
      ],
    );
    return rows[0]!.id;
  };
  const acrylicId = await material('Cast acrylic 3 mm', 'acrylic', 3, false, true);
  const pvcId = await material('PVC sheet', 'pvc', 3, false, false);
  const cardId = await material('Card 350 gsm', 'card', 0.45, true, true);
  const setting = (materialId: string, kerfMm: number) => ({
    materialId,
    kerfMm,
    cutSpeedMmS: 12,
    markSpeedMmS: 200,
    powerPct: 65,
    passes: 1,
    pierceTimeS: 0.2,
  });
  const settings = JSON.stringify([setting(acrylicId, 0.18), setting(pvcId, 0.2), setting(cardId, 0.08)]);
  const profile: { id: string }[] = await ctx.db.query(
    `INSERT INTO machine_profiles (name, kind) VALUES ($1, 'co2-laser') RETURNING id`,
    [`Test laser ${tag}`],
  );
  const laserProfileId = profile[0]!.id;
  const version = async (number: number, state: string) => {
    const rows: { id: string }[] = await ctx.db.query(
      `INSERT INTO machine_profile_versions (profile_id, number, state, bed_width_mm, bed_height_mm, rapid_speed_mm_s, hourly_rate, settings)
       VALUES ($1, $2, $3, 1000, 600, 400, 40, $4) RETURNING id`,
      [laserProfileId, number, state, settings],
    );
    return rows[0]!.id;
  };
  const laserVersionId = await version(1, 'approved');
  const draftVersionId = await version(2, 'draft');
  return { acrylicId, pvcId, cardId, laserProfileId, laserVersionId, draftVersionId };
}

/** A design spec of our own: octahedron planes carrying hexagons, 3 mm rigid stock on a laser. */
export function octahedronHexagons(size = 1.3, diameterMm = 240) {
  return {
    solid: 'octahedron',
    piece: { sides: 6, step: 1, rotationDeg: 0, size },
    scale: { by: 'diameter', mm: diameterMm },
    stock: { thicknessMm: 3, flexible: false },
    machine: { kind: 'laser', kerfMm: 0.15 },
    fitMm: 0,
  };
}
