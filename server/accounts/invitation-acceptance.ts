import type { EntityManager } from 'typeorm';
import type { Role } from '../../shared/roles';
import type { InvitationPreview } from '../../shared/schemas/accounts';
import { BadRequestError, ConflictError } from '../http/errors';
import { hashMailToken } from './mail-tokens';
import { hashPassword } from './passwords';

/**
 * The invited person's side: look at an invitation, accept it signed in, or create an account
 * through it. These act before any cellar membership exists, so they take the token and a
 * user, not an actor; the token is the permission.
 */

interface OpenInvitation {
  id: string;
  cellar_id: string;
  cellar_name: string;
  email: string;
  role: Role;
  expires_at: Date;
}

/**
 * The invitation a token opens, locked for this transaction, or a 400 that says plainly why
 * not (unknown, used, withdrawn, expired).
 */
async function openInvitation(tx: EntityManager, token: string, lock: boolean): Promise<OpenInvitation> {
  const [row]: (OpenInvitation & { accepted_at: Date | null; revoked_at: Date | null; expired: boolean })[] = await tx.query(
    `SELECT i.id, i.cellar_id, c.name AS cellar_name, i.email, i.role, i.expires_at, i.accepted_at, i.revoked_at,
            i.expires_at <= now() AS expired
       FROM invitations i JOIN cellars c ON c.id = i.cellar_id
      WHERE i.token_hash = $1
      ${lock ? 'FOR UPDATE OF i' : ''}`,
    [hashMailToken(token)],
  );
  if (!row) throw new BadRequestError('This invitation link is not valid. Ask the Keeper to send a new one.');
  if (row.accepted_at) throw new BadRequestError('This invitation has already been used. Sign in to open the cellar.');
  if (row.revoked_at) throw new BadRequestError('This invitation was withdrawn. Ask the Keeper if you should still join.');
  if (row.expired) throw new BadRequestError('This invitation has expired. Ask the Keeper to send it again.');
  return row;
}

/** What the invitation page shows before the person accepts. */
export async function previewInvitation(tx: EntityManager, token: string): Promise<InvitationPreview> {
  const inv = await openInvitation(tx, token, false);
  const [account]: unknown[] = await tx.query(`SELECT 1 FROM users WHERE email = $1`, [inv.email]);
  return {
    cellarId: inv.cellar_id,
    cellarName: inv.cellar_name,
    email: inv.email,
    role: inv.role,
    expiresAt: new Date(inv.expires_at).toISOString(),
    accountExists: Boolean(account),
  };
}

async function join(tx: EntityManager, inv: OpenInvitation, userId: string): Promise<void> {
  const [already]: unknown[] = await tx.query(`SELECT 1 FROM memberships WHERE cellar_id = $1 AND user_id = $2`, [inv.cellar_id, userId]);
  if (already) throw new ConflictError(`You are already a member of "${inv.cellar_name}".`);
  await tx.query(`INSERT INTO memberships (cellar_id, user_id, role) VALUES ($1, $2, $3)`, [inv.cellar_id, userId, inv.role]);
  await tx.query(`UPDATE invitations SET accepted_at = now(), accepted_by = $2 WHERE id = $1`, [inv.id, userId]);
}

/**
 * A signed-in person accepts: only the account with the invited address may.
 * @returns the cellar joined
 */
export async function acceptInvitation(tx: EntityManager, token: string, user: { id: string; email: string }): Promise<string> {
  const inv = await openInvitation(tx, token, true);
  if (user.email !== inv.email) {
    throw new ConflictError(`This invitation is for ${inv.email}. Sign out and sign in with that address to accept it.`);
  }
  await join(tx, inv, user.id);
  return inv.cellar_id;
}

/**
 * A new person accepts by creating their account: the invited address, their name and password.
 * @returns the new user (to sign in)
 */
export async function signUpWithInvitation(
  tx: EntityManager,
  token: string,
  displayName: string,
  password: string,
): Promise<{ id: string; email: string; displayName: string }> {
  const inv = await openInvitation(tx, token, true);
  const [account]: unknown[] = await tx.query(`SELECT 1 FROM users WHERE email = $1`, [inv.email]);
  if (account) throw new ConflictError(`An account already uses ${inv.email}. Sign in with it to accept the invitation.`);
  const [user]: { id: string }[] = await tx.query(`INSERT INTO users (email, display_name, password_hash) VALUES ($1, $2, $3) RETURNING id`, [
    inv.email,
    displayName,
    await hashPassword(password),
  ]);
  await join(tx, inv, user!.id);
  return { id: user!.id, email: inv.email, displayName };
}
