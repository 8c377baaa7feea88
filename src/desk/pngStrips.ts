/**
 * A large PNG read in strips of rows, so that the whole picture is never held decoded: the image
 * data (IDAT) is inflated as a stream by the browser's own DecompressionStream ('deflate', the zlib
 * format of PNG), each row unfiltered against the previous one only, and rows handed on as RGBA
 * in strips of `stripRows`.
 *
 * After the PNG specification (W3C, Portable Network Graphics, 2nd ed., 2003): 5.2 signature,
 * 11.2.2 IHDR (width, height, bit depth, colour type, interlace), 11.2.3 PLTE, 11.3.2.1 tRNS,
 * 9.2 the five filter types (None, Sub, Up, Average, Paeth), 9.4 the Paeth predictor, 7.2
 * scanlines (bytes per pixel rounded up to 1 for filtering, samples of fewer than 8 bits packed
 * from the most significant bit).
 *
 * Read here: colour types 0 (grey, 1-16 bits), 2 (RGB, 8 or 16), 3 (palette, 1-8, with tRNS),
 * 4 (grey and alpha, 8 or 16), 6 (RGBA, 8 or 16), not interlaced. Not read (pngStripLayout
 * returns null and the caller lets the browser decode the whole picture): Adam7 interlacing and
 * a tRNS colour key on grey or RGB pictures. Gamma and colour profiles (gAMA, iCCP, sRGB) are
 * not applied: the stored values are shown, as for a TIFF scan; positions are not affected.
 */

const SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

export interface PngLayout {
  readonly widthPx: number;
  readonly heightPx: number;
  readonly bitDepth: number;
  readonly colourType: number;
  /** Samples per pixel: 1 grey or palette, 2 grey and alpha, 3 RGB, 4 RGBA. */
  readonly samples: number;
  /** Palette as RGBA, 4 bytes an entry (colour type 3 only). */
  readonly palette: Uint8Array | null;
  /** The IDAT chunks' data, in order: together one zlib stream. */
  readonly idat: readonly Uint8Array[];
}

/** A strip of picture rows: `rows` rows from row `y0`, RGBA, `widthPx * rows * 4` bytes. */
export interface RgbaStrip {
  readonly y0: number;
  readonly rows: number;
  readonly rgba: Uint8ClampedArray;
}

const SAMPLES: Record<number, number> = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 };

function u32(b: Uint8Array, at: number): number {
  return ((b[at] << 24) | (b[at + 1] << 16) | (b[at + 2] << 8) | b[at + 3]) >>> 0;
}

/**
 * The layout of a PNG file that can be read in strips, or null when it cannot (not PNG,
 * interlaced, a colour key on grey or RGB, a combination the specification does not allow).
 * @example pngStripLayout(bytes)?.widthPx // 20000
 */
export function pngStripLayout(bytes: Uint8Array): PngLayout | null {
  if (bytes.length < 33 || !SIGNATURE.every((v, k) => bytes[k] === v)) return null;
  let at = 8;
  let head: { w: number; h: number; depth: number; type: number; interlace: number } | null = null;
  let palette: Uint8Array | null = null;
  let colourKey = false;
  const idat: Uint8Array[] = [];
  while (at + 8 <= bytes.length) {
    const length = u32(bytes, at);
    const type = String.fromCharCode(bytes[at + 4], bytes[at + 5], bytes[at + 6], bytes[at + 7]);
    const data = bytes.subarray(at + 8, at + 8 + length);
    if (type === 'IHDR') head = { w: u32(data, 0), h: u32(data, 4), depth: data[8], type: data[9], interlace: data[12] };
    else if (type === 'PLTE') {
      palette = new Uint8Array((length / 3) * 4).fill(255);
      for (let k = 0; k < length / 3; k += 1) palette.set(data.subarray(3 * k, 3 * k + 3), 4 * k);
    } else if (type === 'tRNS') {
      if (palette) for (let k = 0; k < data.length && 4 * k + 3 < palette.length; k += 1) palette[4 * k + 3] = data[k];
      else colourKey = true;
    } else if (type === 'IDAT') idat.push(data);
    else if (type === 'IEND') break;
    at += 12 + length;
  }
  if (!head || head.interlace !== 0 || colourKey || idat.length === 0) return null;
  const samples = SAMPLES[head.type];
  if (!samples) return null;
  const depthOk = head.type === 0 ? [1, 2, 4, 8, 16].includes(head.depth) : head.type === 3 ? [1, 2, 4, 8].includes(head.depth) && palette !== null : [8, 16].includes(head.depth);
  if (!depthOk) return null;
  return { widthPx: head.w, heightPx: head.h, bitDepth: head.depth, colourType: head.type, samples, palette, idat };
}

/** The Paeth predictor (PNG 2nd ed., 9.4). */
export function paeth(a: number, b: number, c: number): number {
  const p = a + b - c;
  const pa = Math.abs(p - a);
  const pb = Math.abs(p - b);
  const pc = Math.abs(p - c);
  return pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
}

/** Undo one scanline's filter in place (PNG 2nd ed., 9.2); `prev` is the previous unfiltered line (zeros for the first). */
export function unfilterLine(filter: number, line: Uint8Array, prev: Uint8Array, bpp: number): void {
  const n = line.length;
  if (filter === 0) return;
  if (filter === 1) for (let i = bpp; i < n; i += 1) line[i] = (line[i] + line[i - bpp]) & 255;
  else if (filter === 2) for (let i = 0; i < n; i += 1) line[i] = (line[i] + prev[i]) & 255;
  else if (filter === 3) for (let i = 0; i < n; i += 1) line[i] = (line[i] + (((i >= bpp ? line[i - bpp] : 0) + prev[i]) >> 1)) & 255;
  else if (filter === 4) for (let i = 0; i < n; i += 1) line[i] = (line[i] + paeth(i >= bpp ? line[i - bpp] : 0, prev[i], i >= bpp ? prev[i - bpp] : 0)) & 255;
  else throw new Error(`the PNG file has a row with filter type ${filter}; only 0 to 4 exist`);
}

/** One unfiltered scanline to RGBA at `out[offset...]`. */
function lineToRgba(png: PngLayout, line: Uint8Array, out: Uint8ClampedArray, offset: number): void {
  const { widthPx: w, bitDepth: depth, colourType: type, samples, palette } = png;
  if (depth < 8) {
    const perByte = 8 / depth;
    const mask = (1 << depth) - 1;
    const greyScale = 255 / mask;
    for (let x = 0; x < w; x += 1) {
      const v = (line[(x / perByte) | 0] >> (8 - depth * ((x % perByte) + 1))) & mask;
      const o = offset + 4 * x;
      if (type === 3) out.set(palette!.subarray(4 * v, 4 * v + 4), o);
      else {
        out[o] = out[o + 1] = out[o + 2] = v * greyScale;
        out[o + 3] = 255;
      }
    }
    return;
  }
  const step = depth === 16 ? 2 : 1; // 16-bit samples: the high byte (big-endian) is the 8-bit value
  for (let x = 0, i = 0; x < w; x += 1, i += samples * step) {
    const o = offset + 4 * x;
    if (type === 3) out.set(palette!.subarray(4 * line[i], 4 * line[i] + 4), o);
    else if (samples <= 2) {
      out[o] = out[o + 1] = out[o + 2] = line[i];
      out[o + 3] = samples === 2 ? line[i + step] : 255;
    } else {
      out[o] = line[i];
      out[o + 1] = line[i + step];
      out[o + 2] = line[i + 2 * step];
      out[o + 3] = samples === 4 ? line[i + 3 * step] : 255;
    }
  }
}

/**
 * The picture's rows as RGBA strips of `stripRows` rows (the last one shorter), decoded as the
 * compressed data streams in.
 * @throws Error naming the file when its image data are cut or damaged
 */
export async function* pngStrips(png: PngLayout, stripRows: number, name: string): AsyncGenerator<RgbaStrip> {
  const { widthPx: w, heightPx: h } = png;
  const lineBytes = Math.ceil((w * png.samples * png.bitDepth) / 8);
  const bpp = Math.max(1, (png.samples * png.bitDepth) / 8);
  const compressed = new ReadableStream<Uint8Array>({
    start(controller) {
      for (const chunk of png.idat) controller.enqueue(chunk);
      controller.close();
    },
  });
  const reader = compressed.pipeThrough(new DecompressionStream('deflate') as unknown as ReadableWritablePair<Uint8Array, Uint8Array>).getReader();
  let prev = new Uint8Array(lineBytes);
  let line = new Uint8Array(lineBytes);
  let filter = -1;
  let filled = 0;
  let y = 0;
  let strip = new Uint8ClampedArray(w * Math.min(stripRows, h) * 4);
  let stripY0 = 0;
  try {
    while (y < h) {
      const { value, done } = await reader.read();
      if (done) break;
      let i = 0;
      while (i < value.length && y < h) {
        if (filter < 0) {
          filter = value[i];
          i += 1;
          continue;
        }
        const take = Math.min(lineBytes - filled, value.length - i);
        line.set(value.subarray(i, i + take), filled);
        filled += take;
        i += take;
        if (filled < lineBytes) continue;
        unfilterLine(filter, line, prev, bpp);
        lineToRgba(png, line, strip, (y - stripY0) * w * 4);
        [prev, line] = [line, prev];
        filter = -1;
        filled = 0;
        y += 1;
        if (y - stripY0 === stripRows || y === h) {
          yield { y0: stripY0, rows: y - stripY0, rgba: strip };
          stripY0 = y;
          if (y < h) strip = new Uint8ClampedArray(w * Math.min(stripRows, h - y) * 4);
        }
      }
    }
  } catch (error) {
    throw new Error(`${name}: the PNG file's image data cannot be read (${error instanceof Error ? error.message : String(error)}): a cut or damaged file`);
  } finally {
    void reader.cancel().catch(() => undefined);
  }
  if (y < h) throw new Error(`${name}: the PNG file's image data end after ${y} of ${h} rows: a cut or damaged file`);
}
