import {
  Column,
  CreateDateColumn,
  Entity,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  VersionColumn,
} from 'typeorm';
import { type Role, type UserView } from '@kerfwright/contracts';

@Entity('users')
export class User {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ type: 'varchar', length: 254 }) email: string;
  @Column({ name: 'display_name', type: 'varchar', length: 80 }) displayName: string;
  @Column({ name: 'password_hash', type: 'varchar', length: 100, select: false }) passwordHash: string;
  @Column({ type: 'enum', enum: ['hobbyist', 'fabricator', 'operator', 'supervisor'], enumName: 'user_role' })
  role: Role;
  @Column({ type: 'boolean', default: true }) active: boolean;
  @Column({ name: 'is_demo', type: 'boolean', default: false }) isDemo: boolean;
  @VersionColumn() version: number;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}

export function toUserView(u: User): UserView {
  return {
    id: u.id,
    email: u.email,
    displayName: u.displayName,
    role: u.role,
    active: u.active,
    createdAt: u.createdAt.toISOString(),
  };
}
