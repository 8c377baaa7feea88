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
  FinShadowObservation,
  OverhangShadowObservation,
  PoleShadowObservation,
  RodShadowObservation,
  Side,
} from '../scene/types.js';
import { applyHomography, fitHomographyDlt, homogeneousW, invertHomography, type Homography, type Point2 } from './homography.js';
import { checkPixelPoint, toWorkingFrame, type RectifiedPlane, MIN_POINT_SEPARATION_PX } from './planeInImage.js';
import { groundFromWallsParameterCount, groundFromWallsParameters, groundHomographyOf } from './groundFromWalls.js';
import { monteCarloSpread, propagateFirstOrder, type MeasurementFunction } from './propagation.js';
import { cameraPlaneHomographyOf, projectionFromTip, cameraPlaneParameterCount, cameraPlaneParameters } from './planeFromCamera.js';

/** The pixel-form observations this module measures. */
export type PixelObservation =
  | RodShadowObservation
  | OverhangShadowObservation
  | FinShadowObservation
  | PoleShadowObservation;

/** A measured number with its first-order sigma and the parts of that sigma. */
export interface MeasuredQuantity {
  readonly value: number;
  readonly sigma: number;
  /** Part of the sigma from the clicked corners (the rectification) alone. */
  readonly sigmaFromPlane: number;
  /** Part from the two clicked points of the observation alone. */
  readonly sigmaFromPoints: number;
  /** Part from the sigma of projectionM / heightM alone. */
  readonly sigmaFromLength: number;
  /**
   * False when the measurement (any of its values, since they share the clicks) bends noticeably within
   * two sigmas of the clicks (nonlinearity above LINEARITY_TOLERANCE, see src/image/propagation.ts): then the first-order sigma may be far from the
   * true spread, and the Monte Carlo spread is the one to use.
   */
  readonly firstOrderReliable: boolean;
  readonly nonlinearity: number;
}

/**
 * Largest nonlinearity (src/image/propagation.ts) for a trusted first-order sigma. Chosen on the synthetic
 * cameras of tests/image: well-conditioned cases stay below 0.2, the cases where the first-order sigma is
 * several times off the Monte Carlo spread reach 1 and more.
 */
export const LINEARITY_TOLERANCE = 0.3;

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

interface MeasurementCommon {
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
    });

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

/** Everything one observation's measurement depends on, as a parameter vector. */
interface Setup {
  readonly p0: number[];
  readonly sigmas: number[];
  readonly groups: string[];
  readonly angular: boolean[];
  readonly f: MeasurementFunction;
  readonly names: readonly string[];
}

/**
 * The inputs that fix a plane, as the first entries of a parameter vector, with their sigmas and groups:
 * its clicked points (x, y each), or for a ground from two walls every click of both walls, the corner
 * and the two wall azimuths (groundFromWalls.ts), so that the Jacobian covers the whole chain.
 */
function planeParameters(plane: RectifiedPlane): { p0: number[]; sigmas: number[] } {
  if (plane.fromWalls) return groundFromWallsParameters(plane.fromWalls);
  if (plane.fromCamera) return cameraPlaneParameters(plane.fromCamera);
  const p0: number[] = [];
  const sigmas: number[] = [];
  plane.pixelPoints.forEach((p, i) => {
    p0.push(p[0], p[1]);
    sigmas.push(plane.pointSigmasPx[i], plane.pointSigmasPx[i]);
  });
  return { p0, sigmas };
}

/** Number of entries planeParameters gives. */
function planeParameterCount(plane: RectifiedPlane): number {
  if (plane.fromCamera) return cameraPlaneParameterCount(plane.fromCamera);
  return plane.fromWalls ? groundFromWallsParameterCount(plane.fromWalls) : 2 * plane.pixelPoints.length;
}

/** Plane point of a working-frame pixel point under the inverse of the homography refitted to params. */
function mapSegment(plane: RectifiedPlane, params: readonly number[]): { from: Point2; to: Point2 } {
  const k = planeParameterCount(plane);
  let h: Homography;
  if (plane.fromWalls) {
    h = groundHomographyOf(plane.fromWalls, params);
  } else if (plane.fromCamera) {
    h = cameraPlaneHomographyOf(plane.fromCamera, params);
  } else {
    const px: Point2[] = [];
    for (let i = 0; i < k / 2; i++) px.push([params[2 * i], params[2 * i + 1]]);
    h = fitHomographyDlt(plane.planePoints, px).matrix;
  }
  const g = invertHomography(h);
  return {
    from: applyHomography(g, [params[k], params[k + 1]]),
    to: applyHomography(g, [params[k + 2], params[k + 3]]),
  };
}

function lengthInputs(
  value: number | undefined,
  sigma: number | undefined,
  field: string,
  name: string,
  sigmaName: string,
  required: boolean,
): { value: number; sigma: number } | undefined {
  if (value === undefined && !required) return undefined;
  if (!(typeof value === 'number' && Number.isFinite(value) && value > 0)) {
    throw new InvalidInputError(`${field}.pixels.${name}`, value, 'a length in metres greater than 0');
  }
  const s = sigma ?? 0;
  if (!(Number.isFinite(s) && s >= 0)) {
    throw new InvalidInputError(`${field}.pixels.${sigmaName}`, sigma, 'a sigma in metres, 0 or more');
  }
  return { value, sigma: s };
}

function needsMetric(plane: RectifiedPlane, field: string, what: string): void {
  if (plane.fromCamera) {
    const where = plane.kind === 'wall' ? `wall ${plane.fromCamera.wallId} (its imagePlane` : 'the ground (groundPlane';
    throw new InvalidInputError(
      `${field}.pixels`,
      'a plane from the camera only',
      `a figure of known size on ${where} with widthM and heightM, or planePointsM) for ${field}`,
      `${what} compares a length in the plane with a length out of it in metres; the camera fixes the ${plane.kind} only up to scale (its distance is unknown)`,
    );
  }
  if (!plane.metric) {
    throw new InvalidInputError(
      `${plane.field}.aspect`,
      plane.definition,
      `a plane known in metres (widthM with heightM, or planePointsM) for ${field}`,
      `${what} compares a length in the plane with a length out of it in metres; an aspect-only rectangle gives lengths in the plane only up to scale`,
    );
  }
}

function setupFor(obs: PixelObservation, plane: RectifiedPlane, field: string): Setup {
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
  const pointSigma = seg.sigmaPx ?? image.pixelSigmaPx;
  if (!(Number.isFinite(pointSigma) && pointSigma >= 0)) {
    throw new InvalidInputError(`${field}.pixels.sigmaPx`, seg.sigmaPx, 'a sigma in pixels, 0 or more');
  }
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
 */
export function measurePixelObservation(obs: PixelObservation, plane: RectifiedPlane, field: string): PixelMeasurement {
  const setup = setupFor(obs, plane, field);
  const fo = propagateFirstOrder(setup.f, setup.p0, setup.sigmas, setup.angular, setup.groups);
  const q = (k: number): MeasuredQuantity => ({
    value: fo.values[k],
    sigma: fo.sigmas[k],
    sigmaFromPlane: fo.sigmasByGroup.plane?.[k] ?? 0,
    sigmaFromPoints: fo.sigmasByGroup.points?.[k] ?? 0,
    sigmaFromLength: fo.sigmasByGroup.length?.[k] ?? 0,
    firstOrderReliable: Math.max(...fo.nonlinearity) <= LINEARITY_TOLERANCE,
    nonlinearity: fo.nonlinearity[k],
  });
  const { from, to } = mapSegment(plane, setup.p0);
  const rectification = rectificationReport(plane);
  const unit = plane.metric ? 'm' : plane.fromCamera ? "camera's distances to the plane" : 'rectangle heights';
  const how = plane.fromCamera
    ? `on ${plane.kind === 'wall' ? `wall ${plane.fromCamera.wallId}` : 'the ground'} put into the picture by the camera (no clicked figure)`
    : plane.fromWalls
    ? `clicked on ${plane.field} (from the foot lines of walls ${plane.fromWalls.walls[0].id} and ${plane.fromWalls.walls[1].id} meeting at the corner)`
    : `clicked on ${plane.field} (${plane.definition === 'points' ? `${plane.planePoints.length} plane points` : plane.definition === 'rectangle' ? 'rectangle of known size' : 'rectangle of known aspect'}` +
    `${plane.fit.exactlyDetermined ? ', exact 4-point fit' : `, rms ${fmt(plane.fit.rms, 2)} px`})`;
  const sigmaText = (m: MeasuredQuantity, d: number): string =>
    `sigma ${fmt(m.sigma, d)} by first-order propagation (${plane.fromCamera ? 'camera lines' : 'corners'} ${fmt(m.sigmaFromPlane, d)}, points ${fmt(m.sigmaFromPoints, d)}` +
    `${m.sigmaFromLength > 0 ? `, length ${fmt(m.sigmaFromLength, d)}` : ''})` +
    (m.firstOrderReliable ? '' : ' NOT RELIABLE: the value bends within one clicking error (points far outside the clicked figure or near its horizon line); use the Monte Carlo spread');
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
        throw new InvalidInputError(`${field}.pixels.toPx`, obs.pixels!.toPx, 'a shadow point on or below the overhang root line', `On the wall it lies ${fmt(to[1] - from[1], 3)} m above the root line`);
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
): { readonly names: readonly string[]; readonly values: readonly number[]; readonly means: readonly number[]; readonly sigmas: readonly number[]; readonly samples: number } {
  if (!(Number.isInteger(samples) && samples >= 2)) throw new InvalidInputError('samples', samples, 'a whole number of samples, 2 or more');
  const setup = setupFor(obs, plane, field);
  const mc = monteCarloSpread(setup.f, setup.p0, setup.sigmas, setup.angular, rng, samples);
  return { names: setup.names, ...mc };
}
