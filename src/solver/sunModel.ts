/**
 * The sun's direction as the solver sees it: from (declination, hour angle, latitude) by
 * spherical astronomy, and the year-dependent part (declination and equation of time as
 * functions of the instant) from the full ephemeris through a short local "track".
 *
 * - `sunFromDeclinationHourAngle`: altitude and azimuth of a body of declination dec at
 *   hour angle H seen from latitude phi (Meeus, *Astronomical Algorithms*, 2nd ed. 1998,
 *   eqs. 13.5 and 13.6), plus refraction (src/ephemeris/refraction.ts, Reda and Andreas
 *   2008 eq. 42). Geocentric: parallax is left out; for the sun it is at most 8.8" x cos(alt),
 *   0.0024 deg, far below any shadow measurement.
 * - `SunTrack`: the declination and equation of time of the full ephemeris
 *   (src/ephemeris/sunPosition.ts, astronomy-engine) sampled at three instants one day
 *   apart and interpolated by the parabola through them (Meeus 1998, ch. 3, eq. 3.3).
 *   Error within +/-3 days of the anchor: about 2e-4 deg in declination (the third derivative
 *   of the declination is below 1.3e-4 deg/day^3) and below 0.05 s in the equation of time.
 *   Outside +/-3 days the caller makes a new track.
 * - The instant of local apparent time m (minutes) on the local day d (the JD of local 0h):
 *   jdUT = d + (m - E) / 1440 - longitude / 360, since local apparent time = local mean time
 *   + E and local mean time = UT + longitude / 15 h (Explanatory Supplement to the
 *   Astronomical Almanac, 1992, sec. 2.24; Meeus 1998 ch. 28). The hour angle is
 *   H = (m - 720) / 4 deg by the definition of apparent time.
 */
import type { Air } from '../scene/types.js';
import { DEG_PER_RAD, RAD_PER_DEG, normalizeDeg360 } from '../math/angles.js';
import { refractionDeg } from '../ephemeris/refraction.js';
import { sunPosition, type SunSite } from '../ephemeris/sunPosition.js';
import type { DeltaTModel } from '../time/deltaT.js';

export interface SolverSunDirection {
  readonly azimuthDeg: number;
  readonly altitudeDeg: number; // apparent (refracted) unless air is 'none'
  readonly geometricAltitudeDeg: number;
}

/**
 * Sun direction from declination, hour angle (negative before noon) and latitude, degrees.
 * Meeus (1998) eq. 13.5 (azimuth from the south, turned here to from the north) and 13.6.
 * @example sunFromDeclinationHourAngle(0, 0, 45).altitudeDeg // 45 + refraction (about 45.016)
 */
export function sunFromDeclinationHourAngle(
  declinationDeg: number,
  hourAngleDeg: number,
  latitudeDeg: number,
  air?: Air | 'none',
): SolverSunDirection {
  const dec = declinationDeg * RAD_PER_DEG;
  const h = hourAngleDeg * RAD_PER_DEG;
  const phi = latitudeDeg * RAD_PER_DEG;
  const sinDec = Math.sin(dec);
  const cosDec = Math.cos(dec);
  const sinPhi = Math.sin(phi);
  const cosPhi = Math.cos(phi);
  const cosH = Math.cos(h);
  // eq. 13.6: sin alt = sin phi sin dec + cos phi cos dec cos H
  const sinAlt = sinPhi * sinDec + cosPhi * cosDec * cosH;
  const geometricAltitudeDeg = Math.asin(sinAlt > 1 ? 1 : sinAlt < -1 ? -1 : sinAlt) * DEG_PER_RAD;
  // eq. 13.5 (multiplied through by cos dec): tan A = sin H / (cos H sin phi - tan dec cos phi), A from the south
  const fromSouthDeg = Math.atan2(cosDec * Math.sin(h), cosDec * cosH * sinPhi - sinDec * cosPhi) * DEG_PER_RAD;
  return {
    azimuthDeg: normalizeDeg360(fromSouthDeg + 180),
    altitudeDeg: geometricAltitudeDeg + refractionDeg(geometricAltitudeDeg, air),
    geometricAltitudeDeg,
  };
}

/** Declination and equation of time at an instant. */
export interface SolarState {
  readonly declinationDeg: number;
  readonly equationOfTimeMinutes: number;
}

/** The full ephemeris sampled around an anchor instant (see header). */
export interface SunTrack {
  readonly anchorJdUT: number;
  /** Declination and equation of time at anchor - 1, anchor, anchor + 1 day. */
  readonly declinationDeg: readonly [number, number, number];
  readonly equationOfTimeMinutes: readonly [number, number, number];
}

/** Half-width of the interval in which a track is used, days. */
export const TRACK_REACH_DAYS = 3;

/** A track of the full ephemeris around jdUT: three sunPosition calls (Delta T by the model given, else the default). */
export function makeSunTrack(anchorJdUT: number, site: SunSite, deltaTModel?: DeltaTModel): SunTrack {
  const a = sunPosition(anchorJdUT - 1, site, 'none', { deltaTModel });
  const b = sunPosition(anchorJdUT, site, 'none', { deltaTModel });
  const c = sunPosition(anchorJdUT + 1, site, 'none', { deltaTModel });
  return {
    anchorJdUT,
    declinationDeg: [a.declinationDeg, b.declinationDeg, c.declinationDeg],
    equationOfTimeMinutes: [a.equationOfTimeMinutes, b.equationOfTimeMinutes, c.equationOfTimeMinutes],
  };
}

/** A degenerate track from one exact evaluation (rates zero), for a single instant. */
export function pointSunTrack(jdUT: number, site: SunSite, deltaTModel?: DeltaTModel): SunTrack {
  const p = sunPosition(jdUT, site, 'none', { deltaTModel });
  return {
    anchorJdUT: jdUT,
    declinationDeg: [p.declinationDeg, p.declinationDeg, p.declinationDeg],
    equationOfTimeMinutes: [p.equationOfTimeMinutes, p.equationOfTimeMinutes, p.equationOfTimeMinutes],
  };
}

/** Interpolating parabola through three equidistant values at u = -1, 0, 1 (Meeus 1998, eq. 3.3). */
export function parabola(v: readonly [number, number, number], u: number): number {
  const a = v[1] - v[0];
  const b = v[2] - v[1];
  return v[1] + (u / 2) * (a + b + u * (b - a));
}

/**
 * parabola([v, v, v], u), the same operations on the same numbers (so the same result to the last bit),
 * without the array: for a track made of one exact evaluation (pointSunTrack, stageB.ts exactPoint).
 */
export function flatParabola(v: number, u: number): number {
  const a = v - v;
  const b = v - v;
  return v + (u / 2) * (a + b + u * (b - a));
}

/** Declination and equation of time at jdUT from a track. */
export function solarStateOnTrack(track: SunTrack, jdUT: number): SolarState {
  const u = jdUT - track.anchorJdUT;
  return { declinationDeg: parabola(track.declinationDeg, u), equationOfTimeMinutes: parabola(track.equationOfTimeMinutes, u) };
}

/** Rate of the declination on a track at jdUT, degrees per day. */
export function declinationRateOnTrack(track: SunTrack, jdUT: number): number {
  const u = jdUT - track.anchorJdUT;
  const [v0, v1, v2] = track.declinationDeg;
  return (v2 - v0) / 2 + u * (v2 - 2 * v1 + v0);
}

/**
 * The instant (UT) of local apparent time `apparentMinutes` on the local day whose 0h is `dayJd0`,
 * and the solar state there (one fixed-point step on the equation of time: it changes by
 * less than 0.03 s per minute, so the step leaves under 1e-3 s).
 */
export function instantOfApparentTime(
  track: SunTrack,
  dayJd0: number,
  apparentMinutes: number,
  longitudeDeg: number,
): { jdUT: number; state: SolarState } {
  const jdUT = jdUTOfApparentTime(track, dayJd0, apparentMinutes, longitudeDeg);
  return { jdUT, state: solarStateOnTrack(track, jdUT) };
}

/** The instant of instantOfApparentTime alone (a number: no solar state made for the guess). */
export function jdUTOfApparentTime(track: SunTrack, dayJd0: number, apparentMinutes: number, longitudeDeg: number): number {
  const guess = dayJd0 + apparentMinutes / 1440 - longitudeDeg / 360;
  const e0 = parabola(track.equationOfTimeMinutes, guess - track.anchorJdUT);
  return guess - e0 / 1440;
}
