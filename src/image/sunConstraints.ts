/**
 * Each object-shadow pair, and each shadow whose object point is known only
 * within a wedge, as planes of the sky through the picture's camera: the
 * numeric evidence the date solver uses (src/geometry/skyPlanes.ts).
 *
 * A pair (object point o, shadow point s, pixels): the shadow lies on the ray
 * from the object away from the sun, so the sun's direction lies in the plane
 * through the camera centre and the two viewing rays r_o, r_s (Kee, O'Brien
 * and Farid, ACM Transactions on Graphics 32(4), 2013, sec. 3): its great
 * circle has the normal R^T (r_o x r_s) (H&Z 2nd ed. sec. 8.6, the plane of
 * an image line through the centre is K^T l). On that circle the sun lies on
 * the arc from r_o to -r_s (O - S = t s, t > 0, both points in front of the
 * camera: s = a r_o + b r_s with a > 0, b < 0, cameraSun.ts): two side planes,
 * s . (r_s x n) > 0 and s . (r_o x n) > 0.
 *
 * A wedge (shadow point s, two image points a, b bounding the directions in
 * which its object point lies, as seen from s): for an object point anywhere
 * in the wedge, at any distance, the sun lies in the lune of the sky between
 * the planes through r_s and r_a and through r_s and r_b, on the side of the
 * wedge (the published wedge test, Kee, O'Brien and Farid 2013, sec. 4:
 * the light's projected position must lie in every wedge). Two side planes
 * again, a one-sided constraint.
 *
 * Uncertainty (Criminisi, Reid and Zisserman, "Single view metrology",
 * IJCV 2000, sec. 4; first order, central differences as in propagation.ts):
 * - each plane's own clicks give a 3 x 3 covariance of its normal;
 * - the camera's clicks are shared: their covariance is carried onto the
 *   camera's focal length, principal point and a small rotation w (site
 *   axes, R = R0 exp([w]x)), factored into independent components of one
 *   sigma each (the eigenvectors of that 6 x 6 covariance, scaled by the
 *   square roots of their eigenvalues; Golub and Van Loan 2013, sec. 8.1),
 *   and each plane records how its normal moves for one sigma of each. The
 *   solver fits these components as nuisances with unit priors, so the
 *   correlation between pairs is carried, not assumed away.
 *
 * Not modelled: the camera's error beyond first order (its linearity is
 * checked in camera.ts and reported there); lens distortion.
 */
import { InvalidInputError } from '../errors.js';
import { symmetricEigen } from '../math/symmetricEigen.js';
import type { EnuVector, SkyPlane } from '../geometry/index.js';
import type { Point2 } from './homography.js';
import type { CameraSolution } from './camera.js';
import { checkShadowPair, MIN_PAIR_LENGTH_PX, type ShadowPairInput } from './cameraSun.js';
import { applyMatrix, cameraFromParameters, cameraParameters, cross, dot3, pixelRay, rotationDifferenceDeg, transpose, unit, type Matrix3, type Vector3 } from './cameraModel.js';
import { propagateFirstOrder } from './propagation.js';

/** A camera as (focal length px, principal point x, y px, rotation vector east, north, up deg about the nominal). */
type CameraParameters = readonly [number, number, number, number, number, number];

/** A shadow whose object point lies within a wedge seen from the shadow point, working-frame pixels. */
export interface ShadowWedgeInput {
  readonly field: string;
  readonly shadowPx: Point2;
  /** Two points, one on each bounding direction of the wedge. */
  readonly edgesPx: readonly [Point2, Point2];
  readonly sigmaPx: number;
}

/** Narrowest wedge accepted, degrees in the picture (narrower: the object point is known; use a pair). */
export const MIN_WEDGE_OPENING_DEG = 1;
/** Widest wedge accepted, degrees in the picture (a wedge of 180 deg says nothing). */
export const MAX_WEDGE_OPENING_DEG = 170;

/** The camera's shared error as independent components (see the header). */
export interface CameraErrorComponents {
  /** Nominal parameters [f, px, py, 0, 0, 0]. */
  readonly nominal: CameraParameters;
  /** Each component: the change of the parameters for one sigma of it. */
  readonly components: readonly CameraParameters[];
}

/** R0 exp([w]x), w in degrees (Rodrigues' formula; the inverse of rotationDifferenceDeg in cameraModel.ts). */
function rotate(r0: Matrix3, wDeg: readonly number[]): Matrix3 {
  const w = wDeg.map((x) => (x * Math.PI) / 180);
  const t = Math.hypot(w[0], w[1], w[2]);
  const k = [
    [0, -w[2], w[1]],
    [w[2], 0, -w[0]],
    [-w[1], w[0], 0],
  ];
  const a = t > 1e-12 ? Math.sin(t) / t : 1;
  const b = t > 1e-12 ? (1 - Math.cos(t)) / (t * t) : 0.5;
  const e = [0, 1, 2].map((i) => [0, 1, 2].map((j) => (i === j ? 1 : 0) + a * k[i][j] + b * (k[i][0] * k[0][j] + k[i][1] * k[1][j] + k[i][2] * k[2][j])));
  return [0, 1, 2].map((i) => [0, 1, 2].map((j) => r0[i][0] * e[0][j] + r0[i][1] * e[1][j] + r0[i][2] * e[2][j])) as unknown as Matrix3;
}

/**
 * The camera's error as independent components of one sigma each, from the first-order covariance of its
 * parameters over every clicked line point (components below 1e-12 of the largest are dropped: an assumed
 * principal point or a given focal length has none).
 */
export function cameraErrorComponents(camera: CameraSolution): CameraErrorComponents {
  const { p0, sigmas } = cameraParameters(camera.input);
  const vpOrient = camera.vanishingPoints.map((r) => r.homogeneous);
  const r0 = camera.core.rotation;
  const f = (q: readonly number[]): number[] => {
    const c = cameraFromParameters(camera.input, camera.method, q, vpOrient);
    return [c.focalLengthPx, c.principalPointPx[0], c.principalPointPx[1], ...rotationDifferenceDeg(c.rotation, r0)];
  };
  const fo = propagateFirstOrder(f, p0, sigmas, [false, false, false, false, false, false], p0.map(() => 'clicks'));
  const eig = symmetricEigen(fo.covariance);
  const largest = Math.max(...eig.values, 0);
  const components: CameraParameters[] = [];
  eig.values.forEach((lambda, k) => {
    if (!(lambda > 1e-12 * largest)) return;
    const scale = Math.sqrt(lambda);
    const v = eig.vectors[k];
    components.push([v[0] * scale, v[1] * scale, v[2] * scale, v[3] * scale, v[4] * scale, v[5] * scale]);
  });
  const c = camera.core;
  return { nominal: [c.focalLengthPx, c.principalPointPx[0], c.principalPointPx[1], 0, 0, 0], components };
}

/** A plane's site normal as a function of the camera parameters and its own clicks. */
type NormalFunction = (camera: CameraParameters, clicks: readonly number[]) => Vector3;

/** Rays of the clicked points (flat [x0, y0, x1, y1, ...]) and R^T, for one set of camera parameters. */
function cameraAt(r0: Matrix3, p: CameraParameters): { ray: (x: number, y: number) => Vector3; rt: Matrix3 } {
  const rt = transpose(rotate(r0, [p[3], p[4], p[5]]));
  return { ray: (x, y) => pixelRay([x, y], p[0], [p[1], p[2]]), rt };
}

/** The plane with its click covariance and camera sensitivity (see the header); `sign` keeps the nominal orientation. */
function skyPlaneOf(normalOf: NormalFunction, errors: CameraErrorComponents, clicks: readonly number[], sigmaPx: number): SkyPlane {
  const n0 = normalOf(errors.nominal, clicks);
  const aligned = (n: Vector3): Vector3 => (dot3(n, n0) >= 0 ? n : [-n[0], -n[1], -n[2]]);
  const cov = [0, 1, 2].map(() => [0, 0, 0]);
  const q = [...clicks];
  for (let i = 0; i < clicks.length; i++) {
    const h = 1e-3 * sigmaPx;
    q[i] = clicks[i] + h;
    const plus = aligned(normalOf(errors.nominal, q));
    q[i] = clicks[i] - h;
    const minus = aligned(normalOf(errors.nominal, q));
    q[i] = clicks[i];
    const col = [0, 1, 2].map((k) => ((plus[k] - minus[k]) / (2 * h)) * sigmaPx);
    for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) cov[a][b] += col[a] * col[b];
  }
  const h = 1e-3;
  const cameraSensitivity = errors.components.map((c): EnuVector => {
    const shifted = (t: number) => aligned(normalOf(errors.nominal.map((x, k) => x + t * c[k]) as unknown as CameraParameters, clicks));
    const plus = shifted(h);
    const minus = shifted(-h);
    return [(plus[0] - minus[0]) / (2 * h), (plus[1] - minus[1]) / (2 * h), (plus[2] - minus[2]) / (2 * h)];
  });
  return { normal: n0, clickCovariance: cov, cameraSensitivity };
}

/** One pair as evidence: its great circle and the two side planes that keep the sun on the pair's arc. */
export interface PairConstraint {
  readonly field: string;
  readonly circle: SkyPlane;
  readonly sides: readonly [SkyPlane, SkyPlane];
}

/**
 * A pair's great circle and side planes, with their uncertainty; the pair checked as in cameraSun.ts.
 * @example pairConstraint(camera, errors, { field: 'observations[3]', objectPx: [812, 400], shadowPx: [760, 910], sigmaPx: 1 }).circle.normal // [0.12, -0.35, 0.93]
 */
export function pairConstraint(camera: CameraSolution, errors: CameraErrorComponents, pair: ShadowPairInput): PairConstraint {
  checkShadowPair(camera, pair);
  const r0 = camera.core.rotation;
  const clicks = [pair.objectPx[0], pair.objectPx[1], pair.shadowPx[0], pair.shadowPx[1]];
  const circleCam = (p: CameraParameters, q: readonly number[]) => {
    const c = cameraAt(r0, p);
    const ro = c.ray(q[0], q[1]);
    const rs = c.ray(q[2], q[3]);
    return { c, ro, rs, n: cross(ro, rs) };
  };
  const site = (rt: Matrix3, v: Vector3): Vector3 => unit(applyMatrix(rt, v));
  const circle = skyPlaneOf((p, q) => { const x = circleCam(p, q); return site(x.c.rt, x.n); }, errors, clicks, pair.sigmaPx);
  // a > 0: s . (r_s x n) > 0; b < 0: s . (r_o x n) > 0 (header)
  const sideA = skyPlaneOf((p, q) => { const x = circleCam(p, q); return site(x.c.rt, cross(x.rs, x.n)); }, errors, clicks, pair.sigmaPx);
  const sideB = skyPlaneOf((p, q) => { const x = circleCam(p, q); return site(x.c.rt, cross(x.ro, x.n)); }, errors, clicks, pair.sigmaPx);
  return { field: pair.field, circle, sides: [sideA, sideB] };
}

/** One wedge as evidence: the two side planes of its lune. */
export interface WedgeConstraint {
  readonly field: string;
  readonly edges: readonly [SkyPlane, SkyPlane];
  /** Opening of the wedge in the picture, degrees. */
  readonly openingDeg: number;
}

/**
 * A wedge's two side planes, with their uncertainty; refuses, naming the field, edge points too close to the
 * shadow point and a wedge opening wider than MAX_WEDGE_OPENING_DEG.
 */
export function wedgeConstraint(camera: CameraSolution, errors: CameraErrorComponents, wedge: ShadowWedgeInput): WedgeConstraint {
  if (!(Number.isFinite(wedge.sigmaPx) && wedge.sigmaPx > 0)) throw new InvalidInputError(`${wedge.field}.sigmaPx`, wedge.sigmaPx, 'a clicking sigma in pixels greater than 0');
  const s = wedge.shadowPx;
  const dirs = wedge.edgesPx.map((e, k) => {
    const d = Math.hypot(e[0] - s[0], e[1] - s[1]);
    if (!(d >= MIN_PAIR_LENGTH_PX)) throw new InvalidInputError(`${wedge.field}.edgesPx[${k}]`, e, `a point at least ${MIN_PAIR_LENGTH_PX} px from the shadow point`);
    return [(e[0] - s[0]) / d, (e[1] - s[1]) / d] as const;
  });
  const openingDeg = (Math.acos(Math.max(-1, Math.min(1, dirs[0][0] * dirs[1][0] + dirs[0][1] * dirs[1][1]))) * 180) / Math.PI;
  if (!(openingDeg >= MIN_WEDGE_OPENING_DEG)) {
    throw new InvalidInputError(`${wedge.field}.edgesPx`, wedge.edgesPx, `two directions from the shadow point at least ${MIN_WEDGE_OPENING_DEG} deg apart`, 'For an object point known exactly, use an object-shadow pair');
  }
  if (!(openingDeg <= MAX_WEDGE_OPENING_DEG)) {
    throw new InvalidInputError(`${wedge.field}.edgesPx`, wedge.edgesPx, `two directions from the shadow point at most ${MAX_WEDGE_OPENING_DEG} deg apart`, 'A wider wedge leaves the sun almost anywhere');
  }
  const r0 = camera.core.rotation;
  const clicks = [s[0], s[1], wedge.edgesPx[0][0], wedge.edgesPx[0][1], wedge.edgesPx[1][0], wedge.edgesPx[1][1]];
  // inward normal of the edge through r_s and r_k: towards the wedge's middle direction, taken a short way out from s
  const edge = (k: 0 | 1) => (p: CameraParameters, q: readonly number[]): Vector3 => {
    const c = cameraAt(r0, p);
    const rs = c.ray(q[0], q[1]);
    const rk = c.ray(q[2 + 2 * k], q[3 + 2 * k]);
    const ux = [q[2] - q[0], q[4] - q[0]];
    const uy = [q[3] - q[1], q[5] - q[1]];
    const l0 = Math.hypot(ux[0], uy[0]);
    const l1 = Math.hypot(ux[1], uy[1]);
    const mid = c.ray(q[0] + 10 * (ux[0] / l0 + ux[1] / l1), q[1] + 10 * (uy[0] / l0 + uy[1] / l1));
    const n = cross(rs, rk);
    const inward: Vector3 = dot3(n, mid) >= 0 ? n : [-n[0], -n[1], -n[2]];
    return unit(applyMatrix(c.rt, inward));
  };
  return { field: wedge.field, edges: [skyPlaneOf(edge(0), errors, clicks, wedge.sigmaPx), skyPlaneOf(edge(1), errors, clicks, wedge.sigmaPx)], openingDeg };
}
