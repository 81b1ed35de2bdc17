import { Column, Entity, JoinColumn, ManyToOne, PrimaryGeneratedColumn } from 'typeorm';
import { Rack } from './rack.entity';

/** One shelf of a rack; its slots are numbered 1..slotCount. */
@Entity({ name: 'shelves' })
export class Shelf {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'rack_id', type: 'uuid' })
  rackId: string;

  @ManyToOne(() => Rack, (rack) => rack.shelves, { onDelete: 'CASCADE' })
  @JoinColumn({ name: 'rack_id' })
  rack: Rack;

  @Column({ type: 'integer' })
  number: number;

  @Column({ name: 'slot_count', type: 'integer' })
  slotCount: number;
}
