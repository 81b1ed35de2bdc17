import type { EntityManager } from 'typeorm';
import type { Role } from '../../shared/roles';
import type { Cellar as CellarDto, CellarUpdate } from '../../shared/schemas/cellars';
import { requireRole, type Actor } from '../core/actor';
import { Cellar } from '../entities/cellar.entity';

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

export async function getCellar(actor: Actor, tx: EntityManager): Promise<CellarDto> {
  requireRole(actor, 'guest');
  const cellar = await tx.getRepository(Cellar).findOneByOrFail({ id: actor.cellarId });
  return toDto(cellar, actor.role);
}

export async function updateCellar(actor: Actor, tx: EntityManager, changes: CellarUpdate): Promise<CellarDto> {
  requireRole(actor, 'keeper');
  const repo = tx.getRepository(Cellar);
  await repo.update({ id: actor.cellarId }, changes);
  return toDto(await repo.findOneByOrFail({ id: actor.cellarId }), actor.role);
}
