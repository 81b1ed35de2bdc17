import {
  bottleCaseSchema,
  caseDetailSchema,
  DEPARTURE_LABELS,
  type BottleCase,
  type CaseDetail,
  type DrawDownRequest,
} from '@shared/schemas/bottles';
import type { MoveRequest } from '@shared/schemas/places';
import { request, requestOrQueue, cellarPath } from './http';

export { caseDetailSchema, type CaseDetail };

export const fetchCase = (cellarId: string, caseId: string): Promise<CaseDetail> =>
  request('GET', cellarPath(cellarId, 'cases', caseId), caseDetailSchema);

/**
 * Logs bottles leaving a case (drunk, given, sold…). The server never lets a case go below zero.
 * @param expectedVersion - the case version shown; a different one answers 409
 */
export const drawDown = (cellarId: string, caseId: string, departure: DrawDownRequest): Promise<BottleCase> =>
  requestOrQueue('POST', cellarPath(cellarId, 'cases', caseId, 'departures'), bottleCaseSchema, departure, {
    kind: 'departure',
    label: `Bottles out: ${departure.count} (${DEPARTURE_LABELS[departure.reason].toLowerCase()})`,
    cellarId,
    stampField: 'at',
  });

/** Puts the case into a free slot, or takes it off its shelf with `to: null`. */
export const moveCase = (cellarId: string, caseId: string, move: MoveRequest): Promise<BottleCase> =>
  requestOrQueue('PUT', cellarPath(cellarId, 'cases', caseId, 'place'), bottleCaseSchema, move, {
    kind: 'move',
    label: move.to ? 'Case moved to a slot' : 'Case taken off its shelf',
    cellarId,
  });
