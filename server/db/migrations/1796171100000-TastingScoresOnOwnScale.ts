import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Tasting scores move from a 20-point scale to Cellarwright's own 8-point scale, each point
 * with a word (shared/domain/tasting-scale.ts). The mapping lays 0–20 evenly over 1–8:
 * points = 1 + round(score × 7 / 20), halves up —
 *
 *   out of 20 | 0–1 | 2–4 | 5–7 | 8–9 | 10–12 | 13–15 | 16–18 | 19–20
 *   points    |  1  |  2  |  3  |  4  |   5   |   6   |   7   |   8
 *
 * It rewrites the score of every 'tasted' entry and of every correction that changed a score.
 * The journal is append-only (a trigger refuses UPDATE); the trigger is set aside for these two
 * statements only, inside the migration's transaction. Down maps each point back to the nearest
 * score out of 20 (round((points − 1) × 20 / 7)): the scores that shared a point stay merged.
 */
export class TastingScoresOnOwnScale1796171100000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await this.rescore(q, `1 + round((%s)::numeric * 7 / 20)`);
  }

  async down(q: QueryRunner): Promise<void> {
    await this.rescore(q, `round(((%s)::numeric - 1) * 20 / 7)`);
  }

  /** Rewrites every stored score with `formula` (its %s is the old value). */
  private async rescore(q: QueryRunner, formula: string): Promise<void> {
    const onPayload = formula.replace('%s', `payload->>'score'`);
    const onChanges = formula.replace('%s', `payload->'changes'->>'score'`);
    await q.query(`ALTER TABLE journal_entries DISABLE TRIGGER tr_journal_entries_append_only`);
    await q.query(`
      UPDATE journal_entries SET payload = jsonb_set(payload, '{score}', to_jsonb(${onPayload}))
       WHERE kind = 'tasted' AND jsonb_typeof(payload->'score') = 'number'`);
    await q.query(`
      UPDATE journal_entries SET payload = jsonb_set(payload, '{changes,score}', to_jsonb(${onChanges}))
       WHERE kind = 'amendment' AND jsonb_typeof(payload->'changes'->'score') = 'number'`);
    await q.query(`ALTER TABLE journal_entries ENABLE TRIGGER tr_journal_entries_append_only`);
  }
}
