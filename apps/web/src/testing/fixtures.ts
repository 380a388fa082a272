import {
  type JobSafetyView,
  type JobPreparation,
  type JobView,
  type MachineProfileVersionView,
  type MaterialView,
  type Role,
  type UserView,
} from '@kerfwright/contracts';

export function userFixture(role: Role, overrides: Partial<UserView> = {}): UserView {
  return {
    id: `00000000-0000-4000-8000-00000000000${['hobbyist', 'fabricator', 'operator', 'supervisor'].indexOf(role)}`,
    email: `${role}@workshop.example`,
    displayName: `${role.charAt(0).toUpperCase()}${role.slice(1)} Person`,
    role,
    active: true,
    createdAt: '2026-01-15T09:30:00.000Z',
    ...overrides,
  };
}

/** An approved laser profile version with one material setting (cast acrylic), every field given. */
export function versionFixture(
  overrides: Partial<MachineProfileVersionView> = {},
): MachineProfileVersionView {
  return {
    id: 'v-1',
    profileId: 'p-1',
    number: 1,
    state: 'approved',
    bedWidthMm: 600,
    bedHeightMm: 400,
    rapidSpeedMmS: 400,
    hourlyRate: 24,
    currency: 'EUR',
    notes: '',
    returnReason: null,
    basedOnNumber: null,
    createdBy: null,
    submittedBy: null,
    submittedAt: null,
    approvedBy: null,
    approvedAt: null,
    retiredAt: null,
    retireReason: null,
    lockVersion: 1,
    createdAt: '2026-01-01T00:00:00.000Z',
    updatedAt: '2026-01-01T00:00:00.000Z',
    settings: [
      {
        materialId: 'm-acrylic',
        materialName: 'Cast acrylic 3 mm',
        kerfMm: 0.08,
        cutSpeedMmS: 12,
        markSpeedMmS: 250,
        powerPct: 65,
        passes: 1,
        pierceTimeS: 0.3,
      },
    ],
    ...overrides,
  };
}

/** A job as the jobs list gives it: a requested job with nothing chosen for it yet, every field given. */
export function jobFixture(overrides: Partial<JobView> = {}): JobView {
  return {
    id: '11111111-2222-3333-4444-555555555555',
    state: 'requested',
    designId: 'd-1',
    designName: 'Cube planes with squares turned 45 degrees',
    requesterId: 'u-h',
    requesterName: 'Jun Park',
    quantity: 1,
    notes: '',
    materialId: null,
    materialName: null,
    colours: [],
    profileVersionId: null,
    profileName: null,
    profileVersionNumber: null,
    returnReason: null,
    preparation: null,
    actualMinutes: null,
    sheetsUsed: null,
    measuredKerfMm: null,
    version: 1,
    createdAt: '2026-01-01T00:00:00.000Z',
    updatedAt: '2026-01-01T00:00:00.000Z',
    actions: [],
    ...overrides,
  };
}

/**
 * A preparation as the API keeps it: eight pieces of a laser-cut model on one 600 × 400 mm sheet, with its
 * estimate. `estimate` given in the overrides is merged into this one.
 */
export function preparationFixture(
  overrides: Omit<Partial<JobPreparation>, 'estimate'> & {
    estimate?: Partial<NonNullable<JobPreparation['estimate']>>;
  } = {},
): JobPreparation {
  const { estimate, ...rest } = overrides;
  return {
    thicknessMm: 3,
    machineKind: 'laser',
    kerfMm: 0.15,
    pieceCount: 8,
    crossingCount: 12,
    diameterMm: 200,
    sheetCount: 1,
    sheet: { widthMm: 600, heightMm: 400 },
    utilisation: 0.3,
    warnings: [],
    ...rest,
    estimate: {
      cutLengthMm: 7000,
      markLengthMm: 2600,
      pierces: 8,
      travelMm: 4300,
      minutes: 9.5,
      machineCost: 3.8,
      materialCost: 14.5,
      currency: 'EUR',
      ...estimate,
    },
  };
}

/** A material as GET /api/materials gives it: 3 mm cast acrylic in 600 × 400 mm sheets, fit for a laser. */
export function materialFixture(overrides: Partial<MaterialView> = {}): MaterialView {
  return {
    id: 'm-acrylic',
    name: 'Cast acrylic 3 mm',
    family: 'acrylic',
    nominalThicknessMm: 3,
    measuredThicknessMm: null,
    flexible: false,
    colours: ['clear'],
    stockSheets: [{ widthMm: 600, heightMm: 400, pricePerSheet: 14.5, currency: 'EUR' }],
    laserAllowed: true,
    hazardNote: '',
    notes: '',
    version: 1,
    createdAt: '2026-01-01T00:00:00.000Z',
    updatedAt: '2026-01-01T00:00:00.000Z',
    ...overrides,
  };
}

/** A job's safety view on a CO2 laser and acrylic, with no notices: acknowledged or not. */
export function jobSafetyFixture(jobId: string, acknowledged: boolean): JobSafetyView {
  return {
    jobId,
    machineKind: 'co2-laser',
    materialFamily: 'acrylic',
    notices: [],
    localRules: null,
    preparationId: '7',
    acknowledged,
    acknowledgedAt: acknowledged ? '2026-01-02T00:00:00.000Z' : null,
  };
}
