import { Column, CreateDateColumn, Entity, OneToMany, PrimaryGeneratedColumn } from 'typeorm';
import { Shelf } from './shelf.entity';

/** A shelving unit or a corner of a room, with numbered shelves. */
@Entity({ name: 'racks' })
export class Rack {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'cellar_id', type: 'uuid' })
  cellarId: string;

  @Column({ type: 'varchar', length: 60 })
  name: string;

  @Column({ type: 'varchar', length: 200, default: '' })
  description: string;

  @OneToMany(() => Shelf, (shelf) => shelf.rack)
  shelves: Shelf[];

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
