import { batchFamilySchema, type BatchFamily } from '@shared/schemas/family';
import { request, cellarPath } from './http';

/** A batch's family (parent, splits, blends) for the Compare view. */
export const fetchBatchFamily = (cellarId: string, batchId: string): Promise<BatchFamily> =>
  request('GET', cellarPath(cellarId, 'batches', batchId, 'family'), batchFamilySchema);
