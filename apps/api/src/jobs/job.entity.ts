import {
  Column,
  CreateDateColumn,
  Entity,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  VersionColumn,
} from 'typeorm';
import {
  type DesignSpec,
  JOB_STATES,
  type JobLayoutChoice,
  type JobPreparation,
  type JobState,
} from '@kerfwright/contracts';
import { numericColumn } from '../common/db-helpers';
import { Design } from '../designs/design.entity';
import { User } from '../users/user.entity';

@Entity('jobs')
export class Job {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'seed_key', type: 'varchar', length: 64, nullable: true }) seedKey: string | null;
  @Column({ name: 'design_id', type: 'uuid' }) designId: string;
  @ManyToOne(() => Design) @JoinColumn({ name: 'design_id' }) design?: Design;
  @Column({ name: 'requester_id', type: 'uuid' }) requesterId: string;
  @ManyToOne(() => User) @JoinColumn({ name: 'requester_id' }) requester?: User;
  @Column({ type: 'enum', enumName: 'job_state', enum: [...JOB_STATES] })
  state: JobState;
  /** The design's spec as it was when the job was created or last requested; once prepared, the prepared one. */
  @Column({ type: 'jsonb' }) spec: DesignSpec;
  /**
   * The design's spec as it was last requested: every preparation starts from it (its scale, margin, gap and
   * colour rule), never from an earlier preparation's spec. Null for a job not requested yet, and for jobs
   * prepared before it was kept.
   */
  @Column({ name: 'requested_spec', type: 'jsonb', nullable: true }) requestedSpec: DesignSpec | null;
  @Column({ name: 'material_id', type: 'uuid', nullable: true }) materialId: string | null;
  @Column({ type: 'jsonb', default: [] }) colours: string[];
  @Column({ name: 'profile_version_id', type: 'uuid', nullable: true }) profileVersionId: string | null;
  @Column({ type: 'integer', default: 1 }) quantity: number;
  @Column({ type: 'text', default: '' }) notes: string;
  @Column({ name: 'return_reason', type: 'text', nullable: true }) returnReason: string | null;
  @Column({ type: 'jsonb', nullable: true }) preparation: JobPreparation | null;
  /** The last preparation's sheet, colour rule, margin and gap; outlives its figures (a change of copies). */
  @Column({ name: 'layout_choice', type: 'jsonb', nullable: true }) layoutChoice: JobLayoutChoice | null;
  @Column({ name: 'actual_minutes', type: 'numeric', nullable: true, transformer: numericColumn })
  actualMinutes: number | null;
  @Column({ name: 'sheets_used', type: 'integer', nullable: true }) sheetsUsed: number | null;
  @Column({ name: 'measured_kerf_mm', type: 'numeric', nullable: true, transformer: numericColumn })
  measuredKerfMm: number | null;
  @VersionColumn() version: number;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}

@Entity('job_transitions')
export class JobTransition {
  @PrimaryGeneratedColumn({ type: 'bigint' }) id: string;
  @Column({ name: 'job_id', type: 'uuid' }) jobId: string;
  @Column({ name: 'from_state', type: 'enum', enumName: 'job_state', enum: [...JOB_STATES], nullable: true })
  fromState: JobState | null;
  @Column({ name: 'to_state', type: 'enum', enumName: 'job_state', enum: [...JOB_STATES] })
  toState: JobState;
  @Column({ name: 'actor_id', type: 'uuid', nullable: true }) actorId: string | null;
  @ManyToOne(() => User) @JoinColumn({ name: 'actor_id' }) actor?: User;
  @Column({ type: 'varchar', length: 20 }) action: string;
  @Column({ type: 'text', nullable: true }) reason: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}
