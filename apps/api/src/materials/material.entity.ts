import {
  Column,
  CreateDateColumn,
  Entity,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  VersionColumn,
} from 'typeorm';
import { type MaterialFamily, type MaterialView, type StockSheet } from '@kerfwright/contracts';
import { numericColumn } from '../common/db-helpers';

@Entity('materials')
export class Material {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'seed_key', type: 'varchar', length: 64, nullable: true }) seedKey: string | null;
  @Column({ type: 'varchar', length: 120 }) name: string;
  @Column({ type: 'varchar', length: 40 }) family: MaterialFamily;
  @Column({ name: 'nominal_thickness_mm', type: 'numeric', transformer: numericColumn })
  nominalThicknessMm: number;
  @Column({ name: 'measured_thickness_mm', type: 'numeric', nullable: true, transformer: numericColumn })
  measuredThicknessMm: number | null;
  @Column({ type: 'boolean', default: false }) flexible: boolean;
  @Column({ type: 'jsonb', default: () => "'[]'" }) colours: string[];
  @Column({ name: 'stock_sheets', type: 'jsonb', default: () => "'[]'" }) stockSheets: StockSheet[];
  @Column({ name: 'laser_allowed', type: 'boolean', default: true }) laserAllowed: boolean;
  @Column({ name: 'hazard_note', type: 'text', default: '' }) hazardNote: string;
  @Column({ type: 'text', default: '' }) notes: string;
  @VersionColumn() version: number;
  @Column({ name: 'created_by', type: 'uuid', nullable: true }) createdBy: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}

export function toMaterialView(m: Material): MaterialView {
  return {
    id: m.id,
    name: m.name,
    family: m.family,
    nominalThicknessMm: m.nominalThicknessMm,
    measuredThicknessMm: m.measuredThicknessMm,
    flexible: m.flexible,
    colours: m.colours,
    stockSheets: m.stockSheets,
    laserAllowed: m.laserAllowed,
    hazardNote: m.hazardNote,
    notes: m.notes,
    version: m.version,
    createdAt: m.createdAt.toISOString(),
    updatedAt: m.updatedAt.toISOString(),
  };
}
