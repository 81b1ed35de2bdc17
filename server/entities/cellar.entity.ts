import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { UNIT_SYSTEMS } from '../../shared/schemas/cellars';
import { numericTransformer } from './numeric';

@Entity({ name: 'cellars' })
export class Cellar {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ type: 'varchar', length: 80 })
  name: string;

  @Column({ name: 'unit_system', type: 'varchar', length: 8, default: 'metric' })
  unitSystem: (typeof UNIT_SYSTEMS)[number];

  @Column({ name: 'time_zone', type: 'varchar', length: 64, default: 'UTC' })
  timeZone: string;

  /** A sanitised vessel counts as merely clean after this many days. */
  @Column({ name: 'sanitised_valid_days', type: 'integer', default: 7 })
  sanitisedValidDays: number;

  /** Headspace above this share of the vessel gives a warning when racking. */
  @Column({ name: 'headspace_warn_percent', type: 'numeric', precision: 5, scale: 2, default: 5, transformer: numericTransformer })
  headspaceWarnPercent: number;

  /** Yearly production limit in litres, where local law sets one. */
  @Column({ name: 'annual_limit_l', type: 'numeric', precision: 10, scale: 2, nullable: true, transformer: numericTransformer })
  annualLimitL: number | null;

  /** Bottle and case labels open a public card for anyone (off unless a Keeper turns it on). */
  @Column({ name: 'public_bottle_cards', type: 'boolean', default: false })
  publicBottleCards: boolean;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
