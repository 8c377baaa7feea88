/**
 * `heliochron sun`: the sun at a site and moment, every time scale of that moment, and
 * with --day the whole day between sunrise and sunset. A thin layer over src/ephemeris,
 * src/time and src/calendar; all validation of the options is here.
 */
import { signedFixed } from '../textUnits.js';
import { sunAccuracyWordsFrom } from '../report/formatTimes.js';
import { DEFAULT_DELTA_T_MODEL, deltaTModelName, parseDeltaTModel, type DeltaTModel } from '../time/deltaT.js';
import { InvalidInputError, UnsupportedError } from '../errors.js';
import type { Air, CalendarRule, ClockKind } from '../scene/types.js';
import { jdToCalendarDate, weekdayOfJd, WEEKDAY_NAMES } from '../calendar/julianDay.js';
import { civilDateToJd, jdToCivilDate, parseCalendarRule } from '../calendar/regions.js';
import { parseDateText } from '../calendar/parseDate.js';
import { coordinateWords, parseCoordinate, type CoordinateAxis } from '../scene/coordinateText.js';
import { formatCalendarDate, formatDayWords, formatIsoDay } from '../calendar/format.js';
import { sunPosition, type SunPosition, type SunSite } from '../ephemeris/sunPosition.js';
import { sunEvents } from '../ephemeris/riseSet.js';
import { deltaTAtJdUT, jdUTToJdTT } from '../time/timeScales.js';
import { clockToJdUT, describeClockKind, formatClockKind, formatMinutes, jdUTToClockMinutes, parseClockKind, zoneReading } from '../time/clock.js';
import { dayFrameOf } from '../time/hourSystemClock.js';
import { hourSystemReading, type DayFrame, type HourSystem } from '../time/hourSystems.js';
import type { CliIo } from './io.js';
import type { SunOptions } from './sunSpec.js';

/** Years the sun command accepts: those of a scene window (src/scene/readScene.ts MIN_YEAR, MAX_YEAR), where the Delta T models have a stated sigma. */
const MIN_YEAR = -1999;
const MAX_YEAR = 3000;

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** A number option within [min, max], or InvalidInputError naming the option. */
function numberOption(text: string | undefined, field: string, min: number, max: number, what: string): number {
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
export function parseTimeOfDay(text: string | undefined, field: string): number {
  const allowed = 'a time of day hh:mm or hh:mm:ss on a 24-hour clock, 00:00 to 23:59:59';
  if (text === undefined) throw new InvalidInputError(field, text, `${allowed} (required unless --day is given)`);
  const m = /^(\d{1,2}):(\d{2})(?::(\d{2}(?:\.\d+)?))?$/.exec(text.trim());
  if (!m) throw new InvalidInputError(field, text, allowed);
  const h = Number(m[1]);
  const min = Number(m[2]);
  const s = m[3] === undefined ? 0 : Number(m[3]);
  if (h > 23 || min > 59 || s >= 60) throw new InvalidInputError(field, text, allowed);
  return h * 60 + min + s / 60;
}

interface Inputs {
  readonly deltaTModel: DeltaTModel;
  readonly site: SunSite;
  readonly air: Air;
  readonly rule: CalendarRule;
  readonly clock: ClockKind;
  readonly dayJd0: number;
  readonly dateText: string;
}

function readInputs(options: SunOptions): Inputs {
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

const f = (x: number, digits: number): string => x.toFixed(digits);
const signed = signedFixed;

function clockText(jdUT: number, clock: ClockKind, site: SunSite): string {
  return formatMinutes(jdUTToClockMinutes(jdUT, clock, site).minutesOfDay);
}

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

const ITALIAN_FROM_SUNSET: HourSystem = { kind: 'italian', origin: 'sunset', offsetMinutes: 0 };

/** Everything the answer reports about one moment, as plain data (also the JSON form). */
function momentRecord(jdUT: number, inputs: Inputs, p: SunPosition) {
  const { site, clock, rule, dayJd0, deltaTModel } = inputs;
  const dT = deltaTAtJdUT(jdUT, deltaTModel);
  const civil = jdToCivilDate(rule, dayJd0);
  const utDay = jdToCalendarDate(jdUT, civil.date.calendar);
  const zone = clock.kind === 'zone' ? zoneReading(clock.zone, jdUT, '--clock') : null;
  return {
    jd: jdUT,
    jdTT: jdUTToJdTT(jdUT, deltaTModel),
    azimuth: p.azimuthDeg,
    altitude: p.altitudeDeg,
    geometricAltitude: p.geometricAltitudeDeg,
    declination: p.declinationDeg,
    rightAscension: p.rightAscensionDeg,
    hourAngle: p.hourAngleDeg,
    equationOfTime: p.equationOfTimeMinutes,
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

type MomentRecord = ReturnType<typeof momentRecord>;

function defaultsLine(options: SunOptions): string {
  const names: Record<string, string> = {
    elevation: `--elevation ${options.elevation} m`,
    calendar: `--calendar ${options.calendar} (proleptic Gregorian before 1582)`,
    clock: `--clock ${options.clock} (${describeClockKind(parseClockKind(options.clock, '--clock'))})`,
    pressure: `--pressure ${options.pressure} hPa`,
    temperature: `--temperature ${options.temperature} C`,
    step: `--step ${options.step} min`,
  };
  const used = options.defaulted.filter((n) => n !== 'step' || options.day).map((n) => names[n]);
  return used.length === 0 ? 'Defaults used: none' : `Defaults used: ${used.join(', ')}`;
}

function momentText(r: MomentRecord, inputs: Inputs, air: Air): string {
  const { site, clock } = inputs;
  const lines = [
    `Site        ${f(Math.abs(site.latitudeDeg), 4)} ${site.latitudeDeg < 0 ? 'S' : 'N'}, ${f(Math.abs(site.longitudeDeg), 4)} ${site.longitudeDeg < 0 ? 'W' : 'E'}, ${site.elevationM} m`,
    `Day         ${formatDayWords(jdToCalendarDate(r.dates.jdOfLocalMidnight, 'julian').date)} (Julian) = ${formatDayWords(jdToCalendarDate(r.dates.jdOfLocalMidnight, 'gregorian').date)} (Gregorian), ${r.dates.weekday}`,
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
          ? ` - for this date the zone database gives a local mean time (of the meridian ${f(r.times.zoneMeridianDeg ?? 0, 2)} deg` +
            `${Math.abs((r.times.zoneOffsetMinutes ?? 0) - 4 * (r.times.zoneMeridianDeg ?? 0) - 60) < 1e-6 ? ', with an hour of summer time' : ''}), not a standard zone time`
          : ''),
    );
  }
  lines.push(
    `  UT                   ${r.times.ut}`,
    `  TT                   ${r.times.tt}  (Delta T ${f(r.deltaT.seconds, 1)} s +/- ${f(r.deltaT.sigmaSeconds, r.deltaT.sigmaSeconds < 1 ? 2 : 1)} s, ${r.deltaT.modelName})`,
    `  Julian Day (UT)      ${f(r.jd, 6)}`,
    '',
    'Sun',
    `  azimuth              ${f(r.azimuth, 4)} deg (clockwise from true north)`,
    `  altitude             ${f(r.altitude, 4)} deg refracted (${air.pressureHPa} hPa, ${air.temperatureC} C), ${f(r.geometricAltitude, 4)} deg geometric`,
    `  declination          ${signed(r.declination, 4)} deg`,
    `  hour angle           ${signed(r.hourAngle, 4)} deg (negative before noon)`,
    `  equation of time     ${signed(r.equationOfTime, 2)} min (apparent minus mean time)`,
    ...(sunAccuracyWordsFrom(jdToCalendarDate(r.dates.jdOfLocalMidnight, 'julian').date.year) === null
      ? []
      : [`  accuracy             ${sunAccuracyWordsFrom(jdToCalendarDate(r.dates.jdOfLocalMidnight, 'julian').date.year)}`]),
  );
  return lines.join('\n');
}

function formatRule(rule: CalendarRule): string {
  switch (rule.kind) {
    case 'region':
      return rule.regionId;
    case 'switch':
      return `switch:${formatIsoDay(rule.lastJulian)}/${formatIsoDay(rule.firstGregorian)}`;
    default:
      return rule.kind;
  }
}

function dayRecord(inputs: Inputs, stepMinutes: number) {
  const { site, clock, dayJd0, air } = inputs;
  // The UT instant of local 0h of the day in the clock given.
  const jd0UT = clockToJdUT(dayJd0, 0, clock, site);
  const events = sunEvents(jd0UT, site);
  const minutesOf = (jdUT: number | null): number | null => (jdUT === null ? null : jdUTToClockMinutes(jdUT, clock, site).minutesOfDay);
  const riseMin = minutesOf(events.sunriseJdUT);
  const setMin = minutesOf(events.sunsetJdUT);
  let from = riseMin ?? 0;
  let to = setMin ?? 1440;
  if (events.polar === 'night') to = from - 1; // no rows
  if (events.polar === 'day') [from, to] = [0, 1440 - 1e-9];
  const rows = [];
  for (let m = Math.ceil(from / stepMinutes) * stepMinutes; m <= to && rows.length < 2000; m += stepMinutes) {
    const jdUT = clockToJdUT(dayJd0, m, clock, site);
    const p = sunPosition(jdUT, site, air, { deltaTModel: inputs.deltaTModel });
    rows.push({ time: formatMinutes(m), jd: jdUT, azimuth: p.azimuthDeg, altitude: p.altitudeDeg, geometricAltitude: p.geometricAltitudeDeg, hourAngle: p.hourAngleDeg });
  }
  const show = (jdUT: number | null): string | null => (jdUT === null ? null : formatMinutes(minutesOf(jdUT) ?? 0));
  return {
    sunrise: show(events.sunriseJdUT),
    transit: show(events.transitJdUT),
    sunset: show(events.sunsetJdUT),
    sunriseJd: events.sunriseJdUT,
    transitJd: events.transitJdUT,
    sunsetJd: events.sunsetJdUT,
    polar: events.polar,
    clockKind: formatClockKind(clock),
    stepMinutes,
    rows,
  };
}

function dayText(d: ReturnType<typeof dayRecord>, inputs: Inputs): string {
  const lines = [
    `The day in ${describeClockKind(inputs.clock)}: sunrise ${d.sunrise ?? '-'}, transit ${d.transit}, sunset ${d.sunset ?? '-'}` +
      (d.polar === 'day' ? ' (polar day: the sun does not set)' : d.polar === 'night' ? ' (polar night: the sun does not rise)' : ''),
    `(rise and set: centre of the sun 0.8333 deg below a level horizon, Meeus 1998 ch. 15; Delta T: ${deltaTModelName(inputs.deltaTModel)})`,
    '',
    '  time      azimuth   altitude  geometric  hour angle',
  ];
  for (const r of d.rows) {
    lines.push(`  ${r.time}  ${f(r.azimuth, 3).padStart(8)}  ${f(r.altitude, 3).padStart(8)}  ${f(r.geometricAltitude, 3).padStart(9)}  ${signed(r.hourAngle, 3).padStart(10)}`);
  }
  if (d.rows.length === 0) lines.push('  (no rows: the sun stays below the horizon)');
  return lines.join('\n');
}

/** Run `heliochron sun`. Throws InvalidInputError on bad options (the CLI exits with 2, nothing written). */
export function run(_args: readonly string[], options: SunOptions, io: CliIo): void {
  const inputs = readInputs(options);
  const stepMinutes = options.day ? numberOption(options.step, '--step', 1, 720, 'a table step from 1 to 720 minutes') : 30;
  const defaults = defaultsLine(options);
  let moment: MomentRecord | null = null;
  if (!options.day || options.time !== undefined) {
    const minutes = parseTimeOfDay(options.time, '--time');
    if (inputs.clock.kind === 'zone') zoneReading(inputs.clock.zone, clockToJdUT(inputs.dayJd0, minutes, { kind: 'mean' }, inputs.site), '--clock');
    const jdUT = clockToJdUT(inputs.dayJd0, minutes, inputs.clock, inputs.site);
    moment = momentRecord(jdUT, inputs, sunPosition(jdUT, inputs.site, inputs.air, { deltaTModel: inputs.deltaTModel }));
  }
  const day = options.day ? dayRecord(inputs, stepMinutes) : null;
  if (options.json) {
    const base = moment ?? { jd: null, azimuth: null, altitude: null, declination: null, equationOfTime: null };
    const out = {
      ...base,
      input: {
        lat: inputs.site.latitudeDeg,
        lon: inputs.site.longitudeDeg,
        elevation: inputs.site.elevationM,
        date: inputs.dateText,
        calendar: options.calendar,
        time: options.time ?? null,
        clock: formatClockKind(inputs.clock),
        pressure: inputs.air.pressureHPa,
        temperature: inputs.air.temperatureC,
      },
      defaults: options.defaulted.filter((n) => n !== 'step' || options.day),
      units: { angles: 'degrees', equationOfTime: 'minutes', jd: 'Julian Day, UT' },
      ...(day ? { day } : {}),
    };
    io.out(`${JSON.stringify(out, null, 2)}\n`);
    return;
  }
  const parts: string[] = [];
  if (moment) parts.push(momentText(moment, inputs, inputs.air));
  if (day) {
    if (!moment) {
      const dayWords = `${formatDayWords(jdToCalendarDate(inputs.dayJd0, 'julian').date)} (Julian) = ${formatDayWords(jdToCalendarDate(inputs.dayJd0, 'gregorian').date)} (Gregorian), ${WEEKDAY_NAMES[weekdayOfJd(inputs.dayJd0)]}, JD of local 0h ${inputs.dayJd0}`;
      parts.push(`Day         ${dayWords}`);
    }
    parts.push(dayText(day, inputs));
  }
  parts.push(defaults);
  io.out(`${parts.join('\n\n')}\n`);
}
