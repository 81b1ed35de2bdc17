import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/roles';
import type { Cellar as CellarDto, CellarUpdate, Member } from '../../shared/schemas/cellars';
import { Cellar } from '../entities/cellar.entity';
import { Membership } from '../entities/membership.entity';
import { User } from '../entities/user.entity';
import { ConflictError, NotFoundError } from '../errors';

/** Who is asking, in which cellar, as checked by cellarAccess. */
export interface CellarContext {
  cellarId: string;
  role: Role;
  userId: string;
}

function toDto(cellar: Cellar, role: Role): CellarDto {
  return {
    id: cellar.id,
    name: cellar.name,
    unitSystem: cellar.unitSystem,
    timeZone: cellar.timeZone,
    sanitisedValidDays: cellar.sanitisedValidDays,
    headspaceWarnPercent: cellar.headspaceWarnPercent,
    annualLimitL: cellar.annualLimitL,
    publicBottleCards: cellar.publicBottleCards,
    role,
  };
}

export async function getCellar(ds: DataSource, ctx: CellarContext): Promise<CellarDto> {
  const cellar = await ds.getRepository(Cellar).findOneByOrFail({ id: ctx.cellarId });
  return toDto(cellar, ctx.role);
}

export async function updateCellar(ds: DataSource, ctx: CellarContext, changes: CellarUpdate): Promise<CellarDto> {
  const repo = ds.getRepository(Cellar);
  await repo.update({ id: ctx.cellarId }, changes);
  return toDto(await repo.findOneByOrFail({ id: ctx.cellarId }), ctx.role);
}

export async function listMembers(ds: DataSource, ctx: CellarContext): Promise<Member[]> {
  const rows = await ds.getRepository(Membership).find({
    where: { cellarId: ctx.cellarId },
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

/** Adds an existing account to the cellar. */
export async function addMember(ds: DataSource, ctx: CellarContext, email: string, role: Role): Promise<Member> {
  const user = await ds.getRepository(User).findOneBy({ email });
  if (!user) throw new NotFoundError(`No account uses ${email}. Ask them to create one first.`);
  const repo = ds.getRepository(Membership);
  if (await repo.existsBy({ cellarId: ctx.cellarId, userId: user.id })) {
    throw new ConflictError(`${user.displayName} is already a member of this cellar.`);
  }
  const saved = await repo.save(repo.create({ cellarId: ctx.cellarId, userId: user.id, role }));
  return { id: saved.id, userId: user.id, email: user.email, displayName: user.displayName, role, since: saved.createdAt.toISOString() };
}

/**
 * Changes a member's role or removes them, keeping at least one Keeper: a cellar nobody
 * can manage would be stuck. Runs in a transaction with the memberships locked.
 */
export async function changeMember(
  ds: DataSource,
  ctx: CellarContext,
  memberId: string,
  change: { role: Role } | { remove: true },
): Promise<void> {
  await ds.transaction(async (tx) => {
    const repo = tx.getRepository(Membership);
    const all = await repo
      .createQueryBuilder('m')
      .where('m.cellar_id = :cellarId', { cellarId: ctx.cellarId })
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
  });
}
