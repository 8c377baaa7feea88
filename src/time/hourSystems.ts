/**
 * Hour systems tied to sunrise and sunset, as kept by clocks and sundials before mean time:
 *  - Italian hours (ore italiche): 24 equal hours counted from the previous evening's origin:
 *    sunset, sunset plus a stated number of minutes (the evening bell, "ore italiche da
 *    campanile"), or the end of civil twilight (sun 6 deg below the horizon);
 *  - Babylonian hours (ore babiloniche): 24 equal hours counted from sunrise;
 *  - unequal (temporal) hours: the daylight divided into twelve hours from sunrise, the night
 *    into twelve from sunset; a reading is given on a 24-hour count, day hours 0-12, night 12-24.
 * Definitions: common practice of gnomonics (R. R. J. Rohr, Sundials: History, Theory and Practice,
 * 1965/1970, ch. 1 on the hour systems, from memory); D. S. Landes, Revolution in Time (1983), ch. 4
 * (temporal hours), from memory. The construction here: every system is a count of minutes from an
 * origin that is a sunrise or sunset of the site, with sunrise and sunset as the project computes them
 * (centre of the sun 0.8333 deg below a level horizon, src/ephemeris/riseSet.ts) and civil dusk at 6 deg
 * below the horizon (Explanatory Supplement 1992, sec. 9.3: civil twilight).
 *
 * Everything here is in local apparent minutes (minutes after local apparent midnight, the sundial's
 * own count), so the functions are pure arithmetic on a `DayFrame`: the caller provides the day's
 * rise and set (the sun command from the full ephemeris, the solver from the declination).
 * Leaves out: a raised or hilly horizon (a real sunset behind hills comes earlier), local customs
 * of resetting the clock only every few days (Italian clocks were often set weekly).
 */
import { acosClamped, cosDeg, radToDeg, sinDeg } from '../math/angles.js';

/** What a clock or dial in one of these systems counts. */
export type HourSystem =
  | { readonly kind: 'italian'; readonly origin: 'sunset' | 'civil-dusk'; readonly offsetMinutes: number }
  | { readonly kind: 'babylonian' }
  | { readonly kind: 'unequal' };

/** A local day's sun events in local apparent minutes after that day's local apparent midnight. */
export interface DayFrame {
  /** Previous evening's origin of the Italian count (sunset or dusk of the day before, plus offset), negative. */
  readonly previousEveningMinutes: number;
  readonly sunriseMinutes: number;
  readonly sunsetMinutes: number;
  /** This evening's origin of the Italian count (sunset or dusk, plus offset). */
  readonly eveningMinutes: number;
  /** Next morning's sunrise (after 1440). */
  readonly nextSunriseMinutes: number;
  /** Previous evening's sunset (negative), for night unequal hours before sunrise. */
  readonly previousSunsetMinutes: number;
}

/** Altitude of the sun's centre at the end of civil twilight, degrees (Explanatory Supplement 1992, sec. 9.3). */
export const CIVIL_DUSK_ALTITUDE_DEG = -6;

/**
 * Hour angle (degrees, >= 0) at which the sun's centre stands at `altitudeDeg`, for a declination
 * and latitude: cos H = (sin h - sin phi sin dec) / (cos phi cos dec) (Meeus 1998, eq. 15.1).
 * null when the sun never reaches that altitude that day (polar day or night).
 */
export function hourAngleAtAltitudeDeg(altitudeDeg: number, declinationDeg: number, latitudeDeg: number): number | null {
  const c = (sinDeg(altitudeDeg) - sinDeg(latitudeDeg) * sinDeg(declinationDeg)) / (cosDeg(latitudeDeg) * cosDeg(declinationDeg));
  if (c < -1 || c > 1) return null;
  return radToDeg(acosClamped(c));
}

/**
 * A day frame from a declination taken constant over the day and the evening before (the solver's
 * approximation): sunrise = 720 - 4 H0, sunset = 720 + 4 H0 apparent minutes. The previous evening is
 * taken equal to this evening shifted by a day: the error is the day-to-day change of sunset, under
 * 2 minutes at 48 deg latitude (most near the equinoxes), and the change of the equation of time is
 * already absent (apparent minutes). null for polar day or night.
 */
export function dayFrameFromDeclination(system: HourSystem, declinationDeg: number, latitudeDeg: number, sunriseAltitudeDeg: number): DayFrame | null {
  const h0 = hourAngleAtAltitudeDeg(sunriseAltitudeDeg, declinationDeg, latitudeDeg);
  if (h0 === null) return null;
  const sunrise = 720 - 4 * h0;
  const sunset = 720 + 4 * h0;
  let evening = sunset;
  if (system.kind === 'italian') {
    const hd = system.origin === 'civil-dusk' ? hourAngleAtAltitudeDeg(CIVIL_DUSK_ALTITUDE_DEG, declinationDeg, latitudeDeg) : h0;
    if (hd === null) return null;
    evening = 720 + 4 * hd + system.offsetMinutes;
  }
  return { previousEveningMinutes: evening - 1440, sunriseMinutes: sunrise, sunsetMinutes: sunset, eveningMinutes: evening, nextSunriseMinutes: sunrise + 1440, previousSunsetMinutes: sunset - 1440 };
}

/**
 * The reading, in minutes of the system's 24-hour count, at `apparentMinutes` (local apparent time,
 * [0, 1440)) of a day described by `frame`.
 * @example hourSystemReading({ kind: 'babylonian' }, 720, frame) // 720 - sunrise
 */
export function hourSystemReading(system: HourSystem, apparentMinutes: number, frame: DayFrame): number {
  const m = apparentMinutes;
  switch (system.kind) {
    case 'italian':
      return m >= frame.eveningMinutes ? m - frame.eveningMinutes : m - frame.previousEveningMinutes;
    case 'babylonian':
      return m >= frame.sunriseMinutes ? m - frame.sunriseMinutes : m - (frame.sunriseMinutes - 1440);
    case 'unequal':
      if (m >= frame.sunriseMinutes && m < frame.sunsetMinutes) return (720 * (m - frame.sunriseMinutes)) / (frame.sunsetMinutes - frame.sunriseMinutes);
      if (m >= frame.sunsetMinutes) return 720 + (720 * (m - frame.sunsetMinutes)) / (frame.nextSunriseMinutes - frame.sunsetMinutes);
      return 720 + (720 * (m - frame.previousSunsetMinutes)) / (frame.sunriseMinutes - frame.previousSunsetMinutes);
  }
}

/**
 * The local apparent minutes (may fall outside [0, 1440) when the reading belongs to the evening
 * before or the morning after) at which a clock of the system showed `readingMinutes` (its 24-hour
 * count, [0, 1440)) during the local day of `frame`. The Italian and Babylonian counts run from an
 * origin that lies on the evening or morning before, so a reading is placed after the origin that
 * leaves it within the day; the inverse of hourSystemReading on [0, 1440).
 */
export function hourSystemToApparentMinutes(system: HourSystem, readingMinutes: number, frame: DayFrame): number {
  switch (system.kind) {
    case 'italian': {
      const fromPrevious = frame.previousEveningMinutes + readingMinutes;
      return fromPrevious < frame.eveningMinutes ? fromPrevious : frame.eveningMinutes + readingMinutes;
    }
    case 'babylonian': {
      const fromToday = frame.sunriseMinutes + readingMinutes;
      return fromToday < 1440 ? fromToday : fromToday - 1440;
    }
    case 'unequal': {
      if (readingMinutes < 720) return frame.sunriseMinutes + (readingMinutes / 720) * (frame.sunsetMinutes - frame.sunriseMinutes);
      const night = (readingMinutes - 720) / 720;
      const evening = frame.sunsetMinutes + night * (frame.nextSunriseMinutes - frame.sunsetMinutes);
      return evening < 1440 ? evening : frame.previousSunsetMinutes + night * (frame.sunriseMinutes - frame.previousSunsetMinutes);
    }
  }
}

/** The system in words, for answers. */
export function describeHourSystem(system: HourSystem): string {
  switch (system.kind) {
    case 'italian': {
      const origin = system.origin === 'civil-dusk' ? "the end of the previous evening's civil twilight" : 'the previous sunset';
      const plus = system.offsetMinutes === 0 ? '' : ` ${system.offsetMinutes > 0 ? 'plus' : 'minus'} ${Math.abs(system.offsetMinutes)} min`;
      return `Italian hours (24 hours from ${origin}${plus})`;
    }
    case 'babylonian':
      return 'Babylonian hours (24 hours from sunrise)';
    case 'unequal':
      return 'unequal (temporal) hours (twelve from sunrise to sunset, twelve from sunset to sunrise)';
  }
}

/** The hour lines of a sundial in words: equal hours of local apparent time, or one of the systems above. */
export function describeSundialHours(hours: { readonly kind: 'apparent' } | HourSystem): string {
  return hours.kind === 'apparent' ? 'equal hours of local apparent time (the sun\'s hour angle)' : describeHourSystem(hours);
}
