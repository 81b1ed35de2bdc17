import type { EntityManager } from 'typeorm';
import type { Batch } from '../entities/batch.entity';
import { BadRequestError } from '../http/errors';

/** The start's corrected figures, as CORRECTABLE_FIELDS.started lets them through. */
export interface StartCorrection {
  og?: number | null;
  startedOn?: string;
  volumeL?: number;
  yeastName?: string;
  yeastToleranceAbv?: number;
}

/**
 * Brings the batch's own record in line with a corrected start, in the amendment's
 * transaction: original gravity, start date, volume made, yeast and its tolerance. What is
 * derived from them (ABV, predicted finish, ages, fermentation state, dated tasks) is read
 * from these columns, so it follows. The vessels' contents are not touched: liquid that is
 * not where the record says is corrected by emptying or racking, which journal themselves.
 * @param today - the cellar's date today (YYYY-MM-DD); a start cannot move past it
 */
export async function applyStartCorrection(tx: EntityManager, batch: Batch, changes: StartCorrection, today: string): Promise<void> {
  if (changes.startedOn !== undefined && changes.startedOn > today) {
    throw new BadRequestError(`changes.startedOn: ${changes.startedOn} is after today; a batch cannot start in the future.`, {
      issues: [{ path: 'body.changes.startedOn', message: 'a batch cannot start after today' }],
    });
  }
  const columns: [string, unknown][] = [
    ['og', changes.og],
    ['started_on', changes.startedOn],
    ['planned_volume_l', changes.volumeL],
    ['yeast_name', changes.yeastName],
    ['yeast_tolerance_abv', changes.yeastToleranceAbv],
  ];
  const set = columns.filter(([, value]) => value !== undefined);
  if (set.length === 0) return;
  await tx.query(`UPDATE batches SET ${set.map(([column], i) => `${column} = $${i + 2}`).join(', ')}, updated_at = now() WHERE id = $1`, [
    batch.id,
    ...set.map(([, value]) => value),
  ]);
}
