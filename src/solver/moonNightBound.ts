/**
 * A lower bound of the moon's screening objective (src/solver/moonSearch.ts) over a whole night, from the
 * quick moon's place at the night's three nodes alone, so that a night that cannot come near the best is
 * passed over without its 48 steps. The bound holds for the screening's own numbers (the quick moon,
 * src/ephemeris/moonQuick.ts, and the quick phase, src/ephemeris/moonPhaseApprox.ts, interpolated over the
 * night by the parabola through its nodes); it says nothing of the accuracy of the quick models.
 *
 * - Phase: the night's phase longitude L runs over the range of the parabola through its nodes (ends and
 *   vertex); each phase term's least value over that range (the fraction k = (1 - cos L) / 2, Meeus 1998
 *   eq. 48.1, and the folded phase min(L, 360 - L) are monotone between multiples of 180 deg).
 * - Direction: a drawn direction of the moon (and the shadow of a pole by moonlight, which names one too)
 *   is a point T of the sky with declination dT (spherical law of cosines, with the pole at altitude =
 *   latitude). The quick moon's geocentric point P has the declination d of its place, so the arc
 *   PT >= |d - dT| (two points differ at least by their declinations); its apparent point A differs from P
 *   in altitude alone, by the parallax in altitude (at most the horizontal parallax) and the refraction (at
 *   most refractionDeg at NO_REFRACTION_BELOW_DEG: SPA eq. 42 falls as the altitude rises above -1.9 deg,
 *   Reda and Andreas 2008). So the arc AT >= D = min|d - dT| - E. The arc AT is at most |dAlt| + c |dAz|
 *   with c = cos(altitude of T) (up the vertical circle to T's altitude, then along T's parallel of
 *   altitude, whose arc c |dAz| is at least the great circle's), and by the Cauchy-Schwarz inequality
 *   (dAz/sa)^2 + (dAlt/sh)^2 >= (|dAlt| + c |dAz|)^2 / (sh^2 + c^2 sa^2) >= D^2 / (sh^2 + c^2 sa^2).
 * The bound is the sum of the terms' least values (the least of a sum is at least the sum of the least
 * values); the other rows (shadows on walls, facts, clocks, the sun) add nothing negative and are left at 0.
 */
import type { Air } from '../scene/types.js';
import { asinClamped, cosDeg, radToDeg, sinDeg } from '../math/angles.js';
import { NO_REFRACTION_BELOW_DEG, refractionDeg } from '../ephemeris/refraction.js';
import { MOON_PHASE_APPROX_ALLOWANCE_DEG } from '../ephemeris/moonPhaseApprox.js';
import { QUICK_MOON_ALLOWANCE_DEG } from '../ephemeris/moonQuick.js';
import { ratioSigmaToAngleSigmaDeg } from '../geometry/residuals.js';
import type { EvidenceModel } from './evidenceModel.js';

/** Margin on every range and on the refraction and parallax allowance, degrees: far above rounding, far below any sigma. */
const MARGIN_DEG = 0.01;

/** A drawn point of the sky, as its declination, and sh^2 + c^2 sa^2 of its two rows (see the header). */
interface SkyPoint {
  readonly declinationDeg: number;
  readonly sigmaSquaredSum: number;
}

/** sh^2 + c^2 sa^2 for a point at altitudeDeg with sigmas sa (azimuth) and sh (altitude); c = |cos(altitude)|, 1 past the zenith. */
function sigmaSquaredSum(altitudeDeg: number, azimuthSigmaDeg: number, altitudeSigmaDeg: number): number {
  const c = Math.abs(altitudeDeg) <= 90 ? Math.abs(cosDeg(altitudeDeg)) : 1;
  return altitudeSigmaDeg ** 2 + (c * azimuthSigmaDeg) ** 2;
}

/** The night's quick place at its start, middle and end (u = -1, 0, 1), the angles unwrapped. */
export interface NightNodes {
  readonly declinationDeg: readonly number[];
  readonly parallaxDeg: readonly number[];
  readonly phaseLongitudeDeg: readonly number[];
}

/** [least, greatest] of the parabola through (-1, v0), (0, v1), (1, v2) over -1 <= u <= 1 (Meeus 1998, eq. 3.3). */
export function parabolaRange(v: readonly number[]): [number, number] {
  let lo = Math.min(v[0], v[2]);
  let hi = Math.max(v[0], v[2]);
  const a = v[1] - v[0];
  const b = v[2] - v[1];
  if (b !== a) {
    const u = -(a + b) / (2 * (b - a)); // the vertex
    if (u > -1 && u < 1) {
      const p = v[1] + (u / 2) * (a + b + u * (b - a));
      lo = Math.min(lo, p);
      hi = Math.max(hi, p);
    }
  }
  return [lo, hi];
}

/** Distance of x from the interval [lo, hi] (0 inside). */
function outside(x: number, lo: number, hi: number): number {
  return x < lo ? lo - x : x > hi ? x - hi : 0;
}

/** True when [lo, hi] holds a value c + 360 n. */
function holds(lo: number, hi: number, c: number): boolean {
  return Math.floor((hi - c) / 360) * 360 + c >= lo;
}

/** Least wrapped distance from `target` of a longitude in [lo, hi], degrees. */
function leastWrappedDistance(lo: number, hi: number, target: number): number {
  if (holds(lo, hi, target)) return 0;
  const wrapped = (x: number): number => Math.abs((((x - target) % 360) + 540) % 360 - 180);
  return Math.min(wrapped(lo), wrapped(hi));
}

/** The least chi-square of the drawn phases (as moonYears.ts quickPhaseChiSquare takes them) for a phase longitude in [lo, hi]. */
function leastPhaseChiSquare(model: EvidenceModel, lo: number, hi: number): number {
  if (hi - lo >= 360) return 0;
  let chi = 0;
  for (const t of model.moons) {
    const e = t.evidence;
    if (e.kind === 'moon-fraction') {
      // k = (1 - cos L) / 2: 0 at multiples of 360, 1 at 180 + 360 n, monotone between.
      const kLo = (1 - cosDeg(lo)) / 2;
      const kHi = (1 - cosDeg(hi)) / 2;
      const kMin = holds(lo, hi, 0) ? 0 : Math.min(kLo, kHi);
      const kMax = holds(lo, hi, 180) ? 1 : Math.max(kLo, kHi);
      const sigma = e.sigma + (MOON_PHASE_APPROX_ALLOWANCE_DEG * Math.PI) / 360;
      chi += (outside(e.illuminatedFraction, kMin, kMax) / sigma) ** 2;
    } else if (e.kind === 'moon-named-phase') {
      const sigma = e.sigmaDeg + MOON_PHASE_APPROX_ALLOWANCE_DEG;
      if (!e.folded) chi += (leastWrappedDistance(lo, hi, e.phaseLongitudeDeg) / sigma) ** 2;
      else if (e.phaseLongitudeDeg >= 0 && e.phaseLongitudeDeg <= 180) {
        // The folded phase min(L, 360 - L): 0 at multiples of 360, 180 at 180 + 360 n, monotone between.
        const fold = (x: number): number => {
          const l = ((x % 360) + 360) % 360;
          return Math.min(l, 360 - l);
        };
        const fMin = holds(lo, hi, 0) ? 0 : Math.min(fold(lo), fold(hi));
        const fMax = holds(lo, hi, 180) ? 180 : Math.max(fold(lo), fold(hi));
        chi += (outside(e.phaseLongitudeDeg, fMin, fMax) / sigma) ** 2;
      }
    }
  }
  return chi;
}

/** Declination of the direction (azimuth from north, altitude) seen from latitude, degrees (spherical law of cosines). */
function declinationOf(azimuthDeg: number, altitudeDeg: number, latitudeDeg: number): number {
  return radToDeg(asinClamped(sinDeg(latitudeDeg) * sinDeg(altitudeDeg) + cosDeg(latitudeDeg) * cosDeg(altitudeDeg) * cosDeg(azimuthDeg)));
}

/** The drawn points of the sky of the screening's rows: each drawn direction of the moon, each pole shadow by moonlight with both its parts. */
function skyPoints(model: EvidenceModel): SkyPoint[] {
  const lat = model.scene.site.latitudeDeg;
  const out: SkyPoint[] = [];
  for (const t of model.moons) {
    const e = t.evidence;
    if (e.kind !== 'moon-direction') continue;
    // The sigmas as the screening widens them (moonSearch.ts screenObjective).
    out.push({
      declinationDeg: declinationOf(e.azimuthDeg, e.altitudeDeg, lat),
      sigmaSquaredSum: sigmaSquaredSum(e.altitudeDeg, Math.hypot(e.azimuthSigmaDeg, QUICK_MOON_ALLOWANCE_DEG), Math.hypot(e.altitudeSigmaDeg, QUICK_MOON_ALLOWANCE_DEG)),
    });
  }
  for (const t of model.shadows) {
    const e = t.evidence;
    if (t.light !== 'moon' || e.kind !== 'pole-shadow') continue;
    if (e.shadowAzimuthDeg === undefined || e.shadowAzimuthSigmaDeg === undefined || e.lengthRatio === undefined || e.lengthRatioSigma === undefined) continue;
    // The light stands opposite the shadow, at the altitude whose cotangent is the length ratio (src/geometry/groundShadows.ts).
    const altitudeDeg = radToDeg(Math.atan2(1, e.lengthRatio));
    out.push({
      declinationDeg: declinationOf(e.shadowAzimuthDeg + 180, altitudeDeg, lat),
      sigmaSquaredSum: sigmaSquaredSum(altitudeDeg, e.shadowAzimuthSigmaDeg, ratioSigmaToAngleSigmaDeg(e.lengthRatio, e.lengthRatioSigma)),
    });
  }
  return out;
}

/**
 * The bound of a model's screening as a function of a night's nodes (see the header); 0 when the model
 * holds nothing it can bound.
 * @example moonNightBound(model, air)(nodes) // a chi-square that no instant of that night screens below
 */
export function moonNightBound(model: EvidenceModel, air: Air | 'none' | undefined): (nodes: NightNodes) => number {
  const points = skyPoints(model);
  // The most the apparent altitude differs from the geocentric one: parallax less, refraction more (both bounded above).
  const refractionMostDeg = refractionDeg(NO_REFRACTION_BELOW_DEG, air);
  return (nodes: NightNodes): number => {
    const [phaseLo, phaseHi] = parabolaRange(nodes.phaseLongitudeDeg);
    let bound = leastPhaseChiSquare(model, phaseLo - MARGIN_DEG, phaseHi + MARGIN_DEG);
    if (points.length > 0) {
      const [decLo, decHi] = parabolaRange(nodes.declinationDeg);
      const parallaxMost = Math.max(0, parabolaRange(nodes.parallaxDeg)[1]);
      const allowance = parallaxMost + refractionMostDeg + MARGIN_DEG;
      for (const p of points) {
        const arc = outside(p.declinationDeg, decLo - MARGIN_DEG, decHi + MARGIN_DEG) - allowance;
        if (arc > 0) bound += (arc * arc) / p.sigmaSquaredSum;
      }
    }
    return bound;
  };
}
