import sharp from 'sharp';
import zlib from 'node:zlib';
import { beforeAll, describe, expect, it } from 'vitest';
import { makeBatchInVessels } from '../helpers/batches';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { signedInAgent, testApp } from '../helpers/test-app';

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: CellarCrew;
let hand: Agent;

beforeAll(async () => {
  const made = await testApp();
  ds = made.ds;
  crew = await makeCellarWithCrew(ds);
  hand = await signedInAgent(made.app, crew.hand.email, TEST_PASSWORD);
});

/**
 * A real PNG whose header claims other dimensions: the image data stays tiny, as in the
 * 190 kB, 14000 × 14000 file that was once accepted. The header's CRC is recomputed (PNG
 * specification, ISO/IEC 15948 §5.3: CRC-32 over chunk type and data).
 */
async function pngClaiming(width: number, height: number): Promise<Buffer> {
  const png = Buffer.from(
    await sharp({ create: { width: 8, height: 8, channels: 3, background: '#335533' } })
      .png()
      .toBuffer(),
  );
  // Signature (8 bytes), then IHDR: length (4), type (4), width (4), height (4) …, CRC after 13 data bytes.
  png.writeUInt32BE(width, 16);
  png.writeUInt32BE(height, 20);
  png.writeUInt32BE(zlib.crc32(png.subarray(12, 29)), 29);
  return png;
}

function getBytes(url: string) {
  return hand
    .get(url)
    .buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
}

describe('photo size limits', () => {
  it('refuses a picture of more than 40 megapixels with 413 and stores nothing', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [4] });
    const bomb = await pngClaiming(14_000, 14_000);
    expect(bomb.length).toBeLessThan(1000);
    const res = await hand.post(`/api/cellars/${crew.cellar.id}/batches/${batch.id}/photos`).attach('photo', bomb, 'bomb.png');
    expect(res.status).toBe(413);
    expect(res.body.message).toMatch(/196 megapixels/);
    const [{ n }] = await ds.query(`SELECT COUNT(*)::int AS n FROM photos WHERE batch_id = $1`, [batch.id]);
    expect(n).toBe(0);
  });

  it('keeps a display copy at most 2,560 px on its long side beside the original and the thumbnail', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [4] });
    const wide = await sharp({ create: { width: 3200, height: 1800, channels: 3, background: '#884422' } })
      .jpeg()
      .toBuffer();
    const res = await hand.post(`/api/cellars/${crew.cellar.id}/batches/${batch.id}/photos`).attach('photo', wide, 'wide.jpg');
    expect(res.status).toBe(201);
    const url = `/api/cellars/${crew.cellar.id}/photos/${res.body.photoId}`;
    const display = await sharp((await getBytes(`${url}/display`)).body as Buffer).metadata();
    // 3200 × 1800 scaled to 2560 on the long side: 1800 × 2560 / 3200 = 1440.
    expect([display.width, display.height, display.format]).toEqual([2560, 1440, 'jpeg']);
    const full = await sharp((await getBytes(url)).body as Buffer).metadata();
    expect([full.width, full.height]).toEqual([3200, 1800]);
  });

  it('serves an older photo without a display copy from its original', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [4] });
    const small = await sharp({ create: { width: 400, height: 300, channels: 3, background: '#224488' } })
      .png()
      .toBuffer();
    const res = await hand.post(`/api/cellars/${crew.cellar.id}/batches/${batch.id}/photos`).attach('photo', small, 'small.png');
    await ds.query(`UPDATE photos SET display = NULL WHERE id = $1`, [res.body.photoId]);
    const shown = await getBytes(`/api/cellars/${crew.cellar.id}/photos/${res.body.photoId}/display`);
    expect(shown.status).toBe(200);
    expect(shown.headers['content-type']).toBe('image/png');
    const meta = await sharp(shown.body as Buffer).metadata();
    expect([meta.width, meta.height]).toEqual([400, 300]);
  });
});
