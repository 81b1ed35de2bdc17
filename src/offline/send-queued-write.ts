import { errorFromAnswer, unitsHeader } from '@/api/http';
import type { QueuedWrite, SendOutcome } from './queued-write';

/**
 * Sends one queued write as it was made, with its key: a repeat of a write that already
 * reached the server gets the first answer and records nothing. Null when the request never
 * reached the server.
 */
export async function sendQueuedWrite(write: QueuedWrite): Promise<SendOutcome> {
  let res: Response;
  try {
    res = await fetch(write.url, {
      method: write.method,
      credentials: 'same-origin',
      headers: { accept: 'application/json', 'content-type': 'application/json', ...unitsHeader(), 'Idempotency-Key': write.id },
      body: JSON.stringify(write.body),
    });
  } catch {
    return null;
  }
  if (res.ok) return { status: res.status, message: '' };
  const raw = await res.json().catch(() => ({}));
  return { status: res.status, message: errorFromAnswer(res.status, raw).message };
}
