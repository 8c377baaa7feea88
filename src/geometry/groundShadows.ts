/**
 * Shadows on level ground: a vertical pole (or a building's vertical corner) and
 * the shadow line of an eave (a horizontal edge parallel to a wall).
 *
 * Pole: the tip's shadow lies opposite the sun, at azimuth (sun azimuth + 180),
 * at a distance height / tan(altitude): the pole, its shadow and the sun ray
 * through the tip form a right triangle (common practice).
 *
 * Eave: the edge stands out p from the wall at height h. Its point p n + h up,
 * carried along -s to the ground (t = h / sin a), lands at a distance along the
 * outward normal
 *   d / h = p / h - cos(a) cos(HSA) / sin(a) = p / h - 1 / tan(VSA),
 * with the signed VSA of shadowAngles.ts (tan VSA = tan a / cos HSA). When the sun
 * is behind the wall (wall in shade) the profile angle measured on the shaded side,
 * VSA' = 180 - VSA, gives the usual form d / h = p / h + 1 / tan(VSA'). On a sunlit
 * wall the line reaches the ground in front only where p / h > 1 / tan(VSA) (a deep
 * eave or arcade); otherwise the edge's shadow falls on the wall (d < 0).
 * Valid for the sun above the horizon; ignores anything else casting onto the ground.
 */
import { cosDeg, DEG_PER_RAD, normalizeDeg180, normalizeDeg360, sinDeg } from '../math/angles.js';
import { horizontalShadowAngleDeg, verticalShadowAngleDeg } from './shadowAngles.js';
import { ratioSigmaToAngleSigmaDeg, type PartialsRow, type ResidualSet } from './residuals.js';
import type { SkyLocus } from './skyLocus.js';
import type { SunDirection } from './sunVector.js';
import { verticalShadowAnglePartials } from './wallShadows.js';

// ---------------------------------------------------------------- pole

export interface PoleShadowMeasurement {
  readonly shadowAzimuthDeg?: number;
  readonly shadowAzimuthSigmaDeg?: number;
  readonly lengthRatio?: number; // shadow length / pole height
  readonly lengthRatioSigma?: number;
}

export interface PoleShadowPrediction {
  /** Azimuth from the foot to the shadow tip, [0, 360). */
  readonly shadowAzimuthDeg: number;
  /** Shadow length / height = 1 / tan(altitude); Infinity at altitude 0. Meaningful only when `defined`. */
  readonly lengthRatio: number;
  readonly defined: boolean;
}

/**
 * Forward model of a vertical pole on level ground.
 * @example predictPoleShadow({ azimuthDeg: 200, altitudeDeg: 45 }) // { shadowAzimuthDeg: 20, lengthRatio: 1, defined: true }
 */
export function predictPoleShadow(sun: SunDirection): PoleShadowPrediction {
  const s = sinDeg(sun.altitudeDeg);
  return {
    shadowAzimuthDeg: normalizeDeg360(sun.azimuthDeg + 180),
    lengthRatio: s === 0 ? Infinity : cosDeg(sun.altitudeDeg) / s,
    defined: sun.altitudeDeg > 0,
  };
}

/**
 * Residuals of a pole shadow, one per measured part: the wrapped azimuth difference
 * over its sigma; the length on the angle scale, (atan2(1, ratio) - altitude) / sigma_alt
 * with sigma_alt = sigma_ratio / (1 + ratio^2) (first-order propagation of the cotangent).
 */
export function poleShadowResidual(m: PoleShadowMeasurement, sun: SunDirection): ResidualSet {
  const values = new Float64Array(2);
  const residuals = Array.from(values.subarray(0, poleShadowResidualValues(m, sun, values, 0)));
  const partials: PartialsRow[] = [];
  const labels: string[] = [];
  if (m.shadowAzimuthDeg !== undefined && m.shadowAzimuthSigmaDeg !== undefined) {
    partials.push([1 / m.shadowAzimuthSigmaDeg, 0, 0]);
    labels.push('pole shadow azimuth');
  }
  if (m.lengthRatio !== undefined && m.lengthRatioSigma !== undefined) {
    partials.push([0, -1 / ratioSigmaToAngleSigmaDeg(m.lengthRatio, m.lengthRatioSigma), 0]);
    labels.push('pole shadow length (as altitude)');
  }
  return { residuals, partials, labels, defined: sun.altitudeDeg > 0 };
}

/**
 * The residuals of poleShadowResidual alone (no partials), written into `out` from index `at`, for
 * the solver's sums; returns how many (1 or 2).
 */
export function poleShadowResidualValues(m: PoleShadowMeasurement, sun: SunDirection, out: Float64Array, at: number): number {
  let i = at;
  if (m.shadowAzimuthDeg !== undefined && m.shadowAzimuthSigmaDeg !== undefined) {
    out[i++] = normalizeDeg180(normalizeDeg360(sun.azimuthDeg + 180) - m.shadowAzimuthDeg) / m.shadowAzimuthSigmaDeg;
  }
  if (m.lengthRatio !== undefined && m.lengthRatioSigma !== undefined) {
    const sigmaDeg = ratioSigmaToAngleSigmaDeg(m.lengthRatio, m.lengthRatioSigma);
    // Sign so that it equals (predicted ratio - observed ratio) / sigma to first order (the ratio falls as the altitude rises).
    out[i++] = (Math.atan2(1, m.lengthRatio) * DEG_PER_RAD - sun.altitudeDeg) / sigmaDeg;
  }
  return i - at;
}

/** Sun directions giving exactly this pole shadow: a point (both parts), a vertical line (azimuth), a circle of altitude (length). */
export function poleShadowLocus(m: Pick<PoleShadowMeasurement, 'shadowAzimuthDeg' | 'lengthRatio'>): SkyLocus {
  const hasLength = m.lengthRatio !== undefined && m.lengthRatio >= 0 && Number.isFinite(m.lengthRatio);
  const altitudeDeg = hasLength ? Math.atan2(1, m.lengthRatio as number) * DEG_PER_RAD : NaN;
  if (m.shadowAzimuthDeg !== undefined && hasLength) {
    return {
      kind: 'point',
      sun: { azimuthDeg: normalizeDeg360(m.shadowAzimuthDeg + 180), altitudeDeg },
      description: `pole shadow towards ${m.shadowAzimuthDeg} deg, length ratio ${m.lengthRatio}`,
    };
  }
  if (m.shadowAzimuthDeg !== undefined) {
    return {
      kind: 'vertical',
      azimuthsDeg: [normalizeDeg360(m.shadowAzimuthDeg + 180)],
      minAltitudeDeg: 0,
      maxAltitudeDeg: 90,
      description: `pole shadow towards ${m.shadowAzimuthDeg} deg`,
    };
  }
  if (hasLength) {
    return { kind: 'curve', altitudeAt: () => altitudeDeg, description: `pole shadow length ratio ${m.lengthRatio}` };
  }
  return { kind: 'empty', description: 'a pole shadow with neither a usable azimuth nor a usable length ratio' };
}

// ---------------------------------------------------------------- eave

export interface EaveShadowMeasurement {
  readonly distanceRatio: number; // distance of the shadow line from the wall foot along the normal / eave height
  readonly sigma: number;
  readonly projectionRatio: number; // eave projection / eave height
}

export interface EaveShadowPrediction {
  /** p/h - 1/tan(VSA); negative: the edge's shadow falls on the wall, not the ground. */
  readonly distanceRatio: number;
  readonly verticalShadowAngleDeg: number;
  /** Sun up and the line on the ground in front of the wall (distanceRatio >= 0). */
  readonly defined: boolean;
}

/**
 * Forward model of an eave's shadow line on level ground (derivation in the header).
 * @example predictEaveShadow({ azimuthDeg: 0, altitudeDeg: 45 }, 180, 0.2).distanceRatio // 1.2 (sun behind a south wall)
 */
export function predictEaveShadow(sun: SunDirection, wallAzimuthDeg: number, projectionRatio: number): EaveShadowPrediction {
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  const s = sinDeg(sun.altitudeDeg);
  const along = cosDeg(sun.altitudeDeg) * cosDeg(hsaDeg);
  const distanceRatio = s === 0 ? (along > 0 ? -Infinity : Infinity) : projectionRatio - along / s;
  return {
    distanceRatio,
    verticalShadowAngleDeg: verticalShadowAngleDeg(sun.altitudeDeg, hsaDeg),
    defined: sun.altitudeDeg > 0 && distanceRatio >= 0,
  };
}

/**
 * Residual of an eave shadow line on the angle scale: the observed line fixes
 * cot(VSA) = projectionRatio - distanceRatio, so VSA_obs = atan2(1, that) in (0, 180);
 * residual (VSA - VSA_obs) / sigma_VSA, sigma_VSA = sigma / (1 + cot^2) (first order).
 */
export function eaveShadowResidual(m: EaveShadowMeasurement, sun: SunDirection, wallAzimuthDeg: number): ResidualSet {
  const p = predictEaveShadow(sun, wallAzimuthDeg, m.projectionRatio);
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  const sigmaDeg = ratioSigmaToAngleSigmaDeg(m.projectionRatio - m.distanceRatio, m.sigma);
  const d = verticalShadowAnglePartials(sun.altitudeDeg, hsaDeg);
  return {
    residuals: [eaveShadowResidualValue(m, sun, wallAzimuthDeg)],
    partials: [[d.dHsa / sigmaDeg, d.dAlt / sigmaDeg, -d.dHsa / sigmaDeg]],
    labels: ['eave shadow line distance (as vertical shadow angle)'],
    defined: p.defined && d.ok,
  };
}

/** The residual of eaveShadowResidual alone (no partials), for the solver's sums. */
export function eaveShadowResidualValue(m: EaveShadowMeasurement, sun: SunDirection, wallAzimuthDeg: number): number {
  const cotObserved = m.projectionRatio - m.distanceRatio;
  const vsaDeg = verticalShadowAngleDeg(sun.altitudeDeg, horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg));
  return normalizeDeg180(vsaDeg - Math.atan2(1, cotObserved) * DEG_PER_RAD) / ratioSigmaToAngleSigmaDeg(cotObserved, m.sigma);
}

/**
 * Sun directions giving exactly this eave line: cot(alt) cos(HSA) = c with
 * c = projectionRatio - distanceRatio, so tan(alt) = cos(HSA) / c where that is > 0;
 * for c = 0 the sun lies in the wall's plane (HSA = +/-90, any altitude).
 */
export function eaveShadowLocus(m: Pick<EaveShadowMeasurement, 'distanceRatio' | 'projectionRatio'>, wallAzimuthDeg: number): SkyLocus {
  const c = m.projectionRatio - m.distanceRatio;
  if (!Number.isFinite(c)) return { kind: 'empty', description: 'an eave shadow with a ratio that is not a finite number' };
  if (c === 0) {
    return {
      kind: 'vertical',
      azimuthsDeg: [normalizeDeg360(wallAzimuthDeg - 90), normalizeDeg360(wallAzimuthDeg + 90)],
      minAltitudeDeg: 0,
      maxAltitudeDeg: 90,
      description: 'eave shadow line directly below the edge: the sun in the wall plane',
    };
  }
  return {
    kind: 'curve',
    description: `eave shadow line at distance ratio ${m.distanceRatio} (projection ratio ${m.projectionRatio})`,
    altitudeAt: (azimuthDeg: number) => {
      const t = cosDeg(horizontalShadowAngleDeg(azimuthDeg, wallAzimuthDeg)) / c;
      return t > 0 ? Math.atan(t) * DEG_PER_RAD : null;
    },
  };
}
