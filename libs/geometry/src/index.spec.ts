import * as fs from 'node:fs';
import * as path from 'node:path';
import * as api from './index';

describe('public entry', () => {
  it('reaches no Node-only module (browser-safe)', () => {
    const seen = new Set<string>();
    const banned: string[] = [];
    const visit = (file: string) => {
      if (seen.has(file)) return;
      seen.add(file);
      const text = fs.readFileSync(file, 'utf8');
      for (const m of text.matchAll(/(?:import|export)[^'"]*?from\s+'([^']+)'/g)) {
        const spec = m[1] ?? '';
        if (spec.startsWith('.')) {
          const base = path.resolve(path.dirname(file), spec);
          visit(fs.existsSync(`${base}.ts`) ? `${base}.ts` : path.join(base, 'index.ts'));
        } else if (/^(node:|fs$|path$|os$|child_process$)/.test(spec)) banned.push(`${file}: ${spec}`);
      }
    };
    visit(path.join(__dirname, 'index.ts'));
    expect(seen.size).toBeGreaterThan(10);
    expect(banned).toEqual([]);
  });

  it('exports the verb-named functions', () => {
    for (const name of [
      'buildModel',
      'getSolid',
      'listSolids',
      'parseSolidText',
      'pieceToSvg',
      'pieceToDxf',
      'validateSpec',
    ]) {
      expect(typeof (api as Record<string, unknown>)[name]).toBe('function');
    }
  });
});
