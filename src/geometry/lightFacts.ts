/**
 * Facts without numbers: a wall is lit, a wall is in shade, the sun is up.
 *
 * Each has a hard predicate (common practice: a wall is sunlit when |HSA| < 90 deg
 * and the apparent altitude is above 0) and a soft penalty for least squares:
 * residual = violation / tolerance, where the violation is how far, in degrees,
 * the sun must move for the fact to hold (0 when it holds). The residual is
 * continuous and grows linearly with the violation, so the cost residual^2 / 2 is
 * continuously differentiable. The violation uses the sun's elevation above the
 * wall's plane, beta = asin(cos(alt) cos(HSA)), and its altitude:
 *   wall lit:    max(0, -min(beta, alt))
 *   wall shaded: max(0,  min(beta, alt))
 *   sun up:      max(0, -alt)
 */
import { cosDeg, sinDeg } from '../math/angles.js';
import type { PartialsRow, ResidualSet } from './residuals.js';
import { horizontalShadowAngleDeg, isSunUp, isWallSunlit, sunElevationAboveWallDeg } from './shadowAngles.js';
import type { SunDirection } from './sunVector.js';

/** Default tolerance of the soft penalties, degrees: a violation of this size costs one sigma. */
export const DEFAULT_FACT_TOLERANCE_DEG = 0.5;

export type LightFact = 'wall-lit' | 'wall-shaded' | 'sun-up';

/** The hard predicate of a fact. */
export function isLightFactTrue(fact: LightFact, sun: SunDirection, wallAzimuthDeg = 0): boolean {
  if (fact === 'sun-up') return isSunUp(sun);
  const lit = isWallSunlit(sun, wallAzimuthDeg);
  return fact === 'wall-lit' ? lit : !lit;
}

/** Partials of beta = asin(cos a cos H) per degree: d/da = -sin a cos H / cos beta, d/dH = -cos a sin H / cos beta. */
function betaPartials(sun: SunDirection, wallAzimuthDeg: number): PartialsRow {
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  const along = cosDeg(sun.altitudeDeg) * cosDeg(hsaDeg);
  const cosBeta = Math.sqrt(Math.max(0, 1 - along * along));
  if (cosBeta < 1e-12) return [0, 0, 0];
  const dAlt = (-sinDeg(sun.altitudeDeg) * cosDeg(hsaDeg)) / cosBeta;
  const dHsa = (-cosDeg(sun.altitudeDeg) * sinDeg(hsaDeg)) / cosBeta;
  return [dHsa, dAlt, -dHsa];
}

/**
 * How far, in degrees, the sun must move for the fact to hold (0 when it holds; see header):
 * the soft penalty's residual times its tolerance, without partials or labels (for the solver's
 * inner loop).
 * @example lightFactViolationDeg('sun-up', { azimuthDeg: 90, altitudeDeg: -1 }) // 1
 */
export function lightFactViolationDeg(fact: LightFact, sun: SunDirection, wallAzimuthDeg = 0): number {
  if (fact === 'sun-up') return Math.max(0, -sun.altitudeDeg);
  const betaDeg = sunElevationAboveWallDeg(sun, wallAzimuthDeg);
  const lowest = betaDeg < sun.altitudeDeg ? betaDeg : sun.altitudeDeg;
  return Math.max(0, (fact === 'wall-lit' ? -1 : 1) * lowest);
}

/**
 * The soft penalty of a fact (see header); toleranceDeg > 0.
 * @example lightFactResidual('sun-up', { azimuthDeg: 90, altitudeDeg: -1 }).residuals // [2]
 */
export function lightFactResidual(
  fact: LightFact,
  sun: SunDirection,
  wallAzimuthDeg = 0,
  toleranceDeg: number = DEFAULT_FACT_TOLERANCE_DEG,
): ResidualSet {
  const labels = [`${fact} (soft, tolerance ${toleranceDeg} deg)`];
  const defined = isLightFactTrue(fact, sun, wallAzimuthDeg);
  const note = 'zero when the fact holds';
  const v = lightFactViolationDeg(fact, sun, wallAzimuthDeg);
  if (fact === 'sun-up') {
    return { residuals: [v / toleranceDeg], partials: [[0, v > 0 ? -1 / toleranceDeg : 0, 0]], labels, defined, note };
  }
  const betaDeg = sunElevationAboveWallDeg(sun, wallAzimuthDeg);
  const useBeta = betaDeg < sun.altitudeDeg;
  const dLowest: PartialsRow = useBeta ? betaPartials(sun, wallAzimuthDeg) : [0, 1, 0];
  const sign = fact === 'wall-lit' ? -1 : 1;
  const scale = v > 0 ? sign / toleranceDeg : 0;
  return {
    residuals: [v / toleranceDeg],
    partials: [[dLowest[0] * scale, dLowest[1] * scale, dLowest[2] * scale]],
    labels,
    defined,
    note,
  };
}

