import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import {
  type MachineProfileKind,
  type MachineProfileVersionView,
  type ProfileSetting,
  type ProfileVersionState,
} from '@kerfwright/contracts';
import { numericColumn } from '../common/db-helpers';

@Entity('machine_profiles')
export class MachineProfile {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'seed_key', type: 'varchar', length: 64, nullable: true }) seedKey: string | null;
  @Column({ type: 'varchar', length: 120 }) name: string;
  @Column({ type: 'varchar', length: 40 }) kind: MachineProfileKind;
  @Column({ name: 'created_by', type: 'uuid', nullable: true }) createdBy: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}

/** One numbered version of a profile; its content never changes once submitted. */
@Entity('machine_profile_versions')
export class MachineProfileVersion {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'profile_id', type: 'uuid' }) profileId: string;
  @Column({ type: 'integer' }) number: number;
  @Column({ name: 'based_on_number', type: 'integer', nullable: true }) basedOnNumber: number | null;
  @Column({ type: 'enum', enum: ['draft', 'submitted', 'approved', 'retired'], enumName: 'profile_state' })
  state: ProfileVersionState;
  @Column({ name: 'bed_width_mm', type: 'numeric', transformer: numericColumn }) bedWidthMm: number;
  @Column({ name: 'bed_height_mm', type: 'numeric', transformer: numericColumn }) bedHeightMm: number;
  @Column({ name: 'rapid_speed_mm_s', type: 'numeric', transformer: numericColumn }) rapidSpeedMmS: number;
  @Column({ name: 'hourly_rate', type: 'numeric', transformer: numericColumn }) hourlyRate: number;
  @Column({ type: 'varchar', length: 3 }) currency: string;
  @Column({ type: 'jsonb' }) settings: ProfileSetting[];
  @Column({ type: 'text' }) notes: string;
  @Column({ name: 'return_reason', type: 'text', nullable: true }) returnReason: string | null;
  @Column({ name: 'created_by', type: 'uuid', nullable: true }) createdBy: string | null;
  @Column({ name: 'submitted_by', type: 'uuid', nullable: true }) submittedBy: string | null;
  @Column({ name: 'submitted_at', type: 'timestamptz', nullable: true }) submittedAt: Date | null;
  @Column({ name: 'approved_by', type: 'uuid', nullable: true }) approvedBy: string | null;
  @Column({ name: 'approved_at', type: 'timestamptz', nullable: true }) approvedAt: Date | null;
  @Column({ name: 'returned_by', type: 'uuid', nullable: true }) returnedBy: string | null;
  @Column({ name: 'returned_at', type: 'timestamptz', nullable: true }) returnedAt: Date | null;
  @Column({ name: 'retired_by', type: 'uuid', nullable: true }) retiredBy: string | null;
  @Column({ name: 'retired_at', type: 'timestamptz', nullable: true }) retiredAt: Date | null;
  /** Why a supervisor took the version out of use; null when a newer approved version replaced it. */
  @Column({ name: 'retire_reason', type: 'text', nullable: true }) retireReason: string | null;
  /** Optimistic-locking counter, raised by every change (the service checks and raises it). */
  @Column({ name: 'lock_version', type: 'integer' }) lockVersion: number;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}

@Entity('kerf_records')
export class KerfRecord {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'profile_id', type: 'uuid' }) profileId: string;
  @Column({ name: 'material_id', type: 'uuid' }) materialId: string;
  @Column({ name: 'kerf_mm', type: 'numeric', transformer: numericColumn }) kerfMm: number;
  @Column({ name: 'job_id', type: 'uuid', nullable: true }) jobId: string | null;
  @Column({ type: 'text', default: '' }) notes: string;
  @Column({ name: 'recorded_by', type: 'uuid', nullable: true }) recordedBy: string | null;
  @Column({ name: 'adopted_version_id', type: 'uuid', nullable: true }) adoptedVersionId: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}

const iso = (d: Date | null): string | null => (d ? d.toISOString() : null);

/** What a version's view tells of a material: its name, and the laser condition on its family if any. */
export interface SettingMaterial {
  name: string;
  laserCondition?: string;
}

/** The version as the API shows it; what it tells of the materials comes from the caller (by id). */
export function toVersionView(
  v: MachineProfileVersion,
  materials: ReadonlyMap<string, SettingMaterial>,
): MachineProfileVersionView {
  return {
    id: v.id,
    profileId: v.profileId,
    number: v.number,
    state: v.state,
    bedWidthMm: v.bedWidthMm,
    bedHeightMm: v.bedHeightMm,
    rapidSpeedMmS: v.rapidSpeedMmS,
    hourlyRate: v.hourlyRate,
    currency: v.currency,
    settings: v.settings.map((s) => {
      const m = materials.get(s.materialId);
      return {
        ...s,
        materialName: m?.name ?? '',
        ...(m?.laserCondition ? { laserCondition: m.laserCondition } : {}),
      };
    }),
    notes: v.notes,
    returnReason: v.returnReason,
    basedOnNumber: v.basedOnNumber,
    createdBy: v.createdBy,
    submittedBy: v.submittedBy,
    submittedAt: iso(v.submittedAt),
    approvedBy: v.approvedBy,
    approvedAt: iso(v.approvedAt),
    retiredAt: iso(v.retiredAt),
    retireReason: v.retireReason,
    lockVersion: v.lockVersion,
    createdAt: v.createdAt.toISOString(),
    updatedAt: v.updatedAt.toISOString(),
  };
}
