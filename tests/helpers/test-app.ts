import 'reflect-metadata';
import type { Express } from 'express';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { afterAll, inject } from 'vitest';
import { createApp, type AppOptions } from '../../server/app';
import { createDataSource } from '../../server/db/data-source';

let shared: Promise<DataSource> | undefined;

/** One DataSource per test file (worker), on the database the global setup migrated. */
export function testDataSource(): Promise<DataSource> {
  if (!shared) {
    const ds = createDataSource(inject('databaseUrl'));
    shared = ds.initialize();
    afterAll(async () => {
      await ds.destroy();
    });
  }
  return shared;
}

/** The real app, in-process, on the test database. */
export async function testApp(overrides: Partial<AppOptions> = {}): Promise<{ app: Express; ds: DataSource }> {
  const ds = await testDataSource();
  const app = createApp({
    dataSource: ds,
    sessionSecret: 'test-secret-that-is-long-enough-0123456789',
    cookieSecure: false,
    ...overrides,
  });
  return { app, ds };
}

/** A supertest agent that keeps cookies, signed in as the given account. */
export async function signedInAgent(app: Express, email: string, password: string) {
  const agent = request.agent(app);
  const res = await agent.post('/api/auth/sign-in').send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return agent;
}

/** Signed-in agents for the Keeper, Hand and Guest of a crew (see crew.ts). */
export async function agentsFor(
  app: Express,
  crew: { keeper: { email: string }; hand: { email: string }; guest: { email: string } },
  password: string,
) {
  const [keeper, hand, guest] = await Promise.all([
    signedInAgent(app, crew.keeper.email, password),
    signedInAgent(app, crew.hand.email, password),
    signedInAgent(app, crew.guest.email, password),
  ]);
  return { keeper, hand, guest };
}
