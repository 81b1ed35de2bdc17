import type { EntityManager } from 'typeorm';
import type { MailStatus, ReceivedMailView, UndeliveredMail } from '../../shared/schemas/mail';
import { requireRole, type Actor } from '../core/actor';
import { NotFoundError } from '../http/errors';
import type { LocalMailbox } from './local-mailbox';
import { returningRows } from './returning';

/** What the mail routes know about where mail goes. */
export interface MailboxAccess {
  /** The local mailbox, when no SMTP is configured. */
  mailbox?: LocalMailbox;
  /**
   * Show account mail (password resets, no cellar) on the Outgoing mail page. Only outside
   * production: in a shared deployment a Keeper must not read another person's reset link.
   */
  showAccountMail: boolean;
}

interface UndeliveredRow {
  id: string;
  kind: UndeliveredMail['kind'];
  to_address: string;
  subject: string;
  status: 'pending' | 'failed';
  attempts: number;
  last_error: string | null;
  next_attempt_at: Date;
  created_at: Date;
}

/** The cellar's mail that failed, or is being retried after a failure; newest first. */
async function undeliveredMail(tx: EntityManager, cellarId: string): Promise<UndeliveredMail[]> {
  const rows: UndeliveredRow[] = await tx.query(
    `SELECT id, kind, to_address, subject, status, attempts, last_error, next_attempt_at, created_at
       FROM mail_outbox
      WHERE cellar_id = $1 AND (status = 'failed' OR (status = 'pending' AND last_error IS NOT NULL))
      ORDER BY created_at DESC
      LIMIT 100`,
    [cellarId],
  );
  return rows.map((r) => ({
    id: r.id,
    kind: r.kind,
    to: r.to_address,
    subject: r.subject,
    status: r.status,
    attempts: r.attempts,
    lastError: r.last_error,
    nextAttemptAt: new Date(r.next_attempt_at).toISOString(),
    createdAt: new Date(r.created_at).toISOString(),
  }));
}

/** For Keepers: whether mail goes to the local mailbox, and the cellar's mail that is stuck. */
export async function getMailStatus(actor: Actor, tx: EntityManager, access: MailboxAccess): Promise<MailStatus> {
  requireRole(actor, 'keeper');
  return { localMailbox: Boolean(access.mailbox), undelivered: await undeliveredMail(tx, actor.cellarId) };
}

/**
 * For Keepers, only in local mailbox mode: what the local mailbox received for this cellar
 * (and account mail, where allowed). Never another cellar's mail.
 */
export async function listOutgoingMail(actor: Actor, _tx: EntityManager, access: MailboxAccess): Promise<ReceivedMailView[]> {
  requireRole(actor, 'keeper');
  if (!access.mailbox) throw new NotFoundError('Mail goes to a real mail server here; there is no local mailbox to show.');
  return access.mailbox
    .messages()
    .filter((m) => m.cellarId === actor.cellarId || (m.cellarId === null && access.showAccountMail))
    .map((m) => ({
      id: m.id,
      receivedAt: m.receivedAt,
      from: m.envelopeFrom,
      to: m.envelopeTo,
      subject: m.subject,
      text: m.text,
      html: m.html,
      scope: m.cellarId ? ('cellar' as const) : ('account' as const),
    }));
}

/** Gives a failed message of this cellar a fresh set of attempts, starting now. */
export async function retryMail(actor: Actor, tx: EntityManager, mailId: string): Promise<void> {
  requireRole(actor, 'keeper');
  const rows = await returningRows(
    tx,
    `UPDATE mail_outbox SET status = 'pending', attempts = 0, next_attempt_at = now(), claimed_until = NULL
      WHERE id = $1 AND cellar_id = $2 AND status = 'failed'
      RETURNING id`,
    [mailId, actor.cellarId],
  );
  if (rows.length === 0) throw new NotFoundError('No failed message with that id in this cellar.');
}
