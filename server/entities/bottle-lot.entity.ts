import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { numericTransformer } from './numeric';

/** One bottling run of a batch. */
@Entity({ name: 'bottle_lots' })
export class BottleLotRow {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'cellar_id', type: 'uuid' })
  cellarId: string;

  @Column({ name: 'batch_id', type: 'uuid' })
  batchId: string;

  @Column({ type: 'varchar', length: 8, unique: true })
  code: string;

  @Column({ name: 'bottled_on', type: 'date' })
  bottledOn: string;

  @Column({ name: 'bottle_ml', type: 'integer' })
  bottleMl: number;

  @Column({ name: 'bottle_count', type: 'integer' })
  bottleCount: number;

  @Column({ type: 'varchar', length: 16 })
  closure: string;

  @Column({ type: 'varchar', length: 10 })
  carbonation: 'still' | 'sparkling';

  @Column({ name: 'sulfite_added', type: 'boolean' })
  sulfiteAdded: boolean;

  @Column({ name: 'abv_estimate', type: 'numeric', precision: 4, scale: 1, nullable: true, transformer: numericTransformer })
  abvEstimate: number | null;

  @Column({ type: 'varchar', length: 500, default: '' })
  note: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
