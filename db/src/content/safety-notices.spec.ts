import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import {
  currentNotices,
  MACHINE_PROFILE_KINDS,
  MATERIAL_FAMILIES,
  noticeApplies,
  type SafetyNotice,
} from '@kerfwright/contracts';
import { ContentError } from './content-error';
import { lastParagraph, loadSafetyNotices, parseSafetyNotice } from './safety-notices';
import { contentPaths } from './content-paths';

const { noticesDir: NOTICES_DIR } = contentPaths(path.resolve(__dirname, '..', '..', '..'));

const LASERS = ['co2-laser', 'diode-laser', 'fibre-laser'] as const;

const GOOD = `---
id: sample-notice
version: 2
title: A sample
severity: caution
appliesTo:
  machineKinds: [co2-laser]
  materialFamilies: ['*']
sources:
  - common practice
---

# A sample

Some advice.

This notice does not replace local codes, the machine maker's manual, the material's safety data sheet or
the workshop's own rules.
`;

function byId(notices: readonly SafetyNotice[], id: string): SafetyNotice {
  const found = notices.find((n) => n.id === id);
  if (!found) throw new Error(`no notice ${id}`);
  return found;
}

describe('the safety notices in safety/notices', () => {
  const notices = loadSafetyNotices(NOTICES_DIR);

  it('load, at least one per topic of the safety issue', () => {
    for (const id of [
      'laser-classes',
      'laser-eye-protection',
      'laser-fire',
      'laser-fume-extraction',
      'laser-prohibited-materials',
      'router-work-holding',
      'router-dust-and-noise',
    ]) {
      expect(byId(notices, id).version).toBeGreaterThanOrEqual(1);
    }
  });

  it('each have a whole-number version, non-empty applies-to lists, a severity and named sources', () => {
    for (const n of notices) {
      expect(Number.isInteger(n.version) && n.version >= 1).toBe(true);
      expect(n.appliesTo.machineKinds.length).toBeGreaterThan(0);
      expect(n.appliesTo.materialFamilies.length).toBeGreaterThan(0);
      expect(['danger', 'warning', 'caution']).toContain(n.severity);
      expect(n.sources.length).toBeGreaterThan(0);
      for (const s of n.sources) expect(s.trim().length).toBeGreaterThan(3);
    }
  });

  it('each end by deferring to local codes, the maker’s manual, the safety data sheet and the workshop’s own rules', () => {
    // The deferral every caution needs (REFERENCES.md, Safety: common practice), checked here with
    // plain substring tests independent of the loader's own check.
    for (const n of notices) {
      const last = lastParagraph(n.body).toLowerCase();
      expect(last).toContain('local codes');
      expect(last).toContain("machine maker's manual");
      expect(last).toContain('safety data sheet');
      expect(last).toContain("workshop's own rules");
    }
  });

  it('have unique ids, one file per id', () => {
    const ids = notices.map((n) => n.id);
    expect(new Set(ids).size).toBe(ids.length);
    expect(currentNotices(notices)).toHaveLength(ids.length);
  });

  it('name the standards their facts come from', () => {
    // Sources as REFERENCES.md (Safety) gives them.
    const sources = (id: string) => byId(notices, id).sources.join(' | ');
    expect(sources('laser-classes')).toMatch(/IEC 60825-1/);
    expect(sources('laser-classes')).toMatch(/ANSI Z136\.1/);
    expect(sources('laser-eye-protection')).toMatch(/EN 207/);
    expect(sources('laser-eye-protection')).toMatch(/ISO 19818-1/);
    expect(sources('laser-fire')).toMatch(/NFPA 115/);
    expect(sources('laser-prohibited-materials')).toMatch(/approved-materials lists/);
    expect(sources('router-dust-and-noise')).toMatch(/IARC/);
    expect(sources('router-dust-and-noise')).toMatch(/2003\/10\/EC/);
  });

  it('state the reference values they rely on', () => {
    // IEC 60825-1: class 3B ends at 0.5 W continuous wave, class 4 above (REFERENCES.md, Safety).
    expect(byId(notices, 'laser-classes').body).toMatch(/0\.5 W/);
    // Wavelengths of CO2, blue diode and fibre lasers (REFERENCES.md, Safety).
    const eye = byId(notices, 'laser-eye-protection').body;
    expect(eye).toMatch(/10\.6 µm/);
    expect(eye).toMatch(/445 nm/);
    expect(eye).toMatch(/1064 nm/);
    // NFPA 115: beams above 2 W/cm² are ignition sources.
    expect(byId(notices, 'laser-fire').body).toMatch(/2 W\/cm²/);
    // Every institutional rule set: never leave a running laser unattended.
    expect(byId(notices, 'laser-fire').body.toLowerCase()).toContain('never leave a running laser');
    // EU directive 2003/10/EC: hearing protection worn from 85 dB(A); IARC: wood dust Group 1.
    expect(byId(notices, 'router-dust-and-noise').body).toMatch(/85 dB\(A\)/);
    expect(byId(notices, 'router-dust-and-noise').body).toMatch(/Group 1/);
  });

  it('give every machine kind and material family at least one notice, and every laser the fire notice', () => {
    for (const kind of MACHINE_PROFILE_KINDS) {
      for (const family of MATERIAL_FAMILIES) {
        expect(notices.filter((n) => noticeApplies(n, kind, family)).length).toBeGreaterThan(0);
      }
    }
    const fire = byId(notices, 'laser-fire');
    for (const kind of LASERS) expect(noticeApplies(fire, kind, 'acrylic')).toBe(true);
    expect(noticeApplies(fire, 'cnc-router', 'plywood')).toBe(false);
    expect(noticeApplies(byId(notices, 'router-dust-and-noise'), 'cnc-router', 'mdf')).toBe(true);
    expect(noticeApplies(byId(notices, 'card-and-paper'), 'co2-laser', 'card')).toBe(true);
    expect(noticeApplies(byId(notices, 'card-and-paper'), 'co2-laser', 'acrylic')).toBe(false);
  });
});

describe('parseSafetyNotice', () => {
  const file = path.join('notices', 'sample-notice.md');

  it('reads the front matter and keeps the Markdown body', () => {
    const n = parseSafetyNotice(GOOD, file);
    expect(n).toMatchObject({
      id: 'sample-notice',
      version: 2,
      severity: 'caution',
      appliesTo: { machineKinds: ['co2-laser'], materialFamilies: ['*'] },
      sources: ['common practice'],
    });
    expect(n.body.startsWith('# A sample')).toBe(true);
  });

  it.each([
    ['a fractional version', GOOD.replace('version: 2', 'version: 1.5'), 'version'],
    ['a version of zero', GOOD.replace('version: 2', 'version: 0'), 'version'],
    ['a version given as text', GOOD.replace('version: 2', "version: '2'"), 'version'],
    ['an unknown severity', GOOD.replace('severity: caution', 'severity: mild'), 'severity'],
    ['an unknown machine kind', GOOD.replace('[co2-laser]', '[plasma-cutter]'), 'appliesTo.machineKinds[0]'],
    [
      'an empty family list',
      GOOD.replace("materialFamilies: ['*']", 'materialFamilies: []'),
      'appliesTo.materialFamilies',
    ],
    [
      "'*' beside a family",
      GOOD.replace("materialFamilies: ['*']", "materialFamilies: ['*', card]"),
      'appliesTo.materialFamilies',
    ],
    ['no sources', GOOD.replace('sources:\n  - common practice', 'sources: []'), 'sources'],
    ['no deferral at the end', GOOD.replace(/This notice[\s\S]*$/, 'Be careful.\n'), 'body'],
    [
      'a deferral that forgets the data sheet',
      GOOD.replace("the material's safety data sheet or", 'or'),
      'body',
    ],
    ['a deferral that is not the last paragraph', GOOD + '\nOne more line.\n', 'body'],
    ['an id that is not kebab-case', GOOD.replace('id: sample-notice', 'id: Sample_Notice'), 'id'],
  ])('rejects %s, naming the file and field', (_what, text, field) => {
    expect(() => parseSafetyNotice(text, file)).toThrow(ContentError);
    expect(() => parseSafetyNotice(text, file)).toThrow(`${file}: ${field}:`);
  });

  it('rejects a file not named after its id', () => {
    expect(() => parseSafetyNotice(GOOD, 'notices/other.md')).toThrow('notices/other.md: id:');
  });
});

describe('loadSafetyNotices', () => {
  let dir: string;
  beforeEach(() => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'kw-notices-'));
  });
  afterEach(() => fs.rmSync(dir, { recursive: true, force: true }));

  it('keeps an archived older version beside the new one, and the newer one is current', () => {
    fs.writeFileSync(path.join(dir, 'sample-notice.md'), GOOD);
    fs.writeFileSync(path.join(dir, 'sample-notice.v1.md'), GOOD.replace('version: 2', 'version: 1'));
    const all = loadSafetyNotices(dir);
    expect(all.map((n) => n.version)).toEqual([1, 2]);
    expect(currentNotices(all).map((n) => [n.id, n.version])).toEqual([['sample-notice', 2]]);
  });

  it('refuses the same id and version twice', () => {
    fs.writeFileSync(path.join(dir, 'sample-notice.md'), GOOD);
    fs.writeFileSync(path.join(dir, 'sample-notice.v2.md'), GOOD);
    expect(() => loadSafetyNotices(dir)).toThrow(/version: sample-notice version 2 is also in/);
  });
});
