import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** Bottles leaving a case: drunk, given, sold, sent to a competition or broken. */
@Entity({ name: 'bottle_departures' })
export class BottleDeparture {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'cellar_id', type: 'uuid' })
  cellarId: string;

  @Column({ name: 'case_id', type: 'uuid' })
  caseId: string;

  @Column({ type: 'integer' })
  count: number;

  @Column({ type: 'varchar', length: 12 })
  reason: 'drunk' | 'gift' | 'sold' | 'competition' | 'broken';

  @Column({ type: 'varchar', length: 300, default: '' })
  note: string;

  @Column({ name: 'occurred_at', type: 'timestamptz', default: () => 'now()' })
  occurredAt: Date;

  @Column({ name: 'author_id', type: 'uuid', nullable: true })
  authorId: string | null;
}
