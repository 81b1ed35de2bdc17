import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn, VersionColumn } from 'typeorm';
import type { CleaningState, VesselKind } from '../../shared/schemas/vessels';
import { numericTransformer } from './numeric';

/**
 * A carboy, jug, keg… It holds at most one batch (batchId + volumeL + filledAt, all or none).
 * Its state is derived, never stored: see server/services/vessel-state.ts.
 */
@Entity({ name: 'vessels' })
export class Vessel {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'cellar_id', type: 'uuid' })
  cellarId: string;

  /** Short unguessable code printed on its QR label. */
  @Column({ type: 'varchar', length: 8, unique: true })
  code: string;

  @Column({ type: 'varchar', length: 60 })
  name: string;

  @Column({ type: 'varchar', length: 12 })
  kind: VesselKind;

  @Column({ type: 'varchar', length: 12 })
  material: string;

  @Column({ name: 'capacity_l', type: 'numeric', precision: 10, scale: 3, transformer: numericTransformer })
  capacityL: number;

  /** How clean it was left when last emptied or cleaned. */
  @Column({ name: 'cleaning_state', type: 'varchar', length: 10, default: 'dirty' })
  cleaningState: CleaningState;

  @Column({ name: 'sanitised_at', type: 'timestamptz', nullable: true })
  sanitisedAt: Date | null;

  @Column({ name: 'retired_at', type: 'timestamptz', nullable: true })
  retiredAt: Date | null;

  @Column({ name: 'batch_id', type: 'uuid', nullable: true })
  batchId: string | null;

  @Column({ name: 'volume_l', type: 'numeric', precision: 10, scale: 3, nullable: true, transformer: numericTransformer })
  volumeL: number | null;

  @Column({ name: 'filled_at', type: 'timestamptz', nullable: true })
  filledAt: Date | null;

  @Column({ type: 'varchar', length: 500, default: '' })
  notes: string;

  /** Optimistic locking: every change bumps it; a stale writer gets 409. */
  @VersionColumn({ type: 'integer' })
  version: number;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;

  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' })
  updatedAt: Date;
}
