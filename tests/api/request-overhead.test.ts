import pg from 'pg';
import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { signedInAgent, testApp } from '../helpers/test-app';

/** Every statement the app sends while `fn` runs: TypeORM's, the session store's and the rate limits' alike. */
async function statementsOf(fn: () => Promise<unknown>): Promise<string[]> {
  const spy = vi.spyOn(pg.Client.prototype, 'query');
  await fn();
  // The session store may write after the answer has gone: give it a moment to be counted.
  await new Promise((r) => setTimeout(r, 50));
  return spy.mock.calls.map(([q]) => (typeof q === 'string' ? q : (q as { text: string }).text).replace(/\s+/g, ' ').trim());
}

afterEach(() => {
  vi.restoreAllMocks();
});

describe('what a signed-in read costs around its own queries', () => {
  let app: Awaited<ReturnType<typeof testApp>>['app'];
  let crew: CellarCrew;
  beforeAll(async () => {
    const t = await testApp();
    app = t.app;
    crew = await makeCellarWithCrew(t.ds);
  });

  it('reads session, user and membership in one statement, opens the snapshot in one, and writes no session', async () => {
    const agent = await signedInAgent(app, crew.guest.email, TEST_PASSWORD);
    const sent = await statementsOf(() => agent.get(`/api/cellars/${crew.cellar.id}/vessels`).expect(200));
    const touchingSession = sent.filter((s) => /\bsession\b/.test(s));
    expect(touchingSession).toHaveLength(1);
    expect(touchingSession[0]).toMatch(/^SELECT /);
    expect(touchingSession[0]).toContain('FROM memberships m');
    expect(touchingSession[0]).toContain('FROM session s LEFT JOIN users u');
    expect(sent.some((s) => /FROM "memberships"|FROM "users"/.test(s))).toBe(false);
    expect(sent.filter((s) => /^(BEGIN|START TRANSACTION|SET TRANSACTION)/.test(s))).toEqual(['BEGIN ISOLATION LEVEL REPEATABLE READ READ ONLY']);
    expect(sent.at(-1)).toBe('COMMIT');
  });

  it('still answers 404 for a cellar the member is not in, and refuses a Guest a write', async () => {
    const agent = await signedInAgent(app, crew.guest.email, TEST_PASSWORD);
    const other = await makeCellarWithCrew((await testApp()).ds);
    expect((await agent.get(`/api/cellars/${other.cellar.id}/vessels`)).status).toBe(404);
    expect((await agent.post(`/api/cellars/${crew.cellar.id}/racks`).send({ name: 'Guest rack' })).status).toBe(403);
  });

  it('refuses a read-only snapshot any write', async () => {
    const { ds } = await testApp();
    const { inTransaction } = await import('../../server/core/unit-of-work');
    await expect(inTransaction(ds, 'read', (tx) => tx.query(`UPDATE cellars SET name = name WHERE id = $1`, [crew.cellar.id]))).rejects.toThrow(
      /read-only transaction/,
    );
  });
});
