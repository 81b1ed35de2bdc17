import { z } from 'zod';
import { bottleCaseSchema, type BottleCase, type DrawDownRequest } from '@shared/schemas/bottles';
import type { MoveRequest } from '@shared/schemas/places';
import { request } from './http';

const one = (cellarId: string, caseId: string) => `/api/cellars/${encodeURIComponent(cellarId)}/cases/${encodeURIComponent(caseId)}`;

/** A case with a short summary of its lot (enough to find the lot again). */
export const caseDetailSchema = bottleCaseSchema.extend({
  lot: z.object({ id: z.uuid(), batchName: z.string() }).loose(),
});
export type CaseDetail = z.infer<typeof caseDetailSchema>;

export const fetchCase = (cellarId: string, caseId: string): Promise<CaseDetail> =>
  request('GET', one(cellarId, caseId), caseDetailSchema);

/**
 * Logs bottles leaving a case (drunk, given, sold…). The server never lets a case go below zero.
 * @param expectedVersion - the case version shown; a different one answers 409
 */
export const drawDown = (cellarId: string, caseId: string, departure: DrawDownRequest): Promise<BottleCase> =>
  request('POST', `${one(cellarId, caseId)}/departures`, bottleCaseSchema, departure);

/** Puts the case into a free slot, or takes it off its shelf with `to: null`. */
export const moveCase = (cellarId: string, caseId: string, move: MoveRequest): Promise<BottleCase> =>
  request('PUT', `${one(cellarId, caseId)}/place`, bottleCaseSchema, move);
