/**
 * The picture on the desk: drawn on a canvas at any zoom from its pyramid of tiles (tiles.ts:
 * only the visible tiles of the level that matches the zoom, over the finest level held in
 * full), with the library's overlay (the straightened grids, the measured and predicted
 * shadows: measureOverlaySvg, in picture pixels) laid over it by one CSS transform, and the
 * clicked points drawn at a constant screen size.
 * Points live in picture pixels (x right, y down, origin at the top-left corner of the
 * top-left pixel, docs/conventions.md); only this module converts to and from the screen:
 *   screen = pan + zoom * picture.
 */
import type { PixelPoint } from '../scene/types.js';
import type { TiledPicture } from './tiles.js';

export interface ViewTransform {
  readonly zoom: number;
  readonly panX: number;
  readonly panY: number;
}

export const MIN_ZOOM = 0.02;
export const MAX_ZOOM = 64;

/** Screen (CSS px in the viewer box) -> picture pixels. */
export function screenToPicture(view: ViewTransform, sx: number, sy: number): PixelPoint {
  return [(sx - view.panX) / view.zoom, (sy - view.panY) / view.zoom];
}

/** Picture pixels -> screen (CSS px in the viewer box). */
export function pictureToScreen(view: ViewTransform, p: PixelPoint): [number, number] {
  return [view.panX + view.zoom * p[0], view.panY + view.zoom * p[1]];
}

/** Zoom by `factor` keeping the picture point under (sx, sy) in place. */
export function zoomAround(view: ViewTransform, factor: number, sx: number, sy: number): ViewTransform {
  const zoom = Math.min(MAX_ZOOM, Math.max(MIN_ZOOM, view.zoom * factor));
  const [px, py] = screenToPicture(view, sx, sy);
  return { zoom, panX: sx - zoom * px, panY: sy - zoom * py };
}

/** The whole picture in the box, centred, with a margin. */
export function fitView(boxW: number, boxH: number, picW: number, picH: number): ViewTransform {
  const zoom = Math.max(MIN_ZOOM, Math.min((boxW - 24) / picW, (boxH - 24) / picH));
  return { zoom, panX: Math.round((boxW - zoom * picW) / 2), panY: Math.round((boxH - zoom * picH) / 2) };
}

/** A point to draw: where, its label, and how it is marked (shape as well as colour). */
export interface Mark {
  readonly xy: PixelPoint;
  readonly label: string;
  readonly kind: 'point' | 'selected' | 'pending' | 'refused';
}

const MARK_STYLE = {
  point: { fill: '#0072B2', ring: '#FFFFFF' },
  selected: { fill: '#E69F00', ring: '#000000' },
  pending: { fill: '#CC79A7', ring: '#FFFFFF' },
  refused: { fill: '#D55E00', ring: '#FFFFFF' },
} as const;

/**
 * The tiles of the picture rectangle [x0, x1) x [y0, y1) on a context whose transform maps
 * picture pixels: the finest level held in full beneath (never blank, no seams), the level
 * `level` above it where its tiles are decoded.
 */
function drawTiles(ctx: CanvasRenderingContext2D, picture: TiledPicture, level: number, x0: number, y0: number, x1: number, y1: number): void {
  const under = Math.max(level + 1, picture.finestKept());
  for (const l of under < picture.levels.length ? [under, level] : [level]) {
    for (const t of picture.tilesIn(l, x0, y0, x1, y1)) ctx.drawImage(t.bitmap, t.x, t.y, t.w, t.h);
  }
}

/** Draw the picture and the marks. The canvas is sized to its box times the device pixel ratio. */
export function drawView(canvas: HTMLCanvasElement, picture: TiledPicture | null, picW: number, picH: number, view: ViewTransform, marks: readonly Mark[], lines: readonly (readonly [PixelPoint, PixelPoint])[]): void {
  const ratio = window.devicePixelRatio || 1;
  const w = canvas.clientWidth;
  const h = canvas.clientHeight;
  if (canvas.width !== Math.round(w * ratio) || canvas.height !== Math.round(h * ratio)) {
    canvas.width = Math.round(w * ratio);
    canvas.height = Math.round(h * ratio);
  }
  const ctx = canvas.getContext('2d')!;
  ctx.setTransform(ratio, 0, 0, ratio, 0, 0);
  ctx.fillStyle = '#5C5C5C';
  ctx.fillRect(0, 0, w, h);
  if (picture) {
    ctx.save();
    ctx.setTransform(ratio * view.zoom, 0, 0, ratio * view.zoom, ratio * view.panX, ratio * view.panY);
    // beyond 4x the pixels themselves are shown, for sub-pixel clicking
    ctx.imageSmoothingEnabled = view.zoom < 4;
    picture.beginFrame();
    const [x0, y0] = screenToPicture(view, 0, 0);
    const [x1, y1] = screenToPicture(view, w, h);
    drawTiles(ctx, picture, picture.levelFor(view.zoom * ratio), Math.max(0, x0), Math.max(0, y0), Math.min(picW, x1), Math.min(picH, y1));
    ctx.restore();
  }
  ctx.lineWidth = 1.5;
  ctx.strokeStyle = '#CC79A7';
  ctx.setLineDash([5, 3]);
  for (const [a, b] of lines) {
    const [ax, ay] = pictureToScreen(view, a);
    const [bx, by] = pictureToScreen(view, b);
    ctx.beginPath();
    ctx.moveTo(ax, ay);
    ctx.lineTo(bx, by);
    ctx.stroke();
  }
  ctx.setLineDash([]);
  ctx.font = '12px system-ui, sans-serif';
  for (const m of marks) {
    const [x, y] = pictureToScreen(view, m.xy);
    const style = MARK_STYLE[m.kind];
    ctx.lineWidth = 2;
    ctx.strokeStyle = style.ring;
    ctx.fillStyle = style.fill;
    ctx.beginPath();
    if (m.kind === 'pending') ctx.rect(x - 4, y - 4, 8, 8); // a square: not yet part of the scene
    else if (m.kind === 'refused') { ctx.moveTo(x, y - 6); ctx.lineTo(x + 6, y + 5); ctx.lineTo(x - 6, y + 5); ctx.closePath(); } // a triangle: refused
    else ctx.arc(x, y, m.kind === 'selected' ? 6 : 4, 0, 2 * Math.PI);
    ctx.fill();
    ctx.stroke();
    // a cross hair through the exact point
    ctx.strokeStyle = style.ring;
    ctx.lineWidth = 1;
    ctx.beginPath();
    ctx.moveTo(x - 1.5, y);
    ctx.lineTo(x + 1.5, y);
    ctx.moveTo(x, y - 1.5);
    ctx.lineTo(x, y + 1.5);
    ctx.stroke();
    ctx.lineWidth = 3;
    ctx.strokeStyle = '#FFFFFF';
    ctx.strokeText(m.label, x + 8, y - 8);
    ctx.fillStyle = '#000000';
    ctx.fillText(m.label, x + 8, y - 8);
  }
}

/** The magnifier: the picture's own pixels (level 0) around `at` at 10 screen pixels per picture pixel, with a cross hair on the exact point. */
export function drawMagnifier(canvas: HTMLCanvasElement, picture: TiledPicture | null, at: PixelPoint, marks: readonly Mark[]): void {
  const size = canvas.width;
  const scale = 10;
  const ctx = canvas.getContext('2d')!;
  ctx.setTransform(1, 0, 0, 1, 0, 0);
  ctx.fillStyle = '#5C5C5C';
  ctx.fillRect(0, 0, size, size);
  if (picture) {
    ctx.imageSmoothingEnabled = false;
    ctx.setTransform(scale, 0, 0, scale, size / 2 - scale * at[0], size / 2 - scale * at[1]);
    const half = size / 2 / scale + 1;
    drawTiles(ctx, picture, 0, at[0] - half, at[1] - half, at[0] + half, at[1] + half);
    ctx.setTransform(1, 0, 0, 1, 0, 0);
  }
  for (const m of marks) {
    const x = size / 2 + scale * (m.xy[0] - at[0]);
    const y = size / 2 + scale * (m.xy[1] - at[1]);
    if (x < -10 || y < -10 || x > size + 10 || y > size + 10) continue;
    ctx.strokeStyle = MARK_STYLE[m.kind].fill;
    ctx.lineWidth = 2;
    ctx.beginPath();
    ctx.arc(x, y, 5, 0, 2 * Math.PI);
    ctx.stroke();
  }
  ctx.strokeStyle = '#000000';
  ctx.lineWidth = 3;
  ctx.beginPath();
  ctx.moveTo(size / 2, 0); ctx.lineTo(size / 2, size / 2 - 6);
  ctx.moveTo(size / 2, size / 2 + 6); ctx.lineTo(size / 2, size);
  ctx.moveTo(0, size / 2); ctx.lineTo(size / 2 - 6, size / 2);
  ctx.moveTo(size / 2 + 6, size / 2); ctx.lineTo(size, size / 2);
  ctx.stroke();
  ctx.strokeStyle = '#FFFFFF';
  ctx.lineWidth = 1;
  ctx.stroke();
}
