/**
 * Planes through the observer that bound or hold the sun's direction: the
 * numeric form of a shadow clicked on a picture whose camera is known
 * (src/image/sunConstraints.ts makes them).
 *
 * A plane is given by its unit normal n in the site's east-north-up frame.
 * The sun's unit vector s lies on its great circle when n . s = 0, on its
 * positive side when n . s > 0. The signed angular distance of s from the
 * great circle is asin(n . s) (spherical trigonometry: the angle between a
 * direction and a plane is the complement of its angle to the normal;
 * Todhunter, Spherical Trigonometry, 1886, sec. 1).
 *
 * Uncertainty of a plane comes in two parts:
 * - the clicks of its own points: a covariance C of n (3 x 3, unit-vector
 *   units); to first order the distance asin(n . s) then has the variance
 *   s^T C s, which depends on where s lies along the circle (far from the
 *   clicked points the lever is longer). Weighting each residual by the
 *   variance at the trial sun is the effective-variance method (Orear,
 *   "Least squares when both variables have uncertainties", American Journal
 *   of Physics 50, 1982; the Sampson error of Hartley and Zisserman, 2nd ed.
 *   2003, sec. 4.2.6, is the same first-order idea).
 * - the camera, shared by every plane of one picture: n moves with a few
 *   standardised camera-error components z (one sigma each), n(z) =
 *   unit(n0 + sum_k z_k g_k). The solver fits z as nuisance parameters with
 *   unit Gaussian priors, which carries the correlation between planes
 *   exactly to first order (Press et al., Numerical Recipes 3rd ed. 2007,
 *   sec. 15.4, priors as extra data; minimising over z is the same as using
 *   the full covariance C + G G^T of all planes at once, by the Schur
 *   complement, Golub and Van Loan, Matrix Computations, 4th ed. 2013,
 *   sec. 6.1).
 *
 * Valid while the planes' sigmas are small angles (first order); a sun on the
 * plane's normal has no defined position along it, which does not arise for
 * a sun near its great circle.
 */
import { DEG_PER_RAD } from '../math/angles.js';
import type { PartialsRow, ResidualSet } from './residuals.js';
import { centralDifferencePartials } from './residuals.js';
import type { SkyLocus } from './skyLocus.js';
import { dot, sunUnitVector, type EnuVector, type SunDirection } from './sunVector.js';

/** A plane through the observer, with its uncertainty (see the header). */
export interface SkyPlane {
  /** Unit normal, site east-north-up, at the nominal clicks and camera. */
  readonly normal: EnuVector;
  /** Covariance of the normal from the plane's own clicks, 3 x 3. */
  readonly clickCovariance: readonly (readonly number[])[];
  /** Per camera-error component: the change of the normal for one sigma of it. */
  readonly cameraSensitivity: readonly EnuVector[];
}

/** The plane's normal with the camera-error components z applied (z empty or shorter: the rest zero). */
export function planeNormalAt(plane: SkyPlane, z: readonly number[]): EnuVector {
  let [x, y, w] = plane.normal;
  plane.cameraSensitivity.forEach((g, k) => {
    const zk = z[k] ?? 0;
    x += zk * g[0];
    y += zk * g[1];
    w += zk * g[2];
  });
  const n = Math.hypot(x, y, w);
  return [x / n, y / n, w / n];
}

/** Signed angular distance of a direction from the plane's great circle, degrees, positive on the normal's side. */
export function planeDistanceDeg(normal: EnuVector, s: EnuVector): number {
  return Math.asin(Math.max(-1, Math.min(1, dot(normal, s)))) * DEG_PER_RAD;
}

/** Sigma of that distance from the plane's own clicks, degrees, at direction s: sqrt(s^T C s) (first order, see the header). */
export function planeClickSigmaDeg(plane: SkyPlane, s: EnuVector): number {
  const c = plane.clickCovariance;
  let v = 0;
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) v += s[i] * c[i][j] * s[j];
  return Math.sqrt(Math.max(0, v)) * DEG_PER_RAD;
}

/** Sigma of the distance from the camera alone, degrees, at direction s: |G^T s|. */
export function planeCameraSigmaDeg(plane: SkyPlane, s: EnuVector): number {
  let v = 0;
  for (const g of plane.cameraSensitivity) v += dot(g, s) ** 2;
  return Math.sqrt(v) * DEG_PER_RAD;
}

/** Smallest sigma of a plane's distance, degrees: keeps a residual finite where the lever of the clicks vanishes. */
export const MIN_PLANE_SIGMA_DEG = 1e-6;

/** A sun on a great circle: the circle's plane, as the evidence of one object-shadow pair. */
export interface SunCircleMeasurement {
  readonly circle: SkyPlane;
  /** The camera-error components at which to evaluate (the solver's nuisances); absent: the nominal camera. */
  readonly cameraError?: readonly number[];
}

/**
 * Residual of a sun on a great circle: (signed distance from the circle) / (its sigma from the clicks),
 * the camera's part left to the shared nuisances (z, see the header).
 * @example sunCircleResidual({ circle: { normal: [0, 0, 1], clickCovariance: [[1e-4,0,0],[0,1e-4,0],[0,0,1e-4]], cameraSensitivity: [] } }, { azimuthDeg: 0, altitudeDeg: 1 }).residuals[0] // 1.745 (1 deg over 0.573 deg)
 */
export function sunCircleResidual(m: SunCircleMeasurement, sun: SunDirection): ResidualSet {
  const partials: PartialsRow[] = centralDifferencePartials((trial) => [sunCircleResidualValue(m, trial)], sun, 0).map((r) => [r[0], r[1], 0]);
  return { residuals: [sunCircleResidualValue(m, sun)], partials, labels: ['distance of the sun from the great circle of an object-shadow pair'], defined: true };
}

/** The residual of sunCircleResidual alone (no partials: those cost six more evaluations), for the solver's sums. */
export function sunCircleResidualValue(m: SunCircleMeasurement, sun: SunDirection): number {
  const s = sunUnitVector(sun.azimuthDeg, sun.altitudeDeg);
  const sigma = Math.max(planeClickSigmaDeg(m.circle, s), MIN_PLANE_SIGMA_DEG);
  return planeDistanceDeg(planeNormalAt(m.circle, m.cameraError ?? []), s) / sigma;
}

/**
 * How far a direction lies outside the region where every plane has it on its positive side (a lune for two
 * planes), in sigmas: for each plane the distance to its great circle where the direction is on the wrong side,
 * over that distance's sigma from the clicks; the largest of these (0 inside). One-sided: it never pulls a sun
 * that is inside.
 * @example sideViolation([{ normal: [0, 0, 1], clickCovariance: [[0,0,0],[0,0,0],[0,0,1e-4]], cameraSensitivity: [] }], [0, 0.0175, -0.99985]) // ~ 1.0e2 (1 deg outside, sigma 0.0057 deg)
 */
export function sideViolation(planes: readonly SkyPlane[], s: EnuVector, z: readonly number[] = []): { sigmas: number; degrees: number } {
  let sigmas = 0;
  let degrees = 0;
  for (const p of planes) {
    const d = -planeDistanceDeg(planeNormalAt(p, z), s);
    if (d <= 0) continue;
    const ratio = d / Math.max(planeClickSigmaDeg(p, s), MIN_PLANE_SIGMA_DEG);
    if (ratio > sigmas) sigmas = ratio;
    if (d > degrees) degrees = d;
  }
  return { sigmas, degrees };
}

/**
 * The great circle of a plane as a sky curve (altitude at each azimuth), for seeding: n . s = 0 gives
 * tan(alt) = -(n_e sin az + n_n cos az) / n_u; null where that altitude is not above the horizon.
 */
export function sunCircleLocus(m: SunCircleMeasurement): SkyLocus {
  const [ne, nn, nu] = m.circle.normal;
  return {
    kind: 'curve',
    altitudeAt: (azimuthDeg: number) => {
      if (Math.abs(nu) < 1e-12) return null;
      const a = azimuthDeg / DEG_PER_RAD;
      const alt = Math.atan(-(ne * Math.sin(a) + nn * Math.cos(a)) / nu) * DEG_PER_RAD;
      return alt > 0 ? alt : null;
    },
    description: 'the great circle of an object-shadow pair',
  };
}
