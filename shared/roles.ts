import { z } from 'zod';

/**
 * Roles in a cellar, weakest first. Keeper owns the cellar, Hand does the cellar work,
 * Guest reads everything and changes nothing.
 */
export const ROLES = ['guest', 'hand', 'keeper'] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;

export const ROLE_LABELS: Record<Role, string> = {
  keeper: 'Keeper',
  hand: 'Hand',
  guest: 'Guest',
};

/** True when `role` carries at least the rights of `needed`. */
export function roleAtLeast(role: Role, needed: Role): boolean {
  return ROLES.indexOf(role) >= ROLES.indexOf(needed);
}
