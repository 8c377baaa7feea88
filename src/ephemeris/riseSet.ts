/**
 * Sunrise, local meridian transit and sunset for one local day at a site, with polar day
 * and polar night.
 *
 * Definitions (Meeus, *Astronomical Algorithms*, 2nd ed. 1998, ch. 15): rise and set are
 * when the geometric altitude of the sun's centre is h0 = -0.8333 deg (-50': 34' standard
 * refraction at the horizon plus 16' semidiameter), as seen from the site at its elevation
 * on a level horizon (no dip for a raised observer, no local horizon profile). Transit is
 * hour angle 0.
 *
 * Method (our own, from the full model of sunPosition.ts): transit by Newton steps on the
 * hour angle (the sun's hour angle grows by about 360.9856 deg per day); rise between the
 * antitransit before and the transit, set between the transit and the antitransit after,
 * each by the Illinois variant of regula falsi on altitude - h0 (Dowell and Jarratt 1971),
 * bounded. Accuracy: about a second of time against the model; the model and the real
 * atmosphere at the horizon differ by a minute or more.
 */
import { ConvergenceError } from '../errors.js';
import { normalizeDeg180 } from '../math/angles.js';
import { sunPosition, type SunSite } from './sunPosition.js';

/** Geometric altitude of the sun's centre at rise and set, Meeus (1998) ch. 15. */
export const SUNRISE_ALTITUDE_DEG = -0.8333;
/** Mean rate of the sun's hour angle, degrees per day (Meeus 1998, eq. 15.2 and ch. 12). */
const HOUR_ANGLE_RATE_DEG_PER_DAY = 360.9856;

export interface SunEvents {
  readonly sunriseJdUT: number | null;
  readonly transitJdUT: number;
  readonly sunsetJdUT: number | null;
  /** 'day': the sun stays above h0 all day; 'night': below h0 all day; null otherwise. */
  readonly polar: 'day' | 'night' | null;
  readonly converged: boolean;
  /** Total iterations of the three searches. */
  readonly iterations: number;
}

const MAX_TRANSIT_STEPS = 10;
const MAX_CROSSING_STEPS = 60;
const TOLERANCE_DAYS = 1e-7; // 0.009 s

/** Transit nearest to `guessJdUT`: hour angle 0, by Newton steps. */
function transitNear(guessJdUT: number, site: SunSite): { jdUT: number; iterations: number } {
  let jdUT = guessJdUT;
  for (let i = 1; i <= MAX_TRANSIT_STEPS; i += 1) {
    const step = sunPosition(jdUT, site, 'none').hourAngleDeg / HOUR_ANGLE_RATE_DEG_PER_DAY;
    jdUT -= step;
    if (Math.abs(step) < TOLERANCE_DAYS) return { jdUT, iterations: i };
  }
  throw new ConvergenceError('sun transit search', MAX_TRANSIT_STEPS);
}

/** The instant between a and b where altitude - h0 changes sign, or null if it does not. */
function crossing(a: number, b: number, site: SunSite): { jdUT: number | null; iterations: number } {
  const f = (jdUT: number): number => sunPosition(jdUT, site, 'none').geometricAltitudeDeg - SUNRISE_ALTITUDE_DEG;
  let fa = f(a);
  let fb = f(b);
  if (fa === 0) return { jdUT: a, iterations: 0 };
  if (fb === 0) return { jdUT: b, iterations: 0 };
  if (Math.sign(fa) === Math.sign(fb)) return { jdUT: null, iterations: 0 };
  let side = 0;
  for (let i = 1; i <= MAX_CROSSING_STEPS; i += 1) {
    // Illinois regula falsi: Dowell and Jarratt, BIT 11 (1971) 168-174.
    const c = (a * fb - b * fa) / (fb - fa);
    const fc = f(c);
    if (Math.abs(b - a) < TOLERANCE_DAYS || fc === 0) return { jdUT: c, iterations: i };
    if (Math.sign(fc) === Math.sign(fb)) {
      b = c;
      fb = fc;
      if (side === -1) fa /= 2;
      side = -1;
    } else {
      a = c;
      fa = fc;
      if (side === 1) fb /= 2;
      side = 1;
    }
    if (Math.abs(b - a) < TOLERANCE_DAYS) return { jdUT: (a + b) / 2, iterations: i };
  }
  throw new ConvergenceError('sunrise/sunset search', MAX_CROSSING_STEPS);
}

/**
 * Rise, transit and set of the sun for the local day starting at `localDayJd0UT` (the UT
 * instant of that day's local 0h in whatever clock the caller keeps). The transit is the one
 * nearest the middle of that day; rise and set are those around it.
 * @example sunEvents(2460482.5 - 9.35 / 360, velmar) // June solstice at Velmar: rise ~03:34 UT
 */
export function sunEvents(localDayJd0UT: number, site: SunSite): SunEvents {
  const middle = localDayJd0UT + 0.5;
  const first = sunPosition(middle, site, 'none');
  const transit = transitNear(middle - normalizeDeg180(first.hourAngleDeg) / HOUR_ANGLE_RATE_DEG_PER_DAY, site);
  const half = 180 / HOUR_ANGLE_RATE_DEG_PER_DAY; // transit to antitransit, days
  const rise = crossing(transit.jdUT - half, transit.jdUT, site);
  const set = crossing(transit.jdUT, transit.jdUT + half, site);
  let polar: 'day' | 'night' | null = null;
  if (rise.jdUT === null && set.jdUT === null) {
    polar = sunPosition(transit.jdUT, site, 'none').geometricAltitudeDeg > SUNRISE_ALTITUDE_DEG ? 'day' : 'night';
  }
  return {
    sunriseJdUT: rise.jdUT,
    transitJdUT: transit.jdUT,
    sunsetJdUT: set.jdUT,
    polar,
    converged: true,
    iterations: transit.iterations + rise.iterations + set.iterations,
  };
}
