import { Injectable } from '@nestjs/common';
import { type EntityManager } from 'typeorm';
import {
  type CutPackInput,
  JOB_PACK_STATES,
  type MaterialFamily,
  noticeApplies,
  pricedSheet,
} from '@kerfwright/contracts';
import { Design } from '../designs/design.entity';
import { Job } from '../jobs/job.entity';
import { DEFAULT_GAP_MM, DEFAULT_MARGIN_MM, JobPreparationService } from '../jobs/job-preparation.service';
import { SafetyService } from '../safety/safety.service';
import { User } from '../users/user.entity';
import { ExportFailure } from './export-failure';

/**
 * Everything the geometry library needs to build a job's cut pack, read from the job as it was prepared
 * and approved: its spec and sheet, colours and quantity, the material, the approved profile version's
 * settings for that material, and the safety notices that apply.
 */
@Injectable()
export class CutPackInputService {
  constructor(
    private readonly preparation: JobPreparationService,
    private readonly safety: SafetyService,
  ) {}

  async forJob(m: EntityManager, jobId: string, createdAt: Date): Promise<CutPackInput> {
    const job = await m.findOne(Job, { where: { id: jobId } });
    if (!job) throw new ExportFailure('EXPORT.JOB_GONE', 'The job no longer exists');
    if (!job.preparation || !job.materialId || !job.profileVersionId) {
      throw new ExportFailure('EXPORT.JOB_NOT_PREPARED', 'The job has no preparation to build files from');
    }
    assertJobExportable(job);
    // The machine and material pass preparation's checks again, now: an approved version with settings for
    // the material, and a material still allowed on that kind of machine (MATERIAL.LASER_PROHIBITED else).
    const { version, material, setting } = await this.preparation
      .assertStillCuttable(m, job)
      .catch((err: unknown) => {
        throw ExportFailure.from(err, 'EXPORT.PROFILE_NOT_APPROVED');
      });
    const design = await m.findOne(Design, { where: { id: job.designId } });
    const requester = await m.findOne(User, { where: { id: job.requesterId } });
    const sheet = job.preparation.sheet;
    // The sheet's price as it was when the job was prepared and approved (its estimate's), in the machine's
    // currency; a job prepared before the price was kept is priced from today's list, as preparation prices.
    const pricePerSheet =
      job.preparation.pricePerSheet !== undefined
        ? job.preparation.pricePerSheet
        : pricedSheet(material, sheet, version.currency);
    const notices = (await this.safety.notices({}, m)).filter((n) =>
      noticeApplies(n, version.kind, material.family as MaterialFamily),
    );
    const localRules = await this.safety.localRules(m);
    return {
      spec: job.spec,
      sheet: { widthMm: sheet.widthMm, heightMm: sheet.heightMm },
      marginMm: job.preparation.marginMm ?? DEFAULT_MARGIN_MM,
      gapMm: job.preparation.gapMm ?? DEFAULT_GAP_MM,
      ...(job.preparation.colourRule ? { colourRule: job.preparation.colourRule } : {}),
      colours: job.colours.length > 0 ? job.colours : (material.colours.slice(0, 1) ?? []),
      quantity: job.quantity,
      machine: {
        profileName: version.profileName,
        profileVersion: version.number,
        kind: version.kind,
        bedWidthMm: version.bedWidthMm,
        bedHeightMm: version.bedHeightMm,
        cutSpeedMmS: setting.cutSpeedMmS,
        markSpeedMmS: setting.markSpeedMmS,
        pierceTimeS: setting.pierceTimeS,
        rapidSpeedMmS: version.rapidSpeedMmS,
        passes: setting.passes,
        ...(setting.powerPct !== undefined ? { powerPct: setting.powerPct } : {}),
        ...(setting.spindleRpm !== undefined ? { spindleRpm: setting.spindleRpm } : {}),
        hourlyRate: version.hourlyRate,
        currency: version.currency,
      },
      material: {
        name: material.name,
        family: material.family,
        thicknessMm: job.preparation.thicknessMm,
        pricePerSheet,
        currency: version.currency,
      },
      job: { id: job.id, title: design?.name ?? 'Untitled design', requester: requester?.displayName ?? '' },
      notices: notices.map((n) => ({ id: n.id, version: n.version, title: n.title, severity: n.severity })),
      localRulesVersion: localRules?.version ?? null,
      units: 'mm',
      archive: true,
      createdAt: createdAt.toISOString(),
    };
  }
}

/**
 * A cut pack is built only for an approved job (whose release it is) or a released one (a re-export): a job
 * returned, cut or closed meanwhile gets no files (EXPORT.JOB_CHANGED, final).
 */
export function assertJobExportable(job: Pick<Job, 'state'>): void {
  if (!JOB_PACK_STATES.includes(job.state)) {
    throw new ExportFailure(
      'EXPORT.JOB_CHANGED',
      `The job is ${job.state} now; a cut pack is built only for an approved or released job`,
    );
  }
}
