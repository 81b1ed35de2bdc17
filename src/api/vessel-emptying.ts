import { operationResultSchema, type OperationResult } from '@shared/schemas/batch-detail';
import type { EmptyVesselRequest } from '@shared/schemas/vessel-emptying';
import { request, cellarPath } from './http';

/** Pours a vessel out (journalled on its batch, the vessel left dirty); answers the batch as it is now. */
export const emptyVessel = (cellarId: string, vesselId: string, body: EmptyVesselRequest): Promise<OperationResult> =>
  request('POST', cellarPath(cellarId, 'vessels', vesselId, 'emptying'), operationResultSchema, body);
