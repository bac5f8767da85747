/** Images for photo tests, made on the fly. */
import { once } from 'node:events';
import zlib from 'node:zlib';
import sharp from 'sharp';

function chunk(type: string, data: Buffer) {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(data.length, 0);
  head.write(type, 4, 'ascii');
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(zlib.crc32(Buffer.concat([head.subarray(4), data])), 0);
  return Buffer.concat([head, data, crc]);
}

/**
 * A valid, all-black RGB PNG of any size, written row by row: a 16,000 × 16,000 one (256
 * megapixels, 768 MB once decoded) is about 750 KB, under sharp's default 268-megapixel limit.
 */
export async function pixelBombPng(width = 16_000, height = 16_000) {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr.set([8, 2, 0, 0, 0], 8); // 8-bit, RGB, deflate, no filter set, not interlaced
  const deflate = zlib.createDeflate({ level: 9, memLevel: 9 });
  const parts: Buffer[] = [];
  deflate.on('data', (b: Buffer) => parts.push(b));
  const rows = 64;
  const block = Buffer.alloc((1 + width * 3) * rows); // filter byte 0 and black pixels
  for (let y = 0; y < height; y += rows) {
    if (!deflate.write(block.subarray(0, (1 + width * 3) * Math.min(rows, height - y)))) await once(deflate, 'drain');
  }
  deflate.end();
  await once(deflate, 'end');
  const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  return Buffer.concat([signature, chunk('IHDR', ihdr), chunk('IDAT', Buffer.concat(parts)), chunk('IEND', Buffer.alloc(0))]);
}

/** A small photo-like JPEG; `shade` makes each one different. */
export function smallJpeg(shade = 100, width = 600, height = 400) {
  return sharp({ create: { width, height, channels: 3, background: { r: shade % 256, g: (shade * 7) % 256, b: 60 } } })
    .jpeg()
    .toBuffer();
}
