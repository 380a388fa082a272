import * as fs from 'node:fs';
import * as path from 'node:path';
import {
  currentNotices,
  isLaserKind,
  JOB_STATES,
  laserRefusal,
  noticeApplies,
  ROLES,
} from '@kerfwright/contracts';
import { ContentError } from './content-error';
import { loadMaterialHazards } from './material-hazards';
import { loadSafetyNotices } from './safety-notices';
import { loadScenario, parseScenario, type Scenario } from './scenario';
import { contentPaths } from './content-paths';

const {
  hazardsFile: HAZARDS_FILE,
  noticesDir: NOTICES_DIR,
  samplesDir: SAMPLES_DIR,
} = contentPaths(path.resolve(__dirname, '..', '..', '..'));

const hazards = loadMaterialHazards(HAZARDS_FILE);
const scenarioFile = path.join(SAMPLES_DIR, 'scenario.json');
// The refusal tests edit the raw JSON freely, as a hand-edited file could be.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type RawScenario = Record<string, any>;
const raw = (): RawScenario => JSON.parse(fs.readFileSync(scenarioFile, 'utf8')) as RawScenario;

function material(s: Scenario, key: string) {
  const m = s.materials.find((x) => x.key === key);
  if (!m) throw new Error(`no material ${key}`);
  return m;
}

function laserSetting(s: Scenario, materialKey: string) {
  const profile = s.machineProfiles.find((p) => p.kind === 'co2-laser');
  const setting = profile?.settings.find((x) => x.material === materialKey);
  if (!setting) throw new Error(`no laser setting for ${materialKey}`);
  return setting;
}

describe('the demo scenario in samples/', () => {
  const s = loadScenario(SAMPLES_DIR, { hazards });

  it('has the four demo users, one per role, with the demo password', () => {
    expect(s.users.map((u) => [u.email, u.displayName, u.role])).toEqual([
      ['supervisor@millbrook-makerspace.example', 'Rosa Quintero', 'supervisor'],
      ['fabricator@millbrook-makerspace.example', 'Theo Lindqvist', 'fabricator'],
      ['operator@millbrook-makerspace.example', 'Amara Osei', 'operator'],
      ['hobbyist@millbrook-makerspace.example', 'Jun Park', 'hobbyist'],
    ]);
    expect([...new Set(s.users.map((u) => u.role))].sort()).toEqual([...ROLES].sort());
    expect(s.demoPassword).toBe('kerfwright-demo');
    expect(s.workshop.localRules.length).toBeGreaterThan(50);
  });

  it('stocks card in several colours, 3 mm cast acrylic, 3 mm birch plywood and 2 mm felt', () => {
    const byFamily = (f: string) => s.materials.filter((m) => m.family === f);
    expect(byFamily('card')[0]?.colours.length).toBeGreaterThanOrEqual(3);
    expect(byFamily('acrylic').some((m) => m.nominalThicknessMm === 3 && /cast/i.test(m.name))).toBe(true);
    expect(byFamily('plywood').some((m) => m.nominalThicknessMm === 3 && /birch/i.test(m.name))).toBe(true);
    expect(byFamily('felt').some((m) => m.nominalThicknessMm === 2 && m.flexible)).toBe(true);
  });

  it('keeps a prohibited material on file, marked as not allowed on a laser', () => {
    const refused = s.materials.filter((m) => laserRefusal(m.family, hazards) !== null);
    expect(refused.length).toBeGreaterThan(0);
    for (const m of refused) expect(m.laserAllowed).toBe(false);
    for (const p of s.machineProfiles.filter((x) => isLaserKind(x.kind))) {
      for (const setting of p.settings) expect(refused.map((m) => m.key)).not.toContain(setting.material);
    }
  });

  it('gives measured thicknesses inside the published tolerances', () => {
    // Cast acrylic, ISO 7823-1: ±(0.4 + 0.1·t) mm about the nominal thickness.
    const acrylic = material(s, 'acrylic-cast-3');
    expect(Math.abs(acrylic.measuredThicknessMm - 3)).toBeLessThanOrEqual(0.4 + 0.1 * 3);
    // Card is about 1.1-1.7 µm thick per g/m² (supplier tables): 300 g/m² → 0.33-0.51 mm.
    const card = material(s, 'card-300');
    expect(card.measuredThicknessMm).toBeGreaterThanOrEqual(300 * 0.0011);
    expect(card.measuredThicknessMm).toBeLessThanOrEqual(300 * 0.0017);
    // "3 mm" craft plywood often measures 2.7-3.3 mm (from memory).
    const ply = material(s, 'birch-ply-3');
    expect(ply.measuredThicknessMm).toBeGreaterThanOrEqual(2.7);
    expect(ply.measuredThicknessMm).toBeLessThanOrEqual(3.3);
  });

  it('has one approved 60 W CO2 laser profile and a router profile awaiting approval', () => {
    const laser = s.machineProfiles.filter((p) => p.kind === 'co2-laser');
    const router = s.machineProfiles.filter((p) => p.kind === 'cnc-router');
    expect(laser).toHaveLength(1);
    expect(laser[0]?.status).toBe('approved');
    expect(laser[0]?.name).toMatch(/60 W/);
    expect(router).toHaveLength(1);
    expect(router[0]?.status).toBe('awaiting-approval');
  });

  it('starts the laser from the published kerf and speed ranges', () => {
    // Kerf: laser-cutting services' artwork guides (REFERENCES.md, Stock and machines).
    expect(laserSetting(s, 'acrylic-cast-3').kerfMm).toBeGreaterThanOrEqual(0.15);
    expect(laserSetting(s, 'acrylic-cast-3').kerfMm).toBeLessThanOrEqual(0.23);
    expect(laserSetting(s, 'birch-ply-3').kerfMm).toBeCloseTo(0.2, 2);
    expect(laserSetting(s, 'card-300').kerfMm).toBeCloseTo(0.08, 2);
    for (const p of s.machineProfiles.filter((x) => isLaserKind(x.kind))) {
      for (const setting of p.settings) {
        expect(setting.kerfMm).toBeGreaterThanOrEqual(0.08);
        expect(setting.kerfMm).toBeLessThanOrEqual(0.45);
      }
    }
    // Speeds for a 60 W CO2 laser: a laser training course table.
    expect(laserSetting(s, 'acrylic-cast-3').cutSpeedMmS).toBeGreaterThanOrEqual(10);
    expect(laserSetting(s, 'acrylic-cast-3').cutSpeedMmS).toBeLessThanOrEqual(15);
    expect(laserSetting(s, 'birch-ply-3').cutSpeedMmS).toBeGreaterThanOrEqual(12);
    expect(laserSetting(s, 'birch-ply-3').cutSpeedMmS).toBeLessThanOrEqual(18);
  });

  it('has at least five designs and a job in every state', () => {
    expect(s.designs.length).toBeGreaterThanOrEqual(5);
    expect([...new Set(s.jobs.map((j) => j.state))].sort()).toEqual([...JOB_STATES].sort());
  });

  it('records acknowledgements of existing notice versions, covering every notice that applies', () => {
    const notices = loadSafetyNotices(NOTICES_DIR);
    const current = currentNotices(notices);
    for (const job of s.jobs.filter((j) => j.state === 'cut' || j.state === 'closed')) {
      const profile = s.machineProfiles.find((p) => p.key === job.profile);
      const m = material(s, job.material);
      if (!profile) throw new Error('profile missing');
      const acked = job.acknowledgements.flatMap((a) => a.notices);
      for (const ref of acked) {
        expect(notices.some((n) => n.id === ref.id && n.version === ref.version)).toBe(true);
      }
      for (const n of current.filter((x) => noticeApplies(x, profile.kind, m.family))) {
        expect(acked.map((a) => a.id)).toContain(n.id);
      }
    }
  });

  it('keeps the uploaded solid of a design identical to the file in samples/solids', () => {
    const uploaded = s.designs.filter((d) => typeof d.spec.solid !== 'string');
    expect(uploaded.length).toBeGreaterThan(0);
    for (const d of uploaded) {
      const solid = d.spec.solid;
      if (typeof solid === 'string') continue;
      const file = path.join(SAMPLES_DIR, 'solids', `${solid.name ?? ''}.${solid.format}`);
      expect(solid.text).toBe(fs.readFileSync(file, 'utf8'));
    }
  });
});

describe('parseScenario refuses a broken scenario', () => {
  const parse = (value: unknown) => parseScenario(value, 'scenario.json', SAMPLES_DIR, { hazards });

  it('refuses a laser job in PVC, giving the hazard as the reason', () => {
    const s = raw();
    const job = s.jobs.find((j: { state: string }) => j.state === 'draft');
    Object.assign(job, { material: 'pvc-foam-3', profile: 'co2-laser-60w', colours: ['white'] });
    const index = s.jobs.indexOf(job);
    // The material has no laser setting, so add one to reach the hazard check.
    s.machineProfiles[0].settings.push({ ...s.machineProfiles[0].settings[0], material: 'pvc-foam-3' });
    expect(() => parse(s)).toThrow(/machineProfiles\[0\]\.settings\[4\]\.material: .*not allowed on a laser/);
    s.machineProfiles[0].settings.pop();
    expect(() => parse(s)).toThrow(`jobs[${index}].profile`);
  });

  it('refuses a prohibited material that claims to be allowed on a laser', () => {
    const s = raw();
    const i = s.materials.findIndex((m: { family: string }) => m.family === 'pvc');
    s.materials[i].laserAllowed = true;
    expect(() => parse(s)).toThrow(
      new RegExp(`materials\\[${i}\\]\\.laserAllowed: must be false: .*hydrogen chloride`),
    );
  });

  it.each<[string, (s: RawScenario) => void, string]>([
    ['a missing role', (s) => s.users.pop(), 'users'],
    ['a repeated e-mail', (s) => s.users.push({ ...s.users[0] }), 'users[4]'],
    ['an unknown material family', (s) => (s.materials[0].family = 'cheese'), 'materials[0].family'],
    ['a job on an unknown design', (s) => (s.jobs[0].design = 'nope'), 'jobs[0].design'],
    [
      'a colour the material does not offer',
      (s) => (s.designs[0].colours = ['ultraviolet']),
      'designs[0].colours[0]',
    ],
    [
      'a history that skips approval',
      (s) => {
        const j = s.jobs.find((x: { state: string }) => x.state === 'released');
        j.history = j.history.filter((e: { state: string }) => e.state !== 'approved');
      },
      '.history[3].state',
    ],
    [
      'a prepared job on a profile awaiting approval',
      (s) => {
        const j = s.jobs.find((x: { state: string }) => x.state === 'prepared');
        j.profile = 'cnc-router-small';
        j.material = 'birch-ply-3';
        j.colours = ['natural'];
      },
      '.profile: a prepared job needs an approved machine profile ("cnc-router-small" is awaiting-approval)',
    ],
    [
      'an approval by a hobbyist',
      (s) => {
        const j = s.jobs.find((x: { state: string }) => x.state === 'approved');
        j.history[3].by = 'hobbyist@millbrook-makerspace.example';
      },
      '.history[3].by: a hobbyist may not approve a job',
    ],
    [
      'a returned job without a reason',
      (s) => {
        delete s.jobs.find((x: { state: string }) => x.state === 'returned').returnReason;
      },
      '.returnReason',
    ],
    [
      'a cut job without acknowledgements',
      (s) => {
        delete s.jobs.find((x: { state: string }) => x.state === 'cut').acknowledgements;
      },
      '.acknowledgements',
    ],
    [
      'a laser setting with a power over 100 %',
      (s) => (s.machineProfiles[0].settings[0].powerPct = 120),
      'machineProfiles[0].settings[0].powerPct',
    ],
    [
      'an approved profile without its approver',
      (s) => delete s.machineProfiles[0].approvedBy,
      'machineProfiles[0].approvedBy',
    ],
    [
      'a fractional pass count',
      (s) => (s.machineProfiles[0].settings[0].passes = 1.5),
      'machineProfiles[0].settings[0].passes',
    ],
  ])('refuses %s, naming the field', (_what, edit, field) => {
    const s = raw();
    edit(s);
    expect(() => parse(s)).toThrow(ContentError);
    expect(() => parse(s)).toThrow(field);
  });

  it('refuses a design whose spec does not match its material and profile', () => {
    const s = raw();
    const i = s.designs.findIndex((d: { material: string }) => d.material === 'acrylic-cast-3');
    s.designs[i].material = 'birch-ply-3';
    s.designs[i].colours = ['natural'];
    expect(() => parse(s)).toThrow(/stock\.thicknessMm: must be the measured thickness of "birch-ply-3"/);
  });

  it("refuses a hobbyist's job on a design of someone else's", () => {
    const s = raw();
    const i = s.jobs.findIndex((j: { owner: string }) => j.owner.startsWith('hobbyist@'));
    const other = s.designs.find((d: { owner: string }) => !d.owner.startsWith('hobbyist@'));
    s.jobs[i].design = other.key;
    expect(() => parse(s)).toThrow(`jobs[${i}].design: a hobbyist's job uses one of their own designs`);
  });

  it('refuses a spec file that cannot be read', () => {
    const s = raw();
    s.designs[0].spec = 'specs/missing.json';
    expect(() => parse(s)).toThrow('designs[0].spec: cannot read specs/missing.json');
  });
});
