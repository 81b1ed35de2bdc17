import { Column, Entity, PrimaryGeneratedColumn, VersionColumn } from 'typeorm';

/** A case of bottles from one lot, with its own label code and slot. */
@Entity({ name: 'bottle_cases' })
export class BottleCaseRow {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'cellar_id', type: 'uuid' })
  cellarId: string;

  @Column({ name: 'lot_id', type: 'uuid' })
  lotId: string;

  @Column({ type: 'varchar', length: 8, unique: true })
  code: string;

  @Column({ type: 'integer' })
  number: number;

  @Column({ name: 'bottles_initial', type: 'integer' })
  bottlesInitial: number;

  /** Never below zero: a CHECK constraint backs the service's own check. */
  @Column({ name: 'bottles_left', type: 'integer' })
  bottlesLeft: number;

  @VersionColumn({ type: 'integer' })
  version: number;
}
