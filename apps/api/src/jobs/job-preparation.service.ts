import { HttpStatus, Injectable } from '@nestjs/common';
import { type EntityManager } from 'typeorm';
import {
  COLOUR_RULE_LABELS,
  type ColourRuleName,
  type DesignSpec,
  type DesignSpecInput,
  type JobPreparation,
  type MachineProfileKind,
  type MaterialView,
  pricedSheet,
  type ProfileSetting,
  toEstimateMachine,
  toMachineSpec,
} from '@kerfwright/contracts';
import {
  clashingColourNames,
  DesignTooHeavyError,
  SolidError,
  SpecValidationError,
} from '@kerfwright/geometry';
import { type PreparedJob } from '@kerfwright/geometry/worker';
import { AuditService } from '../audit/audit.service';
import { AppError } from '../common/errors';
import {
  type ApprovedProfileVersion,
  MachineProfilesService,
} from '../machine-profiles/machine-profiles.service';
import { MaterialsService } from '../materials/materials.service';
import { badSolid, invalidSpec, tooHeavy } from '../designs/design-engine';
import { GeometryThreads } from '../geometry/geometry-threads';
import { type PrepareJobDto, toScaleSpec } from './dto/job.dto';
import { type Job } from './job.entity';

export const DEFAULT_MARGIN_MM = 5;
export const DEFAULT_GAP_MM = 3;

/**
 * Preparation: checks material and machine against each other and the hazard table, then has the
 * geometry engine build the model for the real stock and machine and lay it out on sheets.
 */
@Injectable()
export class JobPreparationService {
  constructor(
    private readonly profiles: MachineProfilesService,
    private readonly materials: MaterialsService,
    private readonly audit: AuditService,
    private readonly threads: GeometryThreads,
  ) {}

  async prepare(
    m: EntityManager,
    job: Job,
    dto: PrepareJobDto,
  ): Promise<{ spec: DesignSpec; colours: string[]; preparation: JobPreparation }> {
    const { version, material, setting } = await this.machineFor(m, dto.profileVersionId, dto.materialId);
    const offered = material.colours;
    const colours = dto.colours.length > 0 ? dto.colours : offered.slice(0, 1);
    const unknown = colours.filter((c) => offered.length > 0 && !offered.includes(c));
    if (unknown.length > 0) {
      throw new AppError(
        HttpStatus.BAD_REQUEST,
        'JOB.UNKNOWN_COLOUR',
        `${material.name} is not stocked in ${unknown.join(', ')}`,
        [{ field: 'colours', messages: [`offered: ${offered.join(', ')}`] }],
      );
    }
    const clash = clashingColourNames(colours);
    if (clash) {
      throw new AppError(
        HttpStatus.BAD_REQUEST,
        'JOB.SAME_COLOURS',
        `${clash[0]} and ${clash[1]} cannot be told apart on the sheets and pieces; pick each colour once`,
        [{ field: 'colours', messages: ['each colour once'] }],
      );
    }
    const sheet = dto.sheet ?? material.stockSheets[0];
    if (!sheet) {
      throw new AppError(
        HttpStatus.CONFLICT,
        'JOB.NO_STOCK_SHEET',
        `${material.name} has no stock sheet size; give one`,
      );
    }
    // The layout is made on the sheet, and the machine must reach all of it: a sheet the bed cannot hold
    // either way round would put pieces where the head never goes.
    const bed = { widthMm: version.bedWidthMm, heightMm: version.bedHeightMm };
    if (!sheetFitsBed(sheet, bed)) {
      throw new AppError(
        HttpStatus.CONFLICT,
        'JOB.SHEET_LARGER_THAN_BED',
        `A ${sheet.widthMm} × ${sheet.heightMm} mm sheet does not fit the ${bed.widthMm} × ${bed.heightMm} mm bed of ${version.profileName} either way round; choose a sheet the bed can hold`,
        { sheet: { widthMm: sheet.widthMm, heightMm: sheet.heightMm }, bed },
      );
    }
    const thicknessMm = material.measuredThicknessMm ?? material.nominalThicknessMm;
    const machine = toMachineSpec(version.kind, setting);
    // The design's own layout settings and colour rule apply unless the fabricator overrides them: the design as
    // requested, not an earlier preparation's spec (which keeps only the thickness and names no margin, gap,
    // colour rule or size search), so preparing again starts where the first preparation did.
    const designed = (job.requestedSpec ?? job.spec) as DesignSpecInput;
    const marginMm = dto.marginMm ?? designed.stock.marginMm ?? DEFAULT_MARGIN_MM;
    const gapMm = dto.gapMm ?? designed.stock.gapMm ?? DEFAULT_GAP_MM;
    const colourRule = dto.colourRule ?? designed.colours?.rule;
    const { colours: _designColours, ...rest } = designed;
    const input: DesignSpecInput = {
      ...rest,
      scale: dto.scale ? toScaleSpec(dto.scale) : designed.scale,
      stock: { thicknessMm, flexible: material.flexible },
      machine,
      bed: { widthMm: version.bedWidthMm, heightMm: version.bedHeightMm },
    };
    const layoutStock = {
      sheet: { widthMm: sheet.widthMm, heightMm: sheet.heightMm },
      marginMm,
      gapMm,
      colourCount: colours.length,
      colourRule,
    };
    // The sheet's price now, kept with the preparation: the cut pack prices its sheets with it.
    const pricePerSheet = pricedSheet(material, sheet, version.currency);
    // The engine's work runs in a worker thread (see GeometryThreads): a fit search takes about a second.
    let prepared: PreparedJob;
    try {
      prepared = await this.threads.prepareJob({
        input,
        fitSearch: fitSearchSpec(input, layoutStock),
        cut: {
          sheet,
          marginMm,
          gapMm,
          colours: { count: colours.length, rule: colourRule },
          quantity: job.quantity,
        },
        // Time and cost as the cut pack will give them: the version's speeds and rate for this material, and
        // the sheet's price when the material lists that size (a size typed in has none).
        estimate: {
          machine: toEstimateMachine(version, setting),
          colours,
          pricePerSheet,
          currency: version.currency,
        },
      });
    } catch (err) {
      if (err instanceof SpecValidationError)
        throw invalidSpec(err.fieldErrors, (f) => preparedField(f, dto));
      if (err instanceof SolidError) throw badSolid(err);
      if (err instanceof DesignTooHeavyError) throw tooHeavy(err);
      throw err;
    }
    if (prepared.stage === 'fit') {
      throw new AppError(
        HttpStatus.CONFLICT,
        'JOB.DESIGN_INVALID',
        `The design cannot be fitted to the stock: ${prepared.errors[0]!.message}`,
        prepared.errors,
      );
    }
    const { spec, errors, layoutFailure, summary } = prepared;
    if (errors.length > 0) {
      throw new AppError(
        HttpStatus.CONFLICT,
        'JOB.DESIGN_INVALID',
        `In ${material.name} at ${thicknessMm} mm the design cannot be cut: ${errors[0]!.message}`,
        errors,
      );
    }
    if (layoutFailure || !summary) {
      const failure = layoutFailure ?? { code: 'LAYOUT.INVALID', message: 'no layout', pieces: [] };
      // The engine's "no plan exists: rule "…" cannot be met with k colours; it needs at least m", said as a
      // sentence for the workshop, with what to do about it.
      const message =
        failure.code === 'LAYOUT.NO_COLOUR_PLAN'
          ? `The colour rule “${COLOUR_RULE_LABELS[colourRule ?? 'neighbour-distinct']}” ${failure.message.replace(/^no plan exists: rule "[^"]*" /, '')}. ` +
            'Choose more colours of stock, or another rule.'
          : failure.message;
      throw new AppError(HttpStatus.CONFLICT, 'JOB.LAYOUT_FAILED', message, {
        code: failure.code,
        pieces: failure.pieces,
      });
    }
    return { spec, colours, preparation: { ...summary, pricePerSheet } };
  }

  /**
   * The machine and material a job is cut with, checked as preparation checks them: the profile version
   * approved right now, the material usable on its kind of machine (a laser never gets a material the hazard
   * table or the material itself now refuses, whatever the version's settings still name: 409
   * MATERIAL.LASER_PROHIBITED), and the version's settings for that material.
   */
  async machineFor(
    m: EntityManager,
    profileVersionId: string,
    materialId: string,
    retiredAllowed = false,
  ): Promise<{ version: ApprovedProfileVersion; material: MaterialView; setting: ProfileSetting }> {
    const version = await this.profiles.getApprovedVersion(profileVersionId, m, retiredAllowed);
    const material = await this.materials.assertUsableOn(m, materialId, version.kind);
    const setting = version.settings.find((s) => s.materialId === material.id);
    if (!setting) {
      throw new AppError(
        HttpStatus.CONFLICT,
        'JOB.NO_MACHINE_SETTINGS',
        `The machine profile has no settings for ${material.name}; add them to a new profile version first`,
      );
    }
    return { version, material, setting };
  }

  /**
   * For approval, release and every cut-pack build: the prepared job's machine and material pass the checks of
   * preparation again, now (a material may have been taken off the laser since, a version retired). A released
   * job's pack built again may use the version it was released on though a newer one has retired it.
   */
  async assertStillCuttable(
    m: EntityManager,
    job: Pick<Job, 'profileVersionId' | 'materialId'> & Partial<Pick<Job, 'spec' | 'state'>>,
  ): Promise<{ version: ApprovedProfileVersion; material: MaterialView; setting: ProfileSetting }> {
    if (!job.profileVersionId || !job.materialId) {
      throw new AppError(
        HttpStatus.CONFLICT,
        'JOB.NOT_PREPARED',
        'The job has no material and machine profile yet; prepare it first',
      );
    }
    // A released job was cut on the version it was approved on: its pack may be built again with that version
    // (new safety notices, a lost file) after a newer one retired it. Any other job needs the approved one.
    const found = await this.machineFor(m, job.profileVersionId, job.materialId, job.state === 'released');
    // Slot widths follow the stock's thickness: a new batch measured thicker since preparation would get
    // slots cut for the old one.
    const stock = job.spec?.stock;
    const material = found.material;
    const now = material.measuredThicknessMm ?? material.nominalThicknessMm;
    if (
      stock &&
      (Math.abs(stock.thicknessMm - now) > 1e-6 || (stock.flexible ?? false) !== material.flexible)
    ) {
      const what =
        Math.abs(stock.thicknessMm - now) > 1e-6
          ? `is now ${now} mm thick; the job was prepared for ${stock.thicknessMm} mm`
          : `is now ${material.flexible ? 'flexible' : 'rigid'}; the job was prepared for ${material.flexible ? 'rigid' : 'flexible'} stock`;
      throw new AppError(
        HttpStatus.CONFLICT,
        'JOB.MATERIAL_CHANGED',
        `${material.name} ${what}, and its slots would be cut for that. Prepare the job again`,
        { materialId: material.id, preparedThicknessMm: stock.thicknessMm, thicknessMm: now },
      );
    }
    return found;
  }

  /**
   * For downloads and recording the cut, where the version may since have been retired: the job's material
   * must still be allowed on its kind of machine (409 MATERIAL.LASER_PROHIBITED otherwise).
   */
  async assertMaterialAllowed(
    m: EntityManager,
    job: Pick<Job, 'profileVersionId' | 'materialId'>,
  ): Promise<void> {
    if (!job.profileVersionId || !job.materialId) return;
    const rows: { kind: MachineProfileKind }[] = await m.query(
      `SELECT p.kind FROM machine_profile_versions v JOIN machine_profiles p ON p.id = v.profile_id WHERE v.id = $1`,
      [job.profileVersionId],
    );
    const kind = rows[0]?.kind;
    if (kind) await this.materials.assertUsableOn(m, job.materialId, kind);
  }

  /** Keeps the kerf measured on a job's cut in the profile's kerf history (audited like any write). */
  async recordMeasuredKerf(
    m: EntityManager,
    job: Job,
    kerfMm: number,
    userId: string,
    requestId: string,
  ): Promise<void> {
    const rows: { id: string }[] = await m.query(
      `INSERT INTO kerf_records (profile_id, material_id, kerf_mm, job_id, notes, recorded_by)
       SELECT v.profile_id, $2, $3, $4, 'measured on the job''s cut', $5 FROM machine_profile_versions v WHERE v.id = $1
       RETURNING id`,
      [job.profileVersionId, job.materialId, kerfMm, job.id, userId],
    );
    if (rows[0]) {
      await this.audit.record(m, {
        actorId: userId,
        action: 'kerf-record.create',
        entityType: 'kerf-record',
        entityId: rows[0].id,
        after: { jobId: job.id, kerfMm },
        requestId,
      });
    }
  }
}

/**
 * For a fit scale (`fitSheets`: the largest model on N sheets of the chosen stock, `fitBed`: the largest whose
 * pieces fit the machine's bed): the design carrying that stock, for the geometry library's search. The size
 * found is fixed as a diameter, so the job and its cut pack are cut at exactly that size. Null for a fixed
 * scale.
 */
export function fitSearchSpec(
  input: DesignSpecInput,
  stock: {
    sheet: { widthMm: number; heightMm: number };
    marginMm: number;
    gapMm: number;
    colourCount: number;
    colourRule?: ColourRuleName;
  },
): DesignSpecInput | null {
  if (input.scale.by !== 'fitSheets' && input.scale.by !== 'fitBed') return null;
  // The search lays the pieces out on the chosen stock; each colour is cut from its own sheets.
  return {
    ...input,
    stock: { ...input.stock, sheet: stock.sheet, marginMm: stock.marginMm, gapMm: stock.gapMm },
    ...(stock.colourCount > 1
      ? { colours: { count: stock.colourCount, ...(stock.colourRule ? { rule: stock.colourRule } : {}) } }
      : {}),
  };
}

/** Whether a sheet lies on the bed one way round or the other (a sheet may be turned by a quarter). */
export function sheetFitsBed(
  sheet: { widthMm: number; heightMm: number },
  bed: { widthMm: number; heightMm: number },
): boolean {
  return (
    (sheet.widthMm <= bed.widthMm && sheet.heightMm <= bed.heightMm) ||
    (sheet.widthMm <= bed.heightMm && sheet.heightMm <= bed.widthMm)
  );
}

/**
 * A field of the spec a preparation checks, named as the prepare request names what it set: `scale.sheets` for
 * a scale the request gave, `sheet`, `marginMm`, `gapMm` and `colours` for the stock and colours it chose; a
 * field only the design sets stays `spec.…` (the job's design).
 */
function preparedField(specField: string, dto: { scale?: unknown }): string {
  const [head, ...rest] = specField.split('.');
  if (head === 'scale') return dto.scale ? specField : `spec.${specField}`;
  if (head === 'colours') return 'colours';
  if (head === 'stock' && rest[0] === 'sheet') return ['sheet', ...rest.slice(1)].join('.');
  if (head === 'stock' && (rest[0] === 'marginMm' || rest[0] === 'gapMm')) return rest[0];
  return `spec.${specField}`;
}
