import sharp from 'sharp';
import { beforeAll, describe, expect, it } from 'vitest';
import { JournalEntryRow } from '../../server/journal/journal-entry.entity';
import { Photo } from '../../server/entities/photo.entity';
import { makeBatchInVessels } from '../helpers/batches';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { signedInAgent, testApp } from '../helpers/test-app';

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: CellarCrew;
let other: CellarCrew;
let as: { hand: Agent; guest: Agent; outsider: Agent };
let jpeg: Buffer;

const uploadUrl = (cellarId: string, batchId: string) => `/api/cellars/${cellarId}/batches/${batchId}/photos`;
const photoUrl = (cellarId: string, photoId: string) => `/api/cellars/${cellarId}/photos/${photoId}`;

/** A photo-like picture: noisy pixels, so it compresses like a real photo. */
function picture(width: number, height: number) {
  return sharp({ create: { width, height, channels: 3, background: '#7a3b2e', noise: { type: 'gaussian', mean: 120, sigma: 40 } } });
}

/** GET that keeps the body as raw bytes whatever its type. */
function getBytes(agent: Agent, url: string) {
  return agent
    .get(url)
    .buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
}

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await makeCellarWithCrew(ds);
  other = await makeCellarWithCrew(ds);
  as = {
    hand: await signedInAgent(app, crew.hand.email, TEST_PASSWORD),
    guest: await signedInAgent(app, crew.guest.email, TEST_PASSWORD),
    outsider: await signedInAgent(app, other.keeper.email, TEST_PASSWORD),
  };
  // Landscape pixels with EXIF orientation 6: a camera held upright, so it shows as portrait.
  jpeg = await picture(1200, 800).jpeg({ quality: 90 }).withMetadata({ orientation: 6 }).toBuffer();
});

describe('uploading a photo', () => {
  it('stores a JPEG with an upright thumbnail and a journal entry', async () => {
    const { batch } = await makeBatchInVessels(ds, crew);
    const res = await as.hand
      .post(uploadUrl(crew.cellar.id, batch.id))
      .field('caption', 'Test: colour after racking')
      .attach('photo', jpeg, { filename: 'IMG_0001.jpg', contentType: 'image/jpeg' });
    expect(res.status).toBe(201);
    expect(Object.keys(res.body).sort()).toEqual(['entryId', 'photoId']);

    const entry = await ds.getRepository(JournalEntryRow).findOneByOrFail({ id: res.body.entryId });
    expect(entry).toMatchObject({ batchId: batch.id, kind: 'photo', authorId: crew.hand.id });
    expect(entry.payload).toEqual({ kind: 'photo', photoId: res.body.photoId, caption: 'Test: colour after racking' });

    const full = await getBytes(as.guest, photoUrl(crew.cellar.id, res.body.photoId));
    expect(full.status).toBe(200);
    expect(full.headers['content-type']).toBe('image/jpeg');
    expect(full.headers['cache-control']).toBe('private, max-age=86400');
    expect(full.headers['x-content-type-options']).toBe('nosniff');
    // The kept copy is upright and carries no EXIF (a phone's GPS position stays private).
    const fullMeta = await sharp(full.body as Buffer).metadata();
    expect(fullMeta.format).toBe('jpeg');
    expect(fullMeta.exif).toBeUndefined();
    expect(fullMeta.orientation ?? 1).toBe(1);
    expect(fullMeta.height!).toBeGreaterThan(fullMeta.width!);

    const thumb = await getBytes(as.guest, `${photoUrl(crew.cellar.id, res.body.photoId)}/thumbnail`);
    expect(thumb.status).toBe(200);
    expect(thumb.headers['content-type']).toBe('image/webp');
    expect(thumb.headers['cache-control']).toBe('private, max-age=86400');
    const thumbBytes = thumb.body as Buffer;
    expect(thumbBytes.length).toBeLessThan(jpeg.length);
    const meta = await sharp(thumbBytes).metadata();
    expect(meta.format).toBe('webp');
    expect(Math.max(meta.width!, meta.height!)).toBe(320);
    // Turned by its EXIF orientation: the thumbnail stands upright.
    expect(meta.height!).toBeGreaterThan(meta.width!);
    const decoded = await sharp(thumbBytes).raw().toBuffer({ resolveWithObject: true });
    expect(decoded.info.width * decoded.info.height).toBeGreaterThan(0);
  });

  it('takes a PNG and keeps its type from its bytes, whatever the client claims', async () => {
    const { batch } = await makeBatchInVessels(ds, crew);
    const png = await picture(300, 200).png().toBuffer();
    const res = await as.hand.post(uploadUrl(crew.cellar.id, batch.id)).attach('photo', png, { filename: 'odd-name.jpg', contentType: 'image/jpeg' });
    expect(res.status).toBe(201);
    const photo = await ds.getRepository(Photo).findOneByOrFail({ id: res.body.photoId });
    expect(photo).toMatchObject({ mimeType: 'image/png', batchId: batch.id, cellarId: crew.cellar.id });
    expect(photo.byteSize).toBeGreaterThan(0);
    const full = await getBytes(as.hand, photoUrl(crew.cellar.id, res.body.photoId));
    expect(full.headers['content-type']).toBe('image/png');
  });
});

describe('uploads that are not photos', () => {
  it('refuses a text file named photo.jpg with 415', async () => {
    const { batch } = await makeBatchInVessels(ds, crew);
    const res = await as.hand
      .post(uploadUrl(crew.cellar.id, batch.id))
      .attach('photo', Buffer.from('These are my tasting notes, not a picture.\n'), { filename: 'photo.jpg', contentType: 'image/jpeg' });
    expect(res.status).toBe(415);
    expect(res.body.message).toMatch(/JPEG, PNG or WebP/);
    expect(await ds.getRepository(Photo).countBy({ batchId: batch.id })).toBe(0);
    expect(await ds.getRepository(JournalEntryRow).countBy({ batchId: batch.id, kind: 'photo' })).toBe(0);
  });

  it('refuses an image format we do not keep (SVG) with 415', async () => {
    const { batch } = await makeBatchInVessels(ds, crew);
    const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="40" height="40"><rect width="40" height="40"/></svg>');
    const res = await as.hand.post(uploadUrl(crew.cellar.id, batch.id)).attach('photo', svg, { filename: 'photo.png', contentType: 'image/png' });
    expect(res.status).toBe(415);
  });

  it('refuses a file over 10 MB with 413', async () => {
    const { batch } = await makeBatchInVessels(ds, crew);
    const big = Buffer.alloc(11 * 1024 * 1024, 0xff);
    const res = await as.hand.post(uploadUrl(crew.cellar.id, batch.id)).attach('photo', big, { filename: 'huge.jpg', contentType: 'image/jpeg' });
    expect(res.status).toBe(413);
    expect(res.body).toEqual({ error: 'too_large', message: 'A photo may be at most 10 MB.' });
    expect(await ds.getRepository(Photo).countBy({ batchId: batch.id })).toBe(0);
  });

  it('answers 400 for a missing file, a wrong field or a long caption, and 415 for a JSON body', async () => {
    const { batch } = await makeBatchInVessels(ds, crew);
    const url = uploadUrl(crew.cellar.id, batch.id);
    const noFile = await as.hand.post(url).field('caption', 'Test caption only');
    expect(noFile.status).toBe(400);
    expect(noFile.body.message).toMatch(/"photo"/);
    const wrongField = await as.hand.post(url).attach('picture', jpeg, 'photo.jpg');
    expect(wrongField.status).toBe(400);
    const longCaption = await as.hand.post(url).field('caption', 'x'.repeat(201)).attach('photo', jpeg, 'photo.jpg');
    expect(longCaption.status).toBe(400);
    expect(longCaption.body.issues.map((i: { path: string }) => i.path)).toContain('body.caption');
    const json = await as.hand.post(url).send({ photo: 'not a file' });
    expect(json.status).toBe(415);
    expect(await ds.getRepository(Photo).countBy({ batchId: batch.id })).toBe(0);
  });
});

describe('who may see and add photos', () => {
  it('lets a Guest see photos but not upload', async () => {
    const { batch } = await makeBatchInVessels(ds, crew);
    const res = await as.guest.post(uploadUrl(crew.cellar.id, batch.id)).attach('photo', jpeg, 'photo.jpg');
    expect(res.status).toBe(403);
    expect(await ds.getRepository(Photo).countBy({ batchId: batch.id })).toBe(0);
  });

  it('answers 404 to non-members and across cellars', async () => {
    const { batch } = await makeBatchInVessels(ds, crew);
    const upload = await as.hand.post(uploadUrl(crew.cellar.id, batch.id)).attach('photo', jpeg, 'photo.jpg');
    expect(upload.status).toBe(201);
    const { photoId } = upload.body;

    expect((await as.outsider.get(photoUrl(crew.cellar.id, photoId))).status).toBe(404);
    expect((await as.outsider.get(`${photoUrl(crew.cellar.id, photoId)}/thumbnail`)).status).toBe(404);
    // Asking through their own cellar does not reach another cellar's photo either.
    expect((await as.outsider.get(photoUrl(other.cellar.id, photoId))).status).toBe(404);
    expect((await as.outsider.get(`${photoUrl(other.cellar.id, photoId)}/thumbnail`)).status).toBe(404);

    const intoTheirs = await as.outsider.post(uploadUrl(crew.cellar.id, batch.id)).attach('photo', jpeg, 'photo.jpg');
    expect(intoTheirs.status).toBe(404);
    const viaOwnCellar = await as.outsider.post(uploadUrl(other.cellar.id, batch.id)).attach('photo', jpeg, 'photo.jpg');
    expect(viaOwnCellar.status).toBe(404);
    expect(await ds.getRepository(Photo).countBy({ batchId: batch.id })).toBe(1);
  });
});
