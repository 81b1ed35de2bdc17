import { Router, type ErrorRequestHandler, type RequestHandler } from 'express';
import multer, { MulterError } from 'multer';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { uuidSchema } from '../../shared/schemas/common';
import { requireRole } from '../core/actor';
import { inTransaction } from '../core/unit-of-work';
import { AppError, BadRequestError, UnsupportedMediaError } from '../http/errors';
import { actorFrom, cellarHandler, handle } from '../http/handle';
import { checkPhoto, PHOTO_MAX_BYTES } from './photo-check';
import { addPhoto, readPhoto, type PhotoSize } from './photo.service';

const batchParams = z.object({ batchId: uuidSchema });
const photoParams = z.object({ photoId: uuidSchema });
const captionBody = z.object({
  caption: z.string().trim().max(200, 'a caption is at most 200 characters').default(''),
});

const receiveOnePhoto = multer({
  storage: multer.memoryStorage(),
  // Only `photo` and `caption` are expected; tight limits keep a bad client from filling memory.
  limits: { fileSize: PHOTO_MAX_BYTES, files: 1, fields: 4, fieldSize: 4096, parts: 6 },
}).single('photo');

/** Multer's and the form parser's errors as answers a cellar hand understands. */
function uploadError(error: unknown): AppError {
  if (error instanceof MulterError) {
    if (error.code === 'LIMIT_FILE_SIZE') return new AppError(413, 'too_large', 'A photo may be at most 10 MB.');
    if (error.code === 'LIMIT_UNEXPECTED_FILE' || error.code === 'LIMIT_FILE_COUNT') {
      return new BadRequestError('Send one picture, in the form field "photo".');
    }
    return new BadRequestError(`The upload form is not as expected (${error.message.toLowerCase()}).`);
  }
  return new BadRequestError('The upload was cut off or is not a proper form. Try again.');
}

/** Parses the multipart form into req.file and req.body; errors go on to the error handler as JSON. */
const receivePhoto: RequestHandler = (req, res, next) => {
  if (!req.is('multipart/form-data')) {
    next(new UnsupportedMediaError('Send the photo as a file upload (multipart/form-data) in the form field "photo".'));
    return;
  }
  receiveOnePhoto(req, res, (error?: unknown) => next(error ? uploadError(error) : undefined));
};

/** Anything the form parser throws on its own (outside the callback) is still a bad upload. */
const uploadErrors: ErrorRequestHandler = (error, _req, _res, next) => {
  next(error instanceof AppError ? error : uploadError(error));
};

/**
 * Photos: `upload` is mounted at /api/cellars/:cellarId/batches/:batchId/photos,
 * `serve` at /api/cellars/:cellarId/photos. The access gate runs before either.
 */
export function photoRoutes(ds: DataSource): { upload: Router; serve: Router } {
  const cellar = cellarHandler(ds);
  const upload = Router({ mergeParams: true });
  upload.post(
    '/',
    receivePhoto,
    uploadErrors,
    handle({ params: batchParams, body: captionBody }, async ({ params, body }, req, res) => {
      if (!req.file) throw new BadRequestError('Attach a picture in the form field "photo".');
      const actor = actorFrom(req);
      requireRole(actor, 'hand');
      // Decoding is slow: read the picture before a transaction holds a connection.
      const checked = await checkPhoto(req.file.buffer);
      const saved = await inTransaction(ds, 'write', (tx) => addPhoto(actor, tx, params.batchId, checked, body.caption));
      res.status(201);
      return saved;
    }),
  );

  const serve = Router({ mergeParams: true });
  const sendImage = (size: PhotoSize) =>
    cellar({ params: photoParams }, async ({ params }, actor, tx, req, res) => {
      const image = await readPhoto(actor, tx, params.photoId, size);
      res.set({
        'Content-Type': image.mimeType,
        'Cache-Control': 'private, max-age=86400',
        'X-Content-Type-Options': 'nosniff',
      });
      res.end(image.bytes);
    });
  serve.get('/:photoId', sendImage('full'));
  serve.get('/:photoId/display', sendImage('display'));
  serve.get('/:photoId/thumbnail', sendImage('thumbnail'));
  return { upload, serve };
}
