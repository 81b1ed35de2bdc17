import { defineStore } from 'pinia';
import { Notify } from 'quasar';
import { computed, ref, watch } from 'vue';
import { useSessionStore } from '@/stores/session';
import { idbQueueStorage } from './idb-queue-storage';
import { indexedDbAvailable } from './offline-db';
import { Outbox, type FlushReport, type NewQueuedWrite } from './outbox';
import { memoryQueueStorage } from './queue-storage';
import type { QueuedWrite, WriteSender } from './queued-write';
import { sendQueuedWrite } from './send-queued-write';

/** Waits before trying again after the network or the server failed: growing, then every five minutes. */
export const RETRY_DELAYS_MS = [5_000, 15_000, 60_000, 300_000];

/**
 * The phone's waiting writes and its connection, for the header's count, the "Waiting to send"
 * list and the offline banner. Sends when the connection returns (the `online` event), after
 * each write is kept while a connection seems to be there, and on a growing retry timer.
 */
export const useOutboxStore = defineStore('outbox', () => {
  const session = useSessionStore();
  const outbox = new Outbox(indexedDbAvailable() ? idbQueueStorage() : memoryQueueStorage());
  let sender: WriteSender = sendQueuedWrite;

  const writes = ref<QueuedWrite[]>([]);
  /** The browser says it has a network. */
  const online = ref(typeof navigator === 'undefined' ? true : navigator.onLine);
  /** The last request reached the server (false after a request failed for want of a network). */
  const reached = ref(true);
  const sending = ref(false);
  const offline = computed(() => !online.value || !reached.value);
  const waiting = computed(() => writes.value.filter((w) => !w.problem));
  const held = computed(() => writes.value.filter((w) => w.problem));

  let retryTimer: ReturnType<typeof setTimeout> | undefined;
  let failedFlushes = 0;

  async function refresh(): Promise<void> {
    const userId = session.user?.id;
    writes.value = userId ? await outbox.list(userId) : [];
  }

  function scheduleRetry(): void {
    clearTimeout(retryTimer);
    if (waiting.value.length === 0) return;
    const delay = RETRY_DELAYS_MS[Math.min(failedFlushes, RETRY_DELAYS_MS.length - 1)];
    retryTimer = setTimeout(() => void flush(), delay);
  }

  /** Sends what waits, in order; answers what happened (null when there was nothing to do). */
  async function flush(): Promise<FlushReport | null> {
    const userId = session.user?.id;
    if (!userId) return null;
    sending.value = true;
    try {
      const report = await outbox.flush(sender, userId);
      if (report.sent > 0) notifySent(report.sent);
      if (report.sent > 0 || report.stoppedBy === null) reached.value = true;
      if (report.stoppedBy === 'network') reached.value = false;
      failedFlushes = report.stoppedBy === 'network' || report.stoppedBy === 'server' ? failedFlushes + 1 : 0;
      return report;
    } finally {
      sending.value = false;
      await refresh();
      scheduleRetry();
    }
  }

  /** Pages show what they loaded before: a reload shows what was just sent. */
  function notifySent(count: number): void {
    Notify.create({
      type: 'positive',
      message: count === 1 ? 'A change kept on this phone was sent.' : `${count} changes kept on this phone were sent.`,
      actions: [{ label: 'Refresh', color: 'white', handler: () => window.location.reload() }],
    });
  }

  async function keep(write: Omit<NewQueuedWrite, 'userId'>): Promise<void> {
    const userId = session.user?.id;
    if (!userId) throw new Error('Sign in to keep changes on this phone.');
    await outbox.add({ ...write, userId });
    await refresh();
    scheduleRetry();
  }

  async function retry(id: string): Promise<void> {
    await outbox.retry(id);
    await flush();
  }

  async function keepAnyway(id: string): Promise<void> {
    await outbox.keepAnyway(id);
    await flush();
  }

  async function drop(id: string): Promise<void> {
    await outbox.drop(id);
    await refresh();
  }

  /** A request reached the server or failed for want of a network. */
  function noteReached(ok: boolean): void {
    const wasCut = !reached.value;
    reached.value = ok;
    if (ok && wasCut && waiting.value.length > 0) void flush();
  }

  /** Listens for the connection coming and going; call once at start. */
  function start(): void {
    window.addEventListener('online', () => {
      online.value = true;
      failedFlushes = 0;
      void flush();
    });
    window.addEventListener('offline', () => {
      online.value = false;
    });
    // Each person sees and sends only their own writes: again at every sign-in.
    watch(
      () => session.user?.id,
      () => void refresh().then(() => (online.value ? flush() : null)),
      { immediate: true },
    );
  }

  /** For tests: another way of sending. */
  function useSender(send: WriteSender): void {
    sender = send;
  }

  return { writes, waiting, held, online, reached, offline, sending, refresh, flush, keep, retry, keepAnyway, drop, noteReached, start, useSender };
});
