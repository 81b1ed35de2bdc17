import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { BatchKind, Ingredient, Stage } from '../../shared/schemas/batches';
import { numericTransformer } from './numeric';

/**
 * One thing being made. `stage` and the `last*` columns are caches of the journal, rewritten
 * in the same transaction as every entry so lists can filter in SQL.
 */
@Entity({ name: 'batches' })
export class Batch {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'cellar_id', type: 'uuid' })
  cellarId: string;

  @Column({ type: 'varchar', length: 80 })
  name: string;

  @Column({ type: 'varchar', length: 24 })
  kind: BatchKind;

  @Column({ type: 'jsonb', default: () => "'[]'" })
  ingredients: Ingredient[];

  @Column({ name: 'yeast_name', type: 'varchar', length: 80 })
  yeastName: string;

  @Column({ name: 'yeast_tolerance_abv', type: 'numeric', precision: 4, scale: 1, transformer: numericTransformer })
  yeastToleranceAbv: number;

  @Column({ name: 'planned_volume_l', type: 'numeric', precision: 10, scale: 3, transformer: numericTransformer })
  plannedVolumeL: number;

  /** ISO date (YYYY-MM-DD). */
  @Column({ name: 'started_on', type: 'date' })
  startedOn: string;

  @Column({ type: 'numeric', precision: 5, scale: 3, nullable: true, transformer: numericTransformer })
  og: number | null;

  @Column({ name: 'target_sweetness', type: 'varchar', length: 12, nullable: true })
  targetSweetness: string | null;

  @Column({ type: 'text', default: '' })
  notes: string;

  @Column({ type: 'varchar', length: 12, default: 'primary' })
  stage: Stage;

  @Column({ name: 'last_racked_at', type: 'timestamptz', nullable: true })
  lastRackedAt: Date | null;

  @Column({ name: 'last_reading_sg', type: 'numeric', precision: 5, scale: 3, nullable: true, transformer: numericTransformer })
  lastReadingSg: number | null;

  @Column({ name: 'last_reading_at', type: 'timestamptz', nullable: true })
  lastReadingAt: Date | null;

  @Column({ name: 'created_by', type: 'uuid', nullable: true })
  createdBy: string | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
