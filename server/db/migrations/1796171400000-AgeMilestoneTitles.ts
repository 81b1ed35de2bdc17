import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The default plans' tasting milestones count from the batch's start, so "3 months in bulk: taste
 * it" said more than it knew (a batch may spend its first months in primary); and a title with a
 * colon of its own read badly before the rule's words ("…: taste it: 3 months after the start").
 * They become "Taste it at 3 months old" and "Open one at 6 months in bottle". Plans already
 * written into a cellar keep their rules as stored; this renames the milestones whose title is
 * still the old default, and leaves a title a Keeper wrote alone. A plan it changes gets a new
 * version, as any edit would.
 */
const RENAMES: { rule: 'bulk' | 'bottle'; before: string; after: string }[] = [
  { rule: 'bulk', before: '{n} months in bulk: taste it', after: 'Taste it at {n} months old' },
  { rule: 'bottle', before: '{n} months in bottle: open one', after: 'Open one at {n} months in bottle' },
];

export class AgeMilestoneTitles1796171400000 implements MigrationInterface {
  async up(q: QueryRunner): Promise<void> {
    await retitle(
      q,
      RENAMES.map((r) => ({ rule: r.rule, from: r.before, to: r.after })),
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await retitle(
      q,
      RENAMES.map((r) => ({ rule: r.rule, from: r.after, to: r.before })),
    );
  }
}

/**
 * On the default milestone rules `<rule>-<n>-months`, renames each title `from` to `to` ({n}: the
 * months), in one statement, so a plan with both kinds gets one new version.
 */
async function retitle(q: QueryRunner, renames: { rule: string; from: string; to: string }[]): Promise<void> {
  const params: string[] = [];
  const cases = renames.map(({ rule, from, to }) => {
    const [ruleP, fromP, toP] = [rule, from, to].map((v) => `$${params.push(v)}`);
    const months = `substring(r->>'id' from '^' || ${ruleP} || '-([0-9]+)-months$')`;
    return `WHEN r->>'title' = replace(${fromP}, '{n}', ${months}) THEN replace(${toP}, '{n}', ${months})`;
  });
  const newTitle = `(CASE ${cases.join(' ')} END)`;
  await q.query(
    `UPDATE plans p
        SET rules = (SELECT jsonb_agg(CASE WHEN n.title IS NULL THEN r ELSE jsonb_set(r, '{title}', to_jsonb(n.title)) END ORDER BY i)
                       FROM jsonb_array_elements(p.rules) WITH ORDINALITY AS e(r, i), LATERAL (SELECT ${newTitle} AS title) n),
            version = p.version + 1
      WHERE EXISTS (SELECT 1 FROM jsonb_array_elements(p.rules) AS e(r) WHERE ${newTitle} IS NOT NULL)`,
    params,
  );
}
