/**
 * The picture as a pyramid of tiles, so that a museum scan of 20,000 pixels a side can be
 * zoomed and moved without one canvas or bitmap of its full size: level 0 holds the picture's own
 * pixels in tiles of TILE_PX x TILE_PX, each level above halves both sides (2 x 2 box average)
 * until one tile holds it all. The pyramid is built from the picture's rows, a strip of TILE_PX
 * rows at a time (pictureSource.ts), level by level as the strips pass: no level ever holds more
 * than one strip of its own pixels while it is built.
 *
 * Levels of at most KEEP_DECODED_PX pixels are kept decoded (ImageBitmap); the tiles of larger
 * levels are kept as lossless PNG (the browser's own encoder) and decoded when they come into
 * view, at most DECODED_CACHE_TILES of them at a time (least recently drawn dropped first).
 *
 * Level L tile (i, j) covers picture pixels [i, i + 1) * TILE_PX * 2^L across and [j, j + 1) *
 * TILE_PX * 2^L down (clipped at the picture's edge); picture pixel (x, y) of the view is
 * picture pixel (x, y) of the file at every level (docs/conventions.md).
 */
import type { RgbaStrip } from './pngStrips.js';

/** Side of a tile, px (common practice of deep-zoom viewers: 256 or 512). */
export const TILE_PX = 512;
/** Largest level kept decoded, pixels (16 Mpx = 64 MB of RGBA). */
export const KEEP_DECODED_PX = 16 * 1024 * 1024;
/** Most tiles of the PNG-kept levels held decoded at once (64 MB of RGBA). */
export const DECODED_CACHE_TILES = 64;

interface Tile {
  bitmap: ImageBitmap | null;
  png: Blob | null;
  decoding: boolean;
  lastDrawn: number;
}

export interface PyramidLevel {
  /** Picture pixels per level pixel: 2^level. */
  readonly scale: number;
  readonly widthPx: number;
  readonly heightPx: number;
  readonly cols: number;
  readonly rows: number;
  /** True when every tile of the level is held decoded. */
  readonly kept: boolean;
  readonly tiles: Tile[];
}

/** A visible tile to draw: its bitmap and the picture-pixel rectangle it covers. */
export interface PlacedTile {
  readonly bitmap: ImageBitmap;
  readonly x: number;
  readonly y: number;
  readonly w: number;
  readonly h: number;
}

/** The picture's pyramid and the cache of its decoded tiles. */
export class TiledPicture {
  /** Called when a tile has been decoded and the view can be drawn better. */
  onTileReady: (() => void) | null = null;
  private clock = 0;
  private decodedCount = 0;

  constructor(readonly width: number, readonly height: number, readonly levels: readonly PyramidLevel[]) {}

  /**
   * The level whose pixels are at least as fine as the device's: the coarsest level with at
   * most one level pixel per device pixel at `devicePxPerPicturePx`.
   */
  levelFor(devicePxPerPicturePx: number): number {
    const level = Math.floor(Math.log2(1 / devicePxPerPicturePx));
    return Math.min(this.levels.length - 1, Math.max(0, level));
  }

  /** Let go of every decoded tile and stop asking for more (the picture is replaced by another). */
  dispose(): void {
    this.onTileReady = null;
    for (const l of this.levels) {
      for (const t of l.tiles) {
        t.bitmap?.close();
        t.bitmap = null;
        t.png = null;
      }
    }
  }

  /** Start drawing a new frame: tiles drawn in it are not dropped from the cache while it lasts. */
  beginFrame(): void {
    this.clock += 1;
  }

  /** The finest level held decoded in full (drawn beneath, so that nothing is ever blank). */
  finestKept(): number {
    return this.levels.findIndex((l) => l.kept);
  }

  /**
   * The decoded tiles of `level` that meet the picture rectangle [x0, x1) x [y0, y1); tiles not
   * yet decoded are asked for (onTileReady follows) and left out.
   */
  tilesIn(level: number, x0: number, y0: number, x1: number, y1: number): PlacedTile[] {
    const l = this.levels[level];
    const span = TILE_PX * l.scale;
    const out: PlacedTile[] = [];
    const i0 = Math.max(0, Math.floor(x0 / span));
    const i1 = Math.min(l.cols - 1, Math.floor(x1 / span));
    const j0 = Math.max(0, Math.floor(y0 / span));
    const j1 = Math.min(l.rows - 1, Math.floor(y1 / span));
    for (let j = j0; j <= j1; j += 1) {
      for (let i = i0; i <= i1; i += 1) {
        const tile = l.tiles[j * l.cols + i];
        tile.lastDrawn = this.clock;
        if (!tile.bitmap) {
          this.decode(tile);
          continue;
        }
        out.push({ bitmap: tile.bitmap, x: i * span, y: j * span, w: tile.bitmap.width * l.scale, h: tile.bitmap.height * l.scale });
      }
    }
    return out;
  }

  private decode(tile: Tile): void {
    if (tile.decoding || !tile.png) return;
    tile.decoding = true;
    createImageBitmap(tile.png).then((bitmap) => {
      tile.bitmap = bitmap;
      tile.decoding = false;
      this.decodedCount += 1;
      this.dropOldest();
      this.onTileReady?.();
    }, () => {
      tile.decoding = false;
    });
  }

  /** Keep at most DECODED_CACHE_TILES tiles of the PNG-kept levels decoded, besides those of the frame being drawn. */
  private dropOldest(): void {
    if (this.decodedCount <= DECODED_CACHE_TILES) return;
    const decoded = this.levels.filter((l) => !l.kept).flatMap((l) => l.tiles.filter((t) => t.bitmap));
    decoded.sort((a, b) => a.lastDrawn - b.lastDrawn);
    let count = decoded.length;
    for (const t of decoded) {
      if (count <= DECODED_CACHE_TILES || t.lastDrawn === this.clock) break;
      t.bitmap!.close();
      t.bitmap = null;
      count -= 1;
    }
    this.decodedCount = count;
  }
}

/** Sizes of the pyramid's levels for a picture: level 0 the picture, each next one half (rounded up), to one tile. */
export function levelSizes(widthPx: number, heightPx: number): { widthPx: number; heightPx: number }[] {
  const sizes = [{ widthPx, heightPx }];
  while (sizes[sizes.length - 1].widthPx > TILE_PX || sizes[sizes.length - 1].heightPx > TILE_PX) {
    const last = sizes[sizes.length - 1];
    sizes.push({ widthPx: Math.ceil(last.widthPx / 2), heightPx: Math.ceil(last.heightPx / 2) });
  }
  return sizes;
}

/**
 * Halve a strip of RGBA rows (2 x 2 box average; an odd last column or row is averaged with
 * itself). `w` x `rows` in, ceil(w / 2) x ceil(rows / 2) out.
 */
export function halveStrip(rgba: Uint8ClampedArray, w: number, rows: number): Uint8ClampedArray {
  const hw = Math.ceil(w / 2);
  const hr = Math.ceil(rows / 2);
  const out = new Uint8ClampedArray(hw * hr * 4);
  for (let y = 0; y < hr; y += 1) {
    const r0 = 2 * y * w * 4;
    const r1 = Math.min(2 * y + 1, rows - 1) * w * 4;
    for (let x = 0; x < hw; x += 1) {
      const c0 = 8 * x;
      const c1 = Math.min(2 * x + 1, w - 1) * 4;
      const o = (y * hw + x) * 4;
      for (let k = 0; k < 4; k += 1) out[o + k] = (rgba[r0 + c0 + k] + rgba[r0 + c1 + k] + rgba[r1 + c0 + k] + rgba[r1 + c1 + k] + 2) >> 2;
    }
  }
  return out;
}

/** Rows of one level gathered into strips of TILE_PX rows, cut into tiles, halved and passed up. */
class LevelBuilder {
  private strip: Uint8ClampedArray;
  private filled = 0;
  private stripRow = 0;

  constructor(private readonly level: PyramidLevel, private readonly next: LevelBuilder | null) {
    this.strip = new Uint8ClampedArray(level.widthPx * Math.min(TILE_PX, level.heightPx) * 4);
  }

  async push(rgba: Uint8ClampedArray, rows: number): Promise<void> {
    const rowBytes = this.level.widthPx * 4;
    let from = 0;
    while (from < rows) {
      const take = Math.min(rows - from, this.strip.length / rowBytes - this.filled);
      this.strip.set(rgba.subarray(from * rowBytes, (from + take) * rowBytes), this.filled * rowBytes);
      this.filled += take;
      from += take;
      if (this.filled === this.strip.length / rowBytes) await this.flush();
    }
  }

  private async flush(): Promise<void> {
    const l = this.level;
    const rows = this.filled;
    const j = this.stripRow;
    // the strip's tiles are encoded side by side (the browser encodes off the page's thread)
    await Promise.all(Array.from({ length: l.cols }, async (_, i) => {
      const x0 = i * TILE_PX;
      const tw = Math.min(TILE_PX, l.widthPx - x0);
      const pixels = new Uint8ClampedArray(tw * rows * 4);
      for (let y = 0; y < rows; y += 1) pixels.set(this.strip.subarray((y * l.widthPx + x0) * 4, (y * l.widthPx + x0 + tw) * 4), y * tw * 4);
      const image = new ImageData(pixels, tw, rows);
      const tile = l.tiles[j * l.cols + i];
      if (l.kept) tile.bitmap = await createImageBitmap(image);
      else {
        const canvas = new OffscreenCanvas(tw, rows);
        canvas.getContext('2d')!.putImageData(image, 0, 0);
        tile.png = await canvas.convertToBlob({ type: 'image/png' });
      }
    }));
    if (this.next) await this.next.push(halveStrip(this.strip, l.widthPx, rows), Math.ceil(rows / 2));
    this.stripRow += 1;
    this.filled = 0;
    const left = l.heightPx - this.stripRow * TILE_PX;
    if (left > 0 && left < TILE_PX) this.strip = new Uint8ClampedArray(l.widthPx * left * 4);
  }
}

/**
 * Build the pyramid from the picture's rows, strip by strip (any number of rows a strip, top to
 * bottom). `onProgress(done, total)` follows the picture's rows.
 * @example const picture = await buildPyramid(20000, 12000, pngStrips(layout, 512, name));
 */
export async function buildPyramid(widthPx: number, heightPx: number, strips: AsyncIterable<RgbaStrip> | Iterable<RgbaStrip>, onProgress?: (done: number, total: number) => void): Promise<TiledPicture> {
  const levels: PyramidLevel[] = levelSizes(widthPx, heightPx).map((s, k) => {
    const cols = Math.ceil(s.widthPx / TILE_PX);
    const rows = Math.ceil(s.heightPx / TILE_PX);
    return {
      scale: 2 ** k,
      widthPx: s.widthPx,
      heightPx: s.heightPx,
      cols,
      rows,
      kept: s.widthPx * s.heightPx <= KEEP_DECODED_PX,
      tiles: Array.from({ length: cols * rows }, () => ({ bitmap: null, png: null, decoding: false, lastDrawn: 0 })),
    };
  });
  let builder: LevelBuilder | null = null;
  for (let k = levels.length - 1; k >= 0; k -= 1) builder = new LevelBuilder(levels[k], builder);
  for await (const strip of strips) {
    await builder!.push(strip.rgba, strip.rows);
    onProgress?.(strip.y0 + strip.rows, heightPx);
  }
  return new TiledPicture(widthPx, heightPx, levels);
}
