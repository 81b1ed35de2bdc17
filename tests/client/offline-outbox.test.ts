import { describe, expect, it } from 'vitest';
import { Outbox, type NewQueuedWrite } from '@/offline/outbox';
import { memoryQueueStorage } from '@/offline/queue-storage';
import type { QueuedWrite, SendOutcome } from '@/offline/queued-write';

const ME = 'user-me';
const CELLAR = 'cellar-1';

let made = 0;
/** A reading made at `minute` past 08:00 on 3 Dec 2026 (invented moments). */
function reading(minute: number, extra: Partial<NewQueuedWrite> = {}): NewQueuedWrite {
  made += 1;
  const at = `2026-12-03T08:${String(minute).padStart(2, '0')}:00.000Z`;
  return {
    id: `key-${made}`,
    kind: 'reading',
    label: `Reading at ${minute}`,
    method: 'POST',
    url: `/api/cellars/${CELLAR}/batches/b1/readings`,
    body: { sg: 1.01, vesselId: 'v1', at },
    madeAt: at,
    userId: ME,
    cellarId: CELLAR,
    ...extra,
  };
}

/** A server that answers each key from a script (201 unless told), recording what it was sent. */
function scriptedServer(script: Record<string, SendOutcome | 'throw'> = {}) {
  const sent: QueuedWrite[] = [];
  const send = async (write: QueuedWrite): Promise<SendOutcome> => {
    sent.push(write);
    const answer = script[write.id];
    if (answer === 'throw') throw new TypeError('Failed to fetch');
    return answer === undefined ? { status: 201, message: '' } : answer;
  };
  return { sent, send };
}

describe('Outbox: order', () => {
  it('sends writes in the order they were made, whatever order they were kept in', async () => {
    const outbox = new Outbox(memoryQueueStorage());
    const late = await outbox.add(reading(30));
    const early = await outbox.add(reading(5));
    const middle = await outbox.add(reading(12));
    const server = scriptedServer();
    const report = await outbox.flush(server.send, ME);
    expect(server.sent.map((w) => w.id)).toEqual([early.id, middle.id, late.id]);
    expect(report).toEqual({ sent: 3, held: 0, stoppedBy: null });
    expect(await outbox.list(ME)).toEqual([]);
  });

  it('keeps writes made in the same millisecond in the order they were kept', async () => {
    const outbox = new Outbox(memoryQueueStorage());
    const first = await outbox.add(reading(7, { id: 'zz-first' }));
    const second = await outbox.add(reading(7, { id: 'aa-second' }));
    const server = scriptedServer();
    await outbox.flush(server.send, ME);
    expect(server.sent.map((w) => w.id)).toEqual([first.id, second.id]);
  });

  it('sends only the signed-in person’s writes', async () => {
    const outbox = new Outbox(memoryQueueStorage());
    const mine = await outbox.add(reading(1));
    const theirs = await outbox.add(reading(2, { userId: 'someone-else' }));
    const server = scriptedServer();
    await outbox.flush(server.send, ME);
    expect(server.sent.map((w) => w.id)).toEqual([mine.id]);
    expect((await outbox.list()).map((w) => w.id)).toEqual([theirs.id]);
  });
});

describe('Outbox: retrying', () => {
  it('stops at the first write that meets no network, keeps it and what follows, and resends it with the same key', async () => {
    const outbox = new Outbox(memoryQueueStorage());
    const a = await outbox.add(reading(1));
    const b = await outbox.add(reading(2));
    const c = await outbox.add(reading(3));
    const cut = scriptedServer({ [b.id]: null });
    expect(await outbox.flush(cut.send, ME)).toEqual({ sent: 1, held: 0, stoppedBy: 'network' });
    expect(cut.sent.map((w) => w.id)).toEqual([a.id, b.id]);
    expect((await outbox.list(ME)).map((w) => w.id)).toEqual([b.id, c.id]);

    const back = scriptedServer();
    expect(await outbox.flush(back.send, ME)).toEqual({ sent: 2, held: 0, stoppedBy: null });
    expect(back.sent.map((w) => w.id)).toEqual([b.id, c.id]);
    expect(back.sent[0].body).toEqual(b.body);
  });

  it('treats a thrown fetch like a missing network', async () => {
    const outbox = new Outbox(memoryQueueStorage());
    const a = await outbox.add(reading(1));
    const server = scriptedServer({ [a.id]: 'throw' });
    expect(await outbox.flush(server.send, ME)).toEqual({ sent: 0, held: 0, stoppedBy: 'network' });
    expect(await outbox.list(ME)).toHaveLength(1);
  });

  it('stops on a server error or "too many", counting the attempt, and keeps the write waiting', async () => {
    for (const status of [500, 503, 429]) {
      const outbox = new Outbox(memoryQueueStorage());
      const a = await outbox.add(reading(1));
      await outbox.add(reading(2));
      const server = scriptedServer({ [a.id]: { status, message: 'busy' } });
      expect(await outbox.flush(server.send, ME)).toEqual({ sent: 0, held: 0, stoppedBy: 'server' });
      expect(server.sent).toHaveLength(1);
      const [kept] = await outbox.list(ME);
      expect(kept).toMatchObject({ id: a.id, attempts: 1, problem: null });
    }
  });

  it('stops when the session has ended, sending nothing more', async () => {
    const outbox = new Outbox(memoryQueueStorage());
    const a = await outbox.add(reading(1));
    await outbox.add(reading(2));
    const server = scriptedServer({ [a.id]: { status: 401, message: 'Sign in first.' } });
    expect(await outbox.flush(server.send, ME)).toEqual({ sent: 0, held: 0, stoppedBy: 'session' });
    expect(server.sent).toHaveLength(1);
    expect(await outbox.list(ME)).toHaveLength(2);
  });

  it('runs one flush at a time: a second call while one runs sends nothing twice', async () => {
    const outbox = new Outbox(memoryQueueStorage());
    await outbox.add(reading(1));
    await outbox.add(reading(2));
    const server = scriptedServer();
    const [first, second] = await Promise.all([outbox.flush(server.send, ME), outbox.flush(server.send, ME)]);
    expect(server.sent).toHaveLength(2);
    expect(second).toBe(first);
  });
});

describe('Outbox: refusals wait for the person', () => {
  it('keeps a write the server refused with its message, sends the rest, and does not send it again by itself', async () => {
    const outbox = new Outbox(memoryQueueStorage());
    const moved = await outbox.add(reading(1));
    const next = await outbox.add(reading(2, { body: { sg: 1.0, at: '2026-12-03T08:02:00.000Z' } }));
    const server = scriptedServer({ [moved.id]: { status: 409, message: 'Carboy 2 no longer holds this batch.' } });
    expect(await outbox.flush(server.send, ME)).toEqual({ sent: 1, held: 1, stoppedBy: null });
    expect(server.sent.map((w) => w.id)).toEqual([moved.id, next.id]);
    expect(await outbox.list(ME)).toEqual([
      expect.objectContaining({ id: moved.id, problem: { status: 409, message: 'Carboy 2 no longer holds this batch.' } }),
    ]);
    const again = scriptedServer();
    expect(await outbox.flush(again.send, ME)).toEqual({ sent: 0, held: 0, stoppedBy: null });
    expect(again.sent).toEqual([]);
  });

  it('keeps a validation refusal (400) the same way', async () => {
    const outbox = new Outbox(memoryQueueStorage());
    const a = await outbox.add(reading(1));
    await outbox.flush(scriptedServer({ [a.id]: { status: 400, message: 'sg: at most 1.200' } }).send, ME);
    expect((await outbox.list(ME))[0].problem).toEqual({ status: 400, message: 'sg: at most 1.200' });
  });

  it('"keep it anyway" sends the reading without the vessel it no longer fits, with the same key', async () => {
    const outbox = new Outbox(memoryQueueStorage());
    const a = await outbox.add(reading(1));
    await outbox.flush(scriptedServer({ [a.id]: { status: 409, message: 'moved' } }).send, ME);
    await outbox.keepAnyway(a.id);
    const server = scriptedServer();
    await outbox.flush(server.send, ME);
    expect(server.sent).toHaveLength(1);
    expect(server.sent[0].id).toBe(a.id);
    expect(server.sent[0].body).toEqual({ sg: 1.01, vesselId: null, at: a.madeAt });
  });

  it('"keep it anyway" sends a move without the version the person saw', async () => {
    const outbox = new Outbox(memoryQueueStorage());
    const move = await outbox.add(reading(1, { kind: 'move', method: 'PUT', body: { to: null, expectedVersion: 4 } }));
    await outbox.flush(scriptedServer({ [move.id]: { status: 409, message: 'changed' } }).send, ME);
    await outbox.keepAnyway(move.id);
    const server = scriptedServer();
    await outbox.flush(server.send, ME);
    expect(server.sent[0].body).toEqual({ to: null });
  });

  it('"try again" resends it unchanged; "drop it" forgets it', async () => {
    const outbox = new Outbox(memoryQueueStorage());
    const a = await outbox.add(reading(1));
    const b = await outbox.add(reading(2));
    await outbox.flush(scriptedServer({ [a.id]: { status: 409, message: 'x' }, [b.id]: { status: 409, message: 'y' } }).send, ME);
    await outbox.retry(a.id);
    await outbox.drop(b.id);
    const server = scriptedServer();
    await outbox.flush(server.send, ME);
    expect(server.sent.map((w) => [w.id, w.body])).toEqual([[a.id, a.body]]);
    expect(await outbox.list()).toEqual([]);
  });
});
