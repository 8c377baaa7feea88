/**
 * A PNG file written row by row after the PNG specification (W3C, Portable Network Graphics, 2nd
 * ed., 2003): 5.2 signature, 5.3 chunk layout with its CRC (Annex D, the sample CRC code), 11.2.2
 * IHDR, 9.2 the five filter types (the filter of row y is y mod 5, so that every one is used),
 * 10 the zlib stream (Node's zlib), split over several IDAT chunks. RGB, 8 bits, not interlaced.
 * For the desk's tests of large pictures, whose raw rows are never all held at once.
 */
import { createDeflate } from 'node:zlib';
import { writeFileSync } from 'node:fs';
import { paeth } from '../../src/desk/pngStrips.js';

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k += 1) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});

function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type: string, data: Uint8Array): Buffer {
  const out = Buffer.alloc(12 + data.length);
  out.writeUInt32BE(data.length, 0);
  out.write(type, 4, 'latin1');
  Buffer.from(data.buffer, data.byteOffset, data.length).copy(out, 8);
  out.writeUInt32BE(crc32(out.subarray(4, 8 + data.length)), 8 + data.length);
  return out;
}

/** Filter one RGB row (3 bytes a pixel) with filter `type` against the previous raw row into `out` (filter byte first). */
function filterRow(type: number, row: Uint8Array, prev: Uint8Array, out: Uint8Array): void {
  out[0] = type;
  for (let i = 0; i < row.length; i += 1) {
    const a = i >= 3 ? row[i - 3] : 0;
    const b = prev[i];
    const c = i >= 3 ? prev[i - 3] : 0;
    const predicted = type === 0 ? 0 : type === 1 ? a : type === 2 ? b : type === 3 ? (a + b) >> 1 : paeth(a, b, c);
    out[i + 1] = (row[i] - predicted) & 255;
  }
}

/**
 * Write an RGB PNG of `width` x `height` whose row y is filled by `rowOf(y, row)` (row: width * 3
 * bytes, R G B per pixel).
 * @returns the file's size in bytes
 */
export async function writeRgbPng(path: string, width: number, height: number, rowOf: (y: number, row: Uint8Array) => void): Promise<number> {
  const deflate = createDeflate({ level: 6 });
  const parts: Buffer[] = [];
  deflate.on('data', (d: Buffer) => parts.push(d));
  const ended = new Promise<void>((resolve, reject) => {
    deflate.on('end', resolve);
    deflate.on('error', reject);
  });
  let prev = new Uint8Array(width * 3);
  let row = new Uint8Array(width * 3);
  for (let y = 0; y < height; y += 1) {
    rowOf(y, row);
    const filtered = new Uint8Array(1 + width * 3);
    filterRow(y % 5, row, prev, filtered);
    if (!deflate.write(filtered)) await new Promise((resolve) => deflate.once('drain', resolve));
    [prev, row] = [row, prev];
  }
  deflate.end();
  await ended;
  const data = Buffer.concat(parts);
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // colour type RGB
  const idat: Buffer[] = [];
  for (let at = 0; at < data.length; at += 256 * 1024) idat.push(chunk('IDAT', data.subarray(at, at + 256 * 1024)));
  const file = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), ...idat, chunk('IEND', new Uint8Array(0))]);
  writeFileSync(path, file);
  return file.length;
}
