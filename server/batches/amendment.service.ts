import type { EntityManager } from 'typeorm';
import { type z, ZodError } from 'zod';
import { correctionSchema, isCorrectable, VOLUME_KINDS } from '../../shared/domain/journal';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { amendRequestSchema, JournalKind, JournalPayload } from '../../shared/schemas/journal';
import { recordedGravity } from '../../shared/calc';
import { requireRole, type Actor } from '../core/actor';
import { ConflictError, NotFoundError } from '../http/errors';
import { appendEntry } from '../journal/journal';
import { correctedEntry } from '../journal/journal-queries';
import { localDate } from '../core/local-date';
import { onBatch } from './on-batch';
import { applyStartCorrection } from './start-correction';

type AmendRequest = z.output<typeof amendRequestSchema>;

const NOT_AMENDABLE = 'Volumes and vessel moves cannot be amended; record a new operation instead.';
const ONLY_SOME = 'Only the start, readings, tastings, notes and additions can be amended; record a new entry instead.';

/** Validates `changes` against the entry's kind (400 naming the field, like any bad input). */
function parseChanges(kind: JournalKind, changes: Record<string, unknown>): Record<string, unknown> {
  if (!isCorrectable(kind)) {
    throw new ConflictError(
      kind === 'amendment' ? 'Amend the original entry, not an amendment of it.' : VOLUME_KINDS.includes(kind) ? NOT_AMENDABLE : ONLY_SOME,
    );
  }
  const parsed = correctionSchema(kind).safeParse(changes);
  if (!parsed.success) {
    const issues = parsed.error.issues.map((issue) => ({ ...issue, path: ['changes', ...issue.path] }));
    throw Object.assign(new ZodError(issues), { source: 'body' });
  }
  return parsed.data;
}

/**
 * Corrects the start (its figures: the batch's record follows), a reading, tasting, note or
 * addition by appending an 'amendment' entry (the
 * original stays in the journal). A corrected reading gets its temperature-corrected gravity
 * recomputed and recorded with the changes.
 */
export function amendEntry(actor: Actor, tx: EntityManager, batchId: string, entryId: string, request: AmendRequest): Promise<OperationResult> {
  requireRole(actor, 'hand');
  return onBatch(actor, tx, batchId, { needsVessels: false }, async ({ tx, batch, cellar, now }) => {
    const original = await correctedEntry(tx, batch.id, entryId);
    if (!original) throw new NotFoundError(`No such entry in the journal of ${batch.name}.`);
    const changes = parseChanges(original.kind, request.changes);
    if (original.kind === 'reading') {
      const merged = { ...original.payload, ...changes } as Extract<JournalPayload, { kind: 'reading' }>;
      changes.correctedSg = recordedGravity(merged.sg, merged.temperatureC, merged.calibrationC);
    }
    if (original.kind === 'started') await applyStartCorrection(tx, batch, changes, localDate(now, cellar.timeZone));
    const entry = await appendEntry(tx, actor, batch.id, { kind: 'amendment', reason: request.reason, changes }, { amendsEntryId: original.id });
    return { entryId: entry.id };
  });
}
