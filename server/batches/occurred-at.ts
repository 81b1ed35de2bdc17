import { localDate } from '../core/local-date';
import type { Batch } from '../entities/batch.entity';
import { BadRequestError } from '../http/errors';

/** Clocks on phones drift; a few minutes ahead is not "the future". */
const CLOCK_SLACK_MS = 5 * 60 * 1000;

/**
 * When an operation happened: the given moment, or now. Refuses moments in the future and
 * (for an existing batch) before the batch was started.
 * @param at - ISO date-time from the request, if any
 */
export function occurredAt(at: string | undefined, now: Date, batch?: Batch, timeZone = 'UTC'): Date {
  if (!at) return now;
  const moment = new Date(at);
  if (moment.getTime() > now.getTime() + CLOCK_SLACK_MS) throw new BadRequestError('body.at: that moment is in the future.');
  if (batch && localDate(moment, timeZone) < batch.startedOn) {
    throw new BadRequestError(`body.at: that is before ${batch.name} was started (${batch.startedOn}).`);
  }
  return moment;
}
