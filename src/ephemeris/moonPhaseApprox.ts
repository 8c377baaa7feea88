/**
 * A quick estimate of the moon's phase, for screening many days before the full moon ephemeris
 * (src/ephemeris/moonPosition.ts) is asked.
 *
 * The phase angle i from the mean elongation D, the sun's mean anomaly M and the moon's mean
 * anomaly M' (Meeus, Astronomical Algorithms, 2nd ed. 1998, eq. 48.4, "less accurate" form), with
 * D, M, M' from eqs. 47.2-47.4; written here as the phase longitude L = 180 - i (moon's ecliptic
 * longitude minus the sun's: 0 new, 90 first quarter, 180 full, 270 last quarter).
 * Accuracy, measured against moonPosition (same UT, its Delta T) at 3,000 instants from the year 1000
 * to 2125: largest difference 0.63 deg in L (tests/ephemeris/moonPhaseApprox.test.ts); the screening
 * that uses it allows MOON_PHASE_APPROX_ALLOWANCE_DEG. T is taken from the UT Julian Day: Delta T
 * moves L by 0.5 deg per hour of Delta T, which the measured difference includes.
 */
import { normalizeDeg360, sinDeg } from '../math/angles.js';

/** Allowance for the estimate's error, degrees of phase longitude (about 5 times the largest difference measured). */
export const MOON_PHASE_APPROX_ALLOWANCE_DEG = 3;

/** Days per Julian century and the epoch J2000.0 (Meeus 1998, eq. 22.1). */
const JULIAN_CENTURY_DAYS = 36525;
const J2000 = 2451545.0;

/**
 * The moon's phase longitude, degrees [0, 360), from Meeus eq. 48.4.
 * @example moonPhaseLongitudeApproxDeg(2448724.5) // about 111 (Meeus Example 48.a: k = 0.6786, waxing)
 */
export function moonPhaseLongitudeApproxDeg(jd: number): number {
  const t = (jd - J2000) / JULIAN_CENTURY_DAYS;
  // Meeus eqs. 47.2 (D), 47.3 (M), 47.4 (M'), degrees.
  const d = 297.8501921 + 445267.1114034 * t - 0.0018819 * t * t + (t * t * t) / 545868 - (t * t * t * t) / 113065000;
  const m = 357.5291092 + 35999.0502909 * t - 0.0001536 * t * t + (t * t * t) / 24490000;
  const mp = 134.9633964 + 477198.8675055 * t + 0.0087414 * t * t + (t * t * t) / 69699 - (t * t * t * t) / 14712000;
  // Meeus eq. 48.4: i = 180 - D - 6.289 sin M' + 2.100 sin M - 1.274 sin(2D - M') - 0.658 sin 2D - 0.214 sin 2M' - 0.110 sin D.
  const i = 180 - d - 6.289 * sinDeg(mp) + 2.1 * sinDeg(m) - 1.274 * sinDeg(2 * d - mp) - 0.658 * sinDeg(2 * d) - 0.214 * sinDeg(2 * mp) - 0.11 * sinDeg(d);
  return normalizeDeg360(180 - i);
}
