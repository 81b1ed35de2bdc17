import { Column, CreateDateColumn, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { Shelf } from './shelf.entity';

/** A vessel or a case in one slot. The table's constraints keep one thing per slot. */
@Entity({ name: 'placements' })
export class Placement {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'cellar_id', type: 'uuid' })
  cellarId: string;

  @Column({ name: 'shelf_id', type: 'uuid' })
  shelfId: string;

  @ManyToOne(() => Shelf, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'shelf_id' })
  shelf: Shelf;

  @Column({ type: 'integer' })
  slot: number;

  @Column({ name: 'vessel_id', type: 'uuid', nullable: true })
  vesselId: string | null;

  @Column({ name: 'case_id', type: 'uuid', nullable: true })
  caseId: string | null;

  @CreateDateColumn({ name: 'placed_at', type: 'timestamptz' })
  placedAt: Date;
}
