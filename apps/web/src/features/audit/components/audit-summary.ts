import { type AuditEventView } from '@kerfwright/contracts';
import { isRecordId } from '../../../lib/record-id';
import { formatKerf } from '../../../lib/units';

/** What each kind of record is called on screen. */
export const ENTITY_LABELS: Record<string, string> = {
  material: 'Material',
  'machine-profile': 'Machine profile',
  'machine-profile-version': 'Profile version',
  'kerf-record': 'Kerf record',
  kerf_record: 'Kerf record',
  design: 'Design',
  job: 'Job',
  user: 'Person',
  safety: 'Safety',
};

const VERBS: Record<string, string> = {
  create: 'created',
  register: 'registered',
  update: 'changed',
  delete: 'deleted',
  duplicate: 'duplicated',
  submit: 'submitted for approval',
  approve: 'approved',
  return: 'sent back',
  retire: 'retired',
  adopt: 'adopted into a draft',
  request: 'requested',
  prepare: 'prepared',
  release: 'released',
  cut: 'recorded as cut',
  close: 'closed',
  reopen: 'reopened',
  withdraw: 'withdrawn by its requester',
  acknowledge: 'notices acknowledged',
  'local-rules': 'local rules changed',
};

/**
 * Whole actions whose last word alone would mislead: a job's cut pack being queued is not the job being
 * requested, and its files being stored is not the job being done.
 */
const ACTIONS: Record<string, string> = {
  'export.request': 'cut pack queued',
  'export.done': 'cut pack built',
  'design.solid': 'solid uploaded',
  // A job goes back to its requester as "returned" (its state); a profile version is "sent back".
  'job.return': 'returned',
  'user.sign-out': 'signed out',
};

/** What an action did, in words: "job.close" → "closed", "export.request" → "cut pack queued". */
export function actionVerb(action: string): string {
  const step = action.slice(action.indexOf('.') + 1);
  return ACTIONS[action] ?? VERBS[step] ?? step.replace(/[-_]/g, ' ');
}

/** Fields that change on every write and say nothing to a reader. */
const QUIET = new Set(['version', 'lockVersion', 'updatedAt', 'createdAt', 'id']);

type Fields = Record<string, unknown>;

function fields(value: unknown): Fields | null {
  return typeof value === 'object' && value !== null && !Array.isArray(value) ? (value as Fields) : null;
}

function text(value: unknown): string | null {
  return typeof value === 'string' && value.trim() ? value.trim() : null;
}

function short(value: string, max = 120): string {
  return value.length > max ? `${value.slice(0, max - 1)}…` : value;
}

/** The name of the record the event concerns, as far as its before/after snapshots tell. */
function subjectOf(entityType: string, before: Fields | null, after: Fields | null): string | null {
  for (const snapshot of [after, before]) {
    if (!snapshot) continue;
    if (entityType === 'machine-profile-version' && typeof snapshot.number === 'number') {
      // A version is named by its number, and by its profile when the snapshot carries the profile's name.
      const profile = text(snapshot.profileName);
      return profile ? `“${profile}” version ${snapshot.number}` : `version ${snapshot.number}`;
    }
    const name =
      text(snapshot.name) ??
      text(snapshot.designName) ??
      text(snapshot.displayName) ??
      text(snapshot.materialName) ??
      text(snapshot.email);
    if (name) return `“${name}”`;
    if (typeof snapshot.number === 'number') return `version ${snapshot.number}`;
  }
  return null;
}

/** A field that holds a record's id ("adoptedVersionId", "submittedBy") rather than a value a reader knows. */
function isIdField(key: string, ...values: unknown[]): boolean {
  return /(^id|Id|Ids|By)$/.test(key) || values.some((v) => typeof v === 'string' && isRecordId(v.trim()));
}

/** A field's name as people read it: "laserAllowed" → "laser allowed", "nominalThicknessMm" → "nominal thickness (mm)". */
export function fieldLabel(key: string): string {
  const unit = /Mm$/.test(key) ? ' (mm)' : '';
  const words = key
    .replace(/Mm$/, '')
    // An id field reads as what it points to: "adoptedVersionId" → "adopted version".
    .replace(/(.)Ids?$/, '$1')
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/[_-]+/g, ' ')
    .toLowerCase();
  return `${words}${unit}`;
}

/** A short value as people read it (yes/no, numbers, short text), or null when it is too long to show. */
function shortValue(value: unknown): string | null {
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'number') return String(value);
  if (value === null || value === undefined || value === '') return '—';
  if (typeof value === 'string' && value.length <= 40) return `“${value}”`;
  return null;
}

/**
 * One changed field: its name, with the old and new values when both are short ("laser allowed: no → yes").
 * A field holding a record's id says only whether it was set, cleared or changed ("adopted version set").
 */
function changeOf(key: string, before: Fields | null, after: Fields | null): string {
  const was = before?.[key];
  const now = after?.[key];
  if (isIdField(key, was, now)) {
    const empty = (v: unknown) => v === null || v === undefined || v === '';
    return `${fieldLabel(key)} ${empty(was) ? 'set' : empty(now) ? 'cleared' : 'changed'}`;
  }
  const from = shortValue(before?.[key]);
  const to = shortValue(after?.[key]);
  return from !== null && to !== null ? `${fieldLabel(key)}: ${from} → ${to}` : fieldLabel(key);
}

/** The top-level fields whose value differs between the two snapshots. */
export function changedFields(before: Fields | null, after: Fields | null): string[] {
  if (!before || !after) return [];
  const keys = new Set([...Object.keys(before), ...Object.keys(after)]);
  return [...keys].filter((k) => !QUIET.has(k) && JSON.stringify(before[k]) !== JSON.stringify(after[k]));
}

/**
 * One line saying what an audit event did, built from its action and its before/after snapshots:
 * "Material “Birch plywood 3 mm” created", "Profile version 2 sent back (submitted → draft; reason: …)",
 * "Job “Octahedron hexagons” approved (prepared → approved)". Record ids are never shown.
 */
export function auditSummary(e: Pick<AuditEventView, 'action' | 'entityType' | 'before' | 'after'>): string {
  const before = fields(e.before);
  const after = fields(e.after);
  const step = e.action.slice(e.action.indexOf('.') + 1);
  const verb = actionVerb(e.action);
  const subject = subjectOf(e.entityType, before, after);
  // A version's name says "version": "Profile version 2", "Profile “Bay 3 laser” version 2".
  const what =
    e.entityType === 'machine-profile-version' && subject
      ? 'Profile'
      : (ENTITY_LABELS[e.entityType] ?? e.entityType);
  let line = subject ? `${what} ${subject} ${verb}` : `${what} ${verb}`;

  const details: string[] = [];
  const stateBefore = text(before?.state);
  const stateAfter = text(after?.state);
  if (stateAfter && stateBefore && stateBefore !== stateAfter) details.push(`${stateBefore} → ${stateAfter}`);
  const reason = text(after?.returnReason) ?? text(after?.reason);
  if (reason && (step === 'return' || stateAfter === 'returned')) details.push(`reason: ${short(reason)}`);
  // A machine taken out of use says why (a version retired by a newer approval has no reason).
  const retireReason = text(after?.retireReason);
  if (retireReason && step === 'retire') details.push(`reason: ${short(retireReason)}`);
  if (step === 'update' || step === 'adopt') {
    // Adopting is setting the version a record went into: the verb says so, the version's id says nothing.
    const changed = changedFields(before, after).filter(
      (k) => step !== 'adopt' || !isIdField(k, before?.[k], after?.[k]),
    );
    if (changed.length) details.push(`changed ${changed.map((k) => changeOf(k, before, after)).join(', ')}`);
  }
  if (e.action === 'export.done' && Array.isArray(after?.files)) {
    const n = after.files.length;
    details.push(`${n} file${n === 1 ? '' : 's'}`);
  }
  if (typeof after?.kerfMm === 'number' && e.entityType.startsWith('kerf'))
    details.push(formatKerf(after.kerfMm, 'mm'));
  if (details.length) line += ` (${details.join('; ')})`;
  return line;
}
