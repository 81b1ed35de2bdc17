/** The kinds of write a phone may make without signal and send later. */
export type QueuedWriteKind = 'reading' | 'note' | 'tasting' | 'move' | 'cleaning' | 'departure';

/** Why a queued write is waiting for the person rather than for the network. */
export interface WriteProblem {
  status: number;
  /** The server's message: what changed, or what is wrong with the request. */
  message: string;
}

/**
 * A write kept on this phone until it can be sent. Its `id` is the Idempotency-Key it is sent
 * with every time, so a write that reached the server once is never recorded twice.
 */
export interface QueuedWrite {
  id: string;
  kind: QueuedWriteKind;
  /** What it is, in people's words ("Reading 1.012 · Spring melomel"). */
  label: string;
  method: 'POST' | 'PUT';
  url: string;
  body: Record<string, unknown>;
  /** When it was made (ISO): the order of sending, and the moment a dated write records. */
  madeAt: string;
  /** Who made it, and in which cellar: only that person's session sends it. */
  userId: string;
  cellarId: string;
  /** Set when the server refused it (409 or another 4xx): it waits for the person's choice. */
  problem: WriteProblem | null;
  attempts: number;
  /** Ties between writes made in the same millisecond: the order they were kept in. */
  order: number;
}

/** What the network answered a sent write; `null` when it never reached the server. */
export type SendOutcome = { status: number; message: string } | null;

/** Sends one queued write with its key; resolves null when there is no network. */
export type WriteSender = (write: QueuedWrite) => Promise<SendOutcome>;
