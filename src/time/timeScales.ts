/**
 * Conversions between Universal Time (UT, the Earth's rotation) and Terrestrial Time
 * (TT, uniform), both as Julian Days. This is the only module that converts between them.
 *
 * TT = UT + Delta T, Delta T from src/time/deltaT.ts by a named model (default Morrison et al. 2021).
 * The decimal year fed to Delta T comes from our own calendar code, never from Date:
 * the Julian calendar before 1582-10-15 (as in Espenak and Meeus's canon, whose dates
 * before then are Julian), the Gregorian from then on. (The Morrison et al. spline's year is
 * continuous; the calendar's year differs from it by under two weeks, under 1 s of Delta T.)
 */
import { calendarYearOfJd, civilDayToJd, ROME_FIRST_GREGORIAN_JD, type CalendarKind } from '../calendar/julianDay.js';
import { ConvergenceError } from '../errors.js';
import { DEFAULT_DELTA_T_MODEL, deltaT, deltaTSeconds, type DeltaTModel, type DeltaTValue } from './deltaT.js';

/** Seconds per day (exact by definition). */
export const SECONDS_PER_DAY = 86400;
/**
 * Continuous decimal year of a Julian Day: year + (days since 1 January 0h) / (days in that year),
 * in the Julian calendar before 1582-10-15 and the Gregorian after. At the middle of a month this
 * equals Espenak and Meeus's y = year + (month - 0.5) / 12 to within about two days.
 * @example jdToDecimalYear(2451544.5) // 2000.0 (2000-01-01 0h)
 */
export function jdToDecimalYear(jd: number): number {
  const calendar: CalendarKind = jd < ROME_FIRST_GREGORIAN_JD ? 'julian' : 'gregorian';
  const year = calendarYearOfJd(jd, calendar);
  const start = civilDayToJd(calendar, year, 1, 1);
  const next = civilDayToJd(calendar, year + 1, 1, 1);
  return year + (jd - start) / (next - start);
}

/** Delta T (TT - UT) at an instant given as a UT Julian Day, with its sigma, by the named model. */
export function deltaTAtJdUT(jdUT: number, model: DeltaTModel = DEFAULT_DELTA_T_MODEL): DeltaTValue {
  return deltaT(jdToDecimalYear(jdUT), model);
}

/**
 * Terrestrial Time of an instant given in Universal Time.
 * @example jdUTToJdTT(2451545.0) // 2451545.0 + 63.83 s / 86400
 */
export function jdUTToJdTT(jdUT: number, model: DeltaTModel = DEFAULT_DELTA_T_MODEL): number {
  return jdUT + deltaTSeconds(jdToDecimalYear(jdUT), model) / SECONDS_PER_DAY;
}

/** Result of the bounded TT -> UT iteration. */
export interface JdUTSolution {
  readonly jdUT: number;
  readonly converged: boolean;
  readonly iterations: number;
  /** |TT - (UT + Delta T(UT))| left, days. */
  readonly residualDays: number;
}

const MAX_ITERATIONS = 20;
const TOLERANCE_DAYS = 1e-10; // about 10 microseconds

/**
 * Universal Time of an instant given in Terrestrial Time, by fixed-point iteration
 * UT <- TT - Delta T(UT) (Delta T changes by less than 0.1 s per day at any epoch, so
 * each step gains about six digits). Bounded: at most 20 steps; reports how it ended.
 */
export function jdTTToJdUTSolution(jdTT: number, model: DeltaTModel = DEFAULT_DELTA_T_MODEL): JdUTSolution {
  let jdUT = jdTT - deltaTSeconds(jdToDecimalYear(jdTT), model) / SECONDS_PER_DAY;
  let residualDays = Infinity;
  for (let i = 1; i <= MAX_ITERATIONS; i += 1) {
    const next = jdTT - deltaTSeconds(jdToDecimalYear(jdUT), model) / SECONDS_PER_DAY;
    residualDays = Math.abs(next - jdUT);
    jdUT = next;
    if (residualDays < TOLERANCE_DAYS) return { jdUT, converged: true, iterations: i, residualDays };
  }
  return { jdUT, converged: false, iterations: MAX_ITERATIONS, residualDays };
}

/**
 * Universal Time of an instant given in Terrestrial Time; throws ConvergenceError if the
 * bounded iteration does not settle (not seen in practice: Delta T is smooth).
 */
export function jdTTToJdUT(jdTT: number, model: DeltaTModel = DEFAULT_DELTA_T_MODEL): number {
  const s = jdTTToJdUTSolution(jdTT, model);
  if (!s.converged) throw new ConvergenceError('TT to UT conversion', s.iterations);
  return s.jdUT;
}
