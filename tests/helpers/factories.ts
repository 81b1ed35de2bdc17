import crypto from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/roles';
import { hashPassword } from '../../server/auth/passwords';
import { Cellar } from '../../server/entities/cellar.entity';
import { Membership } from '../../server/entities/membership.entity';
import { User } from '../../server/entities/user.entity';

export const TEST_PASSWORD = 'correct-horse-test-1';
let hash: Promise<string> | undefined;

const unique = () => crypto.randomBytes(5).toString('hex');

/** A user with a unique .test address and TEST_PASSWORD. */
export async function makeUser(ds: DataSource, name = 'Test Person'): Promise<User> {
  hash ??= hashPassword(TEST_PASSWORD);
  const repo = ds.getRepository(User);
  return repo.save(repo.create({ email: `${name.toLowerCase().replace(/\W+/g, '.')}.${unique()}@example.test`, displayName: name, passwordHash: await hash }));
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
  const members: [User, Role][] = [[keeper, 'keeper'], [hand, 'hand'], [guest, 'guest']];
  await ds.getRepository(Membership).save(members.map(([u, role]) => ({ cellarId: cellar.id, userId: u.id, role })));
  return { cellar, keeper, hand, guest };
}
