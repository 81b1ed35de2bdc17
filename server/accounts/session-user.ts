import type { DataSource } from 'typeorm';
import type { SessionUser } from '../../shared/schemas/auth';
import { Membership } from '../entities/membership.entity';
import { User } from '../entities/user.entity';
import { verifyPassword } from './passwords';

/**
 * Finds the user with this e-mail and password, or undefined.
 * @param email - already trimmed and lower-cased by the shared schema
 */
export async function authenticate(ds: DataSource, email: string, password: string): Promise<Express.User | undefined> {
  const user = await ds.getRepository(User).createQueryBuilder('u').addSelect('u.passwordHash').where('u.email = :email', { email }).getOne();
  const ok = await verifyPassword(user?.passwordHash, password);
  if (!user || !ok) return undefined;
  return { id: user.id, email: user.email, displayName: user.displayName };
}

/** The session's user, as loaded for each request, or undefined if deleted meanwhile. */
export async function findSessionUser(ds: DataSource, id: string): Promise<Express.User | undefined> {
  const user = await ds.getRepository(User).findOne({ where: { id } });
  return user ? { id: user.id, email: user.email, displayName: user.displayName } : undefined;
}

/** The signed-in user with every cellar they belong to. */
export async function describeSessionUser(ds: DataSource, user: Express.User): Promise<SessionUser> {
  const memberships = await ds.getRepository(Membership).find({
    where: { userId: user.id },
    relations: { cellar: true },
    order: { cellar: { name: 'ASC' } },
  });
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    cellars: memberships.map((m) => ({ cellarId: m.cellarId, cellarName: m.cellar.name, role: m.role })),
  };
}
