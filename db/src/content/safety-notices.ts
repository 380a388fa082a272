import * as fs from 'node:fs';
import * as path from 'node:path';
import matter from 'gray-matter';
import {
  APPLIES_TO_ALL,
  MACHINE_PROFILE_KINDS,
  MATERIAL_FAMILIES,
  NOTICE_SEVERITIES,
  type MachineProfileKind,
  type MaterialFamily,
  type SafetyNotice,
} from '@kerfwright/contracts';
import { ContentError, FieldReader } from './content-error';

/**
 * What the last paragraph of every notice must mention: local codes, the machine maker's manual, the
 * material's safety data sheet and the workshop's own rules (common practice for safety guidance).
 */
export const DEFERRAL_TERMS: readonly { name: string; pattern: RegExp }[] = [
  { name: 'local codes', pattern: /\blocal codes\b/i },
  { name: "the machine maker's manual", pattern: /\bmachine maker['’]s manual\b/i },
  { name: "the material's safety data sheet", pattern: /\bsafety data sheet\b/i },
  { name: "the workshop's own rules", pattern: /\bworkshop['’]s own rules\b/i },
];

/** The last paragraph of a Markdown body, with line breaks folded to spaces. */
export function lastParagraph(markdown: string): string {
  const paragraphs = markdown
    .trim()
    .split(/\n\s*\n/)
    .map((p) => p.replace(/\s+/g, ' ').trim())
    .filter((p) => p !== '');
  return paragraphs[paragraphs.length - 1] ?? '';
}

/** The deferral terms the body's last paragraph does not mention (empty when it defers properly). */
export function missingDeferralTerms(markdown: string): string[] {
  const last = lastParagraph(markdown);
  return DEFERRAL_TERMS.filter((t) => !t.pattern.test(last)).map((t) => t.name);
}

function appliesToList<T extends string>(
  r: FieldReader,
  value: unknown,
  field: string,
  allowed: readonly T[],
): (T | typeof APPLIES_TO_ALL)[] {
  const items = r.list(value, field, { nonEmpty: true });
  const choices: readonly (T | typeof APPLIES_TO_ALL)[] = [...allowed, APPLIES_TO_ALL];
  const ids = items.map((v, i) => r.oneOf<T | typeof APPLIES_TO_ALL>(v, `${field}[${i}]`, choices));
  if (ids.includes(APPLIES_TO_ALL) && ids.length > 1) r.fail(field, `'*' must stand alone`);
  if (new Set(ids).size !== ids.length) r.fail(field, 'lists an id twice');
  return ids;
}

/**
 * Parses one notice file (Markdown with YAML front matter) and checks every field.
 * @param file used in error messages and to check that the file is named after the notice's id.
 */
export function parseSafetyNotice(text: string, file: string): SafetyNotice {
  const r = new FieldReader(file);
  let parsed: matter.GrayMatterFile<string>;
  try {
    parsed = matter(text);
  } catch (err) {
    throw new ContentError(file, 'front matter', err instanceof Error ? err.message : String(err));
  }
  const data = r.record(parsed.data, 'front matter');
  const id = r.key(data.id, 'id');
  const version = r.integer(data.version, 'version', 1);
  const base = path.basename(file, '.md');
  if (base !== id && base !== `${id}.v${version}`) {
    r.fail('id', `the file must be named ${id}.md (or ${id}.v${version}.md for an archived version)`);
  }
  const appliesTo = r.record(data.appliesTo, 'appliesTo');
  const body = parsed.content.trim();
  if (body === '') r.fail('body', 'must not be empty');
  const missing = missingDeferralTerms(body);
  if (missing.length > 0) {
    r.fail('body', `the last paragraph must defer to ${missing.join(', ')}`);
  }
  return {
    id,
    version,
    title: r.text(data.title, 'title'),
    severity: r.oneOf(data.severity, 'severity', NOTICE_SEVERITIES),
    appliesTo: {
      machineKinds: appliesToList<MachineProfileKind>(
        r,
        appliesTo.machineKinds,
        'appliesTo.machineKinds',
        MACHINE_PROFILE_KINDS,
      ),
      materialFamilies: appliesToList<MaterialFamily>(
        r,
        appliesTo.materialFamilies,
        'appliesTo.materialFamilies',
        MATERIAL_FAMILIES,
      ),
    },
    body,
    sources: r.texts(data.sources, 'sources'),
  };
}

/**
 * Reads every `*.md` notice in a folder (not recursive), sorted by id then version.
 * Throws a ContentError naming the file and field of the first bad notice, or a repeated id + version.
 */
export function loadSafetyNotices(dir: string): SafetyNotice[] {
  const files = fs
    .readdirSync(dir)
    .filter((f) => f.endsWith('.md') && f.toLowerCase() !== 'readme.md')
    .sort();
  const notices: SafetyNotice[] = [];
  const seen = new Map<string, string>();
  for (const name of files) {
    const file = path.join(dir, name);
    const notice = parseSafetyNotice(fs.readFileSync(file, 'utf8'), file);
    const key = `${notice.id}@${notice.version}`;
    const earlier = seen.get(key);
    if (earlier !== undefined) {
      throw new ContentError(file, 'version', `${notice.id} version ${notice.version} is also in ${earlier}`);
    }
    seen.set(key, file);
    notices.push(notice);
  }
  return notices.sort((a, b) => a.id.localeCompare(b.id) || a.version - b.version);
}
