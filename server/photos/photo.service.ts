import type { EntityManager } from 'typeorm';
import { requireRole, type Actor } from '../core/actor';
import { Batch } from '../entities/batch.entity';
import { Photo } from '../entities/photo.entity';
import { NotFoundError } from '../http/errors';
import { appendEntry } from '../journal/journal';
import { THUMBNAIL_MIME, type CheckedPhoto } from './photo-check';

/** The original as stored, the display copy (long side ≤ 2,560 px) or the thumbnail. */
export type PhotoSize = 'full' | 'display' | 'thumbnail';

/** Image bytes ready to send. */
export interface PhotoImage {
  mimeType: string;
  bytes: Buffer;
}

/**
 * Stores a photo of a batch (original and thumbnail, in PostgreSQL) and writes its 'photo'
 * journal entry in the same transaction.
 * @param checked - the upload as `checkPhoto` read it (decoding is slow: the caller does it
 *   before opening the transaction, so no connection waits on it)
 * @returns the new journal entry's id and the photo's id
 */
export async function addPhoto(
  actor: Actor,
  tx: EntityManager,
  batchId: string,
  checked: CheckedPhoto,
  caption: string,
): Promise<{ entryId: string; photoId: string }> {
  requireRole(actor, 'hand');
  const batch = await tx.getRepository(Batch).existsBy({ id: batchId, cellarId: actor.cellarId });
  if (!batch) throw new NotFoundError('No such batch in this cellar.');
  const repo = tx.getRepository(Photo);
  const photo = await repo.save(
    repo.create({
      cellarId: actor.cellarId,
      batchId,
      mimeType: checked.mimeType,
      byteSize: checked.stored.length,
      data: checked.stored,
      thumbnail: checked.thumbnail,
      display: checked.display,
      uploadedBy: actor.userId,
    }),
  );
  const entry = await appendEntry(tx, actor, batchId, { kind: 'photo', photoId: photo.id, caption });
  return { entryId: entry.id, photoId: photo.id };
}

/**
 * A photo of this cellar: full size, its display copy or its thumbnail.
 * @throws NotFoundError when the photo is not in this cellar
 */
export async function readPhoto(actor: Actor, tx: EntityManager, photoId: string, size: PhotoSize): Promise<PhotoImage> {
  requireRole(actor, 'guest');
  // Photos stored before display copies existed are shown from their original.
  const column = size === 'full' ? 'data' : size === 'display' ? 'COALESCE(display, data)' : 'thumbnail';
  const [row]: { mime_type: string; bytes: Buffer }[] = await tx.query(
    `SELECT mime_type, ${column} AS bytes FROM photos WHERE id = $1 AND cellar_id = $2`,
    [photoId, actor.cellarId],
  );
  if (!row) throw new NotFoundError('No such photo in this cellar.');
  return { mimeType: size === 'thumbnail' ? THUMBNAIL_MIME : row.mime_type, bytes: row.bytes };
}
