import { z } from 'zod';
import { rackSchema, type Rack, type RackCreate } from '@shared/schemas/places';
import { request, cellarPath } from './http';

export interface RackChanges {
  name?: string;
  description?: string;
}

/** Every rack of the cellar with its shelves and what sits in each slot. */
export const fetchRacks = (cellarId: string): Promise<Rack[]> => request('GET', cellarPath(cellarId, 'racks'), z.array(rackSchema));

/** Creates a rack; `shelves` holds the slot count of each shelf, top shelf first. */
export const createRack = (cellarId: string, rack: RackCreate): Promise<Rack> => request('POST', cellarPath(cellarId, 'racks'), rackSchema, rack);

export const updateRack = (cellarId: string, rackId: string, changes: RackChanges): Promise<Rack> =>
  request('PATCH', cellarPath(cellarId, 'racks', rackId), rackSchema, changes);

/** Deletes an empty rack (Keeper only; 409 while anything sits on it). */
export const deleteRack = (cellarId: string, rackId: string): Promise<void> => request('DELETE', cellarPath(cellarId, 'racks', rackId));
