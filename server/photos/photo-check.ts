import sharp, { type Sharp } from 'sharp';
import { AppError, UnsupportedMediaError } from '../http/errors';

/** Largest upload, in bytes (the photos table checks the same). */
export const PHOTO_MAX_BYTES = 10 * 1024 * 1024;
/** Longest side of a thumbnail, in pixels. */
export const THUMBNAIL_MAX_PX = 320;
/** Thumbnails are always WebP. */
export const THUMBNAIL_MIME = 'image/webp';
/** Longest side of the display copy, in pixels: sharp on any phone or desktop screen. */
export const DISPLAY_MAX_PX = 2560;
/**
 * Largest picture we decode, in pixels. Phone cameras give 12–50 megapixels and usually save
 * a 12 MP frame; a 14000 × 14000 PNG of 190 kB is a decompression bomb, not a photo.
 */
export const MAX_INPUT_PIXELS = 40_000_000;

const MIME_BY_FORMAT = { jpeg: 'image/jpeg', png: 'image/png', webp: 'image/webp' } as const;
export type PhotoMime = (typeof MIME_BY_FORMAT)[keyof typeof MIME_BY_FORMAT];

const NOT_A_PHOTO = 'That file is not a photo we can read. Send a JPEG, PNG or WebP picture.';

/** A checked photo: its real type (from its bytes), the copy we keep, and a thumbnail. */
export interface CheckedPhoto {
  mimeType: PhotoMime;
  /** Upright, re-encoded without EXIF: a phone photo's GPS position must not leave the cellar's members' hands. */
  stored: Buffer;
  /** Upright, at most DISPLAY_MAX_PX on the long side, in the original's format. */
  display: Buffer;
  thumbnail: Buffer;
}

/**
 * Reads the type from the file's own bytes (never from its name or the client's claim) and
 * makes a thumbnail turned upright by its EXIF orientation. Decoding the whole picture for
 * the thumbnail also proves the file is not truncated or corrupt.
 * @param bytes - the uploaded file
 * @throws UnsupportedMediaError (415) for anything but a readable JPEG, PNG or WebP
 */
export async function checkPhoto(bytes: Buffer): Promise<CheckedPhoto> {
  const options = { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' as const };
  let format: string | undefined;
  let pixels = 0;
  try {
    // Only the header is read here, so no pixel limit yet: the dimensions decide below.
    const meta = await sharp(bytes, { limitInputPixels: false }).metadata();
    format = meta.format;
    pixels = (meta.width ?? 0) * (meta.height ?? 0);
  } catch {
    throw new UnsupportedMediaError(NOT_A_PHOTO);
  }
  if (pixels > MAX_INPUT_PIXELS) {
    throw new AppError(
      413,
      'too_large',
      `That picture is ${Math.round(pixels / 1_000_000)} megapixels; send one of at most ${MAX_INPUT_PIXELS / 1_000_000} megapixels (a phone photo is smaller).`,
    );
  }
  if (format !== 'jpeg' && format !== 'png' && format !== 'webp') {
    throw new UnsupportedMediaError(`That file is a ${format ?? 'kind of'} image; send a JPEG, PNG or WebP picture.`);
  }
  try {
    const thumbnail = await sharp(bytes, options)
      .autoOrient()
      .resize({ width: THUMBNAIL_MAX_PX, height: THUMBNAIL_MAX_PX, fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 75 })
      .toBuffer();
    // sharp writes no metadata unless asked, so this drops EXIF (location, device) too.
    const upright = sharp(bytes, options).autoOrient();
    const encode = (image: Sharp) =>
      (format === 'jpeg' ? image.jpeg({ quality: 90 }) : format === 'png' ? image.png() : image.webp({ quality: 90 })).toBuffer();
    const stored = await encode(upright);
    const display = await encode(
      sharp(bytes, options).autoOrient().resize({ width: DISPLAY_MAX_PX, height: DISPLAY_MAX_PX, fit: 'inside', withoutEnlargement: true }),
    );
    return { mimeType: MIME_BY_FORMAT[format], stored, display, thumbnail };
  } catch {
    throw new UnsupportedMediaError('That picture is damaged or too large to read. Try another copy of it.');
  }
}
