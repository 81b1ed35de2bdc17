import crypto from 'node:crypto';
import type { EntityManager } from 'typeorm';

/** What kind of mail a row is; the Outgoing mail page and the failed list show it. */
export type MailKind = 'invitation' | 'password-reset' | 'task-reminder' | 'task-digest';

/** A mail ready to send: both bodies already rendered (server/mail/templates). */
export interface OutgoingMessage {
  kind: MailKind;
  /** The cellar it belongs to; null for account mail (password reset). */
  cellarId: string | null;
  to: string;
  subject: string;
  text: string;
  html: string;
  /** Extra headers (List-Unsubscribe…). */
  headers?: Record<string, string>;
  /**
   * At most one row ever holds this key (a unique index): enqueueing it again does nothing.
   * Reminders use task occurrence × recipient × kind; the Message-ID is derived from it.
   */
  dedupeKey?: string;
}

/** Header naming the cellar, so the local mailbox can show a cellar's Keepers only their cellar's mail. */
export const CELLAR_HEADER = 'X-Cellarwright-Cellar';

/** A Message-ID that is the same for the same key, so a mail client folds a rare double. */
export function messageIdFor(seed: string, publicUrl: string): string {
  const host = new URL(publicUrl).hostname || 'cellarwright.invalid';
  return `<${crypto.createHash('sha256').update(seed).digest('hex').slice(0, 40)}@${host}>`;
}

/**
 * Puts a message in the outbox inside the caller's transaction: it is delivered only if that
 * transaction commits. Returns false when a message with the same dedupe key already exists.
 * @param tx - the transaction of the change that causes the mail
 */
export async function enqueueMail(tx: EntityManager, message: OutgoingMessage, publicUrl: string): Promise<boolean> {
  return (await enqueueMails(tx, [message], publicUrl)) === 1;
}

/**
 * Puts many messages in the outbox with one statement (the reminder pass's whole harvest),
 * skipping any whose dedupe key is already there. Returns how many were new.
 */
export async function enqueueMails(tx: EntityManager, messages: OutgoingMessage[], publicUrl: string): Promise<number> {
  if (messages.length === 0) return 0;
  const rows = messages.map((m) => ({
    cellar_id: m.cellarId,
    dedupe_key: m.dedupeKey ?? null,
    kind: m.kind,
    to_address: m.to,
    subject: m.subject,
    text_body: m.text,
    html_body: m.html,
    headers: { ...m.headers, ...(m.cellarId ? { [CELLAR_HEADER]: m.cellarId } : {}) },
    message_id: messageIdFor(m.dedupeKey ?? crypto.randomUUID(), publicUrl),
  }));
  const inserted: unknown[] = await tx.query(
    `INSERT INTO mail_outbox (cellar_id, dedupe_key, kind, to_address, subject, text_body, html_body, headers, message_id)
     SELECT cellar_id, dedupe_key, kind, to_address, subject, text_body, html_body, headers, message_id
       FROM jsonb_to_recordset($1::jsonb) AS m(cellar_id uuid, dedupe_key text, kind text, to_address text, subject text,
                                              text_body text, html_body text, headers jsonb, message_id text)
     ON CONFLICT (dedupe_key) DO NOTHING
     RETURNING id`,
    [JSON.stringify(rows)],
  );
  return inserted.length;
}
