import type { EntityManager } from 'typeorm';
import type { Role } from '../../shared/roles';
import type { Member } from '../../shared/schemas/cellars';
import { requireRole, type Actor } from '../core/actor';
import { Membership } from '../entities/membership.entity';
import { ConflictError, NotFoundError } from '../http/errors';

export async function listMembers(actor: Actor, tx: EntityManager): Promise<Member[]> {
  requireRole(actor, 'guest');
  const rows = await tx.getRepository(Membership).find({
    where: { cellarId: actor.cellarId },
    relations: { user: true },
    order: { createdAt: 'ASC' },
  });
  return rows.map((m) => ({
    id: m.id,
    userId: m.userId,
    email: m.user.email,
    displayName: m.user.displayName,
    role: m.role,
    since: m.createdAt.toISOString(),
  }));
}

/**
 * Changes a member's role or removes them, keeping at least one Keeper: a cellar nobody
 * can manage would be stuck. Runs in a transaction with the memberships locked.
 */
export async function changeMember(actor: Actor, tx: EntityManager, memberId: string, change: { role: Role } | { remove: true }): Promise<void> {
  requireRole(actor, 'keeper');
  const repo = tx.getRepository(Membership);
  const all = await repo
    .createQueryBuilder('m')
    .where('m.cellar_id = :cellarId', { cellarId: actor.cellarId })
    .setLock('pessimistic_write')
    .getMany();
  const member = all.find((m) => m.id === memberId);
  if (!member) throw new NotFoundError('No such member in this cellar.');
  const keepersLeft = all.filter((m) => m.role === 'keeper' && m.id !== memberId).length;
  const staysKeeper = 'role' in change && change.role === 'keeper';
  if (member.role === 'keeper' && !staysKeeper && keepersLeft === 0) {
    throw new ConflictError('A cellar needs at least one Keeper. Make someone else Keeper first.');
  }
  if ('remove' in change) await repo.delete({ id: memberId });
  else await repo.update({ id: memberId }, { role: change.role });
}
