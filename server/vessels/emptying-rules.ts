import { occurredAt } from '../batches/batch-lookup';
import { localDate } from '../core/local-date';
import type { Batch } from '../entities/batch.entity';
import type { Vessel } from '../entities/vessel.entity';
import { BadRequestError } from '../http/errors';

/** A refusal of the emptying's date, named under the `at` field. */
function atRefusal(message: string): BadRequestError {
  const plain = message.replace(/^body\.at:\s*/, '');
  return new BadRequestError(`body.at: ${plain}`, { issues: [{ path: 'body.at', message: plain }] });
}

/**
 * When a vessel was poured out: the given moment or now, never in the future, never before
 * the batch began nor before the liquid went into this vessel (days in the cellar's zone).
 * @param at - ISO date-time from the request, if any
 */
export function emptiedAt(at: string | undefined, now: Date, batch: Batch, vessel: Vessel, timeZone: string): Date {
  let moment: Date;
  try {
    moment = occurredAt(at, now, batch, timeZone);
  } catch (err) {
    if (err instanceof BadRequestError) throw atRefusal(err.message);
    throw err;
  }
  if (at && vessel.filledAt && localDate(moment, timeZone) < localDate(vessel.filledAt, timeZone)) {
    throw atRefusal(`that is before ${batch.name} went into ${vessel.name} (${localDate(vessel.filledAt, timeZone)}).`);
  }
  return moment;
}
