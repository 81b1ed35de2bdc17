import type { DataSource } from 'typeorm';
import { returningRows } from './returning';
import type { MailTransport } from './smtp-transport';

export interface OutboxWorkerOptions {
  transport: MailTransport;
  from: string;
  /** The clock; tests move it. */
  now?: () => Date;
  /** Attempts before a message is marked failed. */
  maxAttempts?: number;
  /** Messages one pass claims. */
  batchSize?: number;
  /** How long a claim holds: a worker that died after claiming gives the message back after this. */
  leaseMs?: number;
  /** Wait after the first failure; each further failure doubles it, up to retryMaxMs. */
  retryBaseMs?: number;
  retryMaxMs?: number;
}

interface ClaimedRow {
  id: string;
  to_address: string;
  subject: string;
  text_body: string;
  html_body: string;
  headers: Record<string, string>;
  message_id: string;
  attempts: number;
}

export interface DeliveryPass {
  sent: number;
  /** Failed this time, will be tried again. */
  deferred: number;
  /** Failed for the last time: marked failed. */
  failed: number;
}

const DEFAULTS = { maxAttempts: 8, batchSize: 50, leaseMs: 5 * 60_000, retryBaseMs: 30_000, retryMaxMs: 60 * 60_000 };

/** The wait before attempt n+1 after n failed attempts: 30 s, 1 min, 2 min, … up to the cap. */
export function retryDelayMs(failedAttempts: number, baseMs = DEFAULTS.retryBaseMs, maxMs = DEFAULTS.retryMaxMs): number {
  return Math.min(maxMs, baseMs * 2 ** Math.max(0, failedAttempts - 1));
}

/**
 * Claims up to `limit` messages due at `now`: pending ones whose wait is over, and ones another
 * worker claimed but never finished (its lease ran out). One statement, committed at once:
 * FOR UPDATE SKIP LOCKED lets concurrent workers on other instances pass over rows being
 * claimed instead of waiting, and the claim (status 'sending' with a lease) keeps them away
 * after it commits. So each message goes to one worker at a time.
 */
export async function claimDueMail(ds: DataSource, now: Date, limit: number, leaseMs: number): Promise<ClaimedRow[]> {
  return returningRows<ClaimedRow>(
    ds,
    `UPDATE mail_outbox o
        SET status = 'sending', attempts = o.attempts + 1, claimed_until = $1::timestamptz + make_interval(secs => $2::double precision / 1000)
       FROM (SELECT id FROM mail_outbox
              WHERE (status = 'pending' AND next_attempt_at <= $1) OR (status = 'sending' AND claimed_until <= $1)
              ORDER BY next_attempt_at, created_at
              LIMIT $3
              FOR UPDATE SKIP LOCKED) due
      WHERE o.id = due.id
      RETURNING o.id, o.to_address, o.subject, o.text_body, o.html_body, o.headers, o.message_id, o.attempts`,
    [now.toISOString(), leaseMs, limit],
  );
}

/**
 * One delivery pass: claims due messages and hands each to SMTP. A refusal or an unreachable
 * server puts the message back with a growing wait; after `maxAttempts` it is marked failed
 * with the reason, for a Keeper to see and retry.
 *
 * The one window for a double: the worker dies after the SMTP server accepted a message and
 * before it is marked sent; its lease runs out and another worker sends it again. The
 * Message-ID stays the same, so mail clients can fold the two.
 */
export async function deliverDueMail(ds: DataSource, options: OutboxWorkerOptions): Promise<DeliveryPass> {
  const o = { ...DEFAULTS, ...options, now: options.now ?? (() => new Date()) };
  const claimed = await claimDueMail(ds, o.now(), o.batchSize, o.leaseMs);
  const pass: DeliveryPass = { sent: 0, deferred: 0, failed: 0 };
  for (const row of claimed) {
    try {
      await o.transport.sendMail({
        from: o.from,
        to: row.to_address,
        subject: row.subject,
        text: row.text_body,
        html: row.html_body,
        messageId: row.message_id,
        headers: row.headers,
      });
      await ds.query(
        `UPDATE mail_outbox SET status = 'sent', sent_at = $2, claimed_until = NULL, last_error = NULL WHERE id = $1 AND status = 'sending'`,
        [row.id, o.now().toISOString()],
      );
      pass.sent++;
    } catch (err) {
      const reason = describeSmtpError(err);
      if (row.attempts >= o.maxAttempts) {
        await ds.query(`UPDATE mail_outbox SET status = 'failed', claimed_until = NULL, last_error = $2 WHERE id = $1`, [row.id, reason]);
        pass.failed++;
      } else {
        const next = new Date(o.now().getTime() + retryDelayMs(row.attempts, o.retryBaseMs, o.retryMaxMs));
        await ds.query(`UPDATE mail_outbox SET status = 'pending', claimed_until = NULL, last_error = $2, next_attempt_at = $3 WHERE id = $1`, [
          row.id,
          reason,
          next.toISOString(),
        ]);
        pass.deferred++;
      }
    }
  }
  return pass;
}

/** The reason a Keeper reads: the SMTP server's answer, or why it could not be reached. */
export function describeSmtpError(err: unknown): string {
  const e = err as { response?: string; code?: string; message?: string };
  const text = e.response ?? (e.code ? `${e.code}: ${e.message ?? ''}` : (e.message ?? String(err)));
  return text.slice(0, 500);
}

export interface RunningWorker {
  /** Runs a pass now (and returns when it ends); passes never overlap. */
  runNow(): Promise<void>;
  stop(): Promise<void>;
}

/**
 * Runs delivery passes every `intervalMs` inside the app's process. Several app instances may
 * each run one: the claim keeps them from sending a message twice.
 */
export function startOutboxWorker(
  ds: DataSource,
  options: OutboxWorkerOptions & { intervalMs: number; log?: (line: string) => void },
): RunningWorker {
  let running: Promise<void> | null = null;
  let stopped = false;
  const runNow = (): Promise<void> => {
    if (stopped) return Promise.resolve();
    running ??= (async () => {
      try {
        // Drain: keep going while full batches come back.
        for (;;) {
          const pass = await deliverDueMail(ds, options);
          if (pass.failed) options.log?.(`[mail] ${pass.failed} message(s) could not be delivered and are marked failed`);
          if (pass.sent + pass.deferred + pass.failed < (options.batchSize ?? DEFAULTS.batchSize) || stopped) break;
        }
      } catch (err) {
        options.log?.(`[mail] delivery pass failed: ${err instanceof Error ? err.message : String(err)}`);
      } finally {
        running = null;
      }
    })();
    return running;
  };
  const timer = setInterval(() => void runNow(), options.intervalMs);
  timer.unref();
  return {
    runNow,
    stop: async () => {
      stopped = true;
      clearInterval(timer);
      await running;
    },
  };
}
