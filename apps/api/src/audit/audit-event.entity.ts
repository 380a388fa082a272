import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';

@Entity('audit_events')
export class AuditEvent {
  @PrimaryGeneratedColumn({ type: 'bigint' }) id: string;
  @Column({ name: 'actor_id', type: 'uuid', nullable: true }) actorId: string | null;
  @Column({ type: 'varchar', length: 80 }) action: string;
  @Column({ name: 'entity_type', type: 'varchar', length: 40 }) entityType: string;
  @Column({ name: 'entity_id', type: 'varchar', length: 64 }) entityId: string;
  @Column({ type: 'jsonb', nullable: true }) before: object | null;
  @Column({ type: 'jsonb', nullable: true }) after: object | null;
  @Column({ name: 'request_id', type: 'varchar', length: 64, nullable: true }) requestId: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
}
