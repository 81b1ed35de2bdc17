import { Readable } from 'node:stream';
import zlib from 'node:zlib';
import tar from 'tar-stream';
import { migrations } from '../db/schema';
import { UploadTooLargeError, type UploadChunks } from '../exchange/csv-upload';
import { BadRequestError } from '../http/errors';
import { ARCHIVE_FORMAT, ARCHIVE_VERSION, manifestSchema, sha256, type Manifest } from './archive-format';

/** The largest archive a restore reads (photos are up to 10 MB each). */
export const MAX_ARCHIVE_BYTES = 1024 * 1024 * 1024;

export interface OpenedArchive {
  manifest: Manifest;
  entries: Map<string, Buffer>;
}

const refuse = (why: string) => new BadRequestError(`This archive cannot be restored: ${why}`);

/**
 * Unpacks an uploaded archive and checks it before anything is written: the format and its
 * version, the schema it was written from (a newer installation's archive is refused), and
 * every entry against the manifest's checksum (an archive altered after export is refused).
 */
export async function openArchive(upload: UploadChunks, maxBytes = MAX_ARCHIVE_BYTES): Promise<OpenedArchive> {
  const entries = new Map<string, Buffer>();
  const extract = tar.extract();
  let bytes = 0;
  const source = Readable.from(upload).on('data', (chunk: Buffer) => {
    bytes += chunk.length;
    if (bytes > maxBytes) source.destroy(new UploadTooLargeError(maxBytes));
  });
  const gunzip = zlib.createGunzip();
  source.on('error', (e) => gunzip.destroy(e));
  gunzip.on('error', (e) => extract.destroy(e));
  source.pipe(gunzip).pipe(extract);
  try {
    for await (const entry of extract) {
      const parts: Buffer[] = [];
      for await (const part of entry) parts.push(part as Buffer);
      entries.set(entry.header.name, Buffer.concat(parts));
    }
  } catch (error) {
    if (error instanceof UploadTooLargeError) throw error;
    throw refuse('it is not a Cellarwright archive (a .tar.gz file written by "Download the whole cellar").');
  }

  const raw = entries.get('manifest.json');
  if (!raw) throw refuse('it has no manifest.');
  let manifest: Manifest;
  try {
    const parsed = JSON.parse(raw.toString('utf8')) as { format?: unknown; version?: unknown };
    if (parsed.format !== ARCHIVE_FORMAT) throw refuse('it is not a Cellarwright cellar archive.');
    if (typeof parsed.version === 'number' && parsed.version > ARCHIVE_VERSION) {
      throw refuse(
        `it was written by a newer version of Cellarwright (archive format ${parsed.version}; this installation reads up to ${ARCHIVE_VERSION}). Update this installation first.`,
      );
    }
    manifest = manifestSchema.parse(parsed);
  } catch (error) {
    if (error instanceof BadRequestError) throw error;
    throw refuse('its manifest cannot be read.');
  }
  if (!migrations.some((m) => m.name === manifest.schema)) {
    throw refuse(
      `it was written by a newer version of Cellarwright (database schema ${manifest.schema} is not known here). Update this installation first.`,
    );
  }
  for (const [name, bytes] of entries) {
    if (name === 'manifest.json') continue;
    if (manifest.checksums[name] !== sha256(bytes)) throw refuse(`${name} was changed after the archive was made (its checksum does not match).`);
  }
  for (const name of Object.keys(manifest.checksums)) {
    if (!entries.has(name)) throw refuse(`${name} is missing.`);
  }
  return { manifest, entries };
}
