import { pointsFromFormerScore } from '../../shared/domain/tasting-scale';

/** The migration that moved stored tasting scores onto Cellarwright's own scale. */
const OWN_SCALE_MIGRATION_AT = 1_796_171_100_000;

/** Whether an archive was written before tasting scores moved to our own scale (by the newest migration it names). */
export function scoresOutOfTwenty(schema: string): boolean {
  const at = Number(/(\d{13})$/.exec(schema)?.[1] ?? NaN);
  return Number.isFinite(at) && at < OWN_SCALE_MIGRATION_AT;
}

type Row = Record<string, unknown>;

/**
 * A journal row of an older archive with its tasting score (or a correction's score) moved onto
 * our scale, by the same mapping as the migration (shared/domain/tasting-scale.ts).
 */
export function rescoredJournalRow(row: Row): Row {
  const payload = typeof row.payload === 'string' ? (JSON.parse(row.payload) as Row) : (row.payload as Row | null);
  if (!payload) return row;
  if (row.kind === 'tasted' && typeof payload.score === 'number') {
    return { ...row, payload: { ...payload, score: pointsFromFormerScore(payload.score) } };
  }
  const changes = payload.changes as Row | undefined;
  if (row.kind === 'amendment' && changes && typeof changes.score === 'number') {
    return { ...row, payload: { ...payload, changes: { ...changes, score: pointsFromFormerScore(changes.score) } } };
  }
  return row;
}
