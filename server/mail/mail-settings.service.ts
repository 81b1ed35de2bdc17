import type { EntityManager } from 'typeorm';
import type { MailSettings } from '../../shared/schemas/mail-settings';
import { requireRole, type Actor } from '../core/actor';
import { BadRequestError } from '../http/errors';
import { memberMailSettings, saveMailSettings } from './reminder-settings';

/** The member's own e-mail reminders in this cellar. Every member, Guests too, sets their own. */
export async function getMyMailSettings(actor: Actor, tx: EntityManager): Promise<MailSettings> {
  requireRole(actor, 'guest');
  if (!actor.userId) throw new BadRequestError('Only a member has e-mail settings.');
  return memberMailSettings(tx, actor.cellarId, actor.userId, actor.role);
}

/** Changes the member's own e-mail reminders in this cellar; nobody else's. */
export async function setMyMailSettings(actor: Actor, tx: EntityManager, settings: MailSettings): Promise<MailSettings> {
  requireRole(actor, 'guest');
  if (!actor.userId) throw new BadRequestError('Only a member has e-mail settings.');
  await saveMailSettings(tx, actor.cellarId, actor.userId, { ...settings, kinds: [...new Set(settings.kinds)] });
  return memberMailSettings(tx, actor.cellarId, actor.userId, actor.role);
}
