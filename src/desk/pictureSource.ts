/**
 * The picture file's bytes to the desk's tiled picture (tiles.ts), decoded once:
 * - a large PNG (more than LARGE_PICTURE_PX pixels) in strips of rows as its data stream in
 *   (pngStrips.ts), never whole;
 * - a TIFF by the `tiff` decoder (tiffPicture.ts), its rows turned to RGBA a strip at a time;
 * - any other JPEG or PNG by the browser (createImageBitmap), then cut into strips.
 * JPEG and PNG are first checked as the command line checks them (sniffPicture: header, size),
 * with the same messages.
 */
import { sniffPicture } from '../cli/pictureFile.js';
import { pngStripLayout, pngStrips, type RgbaStrip } from './pngStrips.js';
import { buildPyramid, TILE_PX, type TiledPicture } from './tiles.js';
import { isTiff, tiffStrips } from './tiffPicture.js';

/** Above this many pixels a PNG is read in strips rather than decoded whole by the browser (16 Mpx = 64 MB of RGBA). */
export const LARGE_PICTURE_PX = 16 * 1024 * 1024;

/** A decoded bitmap's rows as RGBA strips, read back through a canvas one strip high. */
function* bitmapStrips(bitmap: ImageBitmap): Generator<RgbaStrip> {
  const canvas = new OffscreenCanvas(bitmap.width, Math.min(TILE_PX, bitmap.height));
  const ctx = canvas.getContext('2d', { willReadFrequently: true })!;
  for (let y0 = 0; y0 < bitmap.height; y0 += TILE_PX) {
    const rows = Math.min(TILE_PX, bitmap.height - y0);
    ctx.clearRect(0, 0, canvas.width, canvas.height);
    ctx.drawImage(bitmap, 0, -y0);
    yield { y0, rows, rgba: ctx.getImageData(0, 0, bitmap.width, rows).data };
  }
}

/**
 * Decode a picture file once and build its pyramid of tiles.
 * @param onProgress rows done of the picture's rows, as the pyramid is built
 * @throws Error naming the file, in the command line's words where it checks the same thing
 * @example const picture = await loadTiledPicture(bytes, 'scan.png'); picture.width // 20000
 */
export async function loadTiledPicture(bytes: Uint8Array, name: string, onProgress?: (done: number, total: number) => void): Promise<TiledPicture> {
  if (isTiff(bytes)) {
    const { widthPx, heightPx, strips } = tiffStrips(bytes, name, TILE_PX);
    return buildPyramid(widthPx, heightPx, strips, onProgress);
  }
  const file = sniffPicture(bytes, 'image.file', name);
  const layout = file.mimeType === 'image/png' && (file.widthPx ?? 0) * (file.heightPx ?? 0) > LARGE_PICTURE_PX ? pngStripLayout(bytes) : null;
  if (layout) return buildPyramid(layout.widthPx, layout.heightPx, pngStrips(layout, TILE_PX, name), onProgress);
  let bitmap: ImageBitmap;
  try {
    bitmap = await createImageBitmap(new Blob([bytes as BlobPart], { type: file.mimeType }));
  } catch {
    throw new Error(`${name}: the browser could not decode this ${file.widthPx ?? '?'} x ${file.heightPx ?? '?'} px ${file.mimeType === 'image/png' ? 'PNG' : 'JPEG'} picture (a damaged file, or a picture too large for the browser's memory); save it as PNG, which the desk reads in strips, and open that`);
  }
  try {
    return await buildPyramid(bitmap.width, bitmap.height, bitmapStrips(bitmap), onProgress);
  } finally {
    bitmap.close();
  }
}
