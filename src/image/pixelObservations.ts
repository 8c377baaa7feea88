/**
 * Pixel forms of shadow observations -> the numeric observation values, each
 * with a sigma and a one-line note of how it was obtained.
 *
 * - rod-shadow: the segment root -> shadow point mapped onto the wall
 *   (u right, v up); slope = atan2(-dv, |du|) below the horizontal, side from
 *   the sign of du. Angles survive a similarity, so an aspect-only wall works.
 * - overhang-shadow: vertical wall distance (v_root - v_shadow) over the
 *   projection depth in metres (tan of the vertical shadow angle).
 * - fin-shadow: horizontal wall distance |u_shadow - u_root| over the fin's
 *   depth in metres (tan |HSA|), side from the sign.
 * - pole-shadow: foot -> tip on the ground (east, north); azimuth
 *   atan2(dE, dN) clockwise from north; length over heightM.
 * - eave-shadow and shadow-points: measured in pointPixels.ts, on the same
 *   parameter vectors (pixelSetup.ts).
 * A ratio of a length in the plane to a depth out of it (overhang, fin, pole
 * length) needs the plane in metres: an aspect-only rectangle fixes the plane
 * only up to scale, and those ratios are refused there.
 *
 * Sigma: first-order propagation (src/image/propagation.ts, after Criminisi,
 * Reid and Zisserman 1997) of the clicking sigma of every corner and of both
 * measured points through the refitted homography, plus the metre sigma of
 * projectionM / heightM. For a ground fixed by two walls (groundFromWalls.ts)
 * the plane's inputs are every click of both walls, the corner and the two
 * wall azimuths, the whole chain refitted inside the measurement function.
 * For a plane from the camera (planeFromCamera.ts) the plane's inputs are
 * every clicked point of the camera's lines, the camera refitted inside the
 * measurement function.
 * A Monte Carlo run of the same clicks is given for checking.
 */
import { InvalidInputError } from '../errors.js';
import { atan2Deg, normalizeDeg360 } from '../math/angles.js';
import type { RandomSource } from '../math/random.js';
import type {
  EaveShadowObservation,
  FinShadowObservation,
  OverhangShadowObservation,
  PoleShadowObservation,
  RodShadowObservation,
  ShadowPointsObservation,
  Side,
} from '../scene/types.js';
import { homogeneousW, type Point2 } from './homography.js';
import { checkPixelPoint, toWorkingFrame, type RectifiedPlane, MIN_POINT_SEPARATION_PX } from './planeInImage.js';
import { monteCarloSpread, propagateFirstOrder, type MeasurementFunction } from './propagation.js';
import {
  clickSigma, lengthInputs, mapPoints, needsMetric, planeHow, planeParameterCount, planeParameters, quantityOf, sigmaWords,
  type MeasuredQuantity, type Setup,
} from './pixelSetup.js';
import { measurePointPixels, pointPixelsSetup, type PointPixelMeasurement } from './pointPixels.js';

export { LINEARITY_TOLERANCE, type MeasuredQuantity } from './pixelSetup.js';
import { projectionFromTip } from './planeFromCamera.js';

/** The pixel-form observations this module measures. */
export type PixelObservation =
  | RodShadowObservation
  | OverhangShadowObservation
  | FinShadowObservation
  | PoleShadowObservation
  | EaveShadowObservation
  | ShadowPointsObservation;

/** What a user needs to judge the rectification. */
export interface RectificationReport {
  readonly field: string;
  readonly definition: RectifiedPlane['definition'];
  readonly metric: boolean;
  readonly residualsPx: readonly number[];
  readonly rmsPx: number;
  readonly exactlyDetermined: boolean;
  readonly conditionNumber: number;
  readonly note: string;
}

export interface MeasurementCommon {
  readonly id: string;
  readonly note: string;
  readonly rectification: RectificationReport;
  /** The two measured points in the plane frame (metres, or rectangle heights for aspect-only). */
  readonly fromPlane: Point2;
  readonly toPlane: Point2;
}

export type PixelMeasurement =
  | (MeasurementCommon & { readonly kind: 'rod-shadow'; readonly slopeDeg: MeasuredQuantity; readonly side: Side; readonly observation: RodShadowObservation })
  | (MeasurementCommon & { readonly kind: 'overhang-shadow'; readonly depthRatio: MeasuredQuantity; readonly projectionInPlane: number; readonly observation: OverhangShadowObservation })
  | (MeasurementCommon & { readonly kind: 'fin-shadow'; readonly widthRatio: MeasuredQuantity; readonly side: Side; readonly projectionInPlane: number; readonly observation: FinShadowObservation })
  | (MeasurementCommon & {
      readonly kind: 'pole-shadow';
      readonly shadowAzimuthDeg: MeasuredQuantity;
      readonly lengthRatio?: MeasuredQuantity;
      readonly observation: PoleShadowObservation;
    })
  | PointPixelMeasurement;

/** The report of a rectification's fit, with a plain-words note. */
export function rectificationReport(plane: RectifiedPlane): RectificationReport {
  const fit = plane.fit;
  const worst = Math.max(...fit.residuals);
  const walls = plane.fromWalls?.walls;
  const note = plane.fromCamera
    ? `from the camera (the camera block's lines) and ${plane.kind === 'wall' ? `wall ${plane.fromCamera.wallId}'s stated azimuth` : 'the vertical'}, no clicked figure: ` +
      'known only up to scale, so angles in the plane are measured and ratios to lengths in metres are not; the camera lines\' meeting test is the check'
    : walls
    ? `from the foot lines of walls ${walls[0].id} and ${walls[1].id} meeting at the corner (${walls[0].field}, ${walls[1].field} and groundPlane.fromWalls.cornerPx): ` +
      'two lines through one point fix the ground exactly, so its residual is zero and tells nothing; the residuals of the two walls are the check'
    : fit.exactlyDetermined
    ? 'exactly 4 points: the rectification passes through every click, so its residual is zero and tells nothing about the clicks or the perspective'
    : `rms residual ${fit.rms.toFixed(2)} px, largest ${worst.toFixed(2)} px at point ${fit.residuals.indexOf(worst)}` +
      (fit.rms > 3 * Math.max(1e-9, ...plane.pointSigmasPx)
        ? ': larger than the clicking precision, so a point is misclicked or the drawing does not follow one perspective'
        : ': within the clicking precision');
  return {
    field: plane.field,
    definition: plane.definition,
    metric: plane.metric,
    residualsPx: fit.residuals,
    rmsPx: fit.rms,
    exactlyDetermined: fit.exactlyDetermined,
    conditionNumber: fit.conditionNumber,
    note,
  };
}

/** The pixel-form observations measured on a segment of two points (rod, overhang, fin, pole). */
type SegmentObservation = RodShadowObservation | OverhangShadowObservation | FinShadowObservation | PoleShadowObservation;

/** Plane points of the segment's two points under the plane map refitted to params. */
function mapSegment(plane: RectifiedPlane, params: readonly number[]): { from: Point2; to: Point2 } {
  const [from, to] = mapPoints(plane, params, 2);
  return { from, to };
}

/** The options a measurement may need from the scene: the stated azimuth of the wall it lies on. */
export interface MeasureContext {
  readonly wallAzimuthDeg?: number;
  readonly wallAzimuthSigmaDeg?: number;
}

function setupFor(obs: PixelObservation, plane: RectifiedPlane, field: string, context: MeasureContext): Setup {
  if (obs.kind === 'eave-shadow' || obs.kind === 'shadow-points') return pointPixelsSetup(obs, plane, field, context);
  const seg = obs.pixels;
  if (seg === undefined) throw new InvalidInputError(`${field}.pixels`, seg, 'a pixel form: fromPx and toPx');
  const expectedPlane = obs.kind === 'pole-shadow' ? 'ground' : 'wall';
  if (plane.kind !== expectedPlane) {
    throw new InvalidInputError(`${field}.kind`, obs.kind, `an observation measured on the ${plane.kind}`);
  }
  const image = plane.image;
  checkPixelPoint(seg.fromPx, image, `${field}.pixels.fromPx`);
  checkPixelPoint(seg.toPx, image, `${field}.pixels.toPx`);
  const from = toWorkingFrame(seg.fromPx, image);
  const to = toWorkingFrame(seg.toPx, image);
  if (Math.hypot(from[0] - to[0], from[1] - to[1]) < MIN_POINT_SEPARATION_PX) {
    throw new InvalidInputError(`${field}.pixels.toPx`, seg.toPx, `a point at least ${MIN_POINT_SEPARATION_PX} px from fromPx`);
  }
  // both points on the visible side of the plane's vanishing line, like the corners
  const g = plane.imageToPlane;
  const cornerSide = Math.sign(homogeneousW(g, plane.pixelPoints[0]));
  for (const [name, p, clicked] of [['fromPx', from, seg.fromPx], ['toPx', to, seg.toPx]] as const) {
    if (Math.sign(homogeneousW(g, p)) !== cornerSide) {
      throw new InvalidInputError(`${field}.pixels.${name}`, clicked, `a point on the ${plane.kind} (below its horizon line in the picture)`);
    }
  }
  const pointSigma = clickSigma(seg.sigmaPx, plane, field);
  const p0: number[] = [];
  const sigmas: number[] = [];
  const groups: string[] = [];
  const planeInputs = planeParameters(plane);
  p0.push(...planeInputs.p0);
  sigmas.push(...planeInputs.sigmas);
  groups.push(...planeInputs.p0.map(() => 'plane'));
  p0.push(from[0], from[1], to[0], to[1]);
  sigmas.push(pointSigma, pointSigma, pointSigma, pointSigma);
  groups.push('points', 'points', 'points', 'points');
  const lengthIndex = p0.length;

  switch (obs.kind) {
    case 'rod-shadow': {
      const f: MeasurementFunction = (q) => {
        const { from: a, to: b } = mapSegment(plane, q);
        return [atan2Deg(a[1] - b[1], Math.abs(b[0] - a[0]))]; // slope below horizontal, degrees
      };
      return { p0, sigmas, groups, angular: [false], f, names: ['slopeDeg'] };
    }
    case 'overhang-shadow':
    case 'fin-shadow': {
      const what = obs.kind === 'overhang-shadow' ? 'An overhang depth ratio' : 'A fin width ratio';
      const vertical = obs.kind === 'overhang-shadow';
      const tipPx = obs.pixels!.tipPx;
      if (tipPx !== undefined) {
        // the projection through the camera: the front edge's point straight out from the root (planeFromCamera.ts)
        if (!plane.fromCamera) throw new InvalidInputError(`${field}.pixels.tipPx`, tipPx, 'tipPx only on a wall put into the picture by the camera (no imagePlane)');
        checkPixelPoint(tipPx, image, `${field}.pixels.tipPx`);
        const tip = toWorkingFrame(tipPx, image);
        p0.push(tip[0], tip[1]);
        sigmas.push(pointSigma, pointSigma);
        groups.push('points', 'points');
        const k = planeParameterCount(plane);
        const source = plane.fromCamera;
        const f: MeasurementFunction = (q) => {
          const { from: a, to: b } = mapSegment(plane, q);
          const depth = projectionFromTip(source, q.slice(0, k), a, [q[lengthIndex], q[lengthIndex + 1]]);
          const d = vertical ? a[1] - b[1] : Math.abs(b[0] - a[0]);
          return [d / depth];
        };
        return { p0, sigmas, groups, angular: [false], f, names: [vertical ? 'depthRatio' : 'widthRatio'] };
      }
      needsMetric(plane, field, what);
      const len = lengthInputs(obs.pixels!.projectionM, obs.pixels!.projectionSigmaM, field, 'projectionM', 'projectionSigmaM', true)!;
      p0.push(len.value);
      sigmas.push(len.sigma);
      groups.push('length');
      const f: MeasurementFunction = (q) => {
        const { from: a, to: b } = mapSegment(plane, q);
        const d = vertical ? a[1] - b[1] : Math.abs(b[0] - a[0]);
        return [d / q[lengthIndex]];
      };
      return { p0, sigmas, groups, angular: [false], f, names: [vertical ? 'depthRatio' : 'widthRatio'] };
    }
    case 'pole-shadow': {
      const len = lengthInputs(obs.pixels!.heightM, obs.pixels!.heightSigmaM, field, 'heightM', 'heightSigmaM', false);
      if (len) {
        needsMetric(plane, field, 'A pole length ratio');
        p0.push(len.value);
        sigmas.push(len.sigma);
        groups.push('length');
      }
      const f: MeasurementFunction = (q) => {
        const { from: a, to: b } = mapSegment(plane, q);
        const dE = b[0] - a[0];
        const dN = b[1] - a[1];
        const az = normalizeDeg360(atan2Deg(dE, dN)); // clockwise from north
        return len ? [az, Math.hypot(dE, dN) / q[lengthIndex]] : [az];
      };
      return {
        p0, sigmas, groups, angular: len ? [true, false] : [true], f,
        names: len ? ['shadowAzimuthDeg', 'lengthRatio'] : ['shadowAzimuthDeg'],
      };
    }
  }
}

/** How far the overhang or fin stands out, in the plane's units, with words for the note. */
function projectionOf(obs: OverhangShadowObservation | FinShadowObservation, plane: RectifiedPlane, p0: readonly number[]): { value: number; unit: string; words: string } {
  const px = obs.pixels!;
  if (px.tipPx !== undefined && plane.fromCamera) {
    const k = planeParameterCount(plane);
    const { from } = mapSegment(plane, p0);
    const value = projectionFromTip(plane.fromCamera, p0.slice(0, k), from, [p0[k + 4], p0[k + 5]]);
    return { value, unit: "of the camera's distance to the wall", words: `${fmt(value, 3)} of the same unit, from the clicked tip point (scale-free ratio)` };
  }
  return { value: px.projectionM!, unit: 'm', words: `${px.projectionM} m` };
}

function fmt(v: number, digits: number): string {
  return v.toFixed(digits);
}

/**
 * Measure a pixel-form observation on its rectified plane.
 * @param field path of the observation in the scene, e.g. `observations[3]`
 * @param context the stated azimuth of the wall a point pair lies on (shadow-points on a wall of known size)
 */
export function measurePixelObservation(obs: PixelObservation, plane: RectifiedPlane, field: string, context: MeasureContext = {}): PixelMeasurement {
  const setup = setupFor(obs, plane, field, context);
  const fo = propagateFirstOrder(setup.f, setup.p0, setup.sigmas, setup.angular, setup.groups);
  const rectification = rectificationReport(plane);
  if (obs.kind === 'eave-shadow' || obs.kind === 'shadow-points') return measurePointPixels(obs, plane, field, setup, fo, rectification, context);
  return measureSegment(obs, plane, field, setup, fo, rectification);
}

function measureSegment(
  obs: SegmentObservation,
  plane: RectifiedPlane,
  field: string,
  setup: Setup,
  fo: ReturnType<typeof propagateFirstOrder>,
  rectification: RectificationReport,
): PixelMeasurement {
  const q = (k: number): MeasuredQuantity => quantityOf(fo, k);
  const { from, to } = mapSegment(plane, setup.p0);
  const unit = plane.metric ? 'm' : plane.fromCamera ? "camera's distances to the plane" : 'rectangle heights';
  const how = planeHow(plane);
  const sigmaText = (m: MeasuredQuantity, d: number): string => sigmaWords(plane, m, d);
  const common = { id: obs.id, rectification, fromPlane: from, toPlane: to };
  switch (obs.kind) {
    case 'rod-shadow': {
      const slope = q(0);
      const side: Side = to[0] - from[0] < 0 ? 'left' : 'right';
      if (!(to[1] < from[1])) {
        throw new InvalidInputError(
          `${field}.pixels.toPx`,
          obs.pixels!.toPx,
          'a shadow point below the rod root on the wall (the shadow of a rod runs downwards)',
          `On the wall it lies ${fmt(to[1] - from[1], 3)} ${unit} above the root`,
        );
      }
      const note = `slope ${fmt(slope.value, 2)} deg below horizontal, down to the ${side}, ${how}; ${sigmaText(slope, 2)} deg`;
      const { pixels: _p, ...rest } = obs;
      return { ...common, kind: obs.kind, slopeDeg: slope, side, note, observation: { ...rest, slopeDeg: slope.value, side, sigmaDeg: slope.sigma } };
    }
    case 'overhang-shadow': {
      const ratio = q(0);
      if (!(ratio.value >= 0)) {
        throw new InvalidInputError(`${field}.pixels.toPx`, obs.pixels!.toPx, 'a shadow point on or below the overhang root line', plane.fromCamera ? 'On the wall it lies above the root line (a wall put in the picture by the camera has no metres: the distance is not given)' : `On the wall it lies ${fmt(Math.abs(to[1] - from[1]), 3)} m above the root line`);
      }
      const projection = projectionOf(obs, plane, setup.p0);
      const note = `depth ratio ${fmt(ratio.value, 4)} (shadow depth ${fmt(from[1] - to[1], 3)} ${projection.unit} over projection ${projection.words}), ${how}; ${sigmaText(ratio, 4)}`;
      const { pixels: _p, ...rest } = obs;
      return { ...common, kind: obs.kind, depthRatio: ratio, projectionInPlane: projection.value, note, observation: { ...rest, depthRatio: ratio.value, sigma: ratio.sigma } };
    }
    case 'fin-shadow': {
      const ratio = q(0);
      const side: Side = to[0] - from[0] < 0 ? 'left' : 'right';
      const projection = projectionOf(obs, plane, setup.p0);
      const note = `width ratio ${fmt(ratio.value, 4)} to the ${side} (shadow width ${fmt(Math.abs(to[0] - from[0]), 3)} ${projection.unit} over fin depth ${projection.words}), ${how}; ${sigmaText(ratio, 4)}`;
      const { pixels: _p, ...rest } = obs;
      return { ...common, kind: obs.kind, widthRatio: ratio, side, projectionInPlane: projection.value, note, observation: { ...rest, widthRatio: ratio.value, side, sigma: ratio.sigma } };
    }
    case 'pole-shadow': {
      const az = q(0);
      const ratio = setup.names.length > 1 ? q(1) : undefined;
      const note =
        `shadow azimuth ${fmt(az.value, 2)} deg, ${sigmaText(az, 2)} deg` +
        (ratio ? `; length ratio ${fmt(ratio.value, 4)} over height ${obs.pixels!.heightM} m, ${sigmaText(ratio, 4)}` : '; no heightM, so no length ratio') +
        `; ${how}`;
      const { pixels: _p, ...rest } = obs;
      const observation: PoleShadowObservation = ratio
        ? { ...rest, shadowAzimuthDeg: az.value, shadowAzimuthSigmaDeg: az.sigma, lengthRatio: ratio.value, lengthRatioSigma: ratio.sigma }
        : { ...rest, shadowAzimuthDeg: az.value, shadowAzimuthSigmaDeg: az.sigma };
      return { ...common, kind: obs.kind, shadowAzimuthDeg: az, ...(ratio ? { lengthRatio: ratio } : {}), note, observation };
    }
  }
}

/** Monte Carlo spread of the same measurement: every click (and length) perturbed by its sigma. */
export function monteCarloPixelObservation(
  obs: PixelObservation,
  plane: RectifiedPlane,
  field: string,
  rng: RandomSource,
  samples: number,
  context: MeasureContext = {},
): { readonly names: readonly string[]; readonly values: readonly number[]; readonly means: readonly number[]; readonly sigmas: readonly number[]; readonly samples: number } {
  if (!(Number.isInteger(samples) && samples >= 2)) throw new InvalidInputError('samples', samples, 'a whole number of samples, 2 or more');
  const setup = setupFor(obs, plane, field, context);
  const mc = monteCarloSpread(setup.f, setup.p0, setup.sigmas, setup.angular, rng, samples);
  return { names: setup.names, ...mc };
}
