/**
 * The common shape of a model's answer for least squares: residuals normalised by
 * their sigma, and their partial derivatives with respect to the three unknowns a
 * solver may adjust: sun azimuth, sun (apparent) altitude and the wall's azimuth.
 * Derivatives are per degree. Also: a central-difference Jacobian for checking
 * analytic derivatives, and the first-order propagation of a ratio's sigma onto
 * the angle whose tangent (or cotangent) it is.
 */
import { DEG_PER_RAD } from '../math/angles.js';
import type { SunDirection } from './sunVector.js';

/** d(residual) / d(sun azimuth, sun altitude, wall azimuth), each per degree. */
export type PartialsRow = readonly [dAzimuth: number, dAltitude: number, dWallAzimuth: number];

export interface ResidualSet {
  /**
   * Residuals, each (predicted - observed) / sigma in the form stated by its model; where a
   * model works on an angle instead of the measured ratio, the residual keeps the sign of
   * (predicted ratio - observed ratio) and equals it over sigma to first order.
   */
  readonly residuals: readonly number[];
  /** One row of partial derivatives per residual. */
  readonly partials: readonly PartialsRow[];
  /** What each residual is, in words ("rod shadow direction on wall A"). */
  readonly labels: readonly string[];
  /**
   * False where the evidence cannot arise for this sun (wall in shade, sun down), or,
   * for a fact without numbers, where the fact does not hold: the residuals are still
   * finite and smooth so a solver can move out of there.
   */
  readonly defined: boolean;
  readonly note?: string;
}

/** Step of the central differences below, degrees (about the cube root of double precision times 10). */
export const CENTRAL_DIFFERENCE_STEP_DEG = 1e-5;

/**
 * Partial derivatives of residual functions by central differences,
 * (f(x + h) - f(x - h)) / 2h with h = stepDeg; error O(h^2) (Press et al.,
 * Numerical Recipes, 3rd ed. 2007, section 5.7).
 */
export function centralDifferencePartials(
  residualsOf: (sun: SunDirection, wallAzimuthDeg: number) => readonly number[],
  sun: SunDirection,
  wallAzimuthDeg: number,
  stepDeg: number = CENTRAL_DIFFERENCE_STEP_DEG,
): PartialsRow[] {
  const shifted = (dAz: number, dAlt: number, dWall: number): readonly number[] =>
    residualsOf(
      { azimuthDeg: sun.azimuthDeg + dAz, altitudeDeg: sun.altitudeDeg + dAlt },
      wallAzimuthDeg + dWall,
    );
  const columns = [
    [shifted(stepDeg, 0, 0), shifted(-stepDeg, 0, 0)],
    [shifted(0, stepDeg, 0), shifted(0, -stepDeg, 0)],
    [shifted(0, 0, stepDeg), shifted(0, 0, -stepDeg)],
  ] as const;
  const count = residualsOf(sun, wallAzimuthDeg).length;
  const rows: PartialsRow[] = [];
  for (let i = 0; i < count; i++) {
    const [a, b, c] = columns.map(([plus, minus]) => (plus[i] - minus[i]) / (2 * stepDeg));
    rows.push([a, b, c]);
  }
  return rows;
}

/**
 * Sigma of the angle atan(ratio), degrees, from the sigma of the ratio:
 * sigma_angle = sigma_ratio / (1 + ratio^2) (first-order propagation, d atan(x)/dx;
 * Taylor, An Introduction to Error Analysis, 2nd ed. 1997, ch. 3). The same holds for
 * an angle whose cotangent is the ratio.
 */
export function ratioSigmaToAngleSigmaDeg(ratio: number, sigmaRatio: number): number {
  return (sigmaRatio / (1 + ratio * ratio)) * DEG_PER_RAD;
}

/**
 * Below this x^2 + y^2 the direction atan2(y, x) is not defined (its derivative
 * (x dy - y dx) / (x^2 + y^2) blows up): models then return zero partials and
 * `defined: false`.
 */
export const TINY_NORM_SQUARED = 1e-24;
