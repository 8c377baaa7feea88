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

export interface DecodedPicture {
  readonly widthPx: number;
  readonly heightPx: number;
  /** Red, green, blue, alpha per pixel, rows from the top. */
  readonly rgba: Uint8ClampedArray;
}

export function isTiff(bytes: Uint8Array): boolean {
  return bytes.length >= 4 && ((bytes[0] === 0x49 && bytes[1] === 0x49 && bytes[2] === 42 && bytes[3] === 0) || (bytes[0] === 0x4d && bytes[1] === 0x4d && bytes[2] === 0 && bytes[3] === 42));
}

/**
 * Decode the first image of a TIFF file to RGBA.
 * @throws Error naming the file and saying what it holds when the kind of TIFF is not read
 * @example decodeTiff(bytes, 'scan.tif').widthPx // 5120
 */
export function decodeTiff(bytes: Uint8Array, name: string): DecodedPicture {
  let ifd;
  try {
    [ifd] = decode(bytes);
  } catch (error) {
    throw new Error(`${name}: this TIFF file cannot be read (${error instanceof Error ? error.message : String(error)}); save it as PNG and open that`);
  }
  if (!ifd) throw new Error(`${name}: the TIFF file holds no image`);
  const { width, height, data } = ifd;
  const samples = ifd.samplesPerPixel;
  const photometric = ifd.type;
  if (photometric === 3 || photometric > 2) {
    throw new Error(`${name}: this TIFF file is ${photometric === 3 ? 'in palette colours' : `in colour model ${photometric}`}, which the desk does not read; save it as PNG and open that`);
  }
  // to 0-255: 8-bit as is, 16-bit scaled down, 1-bit (0 or 1) and 32-bit floats (0..1) scaled up
  const scale = ifd.bitsPerSample === 8 ? 1 : ifd.bitsPerSample === 16 ? 1 / 257 : 255;
  const rgba = new Uint8ClampedArray(width * height * 4);
  const grey = samples <= 2;
  for (let i = 0, j = 0; i < width * height; i += 1, j += samples) {
    let r: number;
    let g: number;
    let b: number;
    if (grey) {
      r = g = b = data[j] * scale; // WhiteIsZero already inverted by the decoder
    } else {
      r = data[j] * scale;
      g = data[j + 1] * scale;
      b = data[j + 2] * scale;
    }
    const hasAlpha = ifd.alpha;
    rgba[4 * i] = r;
    rgba[4 * i + 1] = g;
    rgba[4 * i + 2] = b;
    rgba[4 * i + 3] = hasAlpha ? data[j + samples - 1] * scale : 255;
  }
  return { widthPx: width, heightPx: height, rgba };
}
