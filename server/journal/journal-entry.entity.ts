import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';
import type { JournalKind, JournalPayload } from '../../shared/schemas/journal';

/** One append-only line of a batch's history (a database trigger refuses updates). */
@Entity({ name: 'journal_entries' })
export class JournalEntryRow {
  @PrimaryGeneratedColumn('uuid')
  id: string;

  @Column({ name: 'cellar_id', type: 'uuid' })
  cellarId: string;

  @Column({ name: 'batch_id', type: 'uuid' })
  batchId: string;

  @Column({ type: 'varchar', length: 16 })
  kind: JournalKind;

  @Column({ type: 'jsonb' })
  payload: JournalPayload;

  @Column({ name: 'occurred_at', type: 'timestamptz' })
  occurredAt: Date;

  @Column({ name: 'recorded_at', type: 'timestamptz', default: () => 'now()' })
  recordedAt: Date;

  @Column({ name: 'author_id', type: 'uuid', nullable: true })
  authorId: string | null;

  @Column({ name: 'amends_entry_id', type: 'uuid', nullable: true })
  amendsEntryId: string | null;
}
