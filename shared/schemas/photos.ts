import { z } from 'zod';

/** What a photo upload answers: its journal entry and the stored photo. */
export const photoUploadResultSchema = z.object({ entryId: z.uuid(), photoId: z.uuid() });
export type PhotoUploadResult = z.infer<typeof photoUploadResultSchema>;
