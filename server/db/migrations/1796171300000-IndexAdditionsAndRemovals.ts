import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Two small partial indexes for Today's "take these out" list (`additionsDueOut`): a cellar's
 * additions, and each removal by batch and the addition it took out. Without them the list
 * read the whole journal twice; at 10,000 batches (300,000 entries) it was most of Today's time.
 * Only addition and removal rows are indexed, so appending a reading costs nothing more.
 */
export class IndexAdditionsAndRemovals1796171300000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE INDEX ix_journal_additions ON journal_entries (cellar_id) WHERE kind = 'addition'`);
    await q.query(`CREATE INDEX ix_journal_removals ON journal_entries (batch_id, (payload->>'additionEntryId')) WHERE kind = 'removed'`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX ix_journal_removals`);
    await q.query(`DROP INDEX ix_journal_additions`);
  }
}
