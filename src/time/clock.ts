/**
 * Clock conventions: what a clock (or a written hour) kept, and how its reading turns into
 * an instant (UT Julian Day) and back.
 *
 * Kinds (src/scene/types.ts `ClockKind`):
 *  - `apparent`: local apparent (sundial) time at the site: local mean time + equation of time
 *    (720 min at the sun's local transit, up to the sun's parallax of at most 0.6 s).
 *  - `mean`: local mean time at the site's longitude: UT + longitude / 15 h.
 *  - `meridian:<deg>`: mean time of another meridian (east positive), e.g. a capital's
 *    mean time kept by railways and telegraphs before zone time.
 *  - `zone:<IANA>`: civil time of an IANA time zone through luxon (tz database). The database
 *    holds reliable rules only from the zone's first standard time; before that it gives
 *    local mean time of the zone's reference place. Zone time as such did not exist before
 *    1847 (railway time in Great Britain, December 1847), so before 1847 a zone is refused
 *    unless its earliest entry is local mean time (an offset that is not a whole quarter
 *    hour), in which case it is read as that place's mean time and said so.
 *  - `ut`: Universal Time (Greenwich mean time counted from midnight).
 * Definitions: Explanatory Supplement to the Astronomical Almanac (1992), sec. 2.24 and 2.3;
 * Meeus (1998) ch. 28.
 *
 * Extension point: further kinds are added to `ClockKind` with one case in each of
 * `localOffsetDays` (or, for kinds not tied to the mean sun, in `clockToJdUT` and
 * `jdUTToClockMinutes` directly) and in `parseClockKind` / `formatClockKind`. Italian hours
 * (hours counted from sunset, 24 at sunset) would be `{ kind: 'italian' }`: the day starts at
 * the previous evening's sunset (src/ephemeris/riseSet.ts), so the conversion needs the sunset
 * before the instant rather than a fixed offset. Not implemented.
 */
import { DateTime, IANAZone } from 'luxon';
import { ConvergenceError, InvalidInputError, UnsupportedError } from '../errors.js';
import type { ClockKind } from '../scene/types.js';
import { equationOfTimeMinutes } from '../ephemeris/equationOfTime.js';
import type { SunSite } from '../ephemeris/sunPosition.js';
import { dayFrameOf, isHourSystem } from './hourSystemClock.js';
import { historicalEntry, historicalOffsetMinutes, tzDataWords } from './zoneHistory.js';
import { describeHourSystem, hourSystemReading, hourSystemToApparentMinutes } from './hourSystems.js';

/** The part of a site a clock needs: its longitude, degrees east; hour systems tied to sunrise and sunset also need latitude and height. */
export interface ClockSite {
  readonly longitudeDeg: number;
  readonly latitudeDeg?: number;
  readonly elevationM?: number;
}

/** The full site an hour system needs (sunrise and sunset), or an error naming what is missing (a programming error). */
function fullSite(site: ClockSite): SunSite {
  if (site.latitudeDeg === undefined) throw new Error('hour systems need the site latitude (ClockSite.latitudeDeg)');
  return { latitudeDeg: site.latitudeDeg, longitudeDeg: site.longitudeDeg, elevationM: site.elevationM ?? 0 };
}

/** JD of the Unix epoch 1970-01-01 0h UT (Meeus 1998 ch. 7), to speak to luxon in milliseconds. */
const UNIX_EPOCH_JD = 2440587.5;
const MS_PER_DAY = 86400000;
/** JD of 1847-12-01 0h UT (Gregorian): railway time in Great Britain, the first zone-like civil time (common practice). */
export const ZONE_TIME_EARLIEST_JD = 2395996.5;

/**
 * Offset of a zone from UT at an instant, minutes (fractional for local mean time): before 1970 from
 * the full IANA history with backzone (src/time/zoneHistory.ts), from 1970 through luxon (ICU).
 */
export function zoneOffsetMinutes(zone: string, jdUT: number): number {
  const historical = historicalOffsetMinutes(zone, Math.floor((jdUT - UNIX_EPOCH_JD) * 86400));
  if (historical !== null) return historical;
  return DateTime.fromMillis(Math.round((jdUT - UNIX_EPOCH_JD) * MS_PER_DAY), { zone }).offset;
}

/** True when the zone keeps summer (daylight saving) time at the instant (from 1970: luxon over the runtime's data; before: the history). */
export function isSummerTimeInZone(zone: string, jdUT: number): boolean {
  const unixSeconds = Math.floor((jdUT - UNIX_EPOCH_JD) * 86400);
  const historical = historicalEntry(zone, unixSeconds);
  if (historical !== null) return historical.summerTime;
  return DateTime.fromMillis(unixSeconds * 1000, { zone }).isInDST;
}

/** True when the offset is not a whole quarter hour: the tz database's local mean time entry. */
function isLocalMeanTimeOffset(offsetMinutes: number): boolean {
  return Math.abs(offsetMinutes / 15 - Math.round(offsetMinutes / 15)) > 1e-6;
}

/** What the tz database gives for a zone at an instant, and how to read it. */
export interface ZoneReading {
  readonly offsetMinutes: number;
  /** True when the zone's entry is local mean time of its reference place (before its first standard time). */
  readonly localMeanTime: boolean;
  /** The meridian of that local mean time, degrees east (offset / 4), when localMeanTime. */
  readonly meridianDeg: number | null;
}

/**
 * The zone's offset at jdUT, refusing instants where zone time means nothing:
 * before 1847 unless the zone's entry there is local mean time.
 */
export function zoneReading(zone: string, jdUT: number, field = 'clock'): ZoneReading {
  const offsetMinutes = zoneOffsetMinutes(zone, jdUT);
  // Summer time of a local-mean-time zone (Amsterdam 1909-1940: +1:19:32, then +1:20): judge the standard offset, an hour less.
  const summerHours = historicalEntry(zone, Math.floor((jdUT - UNIX_EPOCH_JD) * 86400))?.summerTime === true ? 60 : 0;
  const standardMinutes = offsetMinutes - summerHours;
  const localMeanTime = isLocalMeanTimeOffset(standardMinutes);
  if (jdUT < ZONE_TIME_EARLIEST_JD && !localMeanTime) {
    throw new UnsupportedError(
      `${field}: zone ${JSON.stringify(zone)} has no time-keeping rule before 1847 (zone time did not exist yet) - ` +
        `the time zone database would apply a later rule backwards. Use "mean" (local mean time), "apparent" (sundial time) ` +
        `or "meridian:<degrees>" for the mean time of a stated meridian`,
    );
  }
  return { offsetMinutes, localMeanTime, meridianDeg: localMeanTime ? standardMinutes / 4 : null };
}

/** Offset of local clock time from UT in days, for the kinds tied to the mean sun or a zone. */
function localOffsetDays(jdUT: number, clock: ClockKind, site: ClockSite, deltaTSeconds?: number): number {
  switch (clock.kind) {
    case 'ut':
      return 0;
    case 'mean':
      return site.longitudeDeg / 360; // Explanatory Supplement (1992) sec. 2.24: LMT = UT + longitude
    case 'meridian':
      return clock.longitudeDeg / 360;
    case 'apparent':
      // Local apparent time = local mean time + equation of time (Meeus 1998 ch. 28).
      return site.longitudeDeg / 360 + equationOfTimeMinutes(jdUT, deltaTSeconds) / 1440;
    case 'zone':
      return zoneReading(clock.zone, jdUT).offsetMinutes / 1440;
    case 'italian':
    case 'babylonian':
    case 'unequal':
      throw new Error(`${clock.kind} hours are not an offset from UT (clock.ts handles them before)`);
  }
}

const MAX_STEPS = 8;

/**
 * The instant (UT JD) at which a clock of the given kind showed `minutesOfDay` on the local
 * day whose 0h is `localDayJd0` (a JD ending in .5 naming the civil day, from the calendar code).
 * Apparent time and zone time depend on the instant itself: solved by a bounded fixed-point
 * iteration (the equation of time changes by under 0.5 s per hour). For a zone time that
 * does not exist (skipped by a change to summer time) an InvalidInputError is thrown; for
 * one that exists twice, the earlier instant is returned.
 * @example clockToJdUT(2451544.5, 720, { kind: 'mean' }, { longitudeDeg: 15 }) // 2451545.0 - 15/360
 */
export function clockToJdUT(localDayJd0: number, minutesOfDay: number, clock: ClockKind, site: ClockSite, deltaTSeconds?: number): number {
  if (isHourSystem(clock)) {
    // The reading names apparent minutes of the day by the day's own sunrise and sunset (src/time/hourSystems.ts).
    const apparent = hourSystemToApparentMinutes(clock, minutesOfDay, dayFrameOf(clock, localDayJd0, fullSite(site)));
    return clockToJdUT(localDayJd0, apparent, { kind: 'apparent' }, site, deltaTSeconds);
  }
  const localJd = localDayJd0 + minutesOfDay / 1440;
  if (clock.kind === 'ut' || clock.kind === 'mean' || clock.kind === 'meridian') {
    return localJd - localOffsetDays(localJd, clock, site);
  }
  if (clock.kind === 'zone') {
    // Try the offsets in force half a day either side; keep the candidates that read back.
    const candidates = new Set<number>();
    for (const probe of [localJd - 0.5, localJd, localJd + 0.5]) {
      candidates.add(zoneOffsetMinutes(clock.zone, probe));
    }
    const hits = [...candidates]
      .map((off) => localJd - off / 1440)
      .filter((jdUT) => Math.abs(jdUT + zoneReading(clock.zone, jdUT).offsetMinutes / 1440 - localJd) < 1e-9)
      .sort((a, b) => a - b);
    if (hits.length === 0) {
      throw new InvalidInputError('time', `${formatMinutes(minutesOfDay)} (${clock.zone})`, 'a time that existed on that day in that zone', 'It falls in the hour skipped when the clocks were put forward');
    }
    return hits[0];
  }
  let jdUT = localJd - site.longitudeDeg / 360;
  for (let i = 0; i < MAX_STEPS; i += 1) {
    const next = localJd - localOffsetDays(jdUT, clock, site, deltaTSeconds);
    if (Math.abs(next - jdUT) < 1e-10) return next;
    jdUT = next;
  }
  // Each step shrinks the error by a factor of about 3e-4: two or three steps suffice.
  throw new ConvergenceError('apparent time to UT conversion', MAX_STEPS);
}

/** A clock reading: the local day (its 0h as a JD ending in .5) and minutes since local midnight. */
export interface ClockReading {
  readonly dayJd0: number;
  readonly minutesOfDay: number;
}

/**
 * What a clock of the given kind showed at instant jdUT.
 * @example jdUTToClockMinutes(2451545.0, { kind: 'ut' }, site) // { dayJd0: 2451544.5, minutesOfDay: 720 }
 */
export function jdUTToClockMinutes(jdUT: number, clock: ClockKind, site: ClockSite, deltaTSeconds?: number): ClockReading {
  if (isHourSystem(clock)) {
    const apparent = jdUTToClockMinutes(jdUT, { kind: 'apparent' }, site, deltaTSeconds);
    const frame = dayFrameOf(clock, apparent.dayJd0, fullSite(site));
    return { dayJd0: apparent.dayJd0, minutesOfDay: hourSystemReading(clock, apparent.minutesOfDay, frame) };
  }
  const localJd = jdUT + localOffsetDays(jdUT, clock, site, deltaTSeconds);
  const dayJd0 = Math.floor(localJd - 0.5) + 0.5;
  return { dayJd0, minutesOfDay: (localJd - dayJd0) * 1440 };
}

/** hh:mm:ss of minutes since midnight (seconds rounded). */
export function formatMinutes(minutesOfDay: number): string {
  let s = Math.round(minutesOfDay * 60);
  s = ((s % 86400) + 86400) % 86400;
  const hh = Math.floor(s / 3600);
  const mm = Math.floor((s % 3600) / 60);
  const ss = s % 60;
  return `${String(hh).padStart(2, '0')}:${String(mm).padStart(2, '0')}:${String(ss).padStart(2, '0')}`;
}

const CLOCK_ALLOWED =
  'apparent, mean, meridian:<degrees east, -180 to 180>, zone:<IANA zone name such as Europe/Zurich>, ut, ' +
  'italian (from sunset), italian+<minutes> (from sunset plus minutes), italian:dusk (from the end of civil twilight), babylonian (from sunrise), or unequal (temporal hours)';

/** Italian hours as written: italian, italian+30, italian-15, italian:dusk, italian:dusk+10. */
function parseItalian(lower: string, field: string, text: string): ClockKind {
  const match = /^italian(:dusk)?(?:([+-])(\d{1,3}))?$/.exec(lower);
  if (!match) throw new InvalidInputError(field, text, CLOCK_ALLOWED, 'Italian hours: italian, italian+<minutes after sunset> (0 to 120), or italian:dusk');
  const offset = match[3] === undefined ? 0 : Number(match[3]) * (match[2] === '-' ? -1 : 1);
  if (Math.abs(offset) > 120) throw new InvalidInputError(field, text, CLOCK_ALLOWED, 'The offset from sunset is at most 120 minutes either way');
  return { kind: 'italian', origin: match[1] === undefined ? 'sunset' : 'civil-dusk', offsetMinutes: offset };
}

/**
 * Read a clock kind from text: `apparent`, `mean`, `meridian:<deg>`, `zone:<IANA>`, `ut`.
 * @example parseClockKind('meridian:2.3372', '--clock') // { kind: 'meridian', longitudeDeg: 2.3372 }
 */
export function parseClockKind(text: string, field: string): ClockKind {
  const t = text.trim();
  const lower = t.toLowerCase();
  if (lower === 'apparent' || lower === 'mean' || lower === 'ut' || lower === 'babylonian' || lower === 'unequal') return { kind: lower };
  if (lower.startsWith('italian')) return parseItalian(lower, field, text);
  if (lower.startsWith('meridian:')) {
    const body = t.slice('meridian:'.length).trim();
    const value = /^[+-]?(\d+(\.\d*)?|\.\d+)$/.test(body) ? Number(body) : NaN;
    if (!Number.isFinite(value) || value < -180 || value > 180) {
      throw new InvalidInputError(field, text, CLOCK_ALLOWED, 'The meridian is a longitude in degrees, east positive (meridian:-0.0015 or meridian:2.3372)');
    }
    return { kind: 'meridian', longitudeDeg: value };
  }
  if (lower.startsWith('zone:')) {
    const zone = t.slice('zone:'.length).trim();
    if (!IANAZone.isValidZone(zone)) {
      throw new InvalidInputError(field, text, CLOCK_ALLOWED, `${JSON.stringify(zone)} is not a zone of the IANA time zone database (for example Europe/Berlin, America/New_York)`);
    }
    return { kind: 'zone', zone };
  }
  throw new InvalidInputError(field, text, CLOCK_ALLOWED);
}

/** The text form of a clock kind, as parseClockKind reads it. */
export function formatClockKind(clock: ClockKind): string {
  switch (clock.kind) {
    case 'meridian':
      return `meridian:${clock.longitudeDeg}`;
    case 'zone':
      return `zone:${clock.zone}`;
    case 'italian':
      return `italian${clock.origin === 'civil-dusk' ? ':dusk' : ''}${clock.offsetMinutes === 0 ? '' : `${clock.offsetMinutes > 0 ? '+' : '-'}${Math.abs(clock.offsetMinutes)}`}`;
    default:
      return clock.kind;
  }
}

/** A plain description of a clock kind for reports. */
export function describeClockKind(clock: ClockKind): string {
  switch (clock.kind) {
    case 'apparent':
      return 'local apparent (sundial) time';
    case 'mean':
      return 'local mean time';
    case 'meridian':
      return `mean time of the meridian ${Math.abs(clock.longitudeDeg)} deg ${clock.longitudeDeg < 0 ? 'W' : 'E'}`;
    case 'zone':
      return `zone time ${clock.zone} (${tzDataWords()})`;
    case 'italian':
    case 'babylonian':
    case 'unequal':
      return describeHourSystem(clock);
    case 'ut':
      return 'Universal Time';
  }
}
