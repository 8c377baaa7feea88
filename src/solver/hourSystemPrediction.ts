/**
 * The solver's prediction of a clock kept in Italian, Babylonian or unequal hours
 * (src/time/hourSystems.ts), from the sun direction it already has: the declination follows from
 * azimuth, geometric altitude and latitude, sin dec = sin phi sin h + cos phi cos h cos A with A from
 * north (the inverse of Meeus 1998 eqs. 13.5-13.6), and the day's sunrise and sunset from the
 * declination (Meeus 1998 eq. 15.1), taken constant over the day and the evening before (error under
 * 2 minutes at 48 deg latitude; see hourSystems.ts).
 */
import { asinClamped, cosDeg, radToDeg, sinDeg } from '../math/angles.js';
import { SUNRISE_ALTITUDE_DEG } from '../ephemeris/riseSet.js';
import { dayFrameFromDeclination, hourSystemReading, type HourSystem } from '../time/hourSystems.js';
import type { SolverSunDirection } from './sunModel.js';

/** Sigma used when the day has no sunrise or sunset (polar day or night): the reading says nothing, minutes. */
const NO_FRAME_SIGMA_MINUTES = 720;

/**
 * Predicted reading (minutes of the system's 24-hour count) at local apparent minutes m, and the
 * sigma to use (the reading's own, or a very wide one on a day without sunrise or sunset).
 */
export function predictHourSystemClock(system: HourSystem, apparentMinutes: number, sun: SolverSunDirection, latitudeDeg: number, precisionMinutes: number): { minutes: number; sigma: number } {
  const declinationDeg = radToDeg(
    asinClamped(sinDeg(latitudeDeg) * sinDeg(sun.geometricAltitudeDeg) + cosDeg(latitudeDeg) * cosDeg(sun.geometricAltitudeDeg) * cosDeg(sun.azimuthDeg)),
  );
  const frame = dayFrameFromDeclination(system, declinationDeg, latitudeDeg, SUNRISE_ALTITUDE_DEG);
  if (frame === null) return { minutes: apparentMinutes, sigma: NO_FRAME_SIGMA_MINUTES };
  return { minutes: hourSystemReading(system, apparentMinutes, frame), sigma: precisionMinutes };
}
