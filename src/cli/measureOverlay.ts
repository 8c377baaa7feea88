/**
 * What the best candidate of a dating predicts for each shadow measured on the
 * picture, and the overlay drawing of `heliochron measure` with it.
 *
 * Predictions use the forward models of src/geometry (rod: the anti-sun vector
 * projected on the wall, direction (cos a sin HSA, -sin a); overhang: depth
 * ratio tan VSA; fin: width ratio tan |HSA|; pole: shadow azimuth sun + 180 and
 * length ratio 1 / tan a; ASHRAE Handbook - Fundamentals, Fenestration, and
 * common practice, see src/geometry/wallShadows.ts and groundShadows.ts), with
 * the candidate's refracted sun and its fitted wall azimuth.
 *
 * Drawn in the picture's own pixels: a rod's or pole's predicted shadow as a
 * dashed line from the clicked root in the predicted direction (through
 * src/image/overlay.ts); an overhang's predicted shadow edge as a dashed
 * horizontal wall line at the predicted depth below the clicked root, a fin's
 * as a dashed vertical wall line at the predicted width beside it (added here,
 * mapped through the wall's rectification).
 */
import { angleDiffDeg, cosDeg, sinDeg } from '../math/angles.js';
import { predictEaveShadow, predictFinShadow, predictOverhangShadow, predictPoleShadow, predictRodShadow } from '../geometry/index.js';
import { sunUnitVector } from '../geometry/sunVector.js';
import type { SunDirection } from '../geometry/sunVector.js';
import { applyHomography, homogeneousW, type Point2 } from '../image/homography.js';
import { OVERLAY_COLOURS, escapeXml, r1, renderOverlaySvg, type OverlayPlane, type OverlayShadow } from '../image/overlay.js';
import { toPictureFrame, type RectifiedPlane } from '../image/planeInImage.js';
import type { ResolvedMeasurement } from '../image/resolvePixels.js';
import type { SceneSun } from '../image/sceneSun.js';
import { cameraOverlayElements } from '../image/cameraOverlay.js';
import type { PictureFile } from './pictureFile.js';
import type { ImageInfo, Scene } from '../scene/types.js';

/** One predicted value beside the measured one. */
export interface PredictedValue {
  readonly name: string;
  readonly measured: number;
  readonly predicted: number;
  readonly sigma: number;
  /** (measured - predicted) / sigma; angles wrapped to (-180, 180]. */
  readonly normalised: number;
}

export interface MeasurementPrediction {
  readonly field: string;
  readonly id: string;
  /** False when the shadow cannot exist at the candidate (wall in shade, sun down). */
  readonly defined: boolean;
  readonly values: readonly PredictedValue[];
  /** Predicted side of a rod or fin shadow, null when not defined (straight down). */
  readonly side?: 'left' | 'right' | null;
  /** Wall azimuth used, degrees (the candidate's fitted value). */
  readonly wallAzimuthDeg?: number;
  /** For drawing: a direction in the plane frame (rod, pole) ... */
  readonly direction?: readonly [number, number];
  /** ... or a line in the plane frame (overhang, fin). */
  readonly line?: readonly [Point2, Point2];
}

/** Index k of a scene path `observations[k]`. */
export function observationIndex(field: string): number {
  return Number(/\[(\d+)\]/.exec(field)![1]);
}

function value(name: string, measured: number, predicted: number, sigma: number, angular = false): PredictedValue {
  const diff = angular ? angleDiffDeg(measured, predicted) : measured - predicted;
  return { name, measured, predicted, sigma, normalised: diff / sigma };
}

/**
 * What a sun direction predicts for each measured shadow.
 * @param wallAzimuth the wall azimuth to use for a wall id (the candidate's fitted value)
 */
export function predictMeasurements(
  scene: Scene,
  measurements: readonly ResolvedMeasurement[],
  sun: SunDirection,
  wallAzimuth: (wallId: string) => number,
): MeasurementPrediction[] {
  return measurements.map(({ field, measurement: m, values }) => {
    const sigma = (name: string): number => values.find((v) => v.name === name)!.sigma;
    const base = { field, id: m.id };
    const original = scene.observations[observationIndex(field)];
    const from = m.fromPlane;
    const to = m.toPlane;
    switch (m.kind) {
      case 'rod-shadow': {
        const az = wallAzimuth(m.observation.wallId);
        const p = predictRodShadow(sun, az);
        const d = p.directionDeg;
        return {
          ...base, defined: p.defined, side: p.side, wallAzimuthDeg: az,
          values: [value('slopeDeg', m.slopeDeg.value, p.slopeDeg, sigma('slopeDeg'))],
          direction: [cosDeg(d), sinDeg(d)] as const,
        };
      }
      case 'overhang-shadow': {
        const az = wallAzimuth(m.observation.wallId);
        const p = predictOverhangShadow(sun, az);
        const v = from[1] - p.depthRatio * m.projectionInPlane;
        const reach = Math.max(0.3, 0.5 * Math.abs(to[0] - from[0]));
        const line: [Point2, Point2] = [[Math.min(from[0], to[0]) - reach, v], [Math.max(from[0], to[0]) + reach, v]];
        return {
          ...base, defined: p.defined && Number.isFinite(p.depthRatio), wallAzimuthDeg: az,
          values: [value('depthRatio', m.depthRatio.value, p.depthRatio, sigma('depthRatio'))],
          line,
        };
      }
      case 'fin-shadow': {
        const az = wallAzimuth(m.observation.wallId);
        const p = predictFinShadow(sun, az);
        const u = from[0] + (p.side === 'left' ? -1 : 1) * p.widthRatio * m.projectionInPlane;
        const reach = Math.max(0.3, 0.5 * Math.abs(to[1] - from[1]));
        const line: [Point2, Point2] = [[u, Math.min(from[1], to[1]) - reach], [u, Math.max(from[1], to[1]) + reach]];
        return {
          ...base, defined: p.defined && Number.isFinite(p.widthRatio), side: p.side, wallAzimuthDeg: az,
          values: [value('widthRatio', m.widthRatio.value, p.widthRatio, sigma('widthRatio'))],
          line,
        };
      }
      case 'pole-shadow': {
        const p = predictPoleShadow(sun);
        const out = [value('shadowAzimuthDeg', m.shadowAzimuthDeg.value, p.shadowAzimuthDeg, sigma('shadowAzimuthDeg'), true)];
        if (m.lengthRatio) out.push(value('lengthRatio', m.lengthRatio.value, p.lengthRatio, sigma('lengthRatio')));
        return {
          ...base, defined: p.defined, values: out,
          direction: [sinDeg(p.shadowAzimuthDeg), cosDeg(p.shadowAzimuthDeg)] as const, // east, north
        };
      }
      case 'eave-shadow': {
        const az = wallAzimuth(m.observation.wallId);
        const p = predictEaveShadow(sun, az, m.projectionRatio);
        const ratio = m.distanceRatio.value;
        // the predicted shadow line: parallel to the foot line, at the predicted distance on the side of the clicked one
        const heightM = original.kind === 'eave-shadow' && original.pixels ? original.pixels.heightM : NaN;
        const [f, along] = [from, m.alongPlane];
        const ex = along[0] - f[0];
        const ey = along[1] - f[1];
        const len = Math.hypot(ex, ey);
        const t = [ex / len, ey / len];
        const side = Math.sign(t[0] * (to[1] - f[1]) - t[1] * (to[0] - f[0])) || 1;
        const n = [-t[1] * side, t[0] * side];
        const dM = p.distanceRatio * heightM;
        const reach = Math.max(0.5, len);
        const line: [Point2, Point2] = [
          [from[0] + n[0] * dM - t[0] * reach, from[1] + n[1] * dM - t[1] * reach],
          [from[0] + n[0] * dM + t[0] * reach, from[1] + n[1] * dM + t[1] * reach],
        ];
        return {
          ...base, defined: p.defined && Number.isFinite(dM), wallAzimuthDeg: az,
          values: [value('distanceRatio', ratio, p.distanceRatio, sigma('distanceRatio'))],
          line,
        };
      }
      case 'shadow-points': {
        const wallId = original.kind === 'shadow-points' ? original.pixels?.wallId : undefined;
        const az = wallId !== undefined ? wallAzimuth(wallId) : undefined;
        const s = sunUnitVector(sun.azimuthDeg, sun.altitudeDeg);
        // the caster's predicted shadow runs from its foot along the anti-sun direction projected on the plane
        const [a, b, n] = wallId !== undefined ? wallAxes(az!) : [[1, 0, 0], [0, 1, 0], [0, 0, 1]] as const;
        const dot = (u: readonly number[]): number => u[0] * s[0] + u[1] * s[1] + u[2] * s[2];
        return {
          ...base, defined: sun.altitudeDeg > 0 && dot(n) > 0, ...(az !== undefined ? { wallAzimuthDeg: az } : {}),
          values: [
            value('sunAzimuthDeg', m.sunAzimuthDeg.value, sun.azimuthDeg, sigma('sunAzimuthDeg'), true),
            value('sunAltitudeDeg', m.sunAltitudeDeg.value, sun.altitudeDeg, sigma('sunAltitudeDeg')),
          ],
          direction: [-dot(a), -dot(b)] as const,
        };
      }
    }
  });
}

/** Wall axes (u, up, outward normal) in the site frame for a wall azimuth, docs/conventions.md. */
function wallAxes(azimuthDeg: number): readonly [readonly number[], readonly number[], readonly number[]] {
  return [[sinDeg(azimuthDeg - 90), cosDeg(azimuthDeg - 90), 0], [0, 0, 1], [sinDeg(azimuthDeg), cosDeg(azimuthDeg), 0]];
}

/** Short label of a plane's points in the overlay: W1, W2 ... for walls in scene order, G for the ground. */
export function planeShortLabel(planeField: string): string {
  const m = /^walls\[(\d+)\]/.exec(planeField);
  return m ? `W${Number(m[1]) + 1}` : 'G';
}

/** Name of a plane in words: the wall's id, or "ground". */
export function planeLabel(scene: Scene, planeField: string): string {
  const m = /^walls\[(\d+)\]/.exec(planeField);
  return m ? scene.walls[Number(m[1])].id : 'ground';
}


/** A plane-frame line as picture pixels, or null when an end lies beyond the plane's horizon line. */
function planeLineToPicture(plane: RectifiedPlane, line: readonly [Point2, Point2]): [Point2, Point2] | null {
  const side = Math.sign(homogeneousW(plane.fit.matrix, plane.planePoints[0]));
  const ends: Point2[] = [];
  for (const p of line) {
    if (Math.sign(homogeneousW(plane.fit.matrix, p)) !== side) return null;
    ends.push(toPictureFrame(applyHomography(plane.fit.matrix, p), plane.image));
  }
  return [ends[0], ends[1]];
}

export interface MeasureOverlayInput {
  readonly scene: Scene;
  readonly image: ImageInfo;
  /** Every rectified plane to draw, by scene path. */
  readonly planes: ReadonlyMap<string, RectifiedPlane>;
  readonly measurements: readonly ResolvedMeasurement[];
  readonly picture?: PictureFile;
  /** Predictions of the best candidate and a one-line caption naming it. */
  readonly best?: { readonly caption: string; readonly predictions: readonly MeasurementPrediction[] };
  /** The camera and the groups' light, when the scene has a camera block and object-shadow pairs. */
  readonly sceneSun?: SceneSun;
}

/**
 * The overlay SVG of `heliochron measure`.
 * @example measureOverlaySvg({ scene, image, planes, measurements }) // '<svg ...>...</svg>'
 */
export function measureOverlaySvg(input: MeasureOverlayInput): string {
  const predictions = new Map((input.best?.predictions ?? []).map((p) => [p.field, p]));
  const overlayPlanes: OverlayPlane[] = [...input.planes].map(([field, plane]) => {
    const shadows: OverlayShadow[] = input.measurements
      .filter((m) => m.measurement.rectification.field === field)
      .map((m) => {
        const obs = input.scene.observations[observationIndex(m.field)];
        const pixels = 'pixels' in obs && obs.kind !== 'moon-direction' ? obs.pixels : undefined;
        const p = predictions.get(m.field);
        const shadow: OverlayShadow = { label: m.measurement.id, fromPx: pixels!.fromPx, toPx: pixels!.toPx };
        return p && p.defined && p.direction ? { ...shadow, predictedDirection: p.direction } : shadow;
      });
    return { label: planeShortLabel(field), plane, shadows };
  });
  const svg = renderOverlaySvg({
    image: input.image,
    planes: overlayPlanes,
    ...(input.picture ? { picture: { bytes: input.picture.bytes, mimeType: input.picture.mimeType } } : {}),
  });
  const extra: string[] = ['<g class="predicted-lines">'];
  for (const m of input.measurements) {
    const p = predictions.get(m.field);
    const plane = input.planes.get(m.measurement.rectification.field);
    if (!p || !p.defined || !p.line || !plane) continue;
    const ends = planeLineToPicture(plane, p.line);
    if (!ends) continue;
    extra.push(
      `<line x1="${r1(ends[0][0])}" y1="${r1(ends[0][1])}" x2="${r1(ends[1][0])}" y2="${r1(ends[1][1])}" ` +
        `stroke="${OVERLAY_COLOURS.predicted}" stroke-width="2" stroke-dasharray="8 5"/>`,
    );
  }
  extra.push('</g>');
  const perspective = input.sceneSun ? cameraOverlayElements(input.sceneSun, input.image) : undefined;
  if (perspective) extra.push(perspective.svg);
  // key, top left, scaled to the picture
  const size = Math.max(12, Math.round(input.image.widthPx / 100));
  const keyLines: { text: string; colour?: string; dash?: string }[] = [...input.planes].map(([field, plane]) => ({
    text: plane.fromCamera
      ? `${field === 'groundPlane' ? 'the ground' : `wall ${planeLabel(input.scene, field)}`}: put into the picture by the camera (no clicked figure)`
      : plane.fromWalls
      ? `${planeShortLabel(field)} corner: where walls ${plane.fromWalls.walls[0].id} and ${plane.fromWalls.walls[1].id} meet the ground (groundPlane.fromWalls.cornerPx); grey: the ground straightened from their foot lines`
      : `${planeShortLabel(field)} 1-${plane.pixelPoints.length}: points clicked on ${field === 'groundPlane' ? 'the ground (groundPlane)' : `wall ${planeLabel(input.scene, field)} (${field})`}; grey: its straightened grid`,
  }));
  if (input.measurements.length > 0) keyLines.push({ text: 'solid: measured shadow, from its clicked root', colour: OVERLAY_COLOURS.measured, dash: '' });
  if (perspective) keyLines.push(...perspective.key);
  if (input.best) {
    keyLines.push({ text: `dashed: predicted by the best candidate, ${input.best.caption}`, colour: OVERLAY_COLOURS.predicted, dash: ' stroke-dasharray="8 5"' });
  }
  const pad = Math.round(size * 0.6);
  const boxW = Math.min(input.image.widthPx - 2 * pad, Math.round(size * 0.52 * Math.max(...keyLines.map((l) => l.text.length)) + 4 * size));
  const boxH = Math.round(keyLines.length * size * 1.5 + pad);
  extra.push(`<g class="key"><rect x="${pad}" y="${pad}" width="${boxW}" height="${boxH}" fill="#ffffff" fill-opacity="0.85" stroke="${OVERLAY_COLOURS.grid}"/>`);
  keyLines.forEach((l, k) => {
    const y = pad + Math.round(size * (1.2 + 1.5 * k));
    const mark = l.colour
      ? `<line x1="${r1(pad + size * 0.5)}" y1="${r1(y - size * 0.35)}" x2="${r1(pad + size * 2.5)}" y2="${r1(y - size * 0.35)}" stroke="${l.colour}" stroke-width="2.5"${l.dash}/>`
      : `<circle cx="${r1(pad + size * 1.5)}" cy="${r1(y - size * 0.35)}" r="4" fill="${OVERLAY_COLOURS.point}"/>`;
    extra.push(`${mark}<text x="${r1(pad + size * 3)}" y="${y}" font-family="sans-serif" font-size="${size}" fill="#222222">${escapeXml(l.text)}</text>`);
  });
  extra.push('</g>');
  return svg.replace(/<\/svg>$/, `${extra.join('\n')}\n</svg>`);
}
