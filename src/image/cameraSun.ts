/**
 * The sun's direction from object points and their shadow points clicked on
 * the picture, through the picture's camera (camera.ts).
 *
 * Geometry: the shadow S of a point O in sunlight lies on the ray from O away
 * from the sun, S = O - t s (t > 0, s the unit vector towards the sun), on
 * whatever surface the shadow falls. In the picture, the line through o and
 * s is therefore the image of a sun ray, and all such lines meet at the
 * vanishing point of the sun's direction (Kee, O'Brien and Farid, "Exposing
 * photo manipulation with inconsistent shadows", ACM Transactions on
 * Graphics 32(4), 2013, sec. 3; H&Z 2nd ed. sec. 8.6.1 for vanishing
 * points). That vanishing point is fitted by the same weighted least squares
 * as the building's lines (vanishingPoint.ts), and the camera turns it into
 * a direction: s = +-R^T K^-1 v (H&Z Result 8.20). In the camera's frame each
 * pair alone confines the sun to the great circle of the plane through the
 * camera centre, O and S; two or more pairs fix it.
 *
 * Which of +-s is the sun: O - S = t s with t > 0 and both points in front
 * of the camera means that s = a r_o + b r_s with a > 0 and b < 0 (r_o, r_s
 * the viewing rays of o and s): the sun lies on the arc of the pair's great
 * circle between r_o and -r_s. The sign is chosen so that the pairs agree;
 * a pair that disagrees is refused by name.
 *
 * Uncertainty: first-order propagation of every click (the camera's lines
 * and the pairs) into azimuth and altitude, with their covariance
 * (Criminisi, Reid and Zisserman, IJCV 2000, sec. 4; src/image/propagation.ts),
 * and the same linearity check as the plane measurements.
 *
 * Meeting test: chi-square of the shadow lines about their common point,
 * with (pairs - 2) degrees of freedom, from the pairs' clicks alone (the
 * camera does not enter): shadows cast by one sun meet in one point; a set
 * that does not was not lit by one light, or a pair is misread.
 *
 * Not modelled: the sun's finite disc (the penumbra makes a shadow point
 * uncertain by about 0.27 deg of the ray; the clicking sigma must cover it),
 * refraction (the direction found is the apparent sun), a curved surface
 * under a shadow point (no matter: only the point's position counts).
 */
import { InvalidInputError } from '../errors.js';
import { chiSquarePValue } from '../math/chiSquare.js';
import type { Point2 } from './homography.js';
import { propagateFirstOrder } from './propagation.js';
import { LINEARITY_TOLERANCE } from './pixelObservations.js';
import type { CameraSolution } from './camera.js';
import { applyMatrix, cameraFromParameters, cameraParameters, cross, dot3, pixelRay, transpose, unit, type CameraCore, type Vector3 } from './cameraModel.js';
import { fitLine, fitVanishingPoint, homogeneousToPixels, toNormalised, type Homogeneous3 } from './vanishingPoint.js';

/** One clicked object point and its shadow point, working-frame pixels. */
export interface ShadowPairInput {
  /** Path in the scene file, e.g. `observations[4]`. */
  readonly field: string;
  readonly objectPx: Point2;
  readonly shadowPx: Point2;
  readonly sigmaPx: number;
}

/** A pair whose great circle passes closer than this to the zenith is refused, degrees. */
export const ZENITH_CIRCLE_LIMIT_DEG = 1;
/** Shortest object-to-shadow distance in the picture, px. */
export const MIN_PAIR_LENGTH_PX = 5;

export interface SunFromShadows {
  readonly azimuthDeg: number;
  readonly altitudeDeg: number;
  readonly azimuthSigmaDeg: number;
  readonly altitudeSigmaDeg: number;
  /** Covariance of (azimuth, altitude), deg^2. */
  readonly covarianceDeg2: readonly (readonly number[])[];
  /** Site unit vector towards the sun (east, north, up). */
  readonly vector: Vector3;
  /** Where the shadow lines meet, working-frame pixels, null when at infinity; covariance px^2 when finite. */
  readonly vanishingPointPx: Point2 | null;
  readonly vanishingPointCovariancePx?: readonly (readonly number[])[];
  /** True when the vanishing point is the sun's own (the sun in front of the camera), false for the anti-sun's. */
  readonly vanishingPointIsSun: boolean;
  readonly chiSquare: number;
  readonly dof: number;
  readonly pValue: number | null;
  /** Per pair, the angle its line must turn to pass through the common point, degrees. */
  readonly missAnglesDeg: readonly number[];
  /** Per pair: the site unit normal of its great circle (sun . normal = 0). */
  readonly circleNormals: readonly Vector3[];
  readonly nonlinearity: number;
  readonly firstOrderReliable: boolean;
  readonly notes: readonly string[];
}

/** Camera-frame sun direction for one camera and one set of pair clicks; `orient` fixes the sign. */
function sunInCamera(core: CameraCore, pairs: readonly (readonly [Point2, Point2])[], sigmas: readonly number[], orient: Homogeneous3 | undefined) {
  const lines = pairs.map(([o, s], k) => fitLine([toNormalised(o, core.frame), toNormalised(s, core.frame)], sigmas[k] / core.frame.scale));
  const fit = fitVanishingPoint(lines, orient);
  const v = fit.point;
  const f = core.focalLengthPx / core.frame.scale;
  const p = [(core.principalPointPx[0] - core.frame.centreX) / core.frame.scale, (core.principalPointPx[1] - core.frame.centreY) / core.frame.scale];
  const d = unit([(v[0] - p[0] * v[2]) / f, (v[1] - p[1] * v[2]) / f, v[2]]); // K^-1 v (H&Z Result 8.20)
  return { fit, d };
}

/**
 * The site unit normal of a pair's great circle (the plane through the camera centre, the object point and its
 * shadow point), after the checks that refuse a pair naming its field: points too close, a bad sigma, a line
 * through the vanishing point of the verticals (a circle through the zenith fixes the azimuth only).
 */
export function checkShadowPair(camera: CameraSolution, pair: ShadowPairInput): Vector3 {
  const core = camera.core;
  const dist = Math.hypot(pair.objectPx[0] - pair.shadowPx[0], pair.objectPx[1] - pair.shadowPx[1]);
  if (!(dist >= MIN_PAIR_LENGTH_PX)) {
    throw new InvalidInputError(`${pair.field}.shadowPx`, pair.shadowPx, `a shadow point at least ${MIN_PAIR_LENGTH_PX} px from the object point`);
  }
  if (!(Number.isFinite(pair.sigmaPx) && pair.sigmaPx > 0)) throw new InvalidInputError(`${pair.field}.sigmaPx`, pair.sigmaPx, 'a clicking sigma in pixels greater than 0');
  const ro = pixelRay(pair.objectPx, core.focalLengthPx, core.principalPointPx);
  const rs = pixelRay(pair.shadowPx, core.focalLengthPx, core.principalPointPx);
  const m = unit(applyMatrix(transpose(core.rotation), cross(ro, rs)));
  if (Math.abs(m[2]) < Math.sin(ZENITH_CIRCLE_LIMIT_DEG / deg)) {
    throw new InvalidInputError(
      `${pair.field}.shadowPx`, pair.shadowPx, 'a shadow point off the vertical through the object point',
      'The line from the object point to its shadow point passes through the vanishing point of the verticals: the shadow runs straight towards or away from the camera, ' +
        'or the shadow point was clicked directly below its object (at its foot); such a pair fixes at most the sun\'s azimuth. Choose a pair whose shadow runs across the view',
    );
  }
  return m;
}

/** a, b with d ~ a r_o + b r_s (least squares in the plane of the two rays). */
function decompose(d: Vector3, ro: Vector3, rs: Vector3): [number, number] {
  const [g11, g12, g22] = [dot3(ro, ro), dot3(ro, rs), dot3(rs, rs)];
  const [h1, h2] = [dot3(ro, d), dot3(rs, d)];
  const det = g11 * g22 - g12 * g12;
  return [(h1 * g22 - g12 * h2) / det, (g11 * h2 - g12 * h1) / det];
}

const deg = 180 / Math.PI;

function toAzAlt(s: Vector3): [number, number] {
  const az = Math.atan2(s[0], s[1]) * deg;
  return [az < 0 ? az + 360 : az, Math.atan2(s[2], Math.hypot(s[0], s[1])) * deg];
}

/**
 * The sun's direction, with covariance, from two or more object-shadow pairs clicked on a picture whose camera is known.
 * Throws InvalidInputError naming the pair's field for a degenerate pair.
 * @example sunFromShadowPairs(camera, [{ field: 'observations[3]', objectPx: [812, 400], shadowPx: [760, 910], sigmaPx: 1.5 }, ...]).azimuthDeg // 213.4
 */
export function sunFromShadowPairs(camera: CameraSolution, pairs: readonly ShadowPairInput[]): SunFromShadows {
  if (pairs.length < 2) {
    throw new InvalidInputError(pairs[0]?.field ?? 'observations', `${pairs.length} pair`, 'two or more object-shadow pairs to fix the sun (one pair confines it to a great circle only)');
  }
  const input = camera.input;
  const core = camera.core;
  const rt = transpose(core.rotation);
  const circleNormals = pairs.map((pair) => checkShadowPair(camera, pair));
  const pairPoints = pairs.map((p): [Point2, Point2] => [p.objectPx, p.shadowPx]);
  const pairSigmas = pairs.map((p) => p.sigmaPx);
  const nominal = sunInCamera(core, pairPoints, pairSigmas, undefined);
  if (!(nominal.fit.separation > 1e-10)) {
    throw new InvalidInputError(pairs[1].field, 'one line', 'pairs whose lines are distinct', 'The object-shadow lines lie on one line in the picture, so they do not fix where they meet');
  }
  // sign: the pairs' arcs (a > 0, b < 0)
  const rays = pairs.map((p) => [unit(pixelRay(p.objectPx, core.focalLengthPx, core.principalPointPx)), unit(pixelRay(p.shadowPx, core.focalLengthPx, core.principalPointPx))] as const);
  const votes = rays.map(([ro, rs]) => {
    const [a, b] = decompose(nominal.d, ro, rs);
    return (a - b) / (Math.abs(a) + Math.abs(b));
  });
  const sign = votes.reduce((s, x) => s + x, 0) >= 0 ? 1 : -1;
  votes.forEach((vote, k) => {
    if (vote * sign <= 0) {
      throw new InvalidInputError(
        `${pairs[k].field}`, [pairs[k].objectPx, pairs[k].shadowPx], 'an object point and its own shadow point',
        'This pair has its shadow falling towards the light as the other pairs place it: the two points are swapped, belong to different objects, or were lit by another light',
      );
    }
  });
  const orientSun: Vector3 = [nominal.d[0] * sign, nominal.d[1] * sign, nominal.d[2] * sign];
  const finiteVp = Math.abs(nominal.d[2]) > 1e-9;
  const { f, p0, sigmas } = sunMeasurement(camera, pairs, orientSun, nominal.fit.point, finiteVp);
  const fo = propagateFirstOrder(f, p0, sigmas, [true, false, false, false], p0.map(() => 'clicks'));
  const vector = applyMatrix(rt, orientSun);
  const [azimuthDeg, altitudeDeg] = toAzAlt(vector);
  // the chain includes the camera: its own bend counts too (the steepest direction of the sun may miss it)
  const nonlinearity = Math.max(fo.nonlinearity[0], fo.nonlinearity[1], camera.nonlinearity);
  const reliable = nonlinearity <= LINEARITY_TOLERANCE;
  const pValue = nominal.fit.dof > 0 ? chiSquarePValue(nominal.fit.chiSquare, nominal.fit.dof) : null;
  const vanishingPointPx = finiteVp ? homogeneousToPixels(nominal.fit.point, core.frame) : null;
  const notes: string[] = [];
  notes.push(
    pValue === null
      ? 'two object-shadow lines always meet: no check that they share one light; a third pair would test it'
      : pValue >= 0.01
      ? `the ${pairs.length} object-shadow lines meet in one point within the clicking precision (chi-square ${nominal.fit.chiSquare.toFixed(1)} for ${nominal.fit.dof} degrees of freedom, p = ${pValue.toPrecision(2)})`
      : `the ${pairs.length} object-shadow lines do NOT meet in one point within the clicking precision (chi-square ${nominal.fit.chiSquare.toFixed(1)} for ${nominal.fit.dof} degrees of freedom, p = ${pValue.toPrecision(2)}): they were not all cast by one light, or a pair is misread`,
  );
  if (!reliable) notes.push('the first-order sigma of this sun direction is NOT RELIABLE (it bends within the clicking error); use the Monte Carlo spread');
  return {
    azimuthDeg, altitudeDeg, azimuthSigmaDeg: fo.sigmas[0], altitudeSigmaDeg: fo.sigmas[1],
    covarianceDeg2: [[fo.covariance[0][0], fo.covariance[0][1]], [fo.covariance[1][0], fo.covariance[1][1]]],
    vector,
    vanishingPointPx,
    ...(vanishingPointPx ? { vanishingPointCovariancePx: [[fo.covariance[2][2], fo.covariance[2][3]], [fo.covariance[3][2], fo.covariance[3][3]]] } : {}),
    vanishingPointIsSun: orientSun[2] > 0,
    chiSquare: nominal.fit.chiSquare, dof: nominal.fit.dof, pValue, missAnglesDeg: nominal.fit.missAnglesDeg,
    circleNormals, nonlinearity, firstOrderReliable: reliable, notes,
  };
}

/**
 * The whole chain as one function of every click (camera lines, then each pair's object and shadow point):
 * [sun azimuth, sun altitude, vanishing point x, y (0, 0 when at infinity)]. The camera is refitted inside.
 */
function sunMeasurement(
  camera: CameraSolution,
  pairs: readonly ShadowPairInput[],
  orientSun: Vector3,
  orientPoint: Homogeneous3,
  finiteVp: boolean,
): { f: (q: readonly number[]) => number[]; p0: number[]; sigmas: number[] } {
  const { p0: camP0, sigmas: camSigmas } = cameraParameters(camera.input);
  const nc = camP0.length;
  const p0 = [...camP0, ...pairs.flatMap((p) => [p.objectPx[0], p.objectPx[1], p.shadowPx[0], p.shadowPx[1]])];
  const sigmas = [...camSigmas, ...pairs.flatMap((p) => [p.sigmaPx, p.sigmaPx, p.sigmaPx, p.sigmaPx])];
  const vpOrient = camera.vanishingPoints.map((r) => r.homogeneous);
  const pairSigmas = pairs.map((p) => p.sigmaPx);
  const f = (q: readonly number[]): number[] => {
    const c = cameraFromParameters(camera.input, camera.method, q.slice(0, nc), vpOrient);
    const pts = pairs.map((_, k): [Point2, Point2] => [[q[nc + 4 * k], q[nc + 4 * k + 1]], [q[nc + 4 * k + 2], q[nc + 4 * k + 3]]]);
    const { fit, d } = sunInCamera(c, pts, pairSigmas, orientPoint);
    const s = applyMatrix(transpose(c.rotation), dot3(d, orientSun) >= 0 ? d : [-d[0], -d[1], -d[2]]);
    const vpx = finiteVp ? homogeneousToPixels(fit.point, c.frame) : null;
    return [...toAzAlt(s), vpx ? vpx[0] : 0, vpx ? vpx[1] : 0];
  };
  return { f, p0, sigmas };
}

/** The same chain for a Monte Carlo check: all clicks in (camera lines, then pairs), [azimuth, altitude] out. */
export function sunFromShadowPairsFunction(camera: CameraSolution, pairs: readonly ShadowPairInput[]): { f: (q: readonly number[]) => number[]; p0: number[]; sigmas: number[] } {
  const sun = sunFromShadowPairs(camera, pairs);
  const orientSun = applyMatrix(camera.rotation, sun.vector);
  const probe = sunMeasurement(camera, pairs, orientSun, [0, 0, 1], false);
  return { ...probe, f: (q) => probe.f(q).slice(0, 2) };
}

/** Whether two sets of pairs share one sun. */
export interface SunComparison {
  /** Angle between the two suns, degrees. */
  readonly separationDeg: number;
  /** Delta chi-square of one sun for both against a sun for each (2 degrees of freedom) and its p-value. */
  readonly chiSquare: number;
  readonly pValue: number;
}

/**
 * Do the pairs `a` and the pairs `b` (two or more each) share one sun? The difference of their two suns,
 * (azimuth difference x cos altitude, altitude difference), with its covariance from every click by
 * first-order propagation (the camera's clicks shared by both, so its error largely cancels), gives
 * chi2 = d^T C^-1 d with 2 degrees of freedom: to first order the Delta chi-square between one sun for all
 * and a separate sun for each set (Press et al., Numerical Recipes 3rd ed. 2007, sec. 15.6, Delta chi2 of
 * nested fits). p = exp(-chi2 / 2), the chi-square tail for 2 degrees of freedom (NIST/SEMATECH e-Handbook).
 * @example compareShadowSets(camera, figures, buildings).pValue // 0.001
 */
export function compareShadowSets(camera: CameraSolution, a: readonly ShadowPairInput[], b: readonly ShadowPairInput[]): SunComparison {
  const sa = sunFromShadowPairs(camera, a);
  const sb = sunFromShadowPairs(camera, b);
  const fa = sunMeasurement(camera, a, applyMatrix(camera.rotation, sa.vector), [0, 0, 1], false);
  const fb = sunMeasurement(camera, b, applyMatrix(camera.rotation, sb.vector), [0, 0, 1], false);
  const nc = cameraParameters(camera.input).p0.length;
  const p0 = [...fa.p0, ...fb.p0.slice(nc)];
  const sigmas = [...fa.sigmas, ...fb.sigmas.slice(nc)];
  const na = fa.p0.length;
  const f = (q: readonly number[]): number[] => {
    const [azA, altA] = fa.f(q.slice(0, na));
    const [azB, altB] = fb.f([...q.slice(0, nc), ...q.slice(na)]);
    let dAz = azA - azB;
    dAz -= 360 * Math.round(dAz / 360);
    return [dAz * Math.cos(((altA + altB) / 2 / 180) * Math.PI), altA - altB];
  };
  const fo = propagateFirstOrder(f, p0, sigmas, [false, false], p0.map(() => 'clicks'));
  const [d0, d1] = fo.values;
  const [[c00, c01], [, c11]] = fo.covariance;
  const det = c00 * c11 - c01 * c01;
  const chiSquare = (d0 * d0 * c11 - 2 * d0 * d1 * c01 + d1 * d1 * c00) / det;
  const separationDeg = (Math.acos(Math.min(1, Math.max(-1, dot3(sa.vector, sb.vector)))) * 180) / Math.PI;
  return { separationDeg, chiSquare, pValue: Math.exp(-chiSquare / 2) };
}
