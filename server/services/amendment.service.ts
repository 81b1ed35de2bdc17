import type { DataSource, EntityManager } from 'typeorm';
import { z, ZodError } from 'zod';
import { gravitySchema } from '../../shared/schemas/batches';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import {
  additionRequestSchema,
  noteRequestSchema,
  readingRequestSchema,
  tasteRequestSchema,
  type amendRequestSchema,
  type JournalKind,
  type JournalPayload,
} from '../../shared/schemas/journal';
import { ConflictError, NotFoundError } from '../errors';
import { onBatch } from './batch-operation';
import { correctedGravity } from './batch-readings.service';
import type { CellarContext } from './cellar.service';
import { appendEntry } from './journal-writer';

type AmendRequest = z.output<typeof amendRequestSchema>;

/** A strict, all-optional schema of the fields of one entry kind that may be corrected. */
function correctable(kind: string, shape: z.ZodRawShape) {
  const fields = Object.keys(shape).join(', ');
  return z
    .strictObject(shape, {
      error: (issue) => (issue.code === 'unrecognized_keys' ? `a ${kind} has no field ${issue.keys.join(', ')} that can be corrected (only ${fields})` : undefined),
    })
    .partial()
    .refine((changes) => Object.keys(changes).length > 0, `say which of ${fields} to correct`);
}

const reading = readingRequestSchema.shape;
const tasting = tasteRequestSchema.shape;
const addition = additionRequestSchema.shape;

/** Which entries can be corrected, and which of their fields. Volumes and moves cannot. */
const CORRECTABLE: Partial<Record<JournalKind, ReturnType<typeof correctable>>> = {
  reading: correctable('reading', { sg: gravitySchema, temperatureC: reading.temperatureC.unwrap(), ph: reading.ph.unwrap() }),
  tasted: correctable('tasting', {
    appearance: tasting.appearance.unwrap(),
    aroma: tasting.aroma.unwrap(),
    flavour: tasting.flavour.unwrap(),
    score: tasting.score.unwrap(),
  }),
  note: correctable('note', { text: noteRequestSchema.shape.text }),
  addition: correctable('addition', { name: addition.name, amount: addition.amount, unit: addition.unit, removeOn: addition.removeOn.unwrap() }),
};

const NOT_AMENDABLE = 'Volumes and vessel moves cannot be amended; record a new operation instead.';
const ONLY_SOME = 'Only readings, tastings, notes and additions can be amended; record a new entry instead.';
const VOLUME_KINDS: JournalKind[] = ['started', 'racked', 'topped-up', 'bottled', 'split', 'blended'];

/** The entry's payload with every earlier amendment applied. */
async function currentPayload(tx: EntityManager, entryId: string, original: JournalPayload): Promise<Record<string, unknown>> {
  const earlier: { payload: Extract<JournalPayload, { kind: 'amendment' }> }[] = await tx.query(
    `SELECT payload FROM journal_entries WHERE amends_entry_id = $1 ORDER BY recorded_at`,
    [entryId],
  );
  return earlier.reduce<Record<string, unknown>>((merged, { payload }) => ({ ...merged, ...payload.changes }), { ...original });
}

/** Validates `changes` against the entry's kind (400 naming the field, like any bad input). */
function parseChanges(kind: JournalKind, changes: Record<string, unknown>): Record<string, unknown> {
  const schema = CORRECTABLE[kind];
  if (!schema) throw new ConflictError(kind === 'amendment' ? 'Amend the original entry, not an amendment of it.' : VOLUME_KINDS.includes(kind) ? NOT_AMENDABLE : ONLY_SOME);
  const parsed = schema.safeParse(changes);
  if (!parsed.success) {
    const issues = parsed.error.issues.map((issue) => ({ ...issue, path: ['changes', ...issue.path] }));
    throw Object.assign(new ZodError(issues), { source: 'body' });
  }
  return parsed.data;
}

/**
 * Corrects a reading, tasting, note or addition by appending an 'amendment' entry (the
 * original stays in the journal). A corrected reading gets its temperature-corrected gravity
 * recomputed and recorded with the changes.
 */
export function amendEntry(ds: DataSource, ctx: CellarContext, batchId: string, entryId: string, request: AmendRequest): Promise<OperationResult> {
  return onBatch(ds, ctx, batchId, { needsVessels: false }, async ({ tx, batch }) => {
    const [original]: { id: string; kind: JournalKind; payload: JournalPayload }[] = await tx.query(
      `SELECT id, kind, payload FROM journal_entries WHERE id = $1 AND batch_id = $2`,
      [entryId, batch.id],
    );
    if (!original) throw new NotFoundError(`No such entry in the journal of ${batch.name}.`);
    const changes = parseChanges(original.kind, request.changes);
    if (original.kind === 'reading') {
      const merged = { ...(await currentPayload(tx, original.id, original.payload)), ...changes } as Extract<JournalPayload, { kind: 'reading' }>;
      changes.correctedSg = correctedGravity(merged.sg, merged.temperatureC, merged.calibrationC);
    }
    const entry = await appendEntry(tx, ctx, batch.id, { kind: 'amendment', reason: request.reason, changes }, { amendsEntryId: original.id });
    return { entryId: entry.id };
  });
}
