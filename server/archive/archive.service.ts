import type { Writable } from 'node:stream';
import type { EntityManager } from 'typeorm';
import type { RestoredCellar } from '../../shared/schemas/archive';
import { requireRole, type Actor } from '../core/actor';
import type { UploadChunks } from '../exchange/csv-upload';
import { ForbiddenError } from '../http/errors';
import { openArchive } from './archive-reader';
import { restoreArchive } from './archive-restore';
import { writeArchive } from './archive-writer';

/**
 * The whole-cellar archive: Keeper work both ways (it holds every member's record, and a
 * restore creates a cellar).
 */

/** Writes this cellar's whole record (journal, photos, plans, tasks…) as a tar.gz to `out`. */
export async function exportArchive(actor: Actor, tx: EntityManager, out: Writable): Promise<void> {
  requireRole(actor, 'keeper');
  await writeArchive(tx, actor.cellarId, out);
}

/**
 * Restores an archive as a new cellar kept by the acting Keeper (of this cellar, on this
 * installation); the archive is checked whole before anything is written.
 */
export async function restoreCellar(actor: Actor, tx: EntityManager, upload: UploadChunks, options: { name?: string } = {}): Promise<RestoredCellar> {
  requireRole(actor, 'keeper');
  if (!actor.userId) throw new ForbiddenError('A restore makes a new cellar for a person; the cellar itself cannot do it.');
  const archive = await openArchive(upload);
  const name = (options.name?.trim() || `${archive.manifest.cellarName} (restored)`).slice(0, 80);
  const restored = await restoreArchive(tx, archive, actor.userId, name);
  return { ...restored, name };
}
