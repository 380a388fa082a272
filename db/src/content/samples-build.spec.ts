import * as fs from 'node:fs';
import * as path from 'node:path';
import { buildModel, parseSolidText } from '@kerfwright/geometry';
import { loadMaterialHazards } from './material-hazards';
import { jobSpec, loadScenario, readDesignSpec } from './scenario';
import { contentPaths } from './content-paths';

const { hazardsFile: HAZARDS_FILE, samplesDir: SAMPLES_DIR } = contentPaths(
  path.resolve(__dirname, '..', '..', '..'),
);

const specsDir = path.join(SAMPLES_DIR, 'specs');
const specFiles = fs
  .readdirSync(specsDir)
  .filter((f) => f.endsWith('.json'))
  .sort();
const scenario = loadScenario(SAMPLES_DIR, { hazards: loadMaterialHazards(HAZARDS_FILE) });

/** Pieces reachable from the first one by following crossings (an assembly is one connected whole). */
function reachable(
  pieces: readonly { id: string }[],
  crossings: readonly { a: string; b: string }[],
): number {
  const first = pieces[0];
  if (first === undefined) return 0;
  const seen = new Set([first.id]);
  const todo = [first.id];
  for (let id = todo.pop(); id !== undefined; id = todo.pop()) {
    for (const c of crossings) {
      const other = c.a === id ? c.b : c.b === id ? c.a : undefined;
      if (other !== undefined && !seen.has(other)) {
        seen.add(other);
        todo.push(other);
      }
    }
  }
  return seen.size;
}

describe('the sample designs build through the geometry engine', () => {
  it('has a spec file for every scenario design and a design for every spec file', () => {
    expect(scenario.designs.map((d) => path.basename(d.specFile)).sort()).toEqual(specFiles);
  });

  it.each(specFiles)('%s builds without errors into one assembly in which every piece is slotted', (name) => {
    const spec = readDesignSpec(JSON.parse(fs.readFileSync(path.join(specsDir, name), 'utf8')), name);
    const { report } = buildModel(spec);
    expect(report.errors).toEqual([]);
    expect(report.crossings.length).toBeGreaterThan(0);
    // A piece without a slot would fall out; pieces in two unconnected groups are two models.
    for (const piece of report.pieces) expect(piece.slotCount).toBeGreaterThan(0);
    expect(reachable(report.pieces, report.crossings)).toBe(report.pieces.length);
  });

  it.each(scenario.jobs.map((j) => [j.key, j] as const))(
    'job %s builds without errors from its material and machine profile',
    (_key, job) => {
      const { report } = buildModel(jobSpec(scenario, job));
      expect(report.errors).toEqual([]);
    },
  );
});

describe('the sample solids for upload', () => {
  const read = (name: string) => fs.readFileSync(path.join(SAMPLES_DIR, 'solids', name), 'utf8');

  // A bipyramid over an n-gon has n + 2 vertices, 2n faces and 3n edges; Euler's formula
  // V - E + F = 2 holds for every convex polyhedron (REFERENCES.md, Geometry).
  it.each([
    ['pentagonal-bipyramid.off', 'off', 5],
    ['tall-square-bipyramid.obj', 'obj', 4],
  ] as const)('reads %s as a convex bipyramid', (name, format, n) => {
    const solid = parseSolidText(format, read(name));
    expect([solid.vertices.length, solid.faces.length, solid.edges.length]).toEqual([n + 2, 2 * n, 3 * n]);
    expect(solid.vertices.length - solid.edges.length + solid.faces.length).toBe(2);
  });
});
