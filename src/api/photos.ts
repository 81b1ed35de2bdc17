import { z } from 'zod';
import { apiErrorSchema } from '@shared/schemas/common';
import { ApiError } from './http';

const uploadResultSchema = z.object({ entryId: z.uuid(), photoId: z.uuid() });
export type PhotoUploadResult = z.infer<typeof uploadResultSchema>;

const cellarBase = (cellarId: string) => `/api/cellars/${encodeURIComponent(cellarId)}`;

/** Where the browser loads a photo's small version. */
export const photoThumbnailUrl = (cellarId: string, photoId: string) => `${cellarBase(cellarId)}/photos/${encodeURIComponent(photoId)}/thumbnail`;

/** Where the browser loads a photo at full size. */
export const photoUrl = (cellarId: string, photoId: string) => `${cellarBase(cellarId)}/photos/${encodeURIComponent(photoId)}`;

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
    res = await fetch(`${cellarBase(cellarId)}/batches/${encodeURIComponent(batchId)}/photos`, {
      method: 'POST',
      credentials: 'same-origin',
      headers: { accept: 'application/json' },
      body: form,
    });
  } catch {
    throw new ApiError(0, 'offline', 'Cannot reach Cellarwright. Check the connection and try again.');
  }
  const raw = await res.json().catch(() => ({}));
  if (!res.ok) {
    const parsed = apiErrorSchema.safeParse(raw);
    const message = parsed.success ? parsed.data.message : `The server answered ${res.status}.`;
    throw new ApiError(res.status, parsed.success ? parsed.data.error : 'http_error', message, parsed.success ? parsed.data.issues : [], raw);
  }
  return uploadResultSchema.parse(raw);
}
