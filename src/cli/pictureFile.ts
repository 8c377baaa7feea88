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
 */
import { readFileSync, statSync } from 'node:fs';
import { InvalidInputError } from '../errors.js';

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
  const ascii = (from: number, to: number): string => String.fromCharCode(...b.subarray(from, to));
  if (ascii(0, 4) === 'GIF8') return 'a GIF picture';
  if (ascii(0, 4) === 'RIFF' && ascii(8, 12) === 'WEBP') return 'a WebP picture';
  if (ascii(0, 2) === 'II' || ascii(0, 2) === 'MM') return 'a TIFF picture';
  if (ascii(0, 4) === '%PDF') return 'a PDF document';
  if (ascii(0, 2) === 'BM') return 'a BMP picture';
  if (/^\s*<(\?xml|svg)/.test(ascii(0, Math.min(b.length, 64)))) return 'an SVG or XML file';
  return null;
}

function pngSize(b: Uint8Array): { w: number; h: number } | null {
  if (b.length < 24) return null;
  const u32 = (i: number): number => ((b[i] << 24) | (b[i + 1] << 16) | (b[i + 2] << 8) | b[i + 3]) >>> 0;
  return { w: u32(16), h: u32(20) };
}

function jpegSize(b: Uint8Array): { w: number; h: number } | null {
  let i = 2;
  // bounded: every step moves forward by at least 2 bytes
  while (i + 9 < b.length) {
    if (b[i] !== 0xff) return null;
    const marker = b[i + 1];
    if (marker === 0xff) {
      i += 1; // fill byte
      continue;
    }
    if (marker === 0xd8 || (marker >= 0xd0 && marker <= 0xd7) || marker === 0x01) {
      i += 2; // markers without a length
      continue;
    }
    const length = (b[i + 2] << 8) | b[i + 3];
    const isFrame = marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc;
    if (isFrame) return { h: (b[i + 5] << 8) | b[i + 6], w: (b[i + 7] << 8) | b[i + 8] };
    if (length < 2) return null;
    i += 2 + length;
  }
  return null;
}

/**
 * Recognise picture bytes as JPEG or PNG.
 * @param field the option or scene path named in a refusal (`--image`, `image.file`)
 * @example sniffPicture(readFileSync('hall.png'), '--image', 'hall.png').mimeType // 'image/png'
 */
export function sniffPicture(bytes: Uint8Array, field: string, name: string): PictureFile {
  if (bytes.length >= 8 && PNG_SIGNATURE.every((v, k) => bytes[k] === v)) {
    const size = pngSize(bytes);
    return { bytes, mimeType: 'image/png', widthPx: size?.w ?? null, heightPx: size?.h ?? null };
  }
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) {
    const size = jpegSize(bytes);
    return { bytes, mimeType: 'image/jpeg', widthPx: size?.w ?? null, heightPx: size?.h ?? null };
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

/** Read and recognise a picture file; refusals name `field` and quote the name as given. */
export function readPictureFile(fullPath: string, field: string, name: string): PictureFile {
  let size: number;
  try {
    const stat = statSync(fullPath);
    if (!stat.isFile()) throw new InvalidInputError(field, name, 'a JPEG or PNG picture file', 'This is not a regular file');
    size = stat.size;
  } catch (error) {
    if (error instanceof InvalidInputError) throw error;
    throw new InvalidInputError(field, name, 'a JPEG or PNG picture file', 'There is no file at this path (or it cannot be read)');
  }
  if (size > MAX_PICTURE_BYTES) {
    throw new InvalidInputError(field, name, `a picture of at most ${MAX_PICTURE_BYTES / (1024 * 1024)} MiB`, `It has ${size} bytes`);
  }
  return sniffPicture(new Uint8Array(readFileSync(fullPath)), field, name);
}
