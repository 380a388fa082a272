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
  type DesignPreview,
  type DesignSpec,
  type DesignSummary,
  type DesignView,
} from '@kerfwright/contracts';
import { User } from '../users/user.entity';

@Entity('designs')
export class Design {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'seed_key', type: 'varchar', length: 64, nullable: true }) seedKey: string | null;
  @Column({ name: 'owner_id', type: 'uuid' }) ownerId: string;
  @ManyToOne(() => User, { onDelete: 'CASCADE' }) @JoinColumn({ name: 'owner_id' }) owner?: User;
  @Column({ type: 'varchar', length: 120 }) name: string;
  @Column({ type: 'text', default: '' }) description: string;
  @Column({ type: 'jsonb' }) spec: DesignSpec;
  @Column({ name: 'solid_file_name', type: 'varchar', length: 200, nullable: true }) solidFileName:
    string | null;
  @Column({ type: 'jsonb', default: {} }) preview: DesignPreview;
  @VersionColumn() version: number;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}

export function toDesignView(d: Design): DesignView {
  return {
    id: d.id,
    ownerId: d.ownerId,
    ownerName: d.owner?.displayName ?? '',
    name: d.name,
    description: d.description,
    spec: d.spec,
    solidFileName: d.solidFileName,
    preview: d.preview,
    version: d.version,
    createdAt: d.createdAt.toISOString(),
    updatedAt: d.updatedAt.toISOString(),
  };
}

export function toDesignSummary(d: Design): DesignSummary {
  const { spec, ...rest } = toDesignView(d);
  return {
    ...rest,
    solid: typeof spec.solid === 'string' ? spec.solid : (spec.solid.name ?? `uploaded ${spec.solid.format}`),
  };
}
