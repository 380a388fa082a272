import * as fs from 'node:fs';
import {
  LASER_ALLOWANCES,
  MATERIAL_FAMILIES,
  type MaterialFamily,
  type MaterialHazard,
} from '@kerfwright/contracts';
import { ContentError, FieldReader } from './content-error';

export interface MaterialHazardTable {
  /** Raised whenever the table changes. */
  version: number;
  rows: MaterialHazard[];
}

/**
 * Checks a parsed hazard table: one row per material family (every family in MATERIAL_FAMILIES),
 * examples, hazard and source on every row, a condition exactly on the conditional rows, and name words
 * only on refused rows.
 */
export function parseMaterialHazards(value: unknown, file: string): MaterialHazardTable {
  const r = new FieldReader(file);
  const top = r.record(value, 'table');
  const version = r.integer(top.version, 'version', 1);
  const seen = new Set<MaterialFamily>();
  const rows = r.list(top.rows, 'rows', { nonEmpty: true }).map((raw, i): MaterialHazard => {
    const at = `rows[${i}]`;
    const row = r.record(raw, at);
    const family = r.oneOf(row.family, `${at}.family`, MATERIAL_FAMILIES);
    if (seen.has(family)) r.fail(`${at}.family`, `"${family}" has more than one row`);
    seen.add(family);
    const laser = r.oneOf(row.laser, `${at}.laser`, LASER_ALLOWANCES);
    const condition = r.optionalText(row.condition, `${at}.condition`);
    if (laser === 'conditional' && condition === undefined) {
      r.fail(`${at}.condition`, 'a conditional row must say what the condition is');
    }
    if (laser !== 'conditional' && condition !== undefined) {
      r.fail(`${at}.condition`, `only conditional rows carry a condition (laser is "${laser}")`);
    }
    const nameWords = row.nameWords === undefined ? undefined : r.texts(row.nameWords, `${at}.nameWords`);
    if (nameWords !== undefined && laser !== 'no') {
      // Name words flag a material filed under another family as one refused on the laser.
      r.fail(`${at}.nameWords`, `only refused rows carry name words (laser is "${laser}")`);
    }
    return {
      family,
      examples: r.texts(row.examples, `${at}.examples`),
      ...(nameWords === undefined ? {} : { nameWords }),
      laser,
      hazard: r.text(row.hazard, `${at}.hazard`),
      ...(condition === undefined ? {} : { condition }),
      source: r.text(row.source, `${at}.source`),
    };
  });
  const missing = MATERIAL_FAMILIES.filter((f) => !seen.has(f));
  if (missing.length > 0) r.fail('rows', `no row for ${missing.join(', ')}`);
  return { version, rows };
}

/** Reads and checks the material hazard table (JSON). */
export function loadMaterialHazardTable(file: string): MaterialHazardTable {
  let value: unknown;
  try {
    value = JSON.parse(fs.readFileSync(file, 'utf8'));
  } catch (err) {
    throw new ContentError(file, 'table', err instanceof Error ? err.message : String(err));
  }
  return parseMaterialHazards(value, file);
}

/** The rows of the material hazard table (see loadMaterialHazardTable for its version). */
export function loadMaterialHazards(file: string): MaterialHazard[] {
  return loadMaterialHazardTable(file).rows;
}
