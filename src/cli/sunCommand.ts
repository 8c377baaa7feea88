/**
 * `heliochron sun`: the sun at a site and moment, every time scale of that moment, and
 * with --day the whole day between sunrise and sunset. A thin layer over src/ephemeris,
 * src/time and src/calendar; the shared options are read and checked in siteMoment.ts.
 */
import { sunAccuracyWordsFrom } from '../report/formatTimes.js';
import { deltaTModelName } from '../time/deltaT.js';
import type { Air } from '../scene/types.js';
import { jdToCalendarDate } from '../calendar/julianDay.js';
import { sunPosition, type SunPosition } from '../ephemeris/sunPosition.js';
import { sunEvents } from '../ephemeris/riseSet.js';
import { clockToJdUT, describeClockKind, formatClockKind, formatMinutes, jdUTToClockMinutes } from '../time/clock.js';
import type { CliIo } from './io.js';
import type { SunOptions } from './sunSpec.js';
import {
  dayWords,
  defaultsLine,
  fixed as f,
  inputRecord,
  jdUTOfMoment,
  momentHeaderLines,
  momentTimes,
  numberOption,
  placeRecord,
  readSiteMoment,
  signed,
  type SiteMoment,
} from './siteMoment.js';

type Inputs = SiteMoment;

/** Everything the answer reports about one moment, as plain data (also the JSON form). */
function momentRecord(jdUT: number, inputs: Inputs, p: SunPosition) {
  return {
    ...placeRecord(jdUT, inputs, p),
    equationOfTime: p.equationOfTimeMinutes,
    ...momentTimes(jdUT, inputs),
  };
}

type MomentRecord = ReturnType<typeof momentRecord>;

function momentText(r: MomentRecord, inputs: Inputs, air: Air): string {
  const accuracy = sunAccuracyWordsFrom(jdToCalendarDate(r.dates.jdOfLocalMidnight, 'julian').date.year);
  const lines = [
    ...momentHeaderLines(r, inputs),
    '',
    'Sun',
    `  azimuth              ${f(r.azimuth, 4)} deg (clockwise from true north)`,
    `  altitude             ${f(r.altitude, 4)} deg refracted (${air.pressureHPa} hPa, ${air.temperatureC} C), ${f(r.geometricAltitude, 4)} deg geometric`,
    `  declination          ${signed(r.declination, 4)} deg`,
    `  hour angle           ${signed(r.hourAngle, 4)} deg (negative before noon)`,
    `  equation of time     ${signed(r.equationOfTime, 2)} min (apparent minus mean time)`,
    ...(accuracy === null ? [] : [`  accuracy             ${accuracy}`]),
  ];
  return lines.join('\n');
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
  const inputs = readSiteMoment(options);
  const stepMinutes = options.day ? numberOption(options.step, '--step', 1, 720, 'a table step from 1 to 720 minutes') : 30;
  const defaults = defaultsLine(options, { step: `--step ${options.step} min` }, options.day ? [] : ['step']);
  let moment: MomentRecord | null = null;
  if (!options.day || options.time !== undefined) {
    const jdUT = jdUTOfMoment(options, inputs);
    moment = momentRecord(jdUT, inputs, sunPosition(jdUT, inputs.site, inputs.air, { deltaTModel: inputs.deltaTModel }));
  }
  const day = options.day ? dayRecord(inputs, stepMinutes) : null;
  if (options.json) {
    const base = moment ?? { jd: null, azimuth: null, altitude: null, declination: null, equationOfTime: null };
    const out = {
      ...base,
      input: inputRecord(options, inputs),
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
    if (!moment) parts.push(`Day         ${dayWords(inputs.dayJd0)}, JD of local 0h ${inputs.dayJd0}`);
    parts.push(dayText(day, inputs));
  }
  parts.push(defaults);
  io.out(`${parts.join('\n\n')}\n`);
}
