/**
 * Evidence that fixes the sun's direction as a point: a surveyed caster point and
 * the point of its shadow, and a sun direction estimated by other means.
 *
 * Shadow points: the ray from the shadow point S to the caster C points at the sun.
 * The misfit of a trial sun s is resolved on two orthonormal axes perpendicular to
 * the observed direction d = (C - S) / |C - S| (e1 horizontal, e2 towards the zenith)
 * with the logarithmic map of the sphere: residual_i = theta (s . e_i) / sin(theta),
 * theta = the angle between s and d, so the residual's length is the angle itself
 * (exact for any misfit below 180 deg). Its sigma, radians, is sqrt(2) sigmaM / |C - S|:
 * the difference of two points each with sigmaM per coordinate has sqrt(2) sigmaM per
 * coordinate, and a displacement across the ray of that size turns it by that angle
 * (first order; Taylor, An Introduction to Error Analysis, 2nd ed. 1997, ch. 3).
 * Valid while |C - S| >> sigmaM.
 */
import { cosDeg, DEG_PER_RAD, normalizeDeg180, RAD_PER_DEG, sinDeg } from '../math/angles.js';
import type { PartialsRow, ResidualSet } from './residuals.js';
import type { SkyLocus } from './skyLocus.js';
import { dot, sunUnitVector, vectorToSunDirection, type EnuVector, type SunDirection } from './sunVector.js';

// ---------------------------------------------------------------- caster and shadow point

export interface ShadowPointsMeasurement {
  readonly caster: EnuVector; // site metres east, north, up
  readonly shadow: EnuVector;
  readonly sigmaM: number; // per coordinate, both points
}

export interface ShadowPointsPrediction {
  /** Direction from the shadow point to the caster (the observed sun direction). */
  readonly observedSun: SunDirection;
  /** Angle between the trial sun and the observed direction, degrees [0, 180]. */
  readonly misfitDeg: number;
  /** Angular sigma of the observed direction, degrees. */
  readonly sigmaDeg: number;
  /** The caster's shadow on the horizontal plane through the shadow point, or null (sun not above the caster's height difference). */
  readonly predictedShadow: EnuVector | null;
  /** Horizontal distance from the predicted to the observed shadow point, metres, or null. */
  readonly misfitM: number | null;
}

function observedDirection(m: ShadowPointsMeasurement): { d: EnuVector; distanceM: number } {
  const v: EnuVector = [m.caster[0] - m.shadow[0], m.caster[1] - m.shadow[1], m.caster[2] - m.shadow[2]];
  const distanceM = Math.hypot(v[0], v[1], v[2]);
  return { d: [v[0] / distanceM, v[1] / distanceM, v[2] / distanceM], distanceM };
}

/** Axes across the observed direction: e1 horizontal (azimuth + 90), e2 towards the zenith. */
function crossAxes(observed: SunDirection): { e1: EnuVector; e2: EnuVector } {
  const sA = sinDeg(observed.azimuthDeg);
  const cA = cosDeg(observed.azimuthDeg);
  const sa = sinDeg(observed.altitudeDeg);
  const ca = cosDeg(observed.altitudeDeg);
  return { e1: [cA, -sA, 0], e2: [-sa * sA, -sa * cA, ca] };
}

/**
 * Forward model: how far a trial sun lies from the caster-to-shadow direction, and
 * where it would put the caster's shadow on the horizontal plane through the shadow point.
 */
export function predictShadowPoints(m: ShadowPointsMeasurement, sun: SunDirection): ShadowPointsPrediction {
  const { d, distanceM } = observedDirection(m);
  const s = sunUnitVector(sun.azimuthDeg, sun.altitudeDeg);
  const rise = m.caster[2] - m.shadow[2];
  let predictedShadow: EnuVector | null = null;
  let misfitM: number | null = null;
  if (s[2] > 0 && rise > 0) {
    const t = rise / s[2];
    predictedShadow = [m.caster[0] - t * s[0], m.caster[1] - t * s[1], m.shadow[2]];
    misfitM = Math.hypot(predictedShadow[0] - m.shadow[0], predictedShadow[1] - m.shadow[1]);
  }
  return {
    observedSun: vectorToSunDirection(d),
    misfitDeg: angleBetween(s, d) * DEG_PER_RAD,
    sigmaDeg: ((Math.SQRT2 * m.sigmaM) / distanceM) * DEG_PER_RAD,
    predictedShadow,
    misfitM,
  };
}

/** Angle between two unit vectors, radians, as atan2(|a x b|, a . b): accurate also near 0 and 180 deg. */
function angleBetween(a: EnuVector, b: EnuVector): number {
  const cross = Math.hypot(a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]);
  return Math.atan2(cross, dot(a, b));
}

/** theta / sin(theta) and its derivative over sin(theta), with series near 0 (both finite up to theta -> 180). */
function logMapFactors(theta: number): { g: number; gPrimeOverSin: number } {
  if (theta < 1e-4) return { g: 1 + (theta * theta) / 6, gPrimeOverSin: 1 / 3 };
  const s = Math.max(Math.sin(theta), 1e-12);
  return { g: theta / s, gPrimeOverSin: (s - theta * Math.cos(theta)) / (s * s * s) };
}

/** Two residuals (across-ray angular misfit, horizontal and vertical axes) over the angular sigma; partials analytic. */
export function shadowPointsResidual(m: ShadowPointsMeasurement, sun: SunDirection): ResidualSet {
  const { d, distanceM } = observedDirection(m);
  const observed = vectorToSunDirection(d);
  const { e1, e2 } = crossAxes(observed);
  const sigmaRad = (Math.SQRT2 * m.sigmaM) / distanceM;
  const s = sunUnitVector(sun.azimuthDeg, sun.altitudeDeg);
  const theta = angleBetween(s, d);
  const { g, gPrimeOverSin } = logMapFactors(theta);
  const sA = sinDeg(sun.azimuthDeg);
  const cA = cosDeg(sun.azimuthDeg);
  const sa = sinDeg(sun.altitudeDeg);
  const ca = cosDeg(sun.altitudeDeg);
  // ds / d(azimuth) and ds / d(altitude), per degree.
  const dsAz: EnuVector = [ca * cA * RAD_PER_DEG, -ca * sA * RAD_PER_DEG, 0];
  const dsAlt: EnuVector = [-sa * sA * RAD_PER_DEG, -sa * cA * RAD_PER_DEG, ca * RAD_PER_DEG];
  const residuals: number[] = [];
  const partials: PartialsRow[] = [];
  for (const e of [e1, e2]) {
    const p = dot(s, e);
    // d(g p) = g dp + p g'(theta) dtheta, dtheta = -dc / sin(theta).
    const part = (ds: EnuVector): number => (g * dot(ds, e) - p * gPrimeOverSin * dot(ds, d)) / sigmaRad;
    residuals.push((g * p) / sigmaRad);
    partials.push([part(dsAz), part(dsAlt), 0]);
  }
  return {
    residuals,
    partials,
    labels: ['shadow points: misfit across the ray, horizontal', 'shadow points: misfit across the ray, vertical'],
    defined: sun.altitudeDeg > 0 && observed.altitudeDeg > 0,
  };
}

/** Sun directions giving exactly these points: the single direction from the shadow point to the caster. */
export function shadowPointsLocus(m: Pick<ShadowPointsMeasurement, 'caster' | 'shadow'>): SkyLocus {
  const v: EnuVector = [m.caster[0] - m.shadow[0], m.caster[1] - m.shadow[1], m.caster[2] - m.shadow[2]];
  if (!(Math.hypot(v[0], v[1], v[2]) > 0)) return { kind: 'empty', description: 'caster and shadow point coincide' };
  const sun = vectorToSunDirection(v);
  if (!(sun.altitudeDeg > 0)) return { kind: 'empty', description: 'the caster is not above its shadow point: no sun above the horizon casts it' };
  return { kind: 'point', sun, description: 'caster and shadow point' };
}

// ---------------------------------------------------------------- sun direction

export interface SunDirectionMeasurement {
  readonly azimuthDeg: number;
  readonly azimuthSigmaDeg: number;
  readonly altitudeDeg: number;
  readonly altitudeSigmaDeg: number;
}

/** Two residuals: wrapped azimuth difference and altitude difference, each over its sigma. */
export function sunDirectionResidual(m: SunDirectionMeasurement, sun: SunDirection): ResidualSet {
  const values = new Float64Array(2);
  sunDirectionResidualValues(m, sun, values, 0);
  return {
    residuals: [values[0], values[1]],
    partials: [
      [1 / m.azimuthSigmaDeg, 0, 0],
      [0, 1 / m.altitudeSigmaDeg, 0],
    ],
    labels: ['sun azimuth', 'sun altitude'],
    defined: true,
  };
}

/** The two residuals of sunDirectionResidual alone, written into `out` at `at` and `at + 1`, for the solver's sums. */
export function sunDirectionResidualValues(m: SunDirectionMeasurement, sun: SunDirection, out: Float64Array, at: number): void {
  out[at] = normalizeDeg180(sun.azimuthDeg - m.azimuthDeg) / m.azimuthSigmaDeg;
  out[at + 1] = (sun.altitudeDeg - m.altitudeDeg) / m.altitudeSigmaDeg;
}

/** The stated direction itself. */
export function sunDirectionLocus(m: Pick<SunDirectionMeasurement, 'azimuthDeg' | 'altitudeDeg'>): SkyLocus {
  return { kind: 'point', sun: { azimuthDeg: m.azimuthDeg, altitudeDeg: m.altitudeDeg }, description: 'stated sun direction' };
}
