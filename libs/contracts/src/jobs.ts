import type { Role } from './roles';

/**
 * A job moves draft → requested → prepared → approved → released → cut → closed, or is returned before its
 * cut; its requester may withdraw a request not yet prepared.
 */
export const JOB_STATES = [
  'draft',
  'requested',
  'prepared',
  'approved',
  'released',
  'cut',
  'closed',
  'returned',
] as const;
export type JobState = (typeof JOB_STATES)[number];

export const JOB_ACTIONS = [
  'request',
  'prepare',
  'approve',
  'release',
  'cut',
  'close',
  'return',
  'reopen',
  'withdraw',
] as const;
export type JobAction = (typeof JOB_ACTIONS)[number];

export interface JobTransitionRule {
  action: JobAction;
  from: readonly JobState[];
  to: JobState;
  /** Roles that may take the action (a supervisor always may). `owner` = the job's requester. */
  roles: readonly (Role | 'owner')[];
  /** What the action means, in the workshop's words. */
  label: string;
  /**
   * Set when the action is carried out by the cut-pack queue: the route answers `202 { exportId }` and the
   * job reaches `to` only when that export is done (in the same transaction), never before its files exist.
   */
  viaExport?: true;
}

/** The answer of `POST /api/jobs/:id/release` (and of `POST /api/jobs/:id/exports`): the queued export. */
export interface ExportRequested {
  exportId: string;
}

/** The job state machine: the server enforces it and the web client uses it to offer actions. */
export const JOB_TRANSITIONS: readonly JobTransitionRule[] = [
  { action: 'request', from: ['draft'], to: 'requested', roles: ['owner'], label: 'Request the cut' },
  {
    action: 'prepare',
    from: ['requested', 'prepared'],
    to: 'prepared',
    roles: ['fabricator'],
    label: 'Prepare: material, machine, layout',
  },
  { action: 'approve', from: ['prepared'], to: 'approved', roles: ['supervisor'], label: 'Approve the job' },
  {
    action: 'release',
    from: ['approved'],
    to: 'released',
    roles: ['fabricator'],
    label: 'Release to the machines',
    viaExport: true,
  },
  { action: 'cut', from: ['released'], to: 'cut', roles: ['operator'], label: 'Record the cut' },
  { action: 'close', from: ['cut'], to: 'closed', roles: ['operator', 'fabricator'], label: 'Close the job' },
  // A released job is returned too: a wrong stock found at the machine, or a machine version withdrawn after
  // release, stops it before the cut (its files are no longer offered).
  {
    action: 'return',
    from: ['requested', 'prepared', 'approved', 'released'],
    to: 'returned',
    roles: ['fabricator'],
    label: 'Return with a reason',
  },
  { action: 'reopen', from: ['returned'], to: 'draft', roles: ['owner'], label: 'Reopen as a draft' },
  // Before anyone has prepared it, the requester may take a request back (a wrong quantity, a changed mind).
  { action: 'withdraw', from: ['requested'], to: 'draft', roles: ['owner'], label: 'Withdraw the request' },
];

export function transitionFor(action: JobAction): JobTransitionRule {
  const rule = JOB_TRANSITIONS.find((t) => t.action === action);
  if (!rule) throw new Error(`unknown job action ${action}`);
  return rule;
}

/**
 * The actions that end a request's wait for the workshop: it is accepted (approved), sent back (returned), or
 * taken back by its requester (withdrawn).
 */
export const JOB_WAIT_ENDING_ACTIONS: readonly JobAction[] = ['approve', 'return', 'withdraw'];

/**
 * States of a job open with the workshop: requested and not yet approved, returned or withdrawn (so requested,
 * or prepared and waiting for approval). Read off the state machine: where a request leads, and every state the
 * workshop's other actions lead on to from there. A requester may have only so many open at a time.
 */
export const JOB_OPEN_STATES: readonly JobState[] = (() => {
  const open = new Set<JobState>([transitionFor('request').to]);
  for (let grew = true; grew;) {
    grew = false;
    for (const t of JOB_TRANSITIONS) {
      if (JOB_WAIT_ENDING_ACTIONS.includes(t.action) || open.has(t.to)) continue;
      if (t.from.some((s) => open.has(s))) {
        open.add(t.to);
        grew = true;
      }
    }
  }
  return [...open];
})();

/** Actions a user may take on a job in its current state. */
export function allowedJobActions(state: JobState, role: Role, isOwner: boolean): JobAction[] {
  return JOB_TRANSITIONS.filter(
    (t) =>
      t.from.includes(state) &&
      (role === 'supervisor' || t.roles.includes(role) || (isOwner && t.roles.includes('owner'))),
  ).map((t) => t.action);
}

/**
 * States in which a job's copies and notes can still be changed: a draft, which is its requester's own (a
 * request is withdrawn, and a returned job reopened, to change them). Not an action: the state stays.
 */
export const JOB_EDITABLE_STATES: readonly JobState[] = ['draft'];

/**
 * States of a job whose cut pack may be built: approved (the build releases it) or released (a re-export). A cut
 * or closed job is done with the machine; a returned one is not to be cut. A job that leaves these states
 * cancels a pack still queued or being built.
 */
export const JOB_PACK_STATES: readonly JobState[] = ['approved', 'released'];

/** Who may change a job's copies and notes (while JOB_EDITABLE_STATES has its state): its requester or a supervisor. */
export function mayChangeJobRequest(role: Role, isOwner: boolean): boolean {
  return isOwner || role === 'supervisor';
}

/** Whether a user may change a job's copies and notes now. */
export function mayEditJobRequest(state: JobState, role: Role, isOwner: boolean): boolean {
  return JOB_EDITABLE_STATES.includes(state) && mayChangeJobRequest(role, isOwner);
}

export interface JobTransitionView {
  from: JobState | null;
  to: JobState;
  action: string;
  actorId: string | null;
  actorName: string | null;
  reason: string | null;
  at: string;
}

/** What preparation computed: the engine's figures for the chosen material, machine and stock. */
export interface JobPreparation {
  thicknessMm: number;
  machineKind: 'laser' | 'router';
  kerfMm?: number;
  toolDiameterMm?: number;
  pieceCount: number;
  crossingCount: number;
  diameterMm: number;
  sheetCount: number;
  sheet: { widthMm: number; heightMm: number };
  /** Layout settings used, so the cut pack lays the sheets out exactly as preparation did. */
  marginMm?: number;
  gapMm?: number;
  colourRule?: ColourRuleName;
  utilisation: number;
  warnings: string[];
  /**
   * The price of one sheet in the machine's currency when the job was prepared (null: the material lists no
   * such size in that currency). The cut pack prices its sheets with it, so its material cost is the one
   * approved even if the price list changes later. Absent on jobs prepared before it was kept.
   */
  pricePerSheet?: number | null;
  /**
   * Time and cost of cutting the sheets as the cut pack draws them (labels and scale marks included), at the
   * profile version's speeds and hourly rate: the figures the setup sheet prints. `materialCost` is null when
   * the sheet size has no price in the material's stock list. Absent on jobs prepared before it was kept.
   */
  estimate?: {
    cutLengthMm: number;
    markLengthMm: number;
    pierces: number;
    travelMm: number;
    minutes: number;
    machineCost: number;
    materialCost: number | null;
    currency: string;
  };
}

/**
 * The layout choices of a job's last preparation: kept when a change of copies drops the preparation's
 * figures, so preparing again starts from the same sheet and colour rule.
 */
export interface JobLayoutChoice {
  sheet: { widthMm: number; heightMm: number };
  colourRule?: ColourRuleName;
  marginMm?: number;
  gapMm?: number;
}

/** The layout choices a preparation was made with (what `JobView.layoutChoice` keeps). */
export function layoutChoiceOf(p: JobPreparation): JobLayoutChoice {
  return {
    sheet: { widthMm: p.sheet.widthMm, heightMm: p.sheet.heightMm },
    ...(p.colourRule ? { colourRule: p.colourRule } : {}),
    ...(p.marginMm !== undefined ? { marginMm: p.marginMm } : {}),
    ...(p.gapMm !== undefined ? { gapMm: p.gapMm } : {}),
  };
}

export interface JobView {
  id: string;
  state: JobState;
  designId: string;
  designName: string;
  requesterId: string;
  requesterName: string;
  quantity: number;
  notes: string;
  materialId: string | null;
  materialName: string | null;
  colours: string[];
  profileVersionId: string | null;
  profileName: string | null;
  profileVersionNumber: number | null;
  /** True when the job's profile version is no longer the approved one (retired since preparation). */
  profileVersionRetired?: boolean;
  /** Why a supervisor took that version out of use, when they did (null when a newer approval retired it). */
  profileRetireReason?: string | null;
  /**
   * Why the job's material may not be cut on its machine now (kept off the laser, or refused by the hazard table,
   * since the job was prepared): the message the server's 409 MATERIAL.LASER_PROHIBITED gives. Such a job is not
   * approved, released or cut (those actions are not offered) until it is prepared with another material or
   * returned. Null when it may be cut, or before preparation and after the cut.
   */
  materialRefusal?: string | null;
  /** True when the caller prepared the job (so may not approve it: four eyes). */
  preparedByCaller?: boolean;
  returnReason: string | null;
  preparation: JobPreparation | null;
  /** The sheet and colour rule the job was last prepared with (null: never prepared). */
  layoutChoice?: JobLayoutChoice | null;
  actualMinutes: number | null;
  sheetsUsed: number | null;
  measuredKerfMm: number | null;
  version: number;
  createdAt: string;
  updatedAt: string;
  /** Actions the caller may take now. */
  actions: JobAction[];
}

export interface JobDetailView extends JobView {
  transitions: JobTransitionView[];
}

/** Rules that share a model's pieces among stock colours (see the geometry library's colour plans). */
export const COLOUR_RULES = ['neighbour-distinct', 'vertex-distinct', 'opposite-match'] as const;
export type ColourRuleName = (typeof COLOUR_RULES)[number];

/** How each colour rule is named to people (forms, messages); the rule's id stays in the saved spec. */
export const COLOUR_RULE_LABELS: Record<ColourRuleName, string> = {
  'neighbour-distinct': 'Neighbours differ',
  'vertex-distinct': 'All pieces around a vertex differ',
  'opposite-match': 'Opposite pieces match, neighbours differ',
};
