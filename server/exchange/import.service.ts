import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { ImportPreview, ImportResult, ImportTarget, importOptionsSchema, readingImportQuerySchema } from '../../shared/schemas/exchange';
import { recordAudit } from '../audit/audit-log';
import { findBatch } from '../batches/batch-lookup';
import { loadCellar } from '../cellars/load-cellar';
import { requireRole, type Actor } from '../core/actor';
import { Vessel } from '../entities/vessel.entity';
import { appendEntries } from '../journal/journal';
import { newLabelCode } from '../labels/label-codes';
import { utf8Text, type UploadChunks } from './csv-upload';
import { previewOf } from './import-preview';
import { readingFromRow, vesselFromRow } from './import-rows';
import { runImport } from './import-run';

/**
 * CSV imports: Keeper work (an import writes many records at once, in others' names as the
 * cellar's). A Guest never imports; a Hand logs readings one by one.
 */

type ImportOptions = z.output<typeof importOptionsSchema>;
type ReadingImport = z.output<typeof readingImportQuerySchema>;

/** The most of a file a preview reads. */
const PREVIEW_BYTES = 64 * 1024;

/** The mapping screen's starting point, from the first 64 KB of the file. */
export async function previewImport(actor: Actor, _tx: EntityManager, target: ImportTarget, upload: UploadChunks): Promise<ImportPreview> {
  requireRole(actor, 'keeper');
  let sample = '';
  // Read to the end (breaking off would close the request under its own answer), keep the start.
  for await (const text of utf8Text(upload)) {
    if (sample.length < PREVIEW_BYTES) sample += text;
  }
  sample = sample.slice(0, PREVIEW_BYTES);
  return previewOf(target, sample);
}

/** Readings into one batch, each through the journal writer; a row already imported is skipped. */
export async function importReadings(actor: Actor, tx: EntityManager, query: ReadingImport, upload: UploadChunks): Promise<ImportResult> {
  requireRole(actor, 'keeper');
  const { batchId, ...options } = query;
  const batch = await findBatch(tx, actor.cellarId, batchId);
  const { timeZone } = await loadCellar(tx, actor.cellarId);
  const now = new Date();
  const result = await runImport(tx, actor.cellarId, upload, options, {
    target: 'readings',
    keyScope: `readings:${batch.id}`,
    read: (record, columns) => readingFromRow(record, columns, options, { timeZone, startedOn: batch.startedOn, now }),
    // A chunk at a time through the journal writer (one update of the batch's caches per chunk).
    write: async (rows) => {
      await appendEntries(
        tx,
        actor,
        batch.id,
        rows.map(({ occurredAt, ...reading }) => ({ occurredAt, payload: { kind: 'reading', ...reading, vesselId: null } })),
      );
    },
  });
  if (result.added) {
    await recordAudit(tx, actor, {
      kind: 'import',
      action: 'imported readings',
      batchId: batch.id,
      summary: `Imported ${result.added} readings into ${batch.name}`,
    });
  }
  return result;
}

/** Vessels for a new cellar's inventory, each with a fresh label code; a row already imported is skipped. */
export async function importVessels(actor: Actor, tx: EntityManager, options: ImportOptions, upload: UploadChunks): Promise<ImportResult> {
  requireRole(actor, 'keeper');
  const repo = tx.getRepository(Vessel);
  const result = await runImport(tx, actor.cellarId, upload, options, {
    target: 'vessels',
    keyScope: 'vessels',
    read: (record, columns) => vesselFromRow(record, columns, options),
    write: async (rows) => {
      for (const v of rows) {
        await repo.insert({
          cellarId: actor.cellarId,
          code: await newLabelCode(tx),
          name: v.name,
          kind: v.kind,
          material: v.material,
          capacityL: v.capacityL,
          cleaningState: v.state,
          sanitisedAt: v.state === 'sanitised' ? new Date() : null,
          notes: v.notes,
        });
      }
    },
  });
  if (result.added) await recordAudit(tx, actor, { kind: 'import', action: 'imported vessels', summary: `Imported ${result.added} vessels` });
  return result;
}
