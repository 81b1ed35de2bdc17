import { z } from 'zod';
import { CODE_ALPHABET, CODE_LENGTH, labelCodeSchema } from './vessels';

export { labelCodeSchema };

/** What a label code opens: the thing, its cellar and the client route to go to. */
export const scanResultSchema = z.object({
  kind: z.enum(['vessel', 'case', 'lot']),
  id: z.uuid(),
  cellarId: z.uuid(),
  /** Client path, e.g. /c/<cellarId>/vessels/<id>. */
  url: z.string(),
});
export type ScanResult = z.infer<typeof scanResultSchema>;

/**
 * The public bottle card: only what a friend holding the bottle may see. Strict, so the
 * client notices if the server ever sends more.
 */
export const bottleCardSchema = z
  .object({
    batchName: z.string(),
    /** Batch kind key, e.g. "melomel" (see BATCH_KIND_LABELS). */
    kind: z.string(),
    bottledOn: z.string(),
    abvEstimate: z.number().nullable(),
    sulfiteAdded: z.boolean(),
    note: z.string(),
  })
  .strict();
export type BottleCard = z.infer<typeof bottleCardSchema>;

export const scanCodeParamsSchema = z.object({ code: labelCodeSchema });

const codePattern = new RegExp(`^[${CODE_ALPHABET}]{${CODE_LENGTH}}$`);

/**
 * The label code in what a scanner read or a person typed: a bare code ("7k3m 9qxa" works:
 * spaces and dashes are dropped, case ignored) or a label URL ending in /s/<code>, whatever
 * its host. Null when there is none.
 * @param text - decoded QR text or typed input
 */
export function codeFromScan(text: string): string | null {
  const trimmed = text.trim();
  const fromUrl = /\/s\/([a-z0-9]+)\/?(?:[?#].*)?$/i.exec(trimmed);
  const candidate = (fromUrl ? fromUrl[1]! : trimmed.replace(/[\s-]+/g, '')).toUpperCase();
  return codePattern.test(candidate) ? candidate : null;
}
