import { z, type ZodType } from 'zod';
import { batchPageSchema, type BatchListQuery, type BatchStart, type batchUpdateSchema } from '@shared/schemas/batches';
import { batchDetailSchema, operationResultSchema, type BatchDetail, type OperationResult } from '@shared/schemas/batch-detail';
import type {
  AdditionRequest,
  amendRequestSchema,
  blendRequestSchema,
  degasRequestSchema,
  noteRequestSchema,
  RackRequest,
  ReadingRequest,
  removalRequestSchema,
  splitRequestSchema,
  tasteRequestSchema,
  topUpRequestSchema,
} from '@shared/schemas/journal';
import { readingResultSchema } from '@shared/schemas/journal';
import { rackTargetSuggestionSchema, type Vessel } from '@shared/schemas/vessels';
import type { RackingStage } from '@shared/calc';
import { request, requestOrQueue, cellarPath, withQuery } from './http';
import { listVessels } from './vessels';

export type BatchPage = z.infer<typeof batchPageSchema>;
export type RackTargetSuggestion = z.infer<typeof rackTargetSuggestionSchema>;

const batchPath = (cellarId: string, batchId: string, ...rest: string[]) => cellarPath(cellarId, 'batches', batchId, ...rest);

/** One page of batches, filtered and sorted on the server. */
export const fetchBatches = (cellarId: string, query: BatchListQuery): Promise<BatchPage> =>
  request('GET', withQuery(cellarPath(cellarId, 'batches'), query), batchPageSchema);

export const fetchBatch = (cellarId: string, batchId: string): Promise<BatchDetail> =>
  request('GET', batchPath(cellarId, batchId), batchDetailSchema);

export const startBatch = (cellarId: string, body: BatchStart): Promise<OperationResult> =>
  request('POST', cellarPath(cellarId, 'batches'), operationResultSchema, body);

export const updateBatch = (cellarId: string, batchId: string, changes: z.input<typeof batchUpdateSchema>): Promise<BatchDetail> =>
  request('PATCH', batchPath(cellarId, batchId), batchDetailSchema, changes);

/** Keeper only; the server refuses (409) while the batch is in vessels or bottled. */
export const deleteBatch = (cellarId: string, batchId: string): Promise<void> => request('DELETE', batchPath(cellarId, batchId));

/** Every journal-writing operation posts to its own path and answers an OperationResult. */
const operation =
  <Body>(path: string) =>
  (cellarId: string, batchId: string, body: Body): Promise<OperationResult> =>
    request('POST', batchPath(cellarId, batchId, path), operationResultSchema, body);

/**
 * Journal writes a phone may make without signal: kept on the phone and sent later with the
 * moment they were made (src/offline/), so a queued reading keeps its own time.
 */
const queueableOperation =
  <Body extends object, Result>(path: string, kind: 'reading' | 'note' | 'tasting', label: (body: Body) => string, answer: ZodType<Result>) =>
  (cellarId: string, batchId: string, body: Body): Promise<Result> =>
    requestOrQueue('POST', batchPath(cellarId, batchId, path), answer, body, { kind, label: label(body), cellarId, stampField: 'at' });

/** A reading answers the reading and the stage, not the whole batch (the most frequent write). */
export const logReading = queueableOperation('readings', 'reading', (r: ReadingRequest) => `Reading ${Number(r.sg).toFixed(3)}`, readingResultSchema);
export const rackBatch = operation<RackRequest>('rackings');
export const splitBatch = operation<z.input<typeof splitRequestSchema>>('splits');
export const addAddition = operation<AdditionRequest>('additions');
export const removeAddition = operation<z.input<typeof removalRequestSchema>>('removals');
export const topUpBatch = operation<z.input<typeof topUpRequestSchema>>('top-ups');
export const degasBatch = operation<z.input<typeof degasRequestSchema>>('degassings');
export const tasteBatch = queueableOperation(
  'tastings',
  'tasting',
  (_: z.input<typeof tasteRequestSchema>) => 'Tasting notes',
  operationResultSchema,
);
export const addNote = queueableOperation(
  'notes',
  'note',
  (n: z.input<typeof noteRequestSchema>) => `Note: ${n.text.slice(0, 40)}`,
  operationResultSchema,
);

/** Blends vessels of two or more batches into a new batch; answers with the new batch. */
export const blendBatches = (cellarId: string, body: z.input<typeof blendRequestSchema>): Promise<OperationResult> =>
  request('POST', cellarPath(cellarId, 'batches', 'blends'), operationResultSchema, body);

/** Records a correction of an earlier journal entry (the entry itself never changes). */
export const amendEntry = (cellarId: string, batchId: string, entryId: string, body: z.input<typeof amendRequestSchema>): Promise<OperationResult> =>
  request('POST', batchPath(cellarId, batchId, 'journal', entryId, 'amendments'), operationResultSchema, body);

// ---- Vessel look-ups the batch operations need (choosing where to fill or rack) -----------

/** Empty, sanitised (not lapsed), not retired vessels, smallest useful first. */
export async function fetchFillCandidates(cellarId: string): Promise<Vessel[]> {
  const page = await listVessels(cellarId, { freeAndSanitised: 'true', pageSize: 200 });
  return [...page.items].sort((a, b) => a.capacityL - b.capacityL || a.name.localeCompare(b.name));
}

/** The server's proposal for a racking: smallest free sanitised vessel that holds the volume after the expected loss. */
export const fetchRackTarget = (
  cellarId: string,
  volumeL: number,
  stage: RackingStage,
  excludeVesselIds: string[] = [],
): Promise<RackTargetSuggestion> =>
  request(
    'GET',
    withQuery(cellarPath(cellarId, 'vessels', 'rack-target'), { volumeL, stage, exclude: excludeVesselIds.join(',') || undefined }),
    rackTargetSuggestionSchema,
  );
