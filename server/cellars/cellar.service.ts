import type { EntityManager } from 'typeorm';
import type { Role } from '../../shared/roles';
import type { Cellar as CellarDto, CellarUpdate } from '../../shared/schemas/cellars';
import { requireRole, type Actor } from '../core/actor';
import { Cellar } from '../entities/cellar.entity';
import { loadCellar } from './load-cellar';

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
  return toDto(await loadCellar(tx, actor.cellarId), actor.role);
}

export async function updateCellar(actor: Actor, tx: EntityManager, changes: CellarUpdate): Promise<CellarDto> {
  requireRole(actor, 'keeper');
  await tx.getRepository(Cellar).update({ id: actor.cellarId }, changes);
  return toDto(await loadCellar(tx, actor.cellarId), actor.role);
}
