/**
 * The site, day and moment that `sun` and `moon` share: their options read and checked (bad input:
 * InvalidInputError naming the option, the value and what is allowed), the instant in UT, every time
 * scale of that moment, the civil date in both calendars, and the lines of the answer that say so.
 * A thin layer over src/calendar and src/time.
 */
import { signedFixed } from '../textUnits.js';
import { DEFAULT_DELTA_T_MODEL, deltaTModelName, parseDeltaTModel, type DeltaTModel } from '../time/deltaT.js';
import { InvalidInputError, UnsupportedError } from '../errors.js';
import type { Air, CalendarRule, ClockKind } from '../scene/types.js';
import { jdToCalendarDate, weekdayOfJd, WEEKDAY_NAMES } from '../calendar/julianDay.js';
import { civilDateToJd, jdToCivilDate, parseCalendarRule } from '../calendar/regions.js';
import { parseDateText } from '../calendar/parseDate.js';
import { coordinateWords, parseCoordinate, type CoordinateAxis } from '../scene/coordinateText.js';
import { formatCalendarDate, formatDayWords, formatIsoDay } from '../calendar/format.js';
import type { SunSite } from '../ephemeris/sunPosition.js';
import { deltaTAtJdUT, jdUTToJdTT } from '../time/timeScales.js';
import { clockToJdUT, describeClockKind, formatClockKind, formatMinutes, jdUTToClockMinutes, parseClockKind, zoneReading } from '../time/clock.js';
import type { SiteMomentOptions } from './siteMomentSpec.js';
import { dayFrameOf } from '../time/hourSystemClock.js';
import { hourSystemReading, type DayFrame, type HourSystem } from '../time/hourSystems.js';

/** Years `sun` and `moon` accept: those of a scene window (src/scene/readScene.ts MIN_YEAR, MAX_YEAR), where the Delta T models have a stated sigma. */
const MIN_YEAR = -1999;
const MAX_YEAR = 3000;

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** A number option within [min, max], or InvalidInputError naming the option. */
export function numberOption(text: string | undefined, field: string, min: number, max: number, what: string): number {
  if (text === undefined) throw new InvalidInputError(field, text, `${what} (this option is required)`);
  const value = NUMBER.test(text.trim()) ? Number(text) : NaN;
  if (!Number.isFinite(value) || value < min || value > max) throw new InvalidInputError(field, text, what);
  return value;
}

/** A required latitude or longitude: decimal degrees, or degrees-minutes-seconds with a hemisphere letter. */
function coordinateOption(text: string | undefined, field: string, axis: CoordinateAxis): number {
  if (text === undefined) throw new InvalidInputError(field, text, `${coordinateWords(axis)} (this option is required)`);
  return parseCoordinate(text, axis, field);
}

/** hh:mm or hh:mm:ss (24-hour) to minutes since midnight. */
export function parseTimeOfDay(text: string | undefined, field: string, whenRequired = 'required unless --day is given'): number {
  const allowed = 'a time of day hh:mm or hh:mm:ss on a 24-hour clock, 00:00 to 23:59:59';
  if (text === undefined) throw new InvalidInputError(field, text, `${allowed} (${whenRequired})`);
  const m = /^(\d{1,2}):(\d{2})(?::(\d{2}(?:\.\d+)?))?$/.exec(text.trim());
  if (!m) throw new InvalidInputError(field, text, allowed);
  const h = Number(m[1]);
  const min = Number(m[2]);
  const s = m[3] === undefined ? 0 : Number(m[3]);
  if (h > 23 || min > 59 || s >= 60) throw new InvalidInputError(field, text, allowed);
  return h * 60 + min + s / 60;
}

/** The shared options, read and checked. */
export interface SiteMoment {
  readonly deltaTModel: DeltaTModel;
  readonly site: SunSite;
  readonly air: Air;
  readonly rule: CalendarRule;
  readonly clock: ClockKind;
  readonly dayJd0: number;
  readonly dateText: string;
}

/** Read and check the shared options; throws InvalidInputError on the first bad one. */
export function readSiteMoment(options: SiteMomentOptions): SiteMoment {
  const site: SunSite = {
    latitudeDeg: coordinateOption(options.lat, '--lat', 'latitude'),
    longitudeDeg: coordinateOption(options.lon, '--lon', 'longitude'),
    elevationM: numberOption(options.elevation, '--elevation', -500, 9000, 'a height above sea level from -500 to 9000 metres'),
  };
  const air: Air = {
    pressureHPa: numberOption(options.pressure, '--pressure', 100, 1200, 'an air pressure from 100 to 1200 hPa'),
    temperatureC: numberOption(options.temperature, '--temperature', -80, 60, 'an air temperature from -80 to 60 degrees Celsius'),
  };
  const rule = parseCalendarRule(options.calendar, '--calendar');
  const clock = parseClockKind(options.clock, '--clock');
  if (options.date === undefined) throw new InvalidInputError('--date', undefined, 'a civil date such as 1650-03-10 (this option is required)');
  const day = parseDateText(options.date, '--date');
  if (day.year < MIN_YEAR || day.year > MAX_YEAR) {
    throw new InvalidInputError('--date', options.date, `a date in the years ${MIN_YEAR} to ${MAX_YEAR} (astronomical numbering)`, 'That is the range over which the Delta T models state an uncertainty, as for the window of a scene file.');
  }
  const dayJd0 = civilDateToJd(rule, day, '--date');
  const deltaTModel = options.deltaT === undefined ? DEFAULT_DELTA_T_MODEL : parseDeltaTModel(options.deltaT, '--delta-t');
  return { deltaTModel, site, air, rule, clock, dayJd0, dateText: formatIsoDay(day) };
}

export const fixed = (x: number, digits: number): string => x.toFixed(digits);
/** A signed number, never "-0.00" (src/textUnits.ts). */
export const signed = signedFixed;

/** The reading of a clock of that kind at an instant, hh:mm:ss. */
export function clockText(jdUT: number, clock: ClockKind, site: SunSite): string {
  return formatMinutes(jdUTToClockMinutes(jdUT, clock, site).minutesOfDay);
}

/** The reading of a clock at an instant, or null where an hour system tied to sunrise and sunset has no reading (a day without sunrise or sunset). */
export function hourSystemText(jdUT: number, clock: ClockKind, site: SunSite): string | null {
  try {
    return clockText(jdUT, clock, site);
  } catch (error) {
    if (error instanceof UnsupportedError) return null;
    throw error;
  }
}

const ITALIAN_FROM_SUNSET: HourSystem = { kind: 'italian', origin: 'sunset', offsetMinutes: 0 };

/**
 * The readings in the three hour systems tied to sunrise and sunset, or nulls on a day without
 * sunrise or sunset. One day frame serves all three (src/time/hourSystemClock.ts: Italian hours
 * from sunset with no offset count from the same sunset as the others), so the sunrises and
 * sunsets around the day are found once, not once per system: the same readings as
 * jdUTToClockMinutes gives for each.
 */
function hourSystemTexts(jdUT: number, site: SunSite): { italian: string | null; babylonian: string | null; unequal: string | null } {
  const apparent = jdUTToClockMinutes(jdUT, { kind: 'apparent' }, site);
  let frame: DayFrame;
  try {
    frame = dayFrameOf(ITALIAN_FROM_SUNSET, apparent.dayJd0, site);
  } catch (error) {
    if (error instanceof UnsupportedError) return { italian: null, babylonian: null, unequal: null };
    throw error;
  }
  const text = (system: HourSystem): string => formatMinutes(hourSystemReading(system, apparent.minutesOfDay, frame));
  return { italian: text(ITALIAN_FROM_SUNSET), babylonian: text({ kind: 'babylonian' }), unequal: text({ kind: 'unequal' }) };
}

/**
 * The UT instant of --time on the day, after checking --time and, for a zone clock, that the zone
 * database covers that day; `whenRequired` words when --time is required in the refusal of a missing one.
 */
export function jdUTOfMoment(options: SiteMomentOptions, inputs: SiteMoment, whenRequired?: string): number {
  const minutes = parseTimeOfDay(options.time, '--time', whenRequired);
  if (inputs.clock.kind === 'zone') zoneReading(inputs.clock.zone, clockToJdUT(inputs.dayJd0, minutes, { kind: 'mean' }, inputs.site), '--clock');
  return clockToJdUT(inputs.dayJd0, minutes, inputs.clock, inputs.site);
}

/** The place of a body in the sky at one moment, in the JSON naming `sun` and `moon` share. */
export function placeRecord(
  jdUT: number,
  inputs: SiteMoment,
  p: { readonly azimuthDeg: number; readonly altitudeDeg: number; readonly geometricAltitudeDeg: number; readonly declinationDeg: number; readonly rightAscensionDeg: number; readonly hourAngleDeg: number },
) {
  return {
    jd: jdUT,
    jdTT: jdUTToJdTT(jdUT, inputs.deltaTModel),
    azimuth: p.azimuthDeg,
    altitude: p.altitudeDeg,
    geometricAltitude: p.geometricAltitudeDeg,
    declination: p.declinationDeg,
    rightAscension: p.rightAscensionDeg,
    hourAngle: p.hourAngleDeg,
  };
}

/** Delta T, every time scale and the civil date of one moment, as plain data (also the JSON form). */
export function momentTimes(jdUT: number, inputs: SiteMoment) {
  const { site, clock, rule, dayJd0, deltaTModel } = inputs;
  const dT = deltaTAtJdUT(jdUT, deltaTModel);
  const civil = jdToCivilDate(rule, dayJd0);
  const utDay = jdToCalendarDate(jdUT, civil.date.calendar);
  const zone = clock.kind === 'zone' ? zoneReading(clock.zone, jdUT, '--clock') : null;
  return {
    deltaT: { seconds: dT.seconds, sigmaSeconds: dT.sigmaSeconds, model: deltaTModel, modelName: deltaTModelName(deltaTModel) },
    times: {
      ut: `${formatMinutes((utDay.dayFraction) * 1440)} on ${formatCalendarDate(utDay.date)}`,
      tt: formatMinutes(((jdUTToJdTT(jdUT, deltaTModel) - 0.5) % 1) * 1440),
      apparent: clockText(jdUT, { kind: 'apparent' }, site),
      mean: clockText(jdUT, { kind: 'mean' }, site),
      // Hour systems tied to sunrise and sunset (src/time/hourSystems.ts); null on a day without sunrise or sunset.
      ...hourSystemTexts(jdUT, site),
      clock: clockText(jdUT, clock, site),
      clockKind: formatClockKind(clock),
      ...(zone
        ? {
            zone: clockText(jdUT, clock, site),
            zoneOffsetMinutes: zone.offsetMinutes,
            zoneIsLocalMeanTime: zone.localMeanTime,
            zoneMeridianDeg: zone.meridianDeg,
          }
        : {}),
    },
    dates: {
      civil: formatIsoDay(civil.civil),
      civilCalendar: civil.reckoning,
      julian: formatIsoDay(jdToCalendarDate(dayJd0, 'julian').date),
      gregorian: formatIsoDay(jdToCalendarDate(dayJd0, 'gregorian').date),
      weekday: WEEKDAY_NAMES[weekdayOfJd(dayJd0)],
      jdOfLocalMidnight: dayJd0,
    },
  };
}

/** The record of momentTimes with the instant's Julian Day (UT). */
export type MomentTimes = ReturnType<typeof momentTimes> & { readonly jd: number };

/** The rule as the user would write it again. */
export function formatRule(rule: CalendarRule): string {
  switch (rule.kind) {
    case 'region':
      return rule.regionId;
    case 'switch':
      return `switch:${formatIsoDay(rule.lastJulian)}/${formatIsoDay(rule.firstGregorian)}`;
    default:
      return rule.kind;
  }
}

/** "Defaults used: ..." naming every option left at its default (`extra` words any command-specific ones). */
export function defaultsLine(options: SiteMomentOptions, extra: Readonly<Record<string, string>> = {}, omit: readonly string[] = []): string {
  const names: Record<string, string> = {
    elevation: `--elevation ${options.elevation} m`,
    calendar: `--calendar ${options.calendar} (proleptic Gregorian before 1582)`,
    clock: `--clock ${options.clock} (${describeClockKind(parseClockKind(options.clock, '--clock'))})`,
    pressure: `--pressure ${options.pressure} hPa`,
    temperature: `--temperature ${options.temperature} C`,
    ...extra,
  };
  const used = options.defaulted.filter((n) => !omit.includes(n)).map((n) => names[n]);
  return used.length === 0 ? 'Defaults used: none' : `Defaults used: ${used.join(', ')}`;
}

/** The options as given, for the `input` block of --json. */
export function inputRecord(options: SiteMomentOptions, inputs: SiteMoment) {
  return {
    lat: inputs.site.latitudeDeg,
    lon: inputs.site.longitudeDeg,
    elevation: inputs.site.elevationM,
    date: inputs.dateText,
    calendar: options.calendar,
    time: options.time ?? null,
    clock: formatClockKind(inputs.clock),
    pressure: inputs.air.pressureHPa,
    temperature: inputs.air.temperatureC,
  };
}

/** The day in both calendars with its weekday, for an answer without a moment. */
export function dayWords(dayJd0: number): string {
  return `${formatDayWords(jdToCalendarDate(dayJd0, 'julian').date)} (Julian) = ${formatDayWords(jdToCalendarDate(dayJd0, 'gregorian').date)} (Gregorian), ${WEEKDAY_NAMES[weekdayOfJd(dayJd0)]}`;
}

/** The first lines of an answer for one moment: site, day, and every time scale of the moment. */
export function momentHeaderLines(r: MomentTimes, inputs: SiteMoment): string[] {
  const { site, clock } = inputs;
  const lines = [
    `Site        ${fixed(Math.abs(site.latitudeDeg), 4)} ${site.latitudeDeg < 0 ? 'S' : 'N'}, ${fixed(Math.abs(site.longitudeDeg), 4)} ${site.longitudeDeg < 0 ? 'W' : 'E'}, ${site.elevationM} m`,
    `Day         ${dayWords(r.dates.jdOfLocalMidnight)}`,
    `            civil date ${r.dates.civil} in the ${r.dates.civilCalendar} calendar under --calendar ${formatRule(inputs.rule)}`,
    '',
    'Time scales of the moment',
    `  clock given (${describeClockKind(clock)})  ${r.times.clock}`,
    `  local apparent time  ${r.times.apparent}`,
    `  local mean time      ${r.times.mean}`,
    `  Italian hours        ${r.times.italian ?? '-'}  (24 hours from the previous sunset)`,
    `  Babylonian hours     ${r.times.babylonian ?? '-'}  (24 hours from sunrise)`,
    `  unequal hours        ${r.times.unequal ?? '-'}  (temporal: 00-12 the twelve hours of daylight, 12-24 those of the night)`,
  ];
  if (r.times.zone !== undefined) {
    lines.push(
      `  zone time ${clock.kind === 'zone' ? clock.zone : ''}  ${r.times.zone} (UT ${signed((r.times.zoneOffsetMinutes ?? 0) / 60, 4)} h)` +
        (r.times.zoneIsLocalMeanTime
          ? ` - for this date the zone database gives a local mean time (of the meridian ${fixed(r.times.zoneMeridianDeg ?? 0, 2)} deg` +
            `${Math.abs((r.times.zoneOffsetMinutes ?? 0) - 4 * (r.times.zoneMeridianDeg ?? 0) - 60) < 1e-6 ? ', with an hour of summer time' : ''}), not a standard zone time`
          : ''),
    );
  }
  lines.push(
    `  UT                   ${r.times.ut}`,
    `  TT                   ${r.times.tt}  (Delta T ${fixed(r.deltaT.seconds, 1)} s +/- ${fixed(r.deltaT.sigmaSeconds, r.deltaT.sigmaSeconds < 1 ? 2 : 1)} s, ${r.deltaT.modelName})`,
    `  Julian Day (UT)      ${fixed(r.jd, 6)}`,
  );
  return lines;
}
