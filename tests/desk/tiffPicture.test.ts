import { describe, expect, it } from 'vitest';
import { decodeTiff, isTiff } from '../../src/desk/tiffPicture.js';
import { tiffFile } from './tiffFile.js';

// TIFF scans on the desk, on files built by hand after the TIFF 6.0 specification (tiffFile.ts).

describe('TIFF pictures', () => {
  it('recognises the TIFF header in both byte orders and nothing else', () => {
    expect(isTiff(new Uint8Array([0x49, 0x49, 42, 0]))).toBe(true);
    expect(isTiff(new Uint8Array([0x4d, 0x4d, 0, 42]))).toBe(true);
    expect(isTiff(new Uint8Array([0x89, 0x50, 0x4e, 0x47]))).toBe(false);
  });

  it('decodes an 8-bit RGB scan to the same pixels, rows from the top', () => {
    const pixels = [255, 0, 0, 0, 255, 0, 0, 0, 255, 10, 20, 30, 200, 100, 50, 1, 2, 3];
    const picture = decodeTiff(tiffFile(3, 2, 8, 3, 2, pixels), 'scan.tif');
    expect([picture.widthPx, picture.heightPx]).toEqual([3, 2]);
    expect(Array.from(picture.rgba.subarray(0, 8))).toEqual([255, 0, 0, 255, 0, 255, 0, 255]);
    expect(Array.from(picture.rgba.subarray(16, 20))).toEqual([200, 100, 50, 255]); // second row, second pixel
  });

  it('decodes a 16-bit greyscale scan by its high byte, and inverts WhiteIsZero', () => {
    const black = decodeTiff(tiffFile(2, 1, 16, 1, 1, [0, 65535]), 'grey.tif');
    expect(Array.from(black.rgba)).toEqual([0, 0, 0, 255, 255, 255, 255, 255]);
    const white = decodeTiff(tiffFile(2, 1, 16, 1, 0, [0, 65535]), 'grey.tif');
    expect(Array.from(white.rgba)).toEqual([255, 255, 255, 255, 0, 0, 0, 255]);
  });

  describe('edge cases', () => {
    it('refuses a palette TIFF and a broken file with a message naming the file', () => {
      expect(() => decodeTiff(tiffFile(1, 1, 8, 1, 3, [0]), 'map.tif')).toThrow(/^map.tif: .*palette/);
      expect(() => decodeTiff(new Uint8Array([0x49, 0x49, 42, 0, 99, 0, 0, 0]), 'cut.tif')).toThrow(/^cut.tif: /);
    });
  });
});
