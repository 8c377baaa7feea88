/**
 * Pixel forms of an eave's shadow line on the ground and of a caster-shadow point pair on a plane -> the
 * numeric observation values (groundShadows.ts, pointShadows.ts), each with a sigma and a one-line note.
 *
 * - eave-shadow, on the ground plane in metres: fromPx and alongPx on the wall's foot line, toPx on the eave's
 *   shadow line. d = |(L - F) x (S - F)| / |L - F|, the distance of the shadow point from the foot line
 *   (common practice: distance of a point from a line through two points). distanceRatio = d / h and
 *   projectionRatio = p / h with the stated eave height h and projection p. The model reads only
 *   c = p / h - d / h = 1 / tan(VSA) and holds projectionRatio at its stated value, so the value measured is
 *   p0 / h0 - c: at the stated lengths it equals d / h, and its sigma carries the errors of the clicks, of h and
 *   of p together (first order and Monte Carlo alike). A plane known only up to scale (camera, aspect only) is
 *   refused: d / h compares a length on the ground with a height in metres.
 * - shadow-points: fromPx is the caster's foot on the plane (straight below it on the ground, straight behind it
 *   on a wall), toPx its shadow point. In plane coordinates (a, b) and an offset c along the plane's normal
 *   N = A x B (ground: east, north, up; wall: u, v and the outward normal, docs/conventions.md) the caster is
 *   (a_F, b_F, h) and the shadow (a_S, b_S, 0). On a plane of known size h is the stated heightM; on a plane put
 *   into the picture by the camera (planeFromCamera.ts) the caster is clicked at objectPx and c is the
 *   least-squares solution of the two linear equations x (p3 + c q3) = p1 + c q1, y (p3 + c q3) = p2 + c q2,
 *   with p = H (a_F, b_F, 1) and q = K R N (Hartley and Zisserman 2003, sec. 8.1.1, eq. (8.1)): the scale of the
 *   plane cancels in the direction. The values are the azimuth and altitude of the direction from the shadow to
 *   the caster (the sun direction the pair gives). The numeric form written for the solver holds the two points
 *   in site coordinates (metres; for a camera plane in units of the camera's distance to the plane, which the
 *   model does not see, since it uses their direction only) and sigmaM chosen so that the model's angular sigma
 *   sqrt(2) sigmaM / distance (pointShadows.ts) equals the larger of the altitude sigma and the azimuth sigma
 *   times cos(altitude): one round sigma that is never smaller than either.
 * On a wall of known size the wall's stated azimuth (and its sigma) turns the wall's axes into site directions;
 * on a camera wall the azimuth is held fixed, as in the camera itself.
 *
 * Leaves out: a ground that is not level, a caster's foot that is not straight below (or behind) it, an eave
 * edge that is not parallel to the wall.
 */
import { InvalidInputError } from '../errors.js';
import { atan2Deg, cosDeg, normalizeDeg360, RAD_PER_DEG, sinDeg } from '../math/angles.js';
import type { EaveShadowObservation, ShadowPointsObservation, SitePoint } from '../scene/types.js';
import type { Point2 } from './homography.js';
import type { MeasureContext, MeasurementCommon, RectificationReport } from './pixelObservations.js';
import { checkPixelPoint, MIN_POINT_SEPARATION_PX, toWorkingFrame, type RectifiedPlane } from './planeInImage.js';
import type { FirstOrderResult, MeasurementFunction } from './propagation.js';
import { cameraPlaneNormal, cameraPlaneProjectionOf } from './planeFromCamera.js';
import {
  clickSigma, lengthInputs, mapPoints, measuredPoint, needsMetric, planeHow, planeParameters, quantityOf, sigmaWords,
  type MeasuredQuantity, type Setup,
} from './pixelSetup.js';
import type { Vector3 } from './cameraModel.js';

export type PointPixelMeasurement =
  | (MeasurementCommon & {
      readonly kind: 'eave-shadow';
      readonly distanceRatio: MeasuredQuantity;
      readonly projectionRatio: number;
      /** Distance of the clicked shadow point from the foot line, metres. */
      readonly distanceM: number;
      /** The foot line's second point (alongPx) in the ground frame; fromPlane is its first. */
      readonly alongPlane: Point2;
      readonly observation: EaveShadowObservation;
    })
  | (MeasurementCommon & {
      readonly kind: 'shadow-points';
      readonly sunAzimuthDeg: MeasuredQuantity;
      readonly sunAltitudeDeg: MeasuredQuantity;
      readonly caster: SitePoint;
      readonly shadow: SitePoint;
      readonly observation: ShadowPointsObservation;
    });

/**
 * The sigma in metres of both points of a shadow-points observation that gives, through the model's
 * sqrt(2) sigmaM / distance (pointShadows.ts), the larger of the two angular sigmas across the ray.
 * @example shadowPointsSigmaM(10, 0.5, 0.4, 60) // 10 * 0.4 deg in radians / sqrt(2) = 0.0494
 */
export function shadowPointsSigmaM(distance: number, azimuthSigmaDeg: number, altitudeSigmaDeg: number, altitudeDeg: number): number {
  const acrossDeg = Math.max(altitudeSigmaDeg, azimuthSigmaDeg * cosDeg(altitudeDeg));
  return (acrossDeg * RAD_PER_DEG * distance) / Math.SQRT2;
}

/** Site axes (A, B, N) of a plane: ground east, north, up; wall u, up and the outward normal (azimuth in degrees). */
function planeAxes(plane: RectifiedPlane, wallAzimuthDeg: number): readonly [Vector3, Vector3, Vector3] {
  if (plane.fromCamera) return [plane.fromCamera.axisA, plane.fromCamera.axisB, cameraPlaneNormal(plane.fromCamera)];
  if (plane.kind === 'ground') return [[1, 0, 0], [0, 1, 0], [0, 0, 1]];
  const u = wallAzimuthDeg - 90; // u points to azimuth (normal - 90 deg), docs/conventions.md
  return [[sinDeg(u), cosDeg(u), 0], [0, 0, 1], [sinDeg(wallAzimuthDeg), cosDeg(wallAzimuthDeg), 0]];
}

function siteOf(axes: readonly [Vector3, Vector3, Vector3], a: number, b: number, c: number): SitePoint {
  const [A, B, N] = axes;
  return [a * A[0] + b * B[0] + c * N[0], a * A[1] + b * B[1] + c * N[1], a * A[2] + b * B[2] + c * N[2]];
}

/** Offset along the plane's normal of the camera-plane point over (a, b) that images at the working-frame point o. */
function liftFromCamera(plane: RectifiedPlane, params: readonly number[], foot: Point2, o: Point2): number {
  const { homography: h, normalImage: q } = cameraPlaneProjectionOf(plane.fromCamera!, params);
  const p = [h[0] * foot[0] + h[1] * foot[1] + h[2], h[3] * foot[0] + h[4] * foot[1] + h[5], h[6] * foot[0] + h[7] * foot[1] + h[8]];
  // c (q_i - x_i q3) = x_i p3 - p_i for i = x, y; least squares in the one unknown c
  const a1 = q[0] - o[0] * q[2];
  const a2 = q[1] - o[1] * q[2];
  const b1 = o[0] * p[2] - p[0];
  const b2 = o[1] * p[2] - p[1];
  return (a1 * b1 + a2 * b2) / (a1 * a1 + a2 * a2);
}

interface PointPairGeometry {
  readonly caster: SitePoint;
  readonly shadow: SitePoint;
  readonly azimuthDeg: number;
  readonly altitudeDeg: number;
  readonly offset: number;
}

function pointPairAt(plane: RectifiedPlane, q: readonly number[], index: { height: number; object: number; azimuth: number }, fallbackAzimuth: number): PointPairGeometry {
  const [foot, shade] = mapPoints(plane, q, 2);
  const offset = plane.fromCamera ? liftFromCamera(plane, q, foot, [q[index.object], q[index.object + 1]]) : q[index.height];
  const axes = planeAxes(plane, index.azimuth >= 0 ? q[index.azimuth] : fallbackAzimuth);
  const caster = siteOf(axes, foot[0], foot[1], offset);
  const shadow = siteOf(axes, shade[0], shade[1], 0);
  const v = [caster[0] - shadow[0], caster[1] - shadow[1], caster[2] - shadow[2]];
  return {
    caster, shadow, offset,
    azimuthDeg: normalizeDeg360(atan2Deg(v[0], v[1])), // clockwise from north: east = sin, north = cos
    altitudeDeg: atan2Deg(v[2], Math.hypot(v[0], v[1])),
  };
}

/** Indices of the stated inputs in a shadow-points parameter vector (by their group); -1 when absent. */
function pointPairIndex(groups: readonly string[]): { height: number; object: number; azimuth: number } {
  return { height: groups.indexOf('length'), object: groups.indexOf('object'), azimuth: groups.indexOf('azimuth') };
}

function eaveSetup(obs: EaveShadowObservation, plane: RectifiedPlane, field: string, base: { p0: number[]; sigmas: number[]; groups: string[] }): Setup {
  const px = obs.pixels!;
  if (plane.kind !== 'ground') throw new InvalidInputError(`${field}.kind`, obs.kind, `an observation measured on the ${plane.kind}`);
  needsMetric(plane, field, 'An eave shadow distance ratio');
  const along = measuredPoint(plane, px.alongPx, `${field}.pixels.alongPx`);
  const from = [base.p0[base.p0.length - 4], base.p0[base.p0.length - 3]];
  if (Math.hypot(along[0] - from[0], along[1] - from[1]) < MIN_POINT_SEPARATION_PX) {
    throw new InvalidInputError(`${field}.pixels.alongPx`, px.alongPx, `a second point of the wall's foot line at least ${MIN_POINT_SEPARATION_PX} px from fromPx`);
  }
  const s = clickSigma(px.sigmaPx, plane, field);
  const { p0, sigmas, groups } = base;
  p0.push(along[0], along[1]);
  sigmas.push(s, s);
  groups.push('points', 'points');
  const height = lengthInputs(px.heightM, px.heightSigmaM, field, 'heightM', 'heightSigmaM', true)!;
  const projection = lengthInputs(px.projectionM, px.projectionSigmaM, field, 'projectionM', 'projectionSigmaM', true, true)!;
  const hi = p0.length;
  p0.push(height.value, projection.value);
  sigmas.push(height.sigma, projection.sigma);
  groups.push('length', 'length');
  const stated = projection.value / height.value;
  const f: MeasurementFunction = (q) => {
    const [F, S, L] = mapPoints(plane, q, 3);
    const ex = L[0] - F[0];
    const ey = L[1] - F[1];
    const d = Math.abs(ex * (S[1] - F[1]) - ey * (S[0] - F[0])) / Math.hypot(ex, ey);
    return [stated - (q[hi + 1] - d) / q[hi]]; // p0/h0 - cot(VSA), see the header
  };
  return { p0, sigmas, groups, angular: [false], f, names: ['distanceRatio'] };
}

function pointPairSetup(obs: ShadowPointsObservation, plane: RectifiedPlane, field: string, base: { p0: number[]; sigmas: number[]; groups: string[] }, context: MeasureContext): Setup {
  const px = obs.pixels!;
  const expected = px.wallId === undefined ? 'ground' : 'wall';
  if (plane.kind !== expected) throw new InvalidInputError(`${field}.pixels`, px.wallId ?? 'ground', `a point pair on the ${plane.kind}`);
  const { p0, sigmas, groups } = base;
  if (plane.fromCamera) {
    if (px.objectPx === undefined) {
      throw new InvalidInputError(`${field}.pixels.objectPx`, undefined, 'the image point of the caster [xPx, yPx]',
        `The ${plane.kind} comes from the camera, known only up to scale, so a height in metres cannot be placed on it; click the caster itself`);
    }
    const s = clickSigma(px.sigmaPx, plane, field);
    // the caster stands off the plane, so it may lie beyond the plane's horizon line: only inside the picture
    checkPixelPoint(px.objectPx, plane.image, `${field}.pixels.objectPx`);
    const o = toWorkingFrame(px.objectPx, plane.image);
    p0.push(o[0], o[1]);
    sigmas.push(s, s);
    groups.push('object', 'object');
  } else {
    if (px.objectPx !== undefined) {
      throw new InvalidInputError(`${field}.pixels.objectPx`, px.objectPx, 'no objectPx on a plane of known size: give heightM, the caster\'s distance from the plane in metres',
        'Only a camera block places a clicked caster in space');
    }
    needsMetric(plane, field, 'A point pair');
    const height = lengthInputs(px.heightM, px.heightSigmaM, field, 'heightM', 'heightSigmaM', true)!;
    p0.push(height.value);
    sigmas.push(height.sigma);
    groups.push('length');
    if (plane.kind === 'wall') {
      if (context.wallAzimuthDeg === undefined) throw new InvalidInputError(`${field}.pixels.wall`, px.wallId, 'a wall of stated azimuth');
      p0.push(context.wallAzimuthDeg);
      sigmas.push(context.wallAzimuthSigmaDeg ?? 0);
      groups.push('azimuth');
    }
  }
  const index = pointPairIndex(groups);
  const f: MeasurementFunction = (q) => {
    const g = pointPairAt(plane, q, index, context.wallAzimuthDeg ?? 0);
    return [g.azimuthDeg, g.altitudeDeg];
  };
  return { p0, sigmas, groups, angular: [true, false], f, names: ['sunAzimuthDeg', 'sunAltitudeDeg'] };
}

/** The parameter vector of an eave or point-pair measurement: plane inputs, then fromPx and toPx, then its own. */
export function pointPixelsSetup(obs: EaveShadowObservation | ShadowPointsObservation, plane: RectifiedPlane, field: string, context: MeasureContext): Setup {
  const px = obs.pixels;
  if (px === undefined) throw new InvalidInputError(`${field}.pixels`, px, 'a pixel form: fromPx and toPx');
  const from = measuredPoint(plane, px.fromPx, `${field}.pixels.fromPx`);
  const to = measuredPoint(plane, px.toPx, `${field}.pixels.toPx`);
  if (Math.hypot(from[0] - to[0], from[1] - to[1]) < MIN_POINT_SEPARATION_PX) {
    throw new InvalidInputError(`${field}.pixels.toPx`, px.toPx, `a point at least ${MIN_POINT_SEPARATION_PX} px from fromPx`);
  }
  const s = clickSigma(px.sigmaPx, plane, field);
  const inputs = planeParameters(plane);
  const base = {
    p0: [...inputs.p0, from[0], from[1], to[0], to[1]],
    sigmas: [...inputs.sigmas, s, s, s, s],
    groups: [...inputs.p0.map(() => 'plane'), 'points', 'points', 'points', 'points'],
  };
  return obs.kind === 'eave-shadow' ? eaveSetup(obs, plane, field, base) : pointPairSetup(obs, plane, field, base, context);
}

const round = (v: number): number => Number(v.toFixed(12));

/** The measurement of an eave or a point pair from its setup and first-order result. */
export function measurePointPixels(
  obs: EaveShadowObservation | ShadowPointsObservation,
  plane: RectifiedPlane,
  field: string,
  setup: Setup,
  fo: FirstOrderResult,
  rectification: RectificationReport,
  context: MeasureContext,
): PointPixelMeasurement {
  const [from, to] = mapPoints(plane, setup.p0, 2);
  const common = { id: obs.id, rectification, fromPlane: from, toPlane: to };
  const how = planeHow(plane);
  const { pixels: _p, ...rest } = obs;
  if (obs.kind === 'eave-shadow') {
    const px = obs.pixels!;
    const ratio = quantityOf(fo, 0);
    const projectionRatio = px.projectionM / px.heightM;
    const distanceM = ratio.value * px.heightM;
    const note = `distance ratio ${ratio.value.toFixed(4)} (shadow line ${distanceM.toFixed(3)} m from the wall foot over eave height ${px.heightM} m` +
      `${px.projectionM > 0 ? `, eave projection ${px.projectionM} m` : ''}), ${how}; ${sigmaWords(plane, ratio, 4)}`;
    return {
      ...common, kind: 'eave-shadow', distanceRatio: ratio, projectionRatio, distanceM, alongPlane: mapPoints(plane, setup.p0, 3)[2], note,
      observation: { ...(rest as Omit<EaveShadowObservation, 'pixels'>), distanceRatio: ratio.value, sigma: ratio.sigma, projectionRatio },
    };
  }
  const az = quantityOf(fo, 0);
  const alt = quantityOf(fo, 1);
  const g = pointPairAt(plane, setup.p0, pointPairIndex(setup.groups), context.wallAzimuthDeg ?? 0);
  if (!(g.altitudeDeg > 0) || (plane.fromCamera && !(g.offset > 0))) {
    throw new InvalidInputError(`${field}.pixels.toPx`, obs.pixels!.toPx, 'a shadow point below its caster (the sun above the horizon casts shadows downwards)',
      plane.fromCamera && !(g.offset > 0) ? `The caster clicked at objectPx lies behind the ${plane.kind}, not in front of it` : `The direction from the shadow to the caster rises ${g.altitudeDeg.toFixed(2)} deg`);
  }
  const caster = g.caster.map(round) as unknown as SitePoint;
  const shadow = g.shadow.map(round) as unknown as SitePoint;
  const distance = Math.hypot(caster[0] - shadow[0], caster[1] - shadow[1], caster[2] - shadow[2]);
  const unit = plane.fromCamera ? " (in units of the camera's distance to the plane)" : ' m';
  const note = `sun direction azimuth ${az.value.toFixed(2)} deg, ${sigmaWords(plane, az, 2)} deg; altitude ${alt.value.toFixed(2)} deg, ${sigmaWords(plane, alt, 2)} deg` +
    ` (caster ${plane.fromCamera ? 'clicked, placed by the camera' : `${obs.pixels!.heightM} m out of the plane`}, ${(distance).toFixed(3)}${unit} from its shadow); ${how}`;
  const sigmaM = shadowPointsSigmaM(distance, az.sigma, alt.sigma, alt.value);
  return {
    ...common, kind: 'shadow-points', sunAzimuthDeg: az, sunAltitudeDeg: alt, caster, shadow, note,
    observation: { ...(rest as Omit<ShadowPointsObservation, 'pixels'>), caster, shadow, sigmaM },
  };
}
