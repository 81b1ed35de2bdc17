import crypto from 'node:crypto';
import { z } from 'zod';

/**
 * The archive file: a gzip'd tar holding `manifest.json` (format, version, the schema it was
 * written from, a SHA-256 of every other entry), `cellar.json`, `people.json`,
 * `tables/<table>.json` and `photos/<photo id>/{data,thumbnail}`. A reader refuses a newer
 * format, a schema this installation does not know, and any entry whose checksum differs.
 */

export const ARCHIVE_FORMAT = 'cellarwright-cellar-archive';
export const ARCHIVE_VERSION = 1;

export const manifestSchema = z.object({
  format: z.literal(ARCHIVE_FORMAT),
  version: z.number().int().min(1),
  /** The newest migration of the installation that wrote it. */
  schema: z.string(),
  exportedAt: z.string(),
  cellarName: z.string(),
  /** entry name → SHA-256 (hex) of its bytes */
  checksums: z.record(z.string(), z.string().regex(/^[0-9a-f]{64}$/)),
});
export type Manifest = z.infer<typeof manifestSchema>;

/** Someone whose id the record names (an author), matched by e-mail on restore. */
export const personSchema = z.object({ id: z.uuid(), email: z.string(), name: z.string() });
export type ArchivedPerson = z.infer<typeof personSchema>;

export const sha256 = (bytes: Buffer) => crypto.createHash('sha256').update(bytes).digest('hex');

export const tableEntry = (table: string) => `tables/${table}.json`;
export const photoEntry = (photoId: string, column: string) => `photos/${photoId}/${column}`;
