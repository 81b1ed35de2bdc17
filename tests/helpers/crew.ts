import crypto from 'node:crypto';
import type { Express } from 'express';
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/roles';
import { hashPassword } from '../../server/accounts/passwords';
import { memberActor, type Actor } from '../../server/core/actor';
import { Cellar } from '../../server/entities/cellar.entity';
import { Membership } from '../../server/entities/membership.entity';
import { User } from '../../server/entities/user.entity';
import { agentsFor, type signedInAgent } from './test-app';

/**
 * People and cellars: users, a cellar with one member of each role, their signed-in agents,
 * and a member as the actor a service takes. Each test makes its own, so its lists and totals are its own.
 */

export const TEST_PASSWORD = 'correct-horse-test-1';
let hash: Promise<string> | undefined;

const unique = () => crypto.randomBytes(5).toString('hex');

export type Agent = Awaited<ReturnType<typeof signedInAgent>>;

/** A user with a unique .test address and TEST_PASSWORD. */
export async function makeUser(ds: DataSource, name = 'Test Person'): Promise<User> {
  hash ??= hashPassword(TEST_PASSWORD);
  const repo = ds.getRepository(User);
  return repo.save(
    repo.create({ email: `${name.toLowerCase().replace(/\W+/g, '.')}.${unique()}@example.test`, displayName: name, passwordHash: await hash }),
  );
}

export interface CellarCrew {
  cellar: Cellar;
  keeper: User;
  hand: User;
  guest: User;
}

/** A fresh cellar with one member of each role. */
export async function makeCellarWithCrew(ds: DataSource, name = `Test cellar ${unique()}`): Promise<CellarCrew> {
  const cellar = await ds.getRepository(Cellar).save(ds.getRepository(Cellar).create({ name }));
  const [keeper, hand, guest] = await Promise.all([makeUser(ds, 'Kay Keeper'), makeUser(ds, 'Hal Hand'), makeUser(ds, 'Gil Guest')]);
  const members: [User, Role][] = [
    [keeper, 'keeper'],
    [hand, 'hand'],
    [guest, 'guest'],
  ];
  await ds.getRepository(Membership).save(members.map(([u, role]) => ({ cellarId: cellar.id, userId: u.id, role })));
  return { cellar, keeper, hand, guest };
}

/** A fresh cellar with one signed-in agent per role. */
export interface Crew extends CellarCrew {
  as: { keeper: Agent; hand: Agent; guest: Agent };
  /** /api/cellars/:id/batches */
  batches: string;
}

export async function crewWithAgents(app: Express, ds: DataSource): Promise<Crew> {
  const crew = await makeCellarWithCrew(ds);
  return { ...crew, as: await agentsFor(app, crew, TEST_PASSWORD), batches: `/api/cellars/${crew.cellar.id}/batches` };
}

/** The crew member of a role as the actor a service takes. */
export function contextOf(crew: CellarCrew, role: Role = 'hand'): Actor {
  return memberActor(crew.cellar.id, crew[role].id, role);
}

/** Turns the cellar's public bottle cards on or off. */
export async function setPublicCards(ds: DataSource, cellarId: string, on: boolean): Promise<void> {
  await ds.getRepository(Cellar).update({ id: cellarId }, { publicBottleCards: on });
}
