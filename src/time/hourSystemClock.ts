/**
 * Hour systems (src/time/hourSystems.ts) on real days: the day frame of a site and local day from
 * the full ephemeris, so that a reading in Italian, Babylonian or unequal hours turns into an instant
 * and back. Sunrise and sunset: src/ephemeris/riseSet.ts (centre 0.8333 deg below a level horizon,
 * Meeus 1998 ch. 15); the end of civil twilight: the hour angle at -6 deg for the declination at
 * sunset (Meeus 1998 eq. 15.1; the declination changes by under 0.01 deg in that half hour).
 */
import { equationOfTimeMinutes } from '../ephemeris/equationOfTime.js';
import { sunEvents, SUNRISE_ALTITUDE_DEG } from '../ephemeris/riseSet.js';
import { sunPosition, type SunSite } from '../ephemeris/sunPosition.js';
import { UnsupportedError } from '../errors.js';
import { CIVIL_DUSK_ALTITUDE_DEG, hourAngleAtAltitudeDeg, type DayFrame, type HourSystem } from './hourSystems.js';

/** Local apparent minutes of an instant, counted from local apparent 0h of the day whose mean 0h is localDayJd0 (JD ending in .5). */
function apparentMinutesOf(jdUT: number, localDayJd0: number, site: SunSite): number {
  return (jdUT + site.longitudeDeg / 360 - localDayJd0) * 1440 + equationOfTimeMinutes(jdUT);
}

/** Sunrise and the Italian origin of one local day, apparent minutes from that day's 0h. */
function eventsOfDay(system: HourSystem, localDayJd0: number, site: SunSite): { sunrise: number; sunset: number; evening: number } {
  const ev = sunEvents(localDayJd0 - site.longitudeDeg / 360, site);
  if (ev.sunriseJdUT === null || ev.sunsetJdUT === null) {
    throw new UnsupportedError(`hour systems tied to sunrise and sunset have no reading on a day without sunrise or sunset (polar ${ev.polar ?? 'day'} at latitude ${site.latitudeDeg})`);
  }
  const sunrise = apparentMinutesOf(ev.sunriseJdUT, localDayJd0, site);
  const sunset = apparentMinutesOf(ev.sunsetJdUT, localDayJd0, site);
  let evening = sunset;
  if (system.kind === 'italian') {
    if (system.origin === 'civil-dusk') {
      const dec = sunPosition(ev.sunsetJdUT, site, 'none').declinationDeg;
      const h = hourAngleAtAltitudeDeg(CIVIL_DUSK_ALTITUDE_DEG, dec, site.latitudeDeg);
      const h0 = hourAngleAtAltitudeDeg(SUNRISE_ALTITUDE_DEG, dec, site.latitudeDeg);
      if (h === null || h0 === null) throw new UnsupportedError(`civil twilight does not end on this day at latitude ${site.latitudeDeg}`);
      evening = sunset + 4 * (h - h0);
    }
    evening += system.offsetMinutes;
  }
  return { sunrise, sunset, evening };
}

/**
 * The day frame of a local day (mean 0h at localDayJd0), with the previous evening and the next
 * morning from their own days. Three rise/set computations.
 */
export function dayFrameOf(system: HourSystem, localDayJd0: number, site: SunSite): DayFrame {
  const before = eventsOfDay(system, localDayJd0 - 1, site);
  const today = eventsOfDay(system, localDayJd0, site);
  const after = eventsOfDay(system, localDayJd0 + 1, site);
  return {
    previousEveningMinutes: before.evening - 1440,
    sunriseMinutes: today.sunrise,
    sunsetMinutes: today.sunset,
    eveningMinutes: today.evening,
    nextSunriseMinutes: after.sunrise + 1440,
    previousSunsetMinutes: before.sunset - 1440,
  };
}

/** True for the clock kinds that count from sunrise or sunset. */
export function isHourSystem(clock: { readonly kind: string }): clock is HourSystem {
  return clock.kind === 'italian' || clock.kind === 'babylonian' || clock.kind === 'unequal';
}
