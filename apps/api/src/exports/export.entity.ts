import { Column, CreateDateColumn, Entity, PrimaryColumn, PrimaryGeneratedColumn } from 'typeorm';
import {
  type CutPackFileRole,
  type CutPackManifest,
  EXPORT_STATES,
  type ExportState,
} from '@kerfwright/contracts';

/** One run of the cut-pack queue for a job. Only the processor's final transaction sets `done`. */
@Entity('exports')
export class Export {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'job_id', type: 'uuid' }) jobId: string;
  @Column({ type: 'enum', enumName: 'export_state', enum: [...EXPORT_STATES], default: 'queued' })
  state: ExportState;
  @Column({ type: 'integer', default: 0 }) progress: number;
  @Column({ type: 'integer', default: 0 }) attempts: number;
  @Column({ name: 'error_code', type: 'varchar', length: 80, nullable: true }) errorCode: string | null;
  @Column({ name: 'error_message', type: 'text', nullable: true }) errorMessage: string | null;
  @Column({ name: 'requested_by', type: 'uuid', nullable: true }) requestedBy: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @Column({ name: 'started_at', type: 'timestamptz', nullable: true }) startedAt: Date | null;
  @Column({ name: 'finished_at', type: 'timestamptz', nullable: true }) finishedAt: Date | null;
  @Column({ type: 'jsonb', nullable: true }) manifest: CutPackManifest | null;
  @Column({ name: 'storage_prefix', type: 'varchar', length: 300 }) storagePrefix: string;
  /** The job's preparation (its `prepare` transition, a bigint as a string) the pack was asked for. */
  @Column({ name: 'preparation_id', type: 'bigint', nullable: true }) preparationId: string | null;
}

const bigint = { to: (v: number) => v, from: (v: string) => Number(v) };

/** A file of a done export: where it is stored and its checksum. Downloads look files up here only. */
@Entity('export_files')
export class ExportFile {
  @PrimaryColumn({ name: 'export_id', type: 'uuid' }) exportId: string;
  @PrimaryColumn({ type: 'varchar', length: 128 }) name: string;
  @Column({ type: 'varchar', length: 40 }) role: CutPackFileRole;
  @Column({ name: 'content_type', type: 'varchar', length: 100 }) contentType: string;
  @Column({ type: 'bigint', transformer: bigint }) bytes: number;
  @Column({ type: 'char', length: 64 }) sha256: string;
  @Column({ name: 'storage_key', type: 'varchar', length: 400 }) storageKey: string;
}
