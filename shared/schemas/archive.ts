import { z } from 'zod';

/** POST /api/cellars/:cellarId/archive/restorations: the new cellar's name (default: the archived one's, "(restored)"). */
export const restoreQuerySchema = z.object({ name: z.string().trim().max(80).optional() });

/** The answer to a restore: the new cellar, and the label codes that were taken here and got new ones. */
export const restoredCellarSchema = z.object({
  cellarId: z.uuid(),
  name: z.string(),
  remappedCodes: z.array(z.object({ table: z.string(), name: z.string(), from: z.string(), to: z.string() })),
});
export type RestoredCellar = z.infer<typeof restoredCellarSchema>;
