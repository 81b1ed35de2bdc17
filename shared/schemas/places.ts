import { z } from 'zod';

export const shelfSchema = z.object({
  id: z.uuid(),
  number: z.number().int(),
  slotCount: z.number().int(),
  /** What sits in each occupied slot. */
  occupants: z.array(
    z.object({
      slot: z.number().int(),
      vesselId: z.uuid().nullable(),
      caseId: z.uuid().nullable(),
      /** "Jug B", "Case 2 of Elderflower mead": what the thing is called in a sentence or a list. */
      label: z.string(),
      /** A vessel's state ("sanitised", "holding", …) or a case's bottles ("11 bottles"). */
      state: z.string(),
      /** For a case, its number and the batch its bottles hold: a small tile shows the batch first. */
      caseNumber: z.number().int().nullable(),
      batchName: z.string().nullable(),
    }),
  ),
});

export const rackSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  description: z.string(),
  shelves: z.array(shelfSchema),
});
export type Rack = z.infer<typeof rackSchema>;
export type Shelf = z.infer<typeof shelfSchema>;

export const rackCreateSchema = z.object({
  name: z.string().trim().min(1, 'give the rack a name').max(60, 'at most 60 characters'),
  description: z.string().trim().max(200).default(''),
  /** Slots on each shelf, top shelf first. */
  shelves: z
    .array(z.number().int('whole slots').min(1, 'a shelf needs at least 1 slot').max(60, 'at most 60 slots'))
    .min(1, 'a rack needs at least one shelf')
    .max(20, 'at most 20 shelves'),
});
export type RackCreate = z.input<typeof rackCreateSchema>;

/** Renaming and re-describing; shelves are set when the rack is made. */
export const rackUpdateSchema = z.object({
  name: rackCreateSchema.shape.name.optional(),
  description: z.string().trim().max(200).optional(),
});

/** Where to put a thing; `null` takes it off its shelf. */
export const moveSchema = z.object({
  to: z.object({ shelfId: z.uuid(), slot: z.number().int().min(1, 'slots start at 1') }).nullable(),
  expectedVersion: z.number().int().optional(),
});
export type MoveRequest = z.infer<typeof moveSchema>;
