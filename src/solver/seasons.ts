/**
 * Where in the year the sun has a given declination: the instants of a given apparent
 * solar longitude, for seeding the per-year refinement only.
 *
 * Model: Meeus, *Astronomical Algorithms*, 2nd ed. (1998), ch. 25, low-precision solar
 * coordinates: mean longitude (25.2), mean anomaly (25.3), equation of the centre (p. 164);
 * mean obliquity (22.2). Error about 0.01 deg in longitude (Meeus p. 163), i.e. a quarter
 * of an hour of time: the refinement with the full ephemeris removes it. UT is used for TT
 * (Delta T moves the sun by under 0.05 deg even at -1000: irrelevant for a seed).
 */
import { DEG_PER_RAD, RAD_PER_DEG, normalizeDeg180 } from '../math/angles.js';

/** Mean tropical year, days (Meeus 1998 ch. 27: 365.24219 days near 2000). */
export const TROPICAL_YEAR_DAYS = 365.24219;

/** Apparent solar longitude (low precision) and the mean obliquity at jd, degrees. */
export function lowPrecisionSun(jd: number): { longitudeDeg: number; obliquityDeg: number } {
  const t = (jd - 2451545) / 36525; // Meeus eq. 25.1
  const l0 = 280.46646 + t * (36000.76983 + 0.0003032 * t); // eq. 25.2
  const m = (357.52911 + t * (35999.05029 - 0.0001537 * t)) * RAD_PER_DEG; // eq. 25.3
  const c = (1.914602 - t * (0.004817 + 0.000014 * t)) * Math.sin(m) + (0.019993 - 0.000101 * t) * Math.sin(2 * m) + 0.000289 * Math.sin(3 * m); // p. 164
  const omega = (125.04 - 1934.136 * t) * RAD_PER_DEG; // p. 164
  const longitudeDeg = l0 + c - 0.00569 - 0.00478 * Math.sin(omega); // apparent longitude, p. 164
  const obliquityDeg = 23.43929111 - t * (0.013004167 + t * (1.6389e-7 - 5.0361e-7 * t)); // eq. 22.2
  return { longitudeDeg, obliquityDeg };
}

/**
 * The instant nearest `nearJd` (within half a year) at which the apparent solar longitude is
 * `targetDeg`: Newton steps with the mean rate 360 / 365.24219 deg/day, at most 12.
 */
export function instantOfSolarLongitude(targetDeg: number, nearJd: number): number {
  const rate = 360 / TROPICAL_YEAR_DAYS;
  let jd = nearJd;
  for (let i = 0; i < 12; i += 1) {
    const step = normalizeDeg180(targetDeg - lowPrecisionSun(jd).longitudeDeg) / rate;
    jd += step;
    if (Math.abs(step) < 1e-6) break;
  }
  return jd;
}

/**
 * Solar longitudes at which the declination is `declinationDeg` (sin dec = sin eps sin lambda,
 * Meeus 1998 eq. 25.7 with latitude 0): two (spring side and autumn side) or, when the
 * declination is at or beyond the tropic, the solstice alone.
 */
export function longitudesOfDeclination(declinationDeg: number, obliquityDeg: number): { longitudeDeg: number; branch: 'rising' | 'falling' | 'solstice' }[] {
  const s = Math.sin(declinationDeg * RAD_PER_DEG) / Math.sin(obliquityDeg * RAD_PER_DEG);
  if (s >= 1) return [{ longitudeDeg: 90, branch: 'solstice' }];
  if (s <= -1) return [{ longitudeDeg: 270, branch: 'solstice' }];
  const l = Math.asin(s) * DEG_PER_RAD;
  return [
    { longitudeDeg: l, branch: 'rising' },
    { longitudeDeg: 180 - l, branch: 'falling' },
  ];
}
