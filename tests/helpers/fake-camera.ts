import fs from 'node:fs';
import { PNG } from 'pngjs';
import QRCode from 'qrcode';

const WIDTH = 640;
const HEIGHT = 480;

/**
 * Writes a short Y4M video (YUV 4:2:0, the format Chromium's fake camera plays) of a QR code
 * holding `text`, black on white in the middle of a 640×480 frame, as a label held up to the
 * camera. Luma uses the video range, 16 (black) to 235 (white); chroma is neutral (128).
 */
export async function writeQrVideo(text: string, file: string): Promise<void> {
  const qr = PNG.sync.read(await QRCode.toBuffer(text, { margin: 4, scale: 8 }));
  const luma = Buffer.alloc(WIDTH * HEIGHT, 235);
  const left = (WIDTH - qr.width) >> 1;
  const top = (HEIGHT - qr.height) >> 1;
  for (let y = 0; y < qr.height; y++) {
    for (let x = 0; x < qr.width; x++) luma[(top + y) * WIDTH + left + x] = qr.data[(y * qr.width + x) * 4]! < 128 ? 16 : 235;
  }
  const chroma = Buffer.alloc((WIDTH / 2) * (HEIGHT / 2), 128);
  const frame = Buffer.concat([Buffer.from('FRAME\n'), luma, chroma, chroma]);
  const header = Buffer.from(`YUV4MPEG2 W${WIDTH} H${HEIGHT} F10:1 Ip A1:1 C420jpeg\n`);
  fs.writeFileSync(file, Buffer.concat([header, ...Array<Buffer>(10).fill(frame)]));
}
