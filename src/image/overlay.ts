/**
 * An SVG overlay of the measurements, in the picture's own pixel frame
 * (viewBox 0 0 widthPx heightPx, mirrored prints drawn as they are, not
 * flipped): the clicked points with labels, the rectified plane grid, the
 * measured shadow segments and, if given, the predicted shadow directions
 * drawn from the measured root point. Plain string output, no DOM.
 *
 * Palette (our own; colour-blind safe hues chosen apart in lightness so that
 * it survives grey-scale printing): points dark blue-violet #3b2a8c on a
 * white halo, grid warm grey #a39a8c, measured shadows dark teal #00675f,
 * predicted shadows dashed vermilion-orange #d9531e.
 * Coordinates are rounded to 0.1 px so that the output is stable.
 */
import type { ImageInfo, PixelPoint } from '../scene/types.js';
import { escapeXml } from '../charts/svg.js';
import { applyHomography, homogeneousW, type Point2 } from './homography.js';
import { toPictureFrame, toWorkingFrame, type RectifiedPlane } from './planeInImage.js';

export const OVERLAY_COLOURS = {
  point: '#3b2a8c',
  halo: '#ffffff',
  grid: '#a39a8c',
  measured: '#00675f',
  predicted: '#d9531e',
} as const;

/** One measured shadow to draw. */
export interface OverlayShadow {
  readonly label: string;
  /** As clicked, in the picture's own pixels. */
  readonly fromPx: PixelPoint;
  readonly toPx: PixelPoint;
  /** Predicted direction of the shadow in the plane frame (u, v or east, north), from the best candidate. */
  readonly predictedDirection?: readonly [number, number];
}

export interface OverlayPlane {
  readonly label: string;
  readonly plane: RectifiedPlane;
  readonly shadows?: readonly OverlayShadow[];
}

export interface OverlayInput {
  readonly image: ImageInfo;
  readonly planes: readonly OverlayPlane[];
  /** The picture itself, embedded underneath as a data URI. */
  readonly picture?: { readonly bytes: Uint8Array; readonly mimeType: 'image/jpeg' | 'image/png' };
}

/** A pixel coordinate to one decimal, never "-0". */
export function r1(v: number): string {
  const r = Math.round(v * 10) / 10;
  return (Object.is(r, -0) ? 0 : r).toString();
}

/** Text for SVG content and attributes (one escaping for every picture and chart: src/charts/svg.ts). */
export { escapeXml };

function line(a: Point2, b: Point2, attrs: string): string {
  return `<line x1="${r1(a[0])}" y1="${r1(a[1])}" x2="${r1(b[0])}" y2="${r1(b[1])}" ${attrs}/>`;
}

/** Plane point -> picture pixels, or null behind the vanishing line. */
function planeToPicture(plane: RectifiedPlane, p: Point2, side: number): Point2 | null {
  if (Math.sign(homogeneousW(plane.fit.matrix, p)) !== side) return null;
  return toPictureFrame(applyHomography(plane.fit.matrix, p), plane.image);
}

function gridLines(plane: RectifiedPlane): string[] {
  const pts = plane.planePoints;
  const minA = Math.min(...pts.map((p) => p[0]));
  const maxA = Math.max(...pts.map((p) => p[0]));
  const minB = Math.min(...pts.map((p) => p[1]));
  const maxB = Math.max(...pts.map((p) => p[1]));
  // every metre, or every tenth of the figure when the plane is known only up to scale
  const stepA = plane.metric ? 1 : (maxA - minA) / 10;
  const stepB = plane.metric ? 1 : (maxB - minB) / 10;
  const side = Math.sign(homogeneousW(plane.fit.matrix, pts[0]));
  const out: string[] = [];
  const attrs = `stroke="${OVERLAY_COLOURS.grid}" stroke-width="1" fill="none"`;
  const emit = (a: Point2, b: Point2): void => {
    const pa = planeToPicture(plane, a, side);
    const pb = planeToPicture(plane, b, side);
    if (pa && pb) out.push(line(pa, pb, attrs));
  };
  const maxLines = 200; // bounded: a grid of at most 200 lines per direction
  const startA = plane.metric ? Math.ceil(minA - 1e-9) : minA;
  for (let k = 0, a = startA; a <= maxA + 1e-9 && k < maxLines; k++, a = startA + k * stepA) emit([a, minB], [a, maxB]);
  const startB = plane.metric ? Math.ceil(minB - 1e-9) : minB;
  for (let k = 0, b = startB; b <= maxB + 1e-9 && k < maxLines; k++, b = startB + k * stepB) emit([minA, b], [maxA, b]);
  return out;
}

function pointMark(p: Point2, label: string): string {
  const [x, y] = [r1(p[0]), r1(p[1])];
  return (
    `<circle cx="${x}" cy="${y}" r="4" fill="${OVERLAY_COLOURS.point}" stroke="${OVERLAY_COLOURS.halo}" stroke-width="2"/>` +
    `<text x="${r1(p[0] + 7)}" y="${r1(p[1] - 7)}" font-family="sans-serif" font-size="14" fill="${OVERLAY_COLOURS.point}" ` +
    `stroke="${OVERLAY_COLOURS.halo}" stroke-width="3" paint-order="stroke">${escapeXml(label)}</text>`
  );
}

function shadowMarks(plane: RectifiedPlane, shadow: OverlayShadow): string[] {
  const out: string[] = [];
  out.push(line(shadow.fromPx, shadow.toPx, `stroke="${OVERLAY_COLOURS.measured}" stroke-width="2.5" stroke-linecap="round"`));
  if (shadow.predictedDirection) {
    const g = plane.imageToPlane;
    const fromPlane = applyHomography(g, toWorkingFrame(shadow.fromPx, plane.image));
    const toPlane = applyHomography(g, toWorkingFrame(shadow.toPx, plane.image));
    const length = Math.hypot(toPlane[0] - fromPlane[0], toPlane[1] - fromPlane[1]);
    const [du, dv] = shadow.predictedDirection;
    const norm = Math.hypot(du, dv);
    if (norm > 0) {
      const end: Point2 = [fromPlane[0] + (du / norm) * length, fromPlane[1] + (dv / norm) * length];
      const side = Math.sign(homogeneousW(plane.fit.matrix, fromPlane));
      const endPx = planeToPicture(plane, end, side);
      if (endPx) {
        out.push(line(shadow.fromPx, endPx, `stroke="${OVERLAY_COLOURS.predicted}" stroke-width="2" stroke-dasharray="8 5"`));
      }
    }
  }
  out.push(pointMark(shadow.fromPx, shadow.label));
  return out;
}

function base64(bytes: Uint8Array): string {
  // btoa over byte chunks: the same text as Node's Buffer, and it runs in a browser too (the desk)
  let binary = '';
  for (let i = 0; i < bytes.length; i += 0x8000) binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(binary);
}

/**
 * The overlay as an SVG document.
 * @example renderOverlaySvg({ image, planes: [{ label: 'Tanners\' Hall', plane }] }) // '<svg ...>...</svg>'
 */
export function renderOverlaySvg(input: OverlayInput): string {
  const { widthPx: w, heightPx: h } = input.image;
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="${r1(w)}" height="${r1(h)}" viewBox="0 0 ${r1(w)} ${r1(h)}">`,
  ];
  if (input.picture) {
    const uri = `data:${input.picture.mimeType};base64,${base64(input.picture.bytes)}`;
    parts.push(`<image x="0" y="0" width="${r1(w)}" height="${r1(h)}" href="${uri}" xlink:href="${uri}"/>`);
  }
  for (const { label, plane, shadows } of input.planes) {
    parts.push(`<g class="plane" data-label="${escapeXml(label)}">`);
    // a plane from the camera has no clicked figure to draw a grid over, nor points of its own
    parts.push(`<g class="grid">${plane.fromCamera ? '' : gridLines(plane).join('')}</g>`);
    parts.push(`<g class="measured">${(shadows ?? []).flatMap((s) => shadowMarks(plane, s)).join('')}</g>`);
    // a ground from two walls has one click of its own, the corner; its other points are derived, not clicked
    const corners = plane.fromCamera
      ? []
      : plane.fromWalls
      ? [pointMark(toPictureFrame(plane.fromWalls.cornerPx, plane.image), `${label} corner`)]
      : plane.pixelPoints.map((p, i) => pointMark(toPictureFrame(p, plane.image), `${label} ${i + 1}`));
    parts.push(`<g class="points">${corners.join('')}</g>`);
    parts.push('</g>');
  }
  parts.push('</svg>');
  return parts.join('\n');
}
