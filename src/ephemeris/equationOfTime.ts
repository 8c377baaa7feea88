/**
 * The equation of time: apparent minus mean solar time, in minutes (positive when a sundial
 * is ahead of a mean-time clock, e.g. about +16 min in early November).
 *
 * From the sun's geocentric apparent right ascension and Greenwich apparent sidereal time,
 * both from astronomy-engine (see sunPosition.ts for the formula and its sources).
 * Accuracy: better than 0.1 s of time given the instant in UT; Meeus (1998) Example 28.a is
 * reproduced to 0.1 s. The mean sun is tied to UT, so an error in Delta T does not move it.
 */
import { EquatorFromVector, SiderealTime } from 'astronomy-engine';
import { astroTimeFromJdUT, withDeltaT } from './engine.js';
import { equationOfTimeFromRaMinutes, geocentricSunOfDate } from './sunPosition.js';

/**
 * Equation of time at instant jdUT, minutes.
 * @example equationOfTimeMinutes(2448908.5 - 59 / 86400) // about +13.71 (Meeus 1998, Example 28.a: +13m42.6s)
 */
export function equationOfTimeMinutes(jdUT: number, deltaTSeconds?: number): number {
  return withDeltaT(deltaTSeconds, () => {
    const time = astroTimeFromJdUT(jdUT, deltaTSeconds);
    const ra = EquatorFromVector(geocentricSunOfDate(time)).ra;
    return equationOfTimeFromRaMinutes(jdUT, SiderealTime(time), ra);
  });
}
