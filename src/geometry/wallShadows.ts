/**
 * Shadows cast onto a wall by things standing out of it: a rod (bracket, sign
 * arm, beam end) perpendicular to the wall, an overhang (cornice, balcony, lintel
 * hood) and a fin (pilaster, buttress, door jamb, side wall of a niche).
 *
 * Geometry (derivation in docs/observations.md). The sun on the wall's axes is
 * s = (normal, u, up) = (cos a cos H, -cos a sin H, sin a), a = altitude, H = HSA.
 * A point standing out a distance P from the wall casts its shadow on the wall at
 * the in-plane offset (u, v) = P (tan H, -tan VSA) from its foot, tan VSA =
 * tan a / cos H (ASHRAE Handbook - Fundamentals, Fenestration: overhang shadow
 * P tan(VSA), fin shadow P tan(HSA); Szokolay, Solar Geometry, PLEA Note 1).
 * Hence a rod's shadow is the segment from its root to that point, and its slope
 * below the horizontal on the frontal view is
 *   tan(slope) = tan(VSA) / |tan H| = tan(a) / |sin H|,
 * running to the viewer's right when H > 0 (sun on the viewer's left) and to the
 * left when H < 0. Multiplying (tan H, -tan VSA) by cos a cos H (> 0 on a sunlit
 * wall) gives the direction (cos a sin H, -sin a) - the anti-sun vector projected
 * on the wall - which is finite for every sun and is what the residuals use.
 *
 * Limits: HSA -> 0: the rod's shadow runs straight down (slope 90), its side is
 * not defined; |HSA| -> 90: slope -> altitude, but the shadow's length grows
 * without bound and the wall goes out of the sun. Valid for a sunlit wall; the
 * residuals stay finite elsewhere and say `defined: false`.
 */
import { atan2Deg, cosDeg, DEG_PER_RAD, normalizeDeg180, normalizeDeg360, sinDeg, tanDeg } from '../math/angles.js';
import { horizontalShadowAngleDeg, isWallSunlit, verticalShadowAngleDeg } from './shadowAngles.js';
import { ratioSigmaToAngleSigmaDeg, TINY_NORM_SQUARED, type ResidualSet } from './residuals.js';
import type { SkyLocus } from './skyLocus.js';
import type { SunDirection } from './sunVector.js';

/** Which way a shadow runs on a wall, as seen from outside facing the wall. */
export type Side = 'left' | 'right';

/** The side a wall shadow runs to for a given HSA; null when HSA is 0 or 180 (straight down / not defined). */
export function shadowSideForHsa(hsaDeg: number): Side | null {
  if (hsaDeg === 0 || hsaDeg === 180) return null;
  return hsaDeg > 0 ? 'right' : 'left';
}

// ---------------------------------------------------------------- rod

export interface RodShadowMeasurement {
  readonly slopeDeg: number; // (0, 90), below the horizontal, frontal view
  readonly side?: Side;
  readonly sigmaDeg: number;
}

export interface RodShadowPrediction {
  /** Slope below the horizontal, [0, 90]. */
  readonly slopeDeg: number;
  readonly side: Side | null;
  /** Direction of the shadow from the rod's root in the wall plane, atan2(v, u), degrees (-180, 180]: -90 straight down. */
  readonly directionDeg: number;
  /** The wall is sunlit, so the shadow exists. */
  readonly defined: boolean;
}

/** Direction of a rod's shadow on the frontal view: atan2(-sin a, cos a sin H) (see header). */
function rodDirection(sun: SunDirection, hsaDeg: number): { x: number; y: number } {
  return { x: cosDeg(sun.altitudeDeg) * sinDeg(hsaDeg), y: -sinDeg(sun.altitudeDeg) };
}

/**
 * Forward model of a rod perpendicular to the wall.
 * @example predictRodShadow({ azimuthDeg: 210, altitudeDeg: 40 }, 180)
 *   // { slopeDeg: 59.2103, side: 'right', directionDeg: -59.2103, defined: true }
 */
export function predictRodShadow(sun: SunDirection, wallAzimuthDeg: number): RodShadowPrediction {
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  const { x, y } = rodDirection(sun, hsaDeg);
  return {
    slopeDeg: atan2Deg(-y, Math.abs(x)),
    side: shadowSideForHsa(hsaDeg),
    directionDeg: atan2Deg(y, x),
    defined: isWallSunlit(sun, wallAzimuthDeg) && x * x + y * y > TINY_NORM_SQUARED,
  };
}

/** The observed direction on the frontal view for a slope and side: right -> -slope, left -> slope - 180. */
export function rodDirectionFromSlope(slopeDeg: number, side: Side): number {
  return side === 'right' ? -slopeDeg : slopeDeg - 180;
}

/**
 * The residual of rodShadowResidual alone (no partials): the number the solver sums, computed
 * without building the residual set. With a side, the wrapped difference of directions on the
 * frontal view times -1 on the right; without, the difference of slopes; over sigmaDeg.
 */
export function rodShadowResidualValue(m: RodShadowMeasurement, sun: SunDirection, wallAzimuthDeg: number): number {
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  const { x, y } = rodDirection(sun, hsaDeg);
  if (m.side !== undefined) {
    // On the right the direction is minus the slope: turn the sign so that the residual runs as
    // (predicted slope - measured slope) on both sides, as for every other measured number
    // (docs/conventions.md); chi-square is unchanged.
    const toSlope = m.side === 'right' ? -1 : 1;
    return (toSlope * normalizeDeg180(atan2Deg(y, x) - rodDirectionFromSlope(m.slopeDeg, m.side))) / m.sigmaDeg;
  }
  return (atan2Deg(-y, Math.abs(x)) - m.slopeDeg) / m.sigmaDeg;
}

/**
 * Residual of a rod's shadow. With a side: the wrapped difference of shadow
 * directions on the frontal view (continuous through HSA = 0), over sigmaDeg, times -1 on the
 * right (so that it runs as predicted minus measured slope on both sides).
 * Without: the difference of slopes, over sigmaDeg. Partials analytic from
 * d atan2(y, x) = (x dy - y dx) / (x^2 + y^2).
 */
export function rodShadowResidual(m: RodShadowMeasurement, sun: SunDirection, wallAzimuthDeg: number): ResidualSet {
  const p = predictRodShadow(sun, wallAzimuthDeg);
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  const sa = sinDeg(sun.altitudeDeg);
  const ca = cosDeg(sun.altitudeDeg);
  const sh = sinDeg(hsaDeg);
  const ch = cosDeg(hsaDeg);
  const q = ca * ca * sh * sh + sa * sa;
  const ok = q > TINY_NORM_SQUARED;
  const residual = rodShadowResidualValue(m, sun, wallAzimuthDeg);
  let dAlt: number;
  let dHsa: number;
  if (m.side !== undefined) {
    const toSlope = m.side === 'right' ? -1 : 1;
    dAlt = ok ? (toSlope * -sh) / q : 0;
    dHsa = ok ? (toSlope * sa * ca * ch) / q : 0;
  } else {
    const sign = Math.sign(sh);
    dAlt = ok ? Math.abs(sh) / q : 0;
    dHsa = ok ? (-sa * ca * sign * ch) / q : 0;
  }
  dAlt /= m.sigmaDeg;
  dHsa /= m.sigmaDeg;
  return {
    residuals: [residual],
    partials: [[dHsa, dAlt, -dHsa]],
    labels: [m.side !== undefined ? 'rod shadow direction on the wall' : 'rod shadow slope on the wall'],
    defined: p.defined,
  };
}

/**
 * Sun directions giving exactly this rod shadow: tan(alt) = tan(slope) |sin HSA| with
 * 0 < |HSA| < 90, HSA > 0 for a shadow to the right, < 0 to the left (inverse of the
 * header's formula).
 */
export function rodShadowLocus(m: Pick<RodShadowMeasurement, 'slopeDeg' | 'side'>, wallAzimuthDeg: number): SkyLocus {
  if (!(m.slopeDeg > 0 && m.slopeDeg < 90)) {
    return { kind: 'empty', description: `a rod shadow slope of ${m.slopeDeg} deg is outside (0, 90)` };
  }
  const tanSlope = tanDeg(m.slopeDeg);
  return {
    kind: 'curve',
    description: `rod shadow at ${m.slopeDeg} deg${m.side ? ` to the ${m.side}` : ''}`,
    altitudeAt: (azimuthDeg: number) => {
      const hsaDeg = horizontalShadowAngleDeg(azimuthDeg, wallAzimuthDeg);
      if (!(Math.abs(hsaDeg) < 90) || hsaDeg === 0) return null;
      if (m.side !== undefined && shadowSideForHsa(hsaDeg) !== m.side) return null;
      const altitudeDeg = Math.atan(tanSlope * Math.abs(sinDeg(hsaDeg))) * DEG_PER_RAD;
      return altitudeDeg > 0 ? altitudeDeg : null;
    },
  };
}

// ---------------------------------------------------------------- overhang

export interface OverhangShadowMeasurement {
  readonly depthRatio: number; // shadow depth below the edge / projection depth, >= 0
  readonly sigma: number;
}

export interface OverhangShadowPrediction {
  /** tan(VSA); Infinity at VSA = 90. Meaningful only when `defined`. */
  readonly depthRatio: number;
  /** Signed vertical shadow angle, degrees (-180, 180]. */
  readonly verticalShadowAngleDeg: number;
  readonly defined: boolean;
}

/**
 * Forward model of an overhang: shadow depth / projection = tan(VSA)
 * (ASHRAE Handbook - Fundamentals, Fenestration; Szokolay, PLEA Note 1).
 * @example predictOverhangShadow({ azimuthDeg: 210, altitudeDeg: 40 }, 180).depthRatio // 0.96891
 */
export function predictOverhangShadow(sun: SunDirection, wallAzimuthDeg: number): OverhangShadowPrediction {
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  const vsaDeg = verticalShadowAngleDeg(sun.altitudeDeg, hsaDeg);
  return {
    depthRatio: vsaDeg === 90 ? Infinity : tanDeg(vsaDeg),
    verticalShadowAngleDeg: vsaDeg,
    defined: isWallSunlit(sun, wallAzimuthDeg),
  };
}

/**
 * Partials of the signed VSA = atan2(sin a, cos a cos H) per degree:
 * d/da = cos H / q, d/dH = sin a cos a sin H / q, q = sin^2 a + cos^2 a cos^2 H.
 */
export function verticalShadowAnglePartials(altitudeDeg: number, hsaDeg: number): { dAlt: number; dHsa: number; ok: boolean } {
  const sa = sinDeg(altitudeDeg);
  const ca = cosDeg(altitudeDeg);
  const ch = cosDeg(hsaDeg);
  const q = sa * sa + ca * ca * ch * ch;
  if (!(q > TINY_NORM_SQUARED)) return { dAlt: 0, dHsa: 0, ok: false };
  return { dAlt: ch / q, dHsa: (sa * ca * sinDeg(hsaDeg)) / q, ok: true };
}

/**
 * Residual of an overhang shadow, on the angle scale: (VSA - atan(depthRatio)) / sigma_VSA,
 * sigma_VSA = sigma / (1 + depthRatio^2) (first order; equal to (predicted ratio -
 * observed ratio) / sigma to first order, and finite for every sun).
 */
export function overhangShadowResidual(m: OverhangShadowMeasurement, sun: SunDirection, wallAzimuthDeg: number): ResidualSet {
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  const sigmaDeg = ratioSigmaToAngleSigmaDeg(m.depthRatio, m.sigma);
  const d = verticalShadowAnglePartials(sun.altitudeDeg, hsaDeg);
  return {
    residuals: [overhangShadowResidualValue(m, sun, wallAzimuthDeg)],
    partials: [[d.dHsa / sigmaDeg, d.dAlt / sigmaDeg, -d.dHsa / sigmaDeg]],
    labels: ['overhang shadow depth (as vertical shadow angle)'],
    defined: isWallSunlit(sun, wallAzimuthDeg) && d.ok,
  };
}

/** The residual of overhangShadowResidual alone (no partials), for the solver's sums. */
export function overhangShadowResidualValue(m: OverhangShadowMeasurement, sun: SunDirection, wallAzimuthDeg: number): number {
  const vsaDeg = verticalShadowAngleDeg(sun.altitudeDeg, horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg));
  return normalizeDeg180(vsaDeg - Math.atan(m.depthRatio) * DEG_PER_RAD) / ratioSigmaToAngleSigmaDeg(m.depthRatio, m.sigma);
}

/** Sun directions giving exactly this overhang shadow: tan(alt) = depthRatio cos(HSA), |HSA| < 90. */
export function overhangShadowLocus(m: Pick<OverhangShadowMeasurement, 'depthRatio'>, wallAzimuthDeg: number): SkyLocus {
  if (!(m.depthRatio > 0) || !Number.isFinite(m.depthRatio)) {
    return { kind: 'empty', description: `an overhang depth ratio of ${m.depthRatio} needs the sun on the horizon or is not a positive number` };
  }
  return {
    kind: 'curve',
    description: `overhang shadow depth ratio ${m.depthRatio}`,
    altitudeAt: (azimuthDeg: number) => {
      const hsaDeg = horizontalShadowAngleDeg(azimuthDeg, wallAzimuthDeg);
      if (!(Math.abs(hsaDeg) < 90)) return null;
      const altitudeDeg = Math.atan(m.depthRatio * cosDeg(hsaDeg)) * DEG_PER_RAD;
      return altitudeDeg > 0 ? altitudeDeg : null;
    },
  };
}

// ---------------------------------------------------------------- fin

export interface FinShadowMeasurement {
  readonly widthRatio: number; // sideways shadow width / fin depth, >= 0
  readonly side?: Side;
  readonly sigma: number;
}

export interface FinShadowPrediction {
  /** |tan HSA|; meaningful only when `defined`. */
  readonly widthRatio: number;
  readonly side: Side | null;
  readonly defined: boolean;
}

/**
 * Forward model of a fin: shadow width / depth = tan(|HSA|), to the right for HSA > 0
 * (ASHRAE Handbook - Fundamentals, Fenestration; Szokolay, PLEA Note 1).
 * @example predictFinShadow({ azimuthDeg: 210, altitudeDeg: 40 }, 180) // { widthRatio: 0.57735, side: 'right', defined: true }
 */
export function predictFinShadow(sun: SunDirection, wallAzimuthDeg: number): FinShadowPrediction {
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  return {
    widthRatio: Math.abs(hsaDeg) === 90 ? Infinity : Math.abs(tanDeg(hsaDeg)),
    side: shadowSideForHsa(hsaDeg),
    defined: isWallSunlit(sun, wallAzimuthDeg),
  };
}

/**
 * Residual of a fin shadow on the angle scale. With a side: (HSA - atan(signed ratio)) /
 * sigma_HSA, the ratio signed positive to the right, times -1 on the left (so that it runs as
 * predicted minus measured width on both sides); without: (|HSA| - atan(ratio)) / sigma_HSA;
 * sigma_HSA = sigma / (1 + ratio^2). Does not depend on the altitude.
 */
export function finShadowResidual(m: FinShadowMeasurement, sun: SunDirection, wallAzimuthDeg: number): ResidualSet {
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  const sigmaDeg = ratioSigmaToAngleSigmaDeg(m.widthRatio, m.sigma);
  const dHsa = m.side !== undefined ? (m.side === 'right' ? 1 : -1) / sigmaDeg : Math.sign(hsaDeg) / sigmaDeg;
  return {
    residuals: [finShadowResidualValue(m, sun, wallAzimuthDeg)],
    partials: [[dHsa, 0, -dHsa]],
    labels: ['fin shadow width (as horizontal shadow angle)'],
    defined: isWallSunlit(sun, wallAzimuthDeg),
  };
}

/** The residual of finShadowResidual alone (no partials), for the solver's sums. */
export function finShadowResidualValue(m: FinShadowMeasurement, sun: SunDirection, wallAzimuthDeg: number): number {
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  const sigmaDeg = ratioSigmaToAngleSigmaDeg(m.widthRatio, m.sigma);
  const observedDeg = Math.atan(m.widthRatio) * DEG_PER_RAD;
  if (m.side !== undefined) {
    // On the left the HSA is minus the angle of the ratio: turn the sign so that the residual runs as
    // (predicted angle - measured angle) on both sides, as for every other measured number
    // (docs/conventions.md); chi-square is unchanged.
    const toRatio = m.side === 'right' ? 1 : -1;
    return (toRatio * normalizeDeg180(hsaDeg - toRatio * observedDeg)) / sigmaDeg;
  }
  return (Math.abs(hsaDeg) - observedDeg) / sigmaDeg;
}

/** Sun directions giving exactly this fin shadow: HSA = +/- atan(widthRatio), any altitude above the horizon. */
export function finShadowLocus(m: Pick<FinShadowMeasurement, 'widthRatio' | 'side'>, wallAzimuthDeg: number): SkyLocus {
  if (!(m.widthRatio >= 0) || !Number.isFinite(m.widthRatio)) {
    return { kind: 'empty', description: `a fin width ratio of ${m.widthRatio} is not a finite number >= 0` };
  }
  const hsaDeg = Math.atan(m.widthRatio) * DEG_PER_RAD;
  const signs = m.side === 'right' ? [1] : m.side === 'left' ? [-1] : hsaDeg === 0 ? [1] : [1, -1];
  return {
    kind: 'vertical',
    azimuthsDeg: signs.map((s) => normalizeDeg360(wallAzimuthDeg + s * hsaDeg)),
    minAltitudeDeg: 0,
    maxAltitudeDeg: 90,
    description: `fin shadow width ratio ${m.widthRatio}${m.side ? ` to the ${m.side}` : ''}`,
  };
}
