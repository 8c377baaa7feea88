/**
 * TIFF scans on the desk: decoded by the `tiff` package (image-js; bilevel, greyscale and RGB,
 * 1, 8, 16 or 32 bits per sample, uncompressed, LZW or Deflate, with or without alpha; it turns
 * WhiteIsZero into BlackIsZero itself) into the RGBA pixels a canvas draws. Only the picture's
 * first image (IFD) is shown; its size is the picture's size.
 *
 * Signature: TIFF 6.0 (Adobe, 1992), section 2 "Image File Header": "II" then 42 as a 2-byte
 * little-endian number, or "MM" then 42 big-endian. PhotometricInterpretation (tag 262),
 * section 3: 0 = WhiteIsZero, 1 = BlackIsZero, 2 = RGB, 3 = palette colour.
 */
import { decode } from 'tiff';
import type { RgbaStrip } from './pngStrips.js';

export interface DecodedPicture {
  readonly widthPx: number;
  readonly heightPx: number;
  /** Red, green, blue, alpha per pixel, rows from the top. */
  readonly rgba: Uint8ClampedArray;
}

export function isTiff(bytes: Uint8Array): boolean {
  return bytes.length >= 4 && ((bytes[0] === 0x49 && bytes[1] === 0x49 && bytes[2] === 42 && bytes[3] === 0) || (bytes[0] === 0x4d && bytes[1] === 0x4d && bytes[2] === 0 && bytes[3] === 42));
}

/** The first image of a TIFF file, decoded by the `tiff` package, with the checks the desk makes. */
interface TiffRaster {
  readonly width: number;
  readonly height: number;
  readonly samples: number;
  readonly data: ArrayLike<number>;
  readonly alpha: boolean;
  /** To 0-255: 8-bit as is, 16-bit scaled down, 1-bit (0 or 1) and 32-bit floats (0..1) scaled up. */
  readonly scale: number;
}

function decodeRaster(bytes: Uint8Array, name: string): TiffRaster {
  let ifd;
  try {
    [ifd] = decode(bytes);
  } catch (error) {
    throw new Error(`${name}: this TIFF file cannot be read (${error instanceof Error ? error.message : String(error)}); save it as PNG and open that`);
  }
  if (!ifd) throw new Error(`${name}: the TIFF file holds no image`);
  const photometric = ifd.type;
  if (photometric === 3 || photometric > 2) {
    throw new Error(`${name}: this TIFF file is ${photometric === 3 ? 'in palette colours' : `in colour model ${photometric}`}, which the desk does not read; save it as PNG and open that`);
  }
  const scale = ifd.bitsPerSample === 8 ? 1 : ifd.bitsPerSample === 16 ? 1 / 257 : 255;
  return { width: ifd.width, height: ifd.height, samples: ifd.samplesPerPixel, data: ifd.data, alpha: ifd.alpha, scale };
}

/** Rows [y0, y0 + rows) of the raster as RGBA into `out` (from its start). */
function rgbaRows(r: TiffRaster, y0: number, rows: number, out: Uint8ClampedArray): void {
  const { width, samples, data, scale, alpha } = r;
  const grey = samples <= 2;
  for (let i = 0, j = y0 * width * samples; i < width * rows; i += 1, j += samples) {
    if (grey) {
      out[4 * i] = out[4 * i + 1] = out[4 * i + 2] = data[j] * scale; // WhiteIsZero already inverted by the decoder
    } else {
      out[4 * i] = data[j] * scale;
      out[4 * i + 1] = data[j + 1] * scale;
      out[4 * i + 2] = data[j + 2] * scale;
    }
    out[4 * i + 3] = alpha ? data[j + samples - 1] * scale : 255;
  }
}

/**
 * Decode the first image of a TIFF file to RGBA.
 * @throws Error naming the file and saying what it holds when the kind of TIFF is not read
 * @example decodeTiff(bytes, 'scan.tif').widthPx // 5120
 */
export function decodeTiff(bytes: Uint8Array, name: string): DecodedPicture {
  const r = decodeRaster(bytes, name);
  const rgba = new Uint8ClampedArray(r.width * r.height * 4);
  rgbaRows(r, 0, r.height, rgba);
  return { widthPx: r.width, heightPx: r.height, rgba };
}

/**
 * Decode the first image of a TIFF file and hand its rows on as RGBA strips of `stripRows`
 * rows, so that no RGBA copy of the whole picture is made (a large scan's decoded samples are
 * held once, by the decoder, until the strips are done).
 * @example const { widthPx, strips } = tiffStrips(bytes, 'scan.tif', 512); for (const s of strips) ...
 */
export function tiffStrips(bytes: Uint8Array, name: string, stripRows: number): { widthPx: number; heightPx: number; strips: Generator<RgbaStrip> } {
  const r = decodeRaster(bytes, name);
  function* strips(): Generator<RgbaStrip> {
    for (let y0 = 0; y0 < r.height; y0 += stripRows) {
      const rows = Math.min(stripRows, r.height - y0);
      const rgba = new Uint8ClampedArray(r.width * rows * 4);
      rgbaRows(r, y0, rows, rgba);
      yield { y0, rows, rgba };
    }
  }
  return { widthPx: r.width, heightPx: r.height, strips: strips() };
}
