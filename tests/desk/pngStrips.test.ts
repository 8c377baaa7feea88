/// <reference lib="dom" />
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync } from 'node:fs';
import { deflateSync } from 'node:zlib';
import type { Browser } from 'playwright-core';
import { CHROMIUM, launchChromium } from '../helpers/chromium.js';
import { pngStripLayout, pngStrips, type RgbaStrip } from '../../src/desk/pngStrips.js';
import { halveStrip, levelSizes, TiledPicture } from '../../src/desk/tiles.js';

// The desk's strip reader of large PNG files (src/desk/pngStrips.ts) checked on files it did not
// write: a picture encoded by Chromium's own PNG encoder (its choice of filters per row), and small
// files built byte by byte after the PNG specification (W3C, PNG 2nd ed., 2003, 7.2 packing of
// samples below 8 bits, most significant bit first; 11.2.2 IHDR; 11.2.3 PLTE; 11.3.2.1 tRNS).
// The chunks' CRC is not checked by the reader, so it is left zero in the hand-built files.

let browser: Browser | undefined;

beforeAll(async () => {
  if (!existsSync(CHROMIUM)) throw new Error(`Chromium was not found at ${CHROMIUM}: install the Debian package "chromium"`);
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
});

async function allRows(bytes: Uint8Array, stripRows: number): Promise<{ strips: RgbaStrip[]; rgba: number[] }> {
  const layout = pngStripLayout(bytes);
  expect(layout).not.toBeNull();
  const strips: RgbaStrip[] = [];
  for await (const s of pngStrips(layout!, stripRows, 'test.png')) strips.push({ ...s, rgba: s.rgba.slice() });
  return { strips, rgba: strips.flatMap((s) => Array.from(s.rgba)) };
}

function chunk(type: string, data: Uint8Array): Buffer {
  const out = Buffer.alloc(12 + data.length);
  out.writeUInt32BE(data.length, 0);
  out.write(type, 4, 'latin1');
  Buffer.from(data).copy(out, 8);
  return out;
}

/** A PNG of raw scanlines (filter byte 0 each) with the given IHDR fields and extra chunks before IDAT. */
function handMadePng(width: number, height: number, depth: number, colourType: number, lines: number[][], extra: Buffer[] = [], interlace = 0): Uint8Array {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = depth;
  ihdr[9] = colourType;
  ihdr[12] = interlace;
  const raw = Buffer.from(lines.flatMap((l) => [0, ...l]));
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), ...extra, chunk('IDAT', deflateSync(raw)), chunk('IEND', new Uint8Array(0))]);
}

describe('pngStrips: a PNG read in strips of rows', () => {
  it('reads a picture written by Chromium\'s PNG encoder to the very values it was given, in strips of the asked height', async () => {
    const page = await browser!.newPage();
    const [w, h] = [301, 97];
    const colour = (x: number, y: number): number[] => [(x * 7 + y * 3) & 255, (x * y) & 255, (x ^ y) & 255, 255];
    const base64 = await page.evaluate(([width, height]) => {
      const canvas = document.createElement('canvas');
      canvas.width = width;
      canvas.height = height;
      const image = new ImageData(width, height);
      for (let y = 0; y < height; y += 1) for (let x = 0; x < width; x += 1) image.data.set([(x * 7 + y * 3) & 255, (x * y) & 255, (x ^ y) & 255, 255], 4 * (y * width + x));
      canvas.getContext('2d')!.putImageData(image, 0, 0);
      return canvas.toDataURL('image/png').split(',')[1];
    }, [w, h]);
    await page.close();
    const { strips, rgba } = await allRows(new Uint8Array(Buffer.from(base64, 'base64')), 40);
    expect(strips.map((s) => [s.y0, s.rows])).toEqual([[0, 40], [40, 40], [80, 17]]);
    const want: number[] = [];
    for (let y = 0; y < h; y += 1) for (let x = 0; x < w; x += 1) want.push(...colour(x, y));
    expect(rgba).toEqual(want);
  });

  it('unpacks 1-bit grey and 4-bit palette samples most significant bit first (PNG 7.2), with the palette\'s transparency', async () => {
    // 1-bit grey, 10 px wide: 0b10110000 0b01000000 -> 1 0 1 1 0 0 0 0 | 0 1
    const grey = await allRows(handMadePng(10, 1, 1, 0, [[0b10110000, 0b01000000]]), 8);
    expect(grey.rgba.filter((_, k) => k % 4 === 0)).toEqual([255, 0, 255, 255, 0, 0, 0, 0, 0, 255]);
    // 4-bit palette of three colours, entry 1 half transparent: indices 2 1 0 2 1 in 0x21 0x02 0x10
    const plte = chunk('PLTE', new Uint8Array([10, 20, 30, 40, 50, 60, 70, 80, 90]));
    const trns = chunk('tRNS', new Uint8Array([255, 128]));
    const palette = await allRows(handMadePng(5, 1, 4, 3, [[0x21, 0x02, 0x10]], [plte, trns]), 8);
    expect(palette.rgba).toEqual([70, 80, 90, 255, 40, 50, 60, 128, 10, 20, 30, 255, 70, 80, 90, 255, 40, 50, 60, 128]);
  });

  it('reads 16-bit grey and alpha by the high byte of each sample', async () => {
    const { rgba } = await allRows(handMadePng(2, 1, 16, 4, [[0x12, 0x34, 0xff, 0x00, 0xab, 0xcd, 0x80, 0x01]]), 8);
    expect(rgba).toEqual([0x12, 0x12, 0x12, 0xff, 0xab, 0xab, 0xab, 0x80]);
  });

  it('leaves to the browser what it does not read in strips: interlaced files and a colour key on RGB', () => {
    expect(pngStripLayout(handMadePng(2, 2, 8, 2, [[1, 2, 3, 4, 5, 6], [1, 2, 3, 4, 5, 6]], [], 1))).toBeNull();
    expect(pngStripLayout(handMadePng(2, 1, 8, 2, [[1, 2, 3, 4, 5, 6]], [chunk('tRNS', new Uint8Array(6))]))).toBeNull();
    expect(pngStripLayout(new Uint8Array([0xff, 0xd8, 0xff]))).toBeNull();
  });

  it('names the file when its image data end early', async () => {
    const whole = handMadePng(4, 3, 8, 0, [[1, 2, 3, 4], [1, 2, 3, 4], [1, 2, 3, 4]]);
    const layout = pngStripLayout(whole)!;
    const cut = { ...layout, idat: [deflateSync(Buffer.from([0, 1, 2, 3, 4]))] };
    await expect((async () => {
      for await (const s of pngStrips(cut, 8, 'scan.png')) void s;
    })()).rejects.toThrow(/^scan\.png: the PNG file's image data end after 1 of 3 rows/);
  });
});

describe('the pyramid of tiles', () => {
  it('halves each level (rounded up) until one 512-px tile holds it', () => {
    expect(levelSizes(20_000, 12_000).map((s) => [s.widthPx, s.heightPx])).toEqual([
      [20_000, 12_000], [10_000, 6000], [5000, 3000], [2500, 1500], [1250, 750], [625, 375], [313, 188],
    ]);
    expect(levelSizes(512, 300)).toHaveLength(1);
  });

  it('halves a strip by 2 x 2 averages, an odd last column and row averaged with themselves', () => {
    // 3 x 3 grey values (R = G = B = A for brevity): rows 0 40 80 / 4 44 84 / 8 48 88
    const values = [0, 40, 80, 4, 44, 84, 8, 48, 88];
    const rgba = new Uint8ClampedArray(values.flatMap((v) => [v, v, v, v]));
    const half = halveStrip(rgba, 3, 3);
    expect(Array.from(half).filter((_, k) => k % 4 === 0)).toEqual([(0 + 40 + 4 + 44 + 2) >> 2, (80 + 80 + 84 + 84 + 2) >> 2, (8 + 48 + 8 + 48 + 2) >> 2, 88]);
  });

  it('draws the coarsest level that still has a level pixel for every device pixel', () => {
    const p = new TiledPicture(20_000, 12_000, levelSizes(20_000, 12_000).map((s, k) => ({ scale: 2 ** k, ...s, cols: 1, rows: 1, kept: true, tiles: [] })));
    expect([4, 1, 0.51, 0.5, 0.26, 0.25, 0.01, 0.0001].map((z) => p.levelFor(z))).toEqual([0, 0, 0, 1, 1, 2, 6, 6]);
  });
});
