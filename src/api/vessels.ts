import {
  vesselDetailSchema,
  vesselPageSchema,
  vesselSchema,
  type CleaningState,
  type Vessel,
  type VesselCreate,
  type VesselDetail,
  type VesselListQuery,
} from '@shared/schemas/vessels';
import type { MoveRequest } from '@shared/schemas/places';
import type { z } from 'zod';
import { request, requestOrQueue, cellarPath, withQuery } from './http';

const vesselPath = (cellarId: string, vesselId: string, ...rest: string[]) => cellarPath(cellarId, 'vessels', vesselId, ...rest);

export type VesselPage = z.infer<typeof vesselPageSchema>;
export interface VesselChanges {
  name?: string;
  kind?: Vessel['kind'];
  material?: Vessel['material'];
  capacityL?: number;
  notes?: string;
  expectedVersion?: number;
}

/** One page of the cellar's vessels, filtered on the server. */
export const listVessels = (cellarId: string, query: VesselListQuery = {}): Promise<VesselPage> =>
  request('GET', withQuery(cellarPath(cellarId, 'vessels'), query), vesselPageSchema);

export const createVessel = (cellarId: string, vessel: VesselCreate): Promise<Vessel> =>
  request('POST', cellarPath(cellarId, 'vessels'), vesselSchema, vessel);

/** The Vessel page's record: the vessel, headspace, last reading, sanitised-until. */
export const fetchVessel = (cellarId: string, vesselId: string): Promise<VesselDetail> =>
  request('GET', vesselPath(cellarId, vesselId), vesselDetailSchema);

export const updateVessel = (cellarId: string, vesselId: string, changes: VesselChanges): Promise<Vessel> =>
  request('PATCH', vesselPath(cellarId, vesselId), vesselSchema, changes);

/**
 * Marks an empty vessel dirty, clean or sanitised. The server refuses dirty → sanitised (409).
 * @param expectedVersion - the version shown; a different one answers 409 saying what changed
 */
export const setCleaning = (cellarId: string, vesselId: string, state: CleaningState, expectedVersion?: number): Promise<Vessel> =>
  requestOrQueue(
    'POST',
    vesselPath(cellarId, vesselId, 'cleaning'),
    vesselSchema,
    { state, expectedVersion },
    { kind: 'cleaning', label: `Marked ${state}`, cellarId },
  );

/** Retires a vessel (or brings it back into use with `retired: false`). */
export const setRetired = (cellarId: string, vesselId: string, retired: boolean, expectedVersion?: number): Promise<Vessel> =>
  request('POST', vesselPath(cellarId, vesselId, 'retirement'), vesselSchema, { retired, expectedVersion });

/** Puts the vessel into a free slot, or takes it off its shelf with `to: null`. */
export const moveVessel = (cellarId: string, vesselId: string, move: MoveRequest): Promise<Vessel> =>
  requestOrQueue('PUT', vesselPath(cellarId, vesselId, 'place'), vesselSchema, move, {
    kind: 'move',
    label: move.to ? 'Vessel moved to a slot' : 'Vessel taken off its shelf',
    cellarId,
  });

/** Deletes an empty vessel (Keeper only). */
export const deleteVessel = (cellarId: string, vesselId: string): Promise<void> => request('DELETE', vesselPath(cellarId, vesselId));
