import { photoUploadResultSchema, type PhotoUploadResult } from '@shared/schemas/photos';
import { errorFromAnswer, offlineError, cellarPath } from './http';

export type { PhotoUploadResult };

/** Where the browser loads a photo's small version. */
export const photoThumbnailUrl = (cellarId: string, photoId: string) => cellarPath(cellarId, 'photos', photoId, 'thumbnail');

/** Where the browser opens a photo to look at it (at most 2,560 px on its long side). */
export const photoDisplayUrl = (cellarId: string, photoId: string) => cellarPath(cellarId, 'photos', photoId, 'display');

/** Where the browser loads a photo at full size. */
export const photoUrl = (cellarId: string, photoId: string) => cellarPath(cellarId, 'photos', photoId);

/**
 * Uploads a photo to a batch's journal (multipart, so not through `request`, which sends JSON).
 * @param caption - optional words shown under the photo
 */
export async function uploadPhoto(cellarId: string, batchId: string, photo: File, caption: string): Promise<PhotoUploadResult> {
  const form = new FormData();
  form.append('photo', photo);
  if (caption.trim()) form.append('caption', caption.trim());
  let res: Response;
  try {
    res = await fetch(cellarPath(cellarId, 'batches', batchId, 'photos'), {
      method: 'POST',
      credentials: 'same-origin',
      headers: { accept: 'application/json' },
      body: form,
    });
  } catch {
    throw offlineError();
  }
  const raw = await res.json().catch(() => ({}));
  if (!res.ok) throw errorFromAnswer(res.status, raw);
  return photoUploadResultSchema.parse(raw);
}
