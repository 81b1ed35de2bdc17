import type { QueueStorage } from './queue-storage';
import type { QueuedWrite, SendOutcome, WriteSender } from './queued-write';

/** A write to keep: everything but what the outbox itself keeps track of. */
export type NewQueuedWrite = Omit<QueuedWrite, 'problem' | 'attempts' | 'order'>;

/** Why a flush stopped before the end of the queue. */
export type FlushStop = 'network' | 'server' | 'session' | null;

export interface FlushReport {
  sent: number;
  /** Refused by the server (409 or another 4xx) during this flush: kept for the person. */
  held: number;
  stoppedBy: FlushStop;
}

/** Statuses that say "not now" rather than "not this": the write is tried again later. */
const TRY_AGAIN_STATUSES = new Set([408, 425, 429]);

/** The order writes are sent in: as they were made, ties by the order they were kept. */
export function inSendingOrder(writes: QueuedWrite[]): QueuedWrite[] {
  return [...writes].sort((a, b) => a.madeAt.localeCompare(b.madeAt) || a.order - b.order);
}

/**
 * The request the person chose to send although the record changed: without the version they
 * saw (`expectedVersion`), and a reading no longer tied to a vessel the batch has left.
 */
export function relaxedBody(write: QueuedWrite): Record<string, unknown> {
  const { expectedVersion: _seen, ...body } = write.body;
  if (write.kind === 'reading') body.vesselId = null;
  return body;
}

/**
 * The queue of writes made without signal, over a storage (IndexedDB on the phone). Writes go
 * in the order they were made, each with its own key; the network failing stops a flush and
 * keeps the rest; a refusal (409, 4xx) is kept with the server's message for the person to
 * send anyway or drop — nothing is ever dropped without them.
 */
export class Outbox {
  private flushing: Promise<FlushReport> | null = null;

  constructor(private readonly storage: QueueStorage) {}

  /** The person's queued writes in sending order (all of them when no user is given). */
  async list(userId?: string): Promise<QueuedWrite[]> {
    const writes = await this.storage.list();
    return inSendingOrder(userId === undefined ? writes : writes.filter((w) => w.userId === userId));
  }

  async add(write: NewQueuedWrite): Promise<QueuedWrite> {
    const existing = await this.storage.list();
    const order = existing.reduce((max, w) => Math.max(max, w.order), 0) + 1;
    const kept: QueuedWrite = { ...write, problem: null, attempts: 0, order };
    await this.storage.put(kept);
    return kept;
  }

  /**
   * Sends the person's waiting writes in order. One flush at a time: a second call while one
   * runs gets the same report.
   */
  flush(send: WriteSender, userId: string): Promise<FlushReport> {
    this.flushing ??= this.sendWaiting(send, userId).finally(() => {
      this.flushing = null;
    });
    return this.flushing;
  }

  private async sendWaiting(send: WriteSender, userId: string): Promise<FlushReport> {
    const report: FlushReport = { sent: 0, held: 0, stoppedBy: null };
    for (const write of await this.list(userId)) {
      if (write.problem) continue;
      let outcome: SendOutcome;
      try {
        outcome = await send(write);
      } catch {
        outcome = null;
      }
      if (outcome === null) return { ...report, stoppedBy: 'network' };
      if (outcome.status < 300) {
        await this.storage.remove(write.id);
        report.sent += 1;
      } else if (outcome.status === 401) {
        return { ...report, stoppedBy: 'session' };
      } else if (outcome.status >= 500 || TRY_AGAIN_STATUSES.has(outcome.status)) {
        await this.storage.put({ ...write, attempts: write.attempts + 1 });
        return { ...report, stoppedBy: 'server' };
      } else {
        await this.storage.put({ ...write, attempts: write.attempts + 1, problem: { status: outcome.status, message: outcome.message } });
        report.held += 1;
      }
    }
    return report;
  }

  /** The person's choice after a refusal: send it again as it was (the next flush takes it). */
  async retry(id: string): Promise<void> {
    const write = (await this.storage.list()).find((w) => w.id === id);
    if (write) await this.storage.put({ ...write, problem: null });
  }

  /** The person's choice after a conflict: send it over the change (see `relaxedBody`). */
  async keepAnyway(id: string): Promise<void> {
    const write = (await this.storage.list()).find((w) => w.id === id);
    if (write) await this.storage.put({ ...write, body: relaxedBody(write), problem: null });
  }

  /** The person's choice: forget it. */
  async drop(id: string): Promise<void> {
    await this.storage.remove(id);
  }
}
