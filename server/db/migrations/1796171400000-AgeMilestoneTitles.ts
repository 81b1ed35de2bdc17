import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The default plans' tasting milestones count from the batch's start, so "3 months in bulk: taste
 * it" said more than it knew (a batch may spend its first months in primary). They are now
 * "3 months old: taste it". Plans already written into a cellar keep their rules as stored; this
 * renames the milestones whose title is still the old default, and leaves a title a Keeper wrote
 * alone. A plan it changes gets a new version, as any edit would.
 */
export class AgeMilestoneTitles1796171400000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await retitle(q, 'months in bulk: taste it', 'months old: taste it');
  }

  async down(q: QueryRunner): Promise<void> {
    await retitle(q, 'months old: taste it', 'months in bulk: taste it');
  }
}

/** Renames `<n> <from>` to `<n> <to>` on the default milestone rules (`bulk-<n>-months`). */
async function retitle(q: QueryRunner, from: string, to: string): Promise<void> {
  const milestone = `r->>'id' ~ '^bulk-[0-9]+-months$' AND r->>'title' = substring(r->>'id' from '^bulk-([0-9]+)-months$') || ' ' || $1`;
  await q.query(
    `UPDATE plans p
        SET rules = (SELECT jsonb_agg(CASE WHEN ${milestone}
                                           THEN jsonb_set(r, '{title}', to_jsonb(substring(r->>'id' from '^bulk-([0-9]+)-months$') || ' ' || $2))
                                           ELSE r END ORDER BY i)
                       FROM jsonb_array_elements(p.rules) WITH ORDINALITY AS e(r, i)),
            version = p.version + 1
      WHERE EXISTS (SELECT 1 FROM jsonb_array_elements(p.rules) AS e(r) WHERE ${milestone})`,
    [from, to],
  );
}
