import { restoredCellarSchema, type RestoredCellar } from '@shared/schemas/archive';
import { errorFromAnswer, offlineError, cellarPath, withQuery } from './http';

/** Where the whole cellar downloads as one .tar.gz (a plain link: the browser saves it). */
export const archiveUrl = (cellarId: string): string => cellarPath(cellarId, 'archive');

/** Restores an archive file as a new cellar; label codes taken here come back remapped. */
export async function restoreArchive(cellarId: string, file: Blob, name?: string): Promise<RestoredCellar> {
  let res: Response;
  try {
    res = await fetch(withQuery(cellarPath(cellarId, 'archive', 'restorations'), { name }), {
      method: 'POST',
      credentials: 'same-origin',
      headers: { accept: 'application/json', 'content-type': 'application/gzip' },
      body: file,
    });
  } catch {
    throw offlineError();
  }
  const raw = await res.json().catch(() => ({}));
  if (!res.ok) throw errorFromAnswer(res.status, raw);
  return restoredCellarSchema.parse(raw);
}
