/**
 * A picture file to embed under an overlay: only JPEG and PNG, recognised by
 * their first bytes (the file name's ending is not trusted), with the pixel
 * size read from the file so that a picture of another size than the scene's
 * image block can be pointed out.
 *
 * Signatures: PNG, ISO/IEC 15948:2004 (PNG specification, 2nd ed.), sec. 5.2
 * (the 8-byte signature 89 50 4E 47 0D 0A 1A 0A) and sec. 11.2.2 (IHDR: width
 * and height as 4-byte big-endian integers at bytes 16-23). JPEG, ITU-T T.81
 * (1992), Annex B: the SOI marker FF D8 followed by marker segments, each FF xx
 * with a 2-byte big-endian length; a start-of-frame marker (C0-CF except C4,
 * C8, CC) carries the height then the width (2 bytes each) after the
 * precision byte.
 *
 * The whole header is checked, not only the first bytes: for PNG the IHDR chunk
 * (length, checksum, size, bit depth and colour type) and the chain of chunks up to
 * IEND with image data (IDAT) in it; for JPEG the marker segments up to the frame
 * header (SOFn: precision, size, components) and the scan (SOS), and the end marker.
 * The declared size must be at most MAX_IMAGE_SIDE_PX a side and MAX_PICTURE_PIXELS
 * in all. The picture is not decoded (no decoder is bundled): a file damaged inside
 * its compressed data passes and shows as a broken picture in the overlay.
 *
 * Bytes in, no file access (the desk's page uses it too); readPictureFile.ts reads the file.
 */
import { InvalidInputError } from '../errors.js';
import { MAX_IMAGE_SIDE_PX } from '../scene/readImage.js';

/** Largest picture embedded, bytes (common practice: a scan for measuring rarely exceeds a few tens of MB). */
export const MAX_PICTURE_BYTES = 64 * 1024 * 1024;

export interface PictureFile {
  readonly bytes: Uint8Array;
  readonly mimeType: 'image/jpeg' | 'image/png';
  /** Size read from the file, or null when the file does not say (a JPEG without a frame header). */
  readonly widthPx: number | null;
  readonly heightPx: number | null;
}

const PNG_SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

/** What other common formats look like, for a helpful refusal. */
function otherFormat(b: Uint8Array): string | null {
  if (ascii(b, 0, 4) === 'GIF8') return 'a GIF picture';
  if (ascii(b, 0, 4) === 'RIFF' && ascii(b, 8, 12) === 'WEBP') return 'a WebP picture';
  if (ascii(b, 0, 2) === 'II' || ascii(b, 0, 2) === 'MM') return 'a TIFF picture';
  if (ascii(b, 0, 4) === '%PDF') return 'a PDF document';
  if (ascii(b, 0, 2) === 'BM') return 'a BMP picture';
  if (/^\s*<(\?xml|svg)/.test(ascii(b, 0, Math.min(b.length, 64)))) return 'an SVG or XML file';
  return null;
}

/** CRC-32 as PNG uses it (ISO/IEC 15948:2004, Annex D: polynomial 0xEDB88320, reflected). */
function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (const byte of bytes) {
    c ^= byte;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  }
  return (c ^ 0xffffffff) >>> 0;
}

const u32 = (b: Uint8Array, i: number): number => ((b[i] << 24) | (b[i + 1] << 16) | (b[i + 2] << 8) | b[i + 3]) >>> 0;
const ascii = (b: Uint8Array, from: number, to: number): string => String.fromCharCode(...b.subarray(from, to));

/** Allowed bit depths per PNG colour type (ISO/IEC 15948:2004, sec. 11.2.2, Table 11.1). */
const PNG_DEPTHS: Readonly<Record<number, readonly number[]>> = { 0: [1, 2, 4, 8, 16], 2: [8, 16], 3: [1, 2, 4, 8], 4: [8, 16], 6: [8, 16] };

/** The size a PNG declares, or what is wrong with its header and chunks (sec. 5.3: length, type, data, CRC; sec. 11.2). */
function pngSize(b: Uint8Array): { w: number; h: number } | string {
  if (b.length < 33 || u32(b, 8) !== 13 || ascii(b, 12, 16) !== 'IHDR') return 'its first chunk is not a complete image header (IHDR)';
  if (crc32(b.subarray(12, 29)) !== u32(b, 29)) return 'its image header (IHDR) fails its checksum (CRC)';
  const w = u32(b, 16);
  const h = u32(b, 20);
  const [depth, colour, compression, filter, interlace] = [b[24], b[25], b[26], b[27], b[28]];
  if (w === 0 || h === 0 || w > 0x7fffffff || h > 0x7fffffff) return `its header gives a size of ${w} x ${h} pixels`;
  if (!(PNG_DEPTHS[colour] ?? []).includes(depth) || compression !== 0 || filter !== 0 || interlace > 1) {
    return `its header holds values the PNG standard does not define (bit depth ${depth}, colour type ${colour})`;
  }
  // Walk the chunks: each fits in the file, at least one holds image data, the last is IEND. Bounded: each step moves 12 bytes or more.
  let i = 8;
  let data = false;
  while (i + 12 <= b.length) {
    const length = u32(b, i);
    const type = ascii(b, i + 4, i + 8);
    if (length > b.length - i - 12) return `its chunk "${type.replace(/[^\x20-\x7e]/g, '?')}" runs past the end of the file (a cut or damaged file)`;
    if (type === 'IDAT') data = true;
    if (type === 'IEND') return data ? { w, h } : 'it holds no image data (IDAT)';
    i += 12 + length;
  }
  return 'it ends before its last chunk (IEND): a cut or damaged file';
}

/** The size a JPEG's frame header declares, or what is wrong (ITU-T T.81, B.1.1.2 markers, B.2.2 frame header). */
function jpegSize(b: Uint8Array): { w: number; h: number } | string {
  let i = 2;
  let frame: { w: number; h: number } | undefined;
  // Bounded: every step moves forward by at least 1 byte.
  while (i + 4 <= b.length) {
    if (b[i] !== 0xff) return `byte ${i} is not a marker (FF xx) where one is due: it is not a JPEG file, or a damaged one`;
    const marker = b[i + 1];
    if (marker === 0xff) {
      i += 1; // fill byte
      continue;
    }
    if ((marker >= 0xd0 && marker <= 0xd7) || marker === 0x01) {
      i += 2; // markers without a length
      continue;
    }
    if (marker === 0xd8 || marker === 0xd9 || marker === 0x00) return `marker FF ${marker.toString(16).toUpperCase().padStart(2, '0')} stands where a segment is due: a damaged JPEG file`;
    const length = (b[i + 2] << 8) | b[i + 3];
    if (length < 2 || i + 2 + length > b.length) return 'a segment runs past the end of the file (a cut or damaged file)';
    const isFrame = marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc;
    if (isFrame) {
      const precision = b[i + 4];
      const h = (b[i + 5] << 8) | b[i + 6];
      const w = (b[i + 7] << 8) | b[i + 8];
      const components = b[i + 9];
      if (length < 8 || length !== 8 + 3 * components || components < 1 || components > 4) return 'its frame header (SOF) is malformed';
      if (![8, 12, 16].includes(precision) && !(marker === 0xc3 && precision >= 2 && precision <= 16)) return `its frame header gives a sample precision of ${precision} bits`;
      if (w === 0 || h === 0) return `its frame header gives a size of ${w} x ${h} pixels`;
      frame = { w, h };
    }
    if (marker === 0xda) {
      // Start of scan: entropy-coded data follows; the file must end with EOI (FF D9), trailing padding aside.
      if (!frame) return 'it has image data (SOS) before any frame header (SOF)';
      const tail = b.subarray(Math.max(i, b.length - 1024));
      for (let k = tail.length - 2; k >= 0; k--) if (tail[k] === 0xff && tail[k + 1] === 0xd9) return frame;
      return 'it does not end with the end-of-image marker (FF D9): a cut or damaged file';
    }
    i += 2 + length;
  }
  return frame ? 'it ends before its image data (SOS): a cut or damaged file' : 'it has no frame header (SOF) giving its size: a damaged file';
}

/** Largest picture in pixels (museum scans reach 20,000 pixels a side: 400 megapixels is a square of that side; the desk shows them tiled). */
export const MAX_PICTURE_PIXELS = 400_000_000;

/** Check a declared size against the limits, or throw. */
function checkPictureSize(size: { w: number; h: number } | string, kind: string, field: string, name: string): { w: number; h: number } {
  if (typeof size === 'string') throw new InvalidInputError(field, name, `a complete ${kind} picture`, `The file starts like ${kind}, but ${size}`);
  if (size.w > MAX_IMAGE_SIDE_PX || size.h > MAX_IMAGE_SIDE_PX || size.w * size.h > MAX_PICTURE_PIXELS) {
    throw new InvalidInputError(
      field,
      name,
      `a picture of at most ${MAX_IMAGE_SIDE_PX} pixels a side and ${MAX_PICTURE_PIXELS / 1e6} megapixels`,
      `Its header says ${size.w} x ${size.h} pixels`,
    );
  }
  return size;
}

/**
 * Recognise picture bytes as JPEG or PNG.
 * @param field the option or scene path named in a refusal (`--image`, `image.file`)
 * @example sniffPicture(pngBytes, '--image', 'hall.png').mimeType // 'image/png'
 */
export function sniffPicture(bytes: Uint8Array, field: string, name: string): PictureFile {
  if (bytes.length >= 8 && PNG_SIGNATURE.every((v, k) => bytes[k] === v)) {
    const size = checkPictureSize(pngSize(bytes), 'PNG', field, name);
    return { bytes, mimeType: 'image/png', widthPx: size.w, heightPx: size.h };
  }
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) {
    const size = checkPictureSize(jpegSize(bytes), 'JPEG', field, name);
    return { bytes, mimeType: 'image/jpeg', widthPx: size.w, heightPx: size.h };
  }
  const other = otherFormat(bytes);
  const head = Array.from(bytes.subarray(0, 8), (v) => v.toString(16).toUpperCase().padStart(2, '0')).join(' ');
  throw new InvalidInputError(
    field,
    name,
    'a JPEG or PNG picture',
    other
      ? `This file is ${other}; save the picture as PNG or JPEG and give that file`
      : `Its first bytes (${head || 'none: the file is empty'}) are neither JPEG (FF D8 FF) nor PNG (89 50 4E 47 0D 0A 1A 0A)`,
  );
}
