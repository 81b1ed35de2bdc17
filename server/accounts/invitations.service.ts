import type { EntityManager } from 'typeorm';
import type { Role } from '../../shared/roles';
import type { Invitation } from '../../shared/schemas/accounts';
import { requireRole, type Actor } from '../core/actor';
import { ConflictError, NotFoundError } from '../http/errors';
import { enqueueMail } from '../mail/outbox';
import { returningRows } from '../mail/returning';
import { invitationMail } from '../mail/templates/invitation-mail';
import { newMailToken } from './mail-tokens';

/** How long an invitation link works. */
export const INVITATION_VALID_DAYS = 7;

interface InvitationRow {
  id: string;
  email: string;
  role: Role;
  created_at: Date;
  expires_at: Date;
}

const toInvitation = (r: InvitationRow, now = Date.now()): Invitation => ({
  id: r.id,
  email: r.email,
  role: r.role,
  invitedAt: new Date(r.created_at).toISOString(),
  expiresAt: new Date(r.expires_at).toISOString(),
  expired: new Date(r.expires_at).getTime() <= now,
});

/** The link in the mail: the client's invitation page with the token. */
const invitationUrl = (publicUrl: string, token: string) => `${publicUrl}/invitation?token=${token}`;

/** Renders the invitation mail and puts it in the outbox, in the caller's transaction. */
async function sendInvitationMail(actor: Actor, tx: EntityManager, row: InvitationRow, token: string, publicUrl: string): Promise<void> {
  const [names]: { cellar_name: string; inviter_name: string | null }[] = await tx.query(
    `SELECT c.name AS cellar_name, u.display_name AS inviter_name FROM cellars c LEFT JOIN users u ON u.id = $2 WHERE c.id = $1`,
    [actor.cellarId, actor.userId],
  );
  const mail = invitationMail({
    cellarName: names!.cellar_name,
    inviterName: names!.inviter_name ?? 'A Keeper',
    role: row.role,
    acceptUrl: invitationUrl(publicUrl, token),
    expiresAt: new Date(row.expires_at),
  });
  await enqueueMail(tx, { kind: 'invitation', cellarId: actor.cellarId, to: row.email, ...mail }, publicUrl);
}

/**
 * Invites an address to the cellar with a role and mails it a single-use link. The answer is
 * the same whether or not an account uses the address; nobody is added until they accept.
 * @param publicUrl - base of the link in the mail
 */
export async function inviteMember(actor: Actor, tx: EntityManager, email: string, role: Role, publicUrl: string): Promise<Invitation> {
  requireRole(actor, 'keeper');
  const [member]: unknown[] = await tx.query(`SELECT 1 FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.cellar_id = $1 AND u.email = $2`, [
    actor.cellarId,
    email,
  ]);
  if (member) throw new ConflictError(`${email} is already a member of this cellar.`);
  // An expired invitation no longer blocks a new one.
  await tx.query(
    `UPDATE invitations SET revoked_at = now()
      WHERE cellar_id = $1 AND email = $2 AND accepted_at IS NULL AND revoked_at IS NULL AND expires_at <= now()`,
    [actor.cellarId, email],
  );
  const [open]: unknown[] = await tx.query(
    `SELECT 1 FROM invitations WHERE cellar_id = $1 AND email = $2 AND accepted_at IS NULL AND revoked_at IS NULL`,
    [actor.cellarId, email],
  );
  if (open) throw new ConflictError(`An invitation to ${email} is already waiting. Resend it or withdraw it.`);
  const { token, hash } = newMailToken();
  const [row]: InvitationRow[] = await tx.query(
    `INSERT INTO invitations (cellar_id, email, role, token_hash, invited_by, expires_at)
     VALUES ($1, $2, $3, $4, $5, now() + make_interval(days => $6))
     RETURNING id, email, role, created_at, expires_at`,
    [actor.cellarId, email, role, hash, actor.userId, INVITATION_VALID_DAYS],
  );
  await sendInvitationMail(actor, tx, row!, token, publicUrl);
  return toInvitation(row!);
}

/** Invitations not yet accepted or withdrawn, oldest first (expired ones too, marked). */
export async function listInvitations(actor: Actor, tx: EntityManager): Promise<Invitation[]> {
  requireRole(actor, 'keeper');
  const rows: InvitationRow[] = await tx.query(
    `SELECT id, email, role, created_at, expires_at FROM invitations
      WHERE cellar_id = $1 AND accepted_at IS NULL AND revoked_at IS NULL
      ORDER BY created_at`,
    [actor.cellarId],
  );
  return rows.map((r) => toInvitation(r));
}

/** Mails a fresh link (the old one stops working) valid for another 7 days. */
export async function resendInvitation(actor: Actor, tx: EntityManager, invitationId: string, publicUrl: string): Promise<Invitation> {
  requireRole(actor, 'keeper');
  const { token, hash } = newMailToken();
  const [row] = await returningRows<InvitationRow>(
    tx,
    `UPDATE invitations SET token_hash = $3, created_at = now(), expires_at = now() + make_interval(days => $4)
      WHERE id = $1 AND cellar_id = $2 AND accepted_at IS NULL AND revoked_at IS NULL
      RETURNING id, email, role, created_at, expires_at`,
    [invitationId, actor.cellarId, hash, INVITATION_VALID_DAYS],
  );
  if (!row) throw new NotFoundError('No waiting invitation with that id in this cellar.');
  await sendInvitationMail(actor, tx, row, token, publicUrl);
  return toInvitation(row);
}

/** Withdraws a waiting invitation: its link stops working. */
export async function revokeInvitation(actor: Actor, tx: EntityManager, invitationId: string): Promise<void> {
  requireRole(actor, 'keeper');
  const rows = await returningRows(
    tx,
    `UPDATE invitations SET revoked_at = now()
      WHERE id = $1 AND cellar_id = $2 AND accepted_at IS NULL AND revoked_at IS NULL
      RETURNING id`,
    [invitationId, actor.cellarId],
  );
  if (rows.length === 0) throw new NotFoundError('No waiting invitation with that id in this cellar.');
}
