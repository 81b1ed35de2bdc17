import type { UnitSystem } from '../../shared/calc';
import { roleAtLeast, type Role } from '../../shared/roles';
import { ForbiddenError } from '../http/errors';

/**
 * Who acts on a cellar: a member signed in through the HTTP door, or the cellar's own work
 * running from a clock, a device token or an import. Every service takes one and checks it
 * first (`requireRole`), so work that never passes the HTTP gate obeys the same rules.
 */
export type Actor = MemberActor | SystemActor;

export interface MemberActor {
  kind: 'member';
  cellarId: string;
  role: Role;
  userId: string;
  /** The units its messages are worded in: the person's choice, sent with each request (metric when not said). */
  units: UnitSystem;
}

/** What the cellar's own jobs are; each acts with the role a person doing it would need. */
export type SystemJob = 'schedule' | 'device' | 'import';

export interface SystemActor {
  kind: 'system';
  cellarId: string;
  role: Role;
  job: SystemJob;
  /** Journal entries it writes have no author. */
  userId: null;
  /** Its messages are read by no one in particular: metric, as the records keep them. */
  units: 'metric';
}

export function memberActor(cellarId: string, userId: string, role: Role, units: UnitSystem = 'metric'): MemberActor {
  return { kind: 'member', cellarId, userId, role, units };
}

export function systemActor(cellarId: string, job: SystemJob, role: Role): SystemActor {
  return { kind: 'system', cellarId, job, role, userId: null, units: 'metric' };
}

/**
 * The inner door: refuses (403) an actor whose role in its cellar is below `least`. The first
 * line of every service function.
 */
export function requireRole(actor: Actor, least: Role): void {
  if (roleAtLeast(actor.role, least)) return;
  throw new ForbiddenError(
    least === 'keeper' ? 'Only a Keeper of this cellar can do that.' : 'Guests can look but not change anything in this cellar.',
  );
}
