import { Injectable } from '@nestjs/common';
import { type EntityManager } from 'typeorm';
import { type LaserAllowance, type MaterialFamily, type MaterialHazard } from '@kerfwright/contracts';

interface HazardRow {
  family: MaterialFamily;
  examples: string[];
  name_words: string[];
  laser: LaserAllowance;
  hazard: string;
  condition: string | null;
  source: string;
}

/**
 * Reads the material hazard table (seeded into `material_hazards` from safety/material-hazards.json).
 * Read inside the caller's transaction and never cached, so a changed table applies at once. An empty
 * table refuses every family for lasers (laserRefusal treats an unlisted family as unidentified).
 */
@Injectable()
export class HazardTableService {
  async rows(manager: EntityManager): Promise<MaterialHazard[]> {
    const rows: HazardRow[] = await manager.query(
      `SELECT family, examples, name_words, laser, hazard, condition, source FROM material_hazards ORDER BY family`,
    );
    return rows.map((r) => ({
      family: r.family,
      examples: r.examples,
      ...(r.name_words.length > 0 ? { nameWords: r.name_words } : {}),
      laser: r.laser,
      hazard: r.hazard,
      ...(r.condition ? { condition: r.condition } : {}),
      source: r.source,
    }));
  }
}
