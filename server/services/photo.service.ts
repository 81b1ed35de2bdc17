import type { DataSource } from 'typeorm';
import { Batch } from '../entities/batch.entity';
import { Photo } from '../entities/photo.entity';
import { NotFoundError } from '../errors';
import type { CellarContext } from './cellar.service';
import { appendEntry } from './journal-writer';
import { checkPhoto, THUMBNAIL_MIME } from './photo-check';

/** Image bytes ready to send. */
export interface PhotoImage {
  mimeType: string;
  bytes: Buffer;
}

/**
 * Stores a photo of a batch (original and thumbnail, in PostgreSQL) and writes its 'photo'
 * journal entry in the same transaction.
 * @param bytes - the uploaded file; its type is read from these bytes
 * @returns the new journal entry's id and the photo's id
 */
export async function addPhoto(
  ds: DataSource,
  ctx: CellarContext,
  batchId: string,
  bytes: Buffer,
  caption: string,
): Promise<{ entryId: string; photoId: string }> {
  const batch = await ds.getRepository(Batch).findOneBy({ id: batchId, cellarId: ctx.cellarId });
  if (!batch) throw new NotFoundError('No such batch in this cellar.');
  // Decoding is slow; do it before the transaction holds a connection.
  const checked = await checkPhoto(bytes);
  return ds.transaction(async (tx) => {
    const stillThere = await tx.getRepository(Batch).existsBy({ id: batchId, cellarId: ctx.cellarId });
    if (!stillThere) throw new NotFoundError('No such batch in this cellar.');
    const repo = tx.getRepository(Photo);
    const photo = await repo.save(
      repo.create({
        cellarId: ctx.cellarId,
        batchId,
        mimeType: checked.mimeType,
        byteSize: checked.stored.length,
        data: checked.stored,
        thumbnail: checked.thumbnail,
        uploadedBy: ctx.userId,
      }),
    );
    const entry = await appendEntry(tx, ctx, batchId, { kind: 'photo', photoId: photo.id, caption });
    return { entryId: entry.id, photoId: photo.id };
  });
}

/**
 * A photo of this cellar, full size or as its thumbnail.
 * @throws NotFoundError when the photo is not in this cellar
 */
export async function readPhoto(ds: DataSource, ctx: CellarContext, photoId: string, size: 'full' | 'thumbnail'): Promise<PhotoImage> {
  const column = size === 'full' ? 'data' : 'thumbnail';
  const [row]: { mime_type: string; bytes: Buffer }[] = await ds.query(
    `SELECT mime_type, ${column} AS bytes FROM photos WHERE id = $1 AND cellar_id = $2`,
    [photoId, ctx.cellarId],
  );
  if (!row) throw new NotFoundError('No such photo in this cellar.');
  return { mimeType: size === 'full' ? row.mime_type : THUMBNAIL_MIME, bytes: row.bytes };
}
