import type { EntityManager } from 'typeorm';
import type { CalendarFeed } from '../../shared/schemas/tasks';
import { requireRole, type Actor } from '../core/actor';
import { ForbiddenError } from '../http/errors';
import { feedCreatedAt, feedPath, issueFeedToken, revokeFeedToken } from './feed-tokens';

/** The feed belongs to a person: the cellar's own jobs have none. */
function personOf(actor: Actor): string {
  if (actor.kind !== 'member') throw new ForbiddenError('A calendar feed belongs to a person.');
  return actor.userId;
}

/** Whether the actor's own calendar feed is on (its URL is never shown again). */
export async function getCalendarFeed(actor: Actor, tx: EntityManager): Promise<CalendarFeed> {
  requireRole(actor, 'guest');
  const createdAt = await feedCreatedAt(tx, personOf(actor));
  return { on: createdAt !== null, url: null, createdAt: createdAt?.toISOString() ?? null };
}

/** Turns the actor's feed on, or gives it a new URL (the old one stops working). The URL is in this answer only. */
export async function turnOnCalendarFeed(actor: Actor, tx: EntityManager): Promise<CalendarFeed> {
  requireRole(actor, 'guest');
  const token = await issueFeedToken(tx, personOf(actor));
  return { on: true, url: feedPath(token), createdAt: new Date().toISOString() };
}

/** Turns the actor's feed off: its URL answers 404 from now on. */
export async function turnOffCalendarFeed(actor: Actor, tx: EntityManager): Promise<CalendarFeed> {
  requireRole(actor, 'guest');
  await revokeFeedToken(tx, personOf(actor));
  return { on: false, url: null, createdAt: null };
}
