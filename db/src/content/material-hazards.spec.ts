import * as path from 'node:path';
import {
  familyNamedIn,
  findMaterialHazard,
  laserRefusal,
  MATERIAL_FAMILIES,
  type MaterialHazard,
} from '@kerfwright/contracts';
import { ContentError } from './content-error';
import { loadMaterialHazardTable, loadMaterialHazards, parseMaterialHazards } from './material-hazards';
import { contentPaths } from './content-paths';

const { hazardsFile: HAZARDS_FILE } = contentPaths(path.resolve(__dirname, '..', '..', '..'));

/**
 * Never laser-cut (university EHS approved-materials lists, as REFERENCES.md "Safety" gives them):
 * chlorinated plastics, polycarbonate, ABS, HDPE, foams, PTFE, acetal, fibreglass, coated carbon fibre,
 * glue-backed sheet and anything unidentified.
 */
const NEVER_ON_LASER = [
  'pvc',
  'polycarbonate',
  'abs',
  'hdpe',
  'foam',
  'ptfe',
  'acetal',
  'fibreglass',
  'carbon-fibre',
  'glue-backed',
  'unidentified',
];
/** Fine with care (same lists): acrylic, plywood, MDF, card and paper. */
const FINE_WITH_CARE = ['acrylic', 'plywood', 'mdf', 'card', 'paper'];

describe('the material hazard table in safety/material-hazards.json', () => {
  const table = loadMaterialHazardTable(HAZARDS_FILE);
  const rows = table.rows;

  it('has a version and exactly one row for every material family', () => {
    expect(Number.isInteger(table.version)).toBe(true);
    expect(rows.map((r) => r.family).sort()).toEqual([...MATERIAL_FAMILIES].sort());
  });

  it('names a source on every row', () => {
    for (const row of rows) {
      expect(row.source).toMatch(/EHS|common practice|from memory|ISO|IEC|ANSI|NFPA|IARC/);
      expect(row.examples.length).toBeGreaterThan(0);
      expect(row.hazard.length).toBeGreaterThan(10);
    }
  });

  it('marks every family on the never-cut lists as not allowed on a laser', () => {
    for (const family of NEVER_ON_LASER) expect(findMaterialHazard(family, rows)?.laser).toBe('no');
  });

  it('names the never-cut plastics by the words their sheets are sold under, and no allowed sample material', () => {
    // Trade names and abbreviations of the never-cut plastics (common practice); the shipped sample materials
    // are named as their own families.
    for (const [name, family] of [
      ['Grey PVC sheet 3 mm', 'pvc'],
      ['Polyvinyl chloride offcut', 'pvc'],
      ['Self-adhesive vinyl', 'pvc'],
      ['Lexan offcut', 'polycarbonate'],
      ['Black ABS 2 mm', 'abs'],
      ['Delrin plate', 'acetal'],
      ['PTFE sheet', 'ptfe'],
      ['FR-4 board', 'fibreglass'],
      ['Carbon fibre laminate', 'carbon-fibre'],
    ] as const)
      expect(familyNamedIn(name, 'acrylic', rows)?.row.family).toBe(family);
    for (const name of [
      'Card stock 300 g/m²',
      'Cast acrylic 3 mm',
      'Birch plywood 3 mm',
      'Wool felt 2 mm',
      'MDF',
    ])
      expect(familyNamedIn(name, 'other', rows)).toBeUndefined();
  });

  it('allows the families that are fine with care', () => {
    for (const family of FINE_WITH_CARE) expect(findMaterialHazard(family, rows)?.laser).toBe('yes');
  });

  it('refuses every family whose row says no, with the hazard as the reason', () => {
    const refused = rows.filter((r) => r.laser === 'no');
    expect(refused.length).toBeGreaterThanOrEqual(NEVER_ON_LASER.length);
    for (const row of refused) {
      const reason = laserRefusal(row.family, rows);
      expect(reason).not.toBeNull();
      expect(reason).toContain(row.hazard);
    }
  });

  it('does not refuse the allowed and conditional families, and states each condition', () => {
    for (const row of rows.filter((r) => r.laser !== 'no')) {
      expect(laserRefusal(row.family, rows)).toBeNull();
      if (row.laser === 'conditional') expect(row.condition).toBeTruthy();
    }
  });

  it('gives the reasons the approved-materials lists give', () => {
    // University EHS approved-materials lists (REFERENCES.md, Safety).
    expect(laserRefusal('pvc', rows)).toMatch(/hydrogen chloride/);
    expect(laserRefusal('abs', rows)).toMatch(/hydrogen cyanide/);
    expect(laserRefusal('acetal', rows)).toMatch(/formaldehyde/);
    expect(laserRefusal('ptfe', rows)).toMatch(/fluorinated/);
    // Named as people know the material, by the table's examples, not by the family's code.
    const pvc = rows.find((r) => r.family === 'pvc')!;
    expect(laserRefusal('pvc', rows)).toMatch(new RegExp(`^${pvc.examples[0]}`));
    expect(laserRefusal('glue-backed', rows) ?? '').not.toMatch(/family|"glue-backed"/);
  });

  it('refuses a family missing from the table, as if unidentified', () => {
    const withoutFelt = rows.filter((r) => r.family !== 'felt');
    expect(laserRefusal('felt', withoutFelt)).toMatch(/not in the hazard table/);
    expect(laserRefusal('felt', rows)).toBeNull();
  });

  it('is what loadMaterialHazards returns', () => {
    expect(loadMaterialHazards(HAZARDS_FILE)).toEqual(rows);
  });
});

describe('parseMaterialHazards', () => {
  const base = (): { version: number; rows: MaterialHazard[] } => ({
    version: 1,
    rows: MATERIAL_FAMILIES.map((family) => ({
      family,
      examples: [`some ${family}`],
      laser: 'yes' as const,
      hazard: 'A hazard worth naming.',
      source: 'common practice',
    })),
  });
  const file = 'material-hazards.json';

  it('accepts a complete table', () => {
    expect(parseMaterialHazards(base(), file).rows).toHaveLength(MATERIAL_FAMILIES.length);
  });

  it.each<[string, (t: ReturnType<typeof base>) => unknown, string]>([
    [
      'a row without a source',
      (t) => ({ ...t, rows: t.rows.map((r, i) => (i === 2 ? { ...r, source: '' } : r)) }),
      'rows[2].source',
    ],
    [
      'an unknown family',
      (t) => ({ ...t, rows: [...t.rows, { ...t.rows[0], family: 'plutonium' }] }),
      `rows[${MATERIAL_FAMILIES.length}].family`,
    ],
    [
      'a family twice',
      (t) => ({ ...t, rows: [...t.rows, t.rows[0]] }),
      `rows[${MATERIAL_FAMILIES.length}].family`,
    ],
    ['a missing family', (t) => ({ ...t, rows: t.rows.filter((r) => r.family !== 'pvc') }), 'rows'],
    [
      'a conditional row without its condition',
      (t) => ({ ...t, rows: t.rows.map((r, i) => (i === 0 ? { ...r, laser: 'conditional' } : r)) }),
      'rows[0].condition',
    ],
    [
      'an allowance that is not yes/no/conditional',
      (t) => ({ ...t, rows: t.rows.map((r, i) => (i === 1 ? { ...r, laser: 'maybe' } : r)) }),
      'rows[1].laser',
    ],
    [
      'no examples',
      (t) => ({ ...t, rows: t.rows.map((r, i) => (i === 3 ? { ...r, examples: [] } : r)) }),
      'rows[3].examples',
    ],
    [
      'name words on a row the laser may cut',
      (t) => ({ ...t, rows: t.rows.map((r, i) => (i === 4 ? { ...r, nameWords: ['ply'] } : r)) }),
      'rows[4].nameWords',
    ],
    ['a version that is not a whole number', (t) => ({ ...t, version: 1.2 }), 'version'],
  ])('rejects %s, naming the field', (_what, edit, field) => {
    const bad = edit(base());
    expect(() => parseMaterialHazards(bad, file)).toThrow(ContentError);
    expect(() => parseMaterialHazards(bad, file)).toThrow(`${file}: ${field}:`);
  });
});
