/**
 * `heliochron moon`: the moon at a site and moment - place, phase, age, the tilt of its lit side -
 * with moonrise, transit and moonset of the day on the clock given, and every time scale of the moment.
 * A thin layer over src/ephemeris (moonPosition, moonEvents, moonLook); the options are read and checked
 * in siteMoment.ts, as for `sun`.
 */
import { sunAccuracyWordsFrom } from '../report/formatTimes.js';
import { deltaTModelName } from '../time/deltaT.js';
import { jdToCalendarDate } from '../calendar/julianDay.js';
import { jdToCivilDate } from '../calendar/regions.js';
import { formatCalendarDate } from '../calendar/format.js';
import { moonPosition, type MoonPosition } from '../ephemeris/moonPosition.js';
import { moonAge, moonEvents } from '../ephemeris/moonEvents.js';
import { litSideWords, moonPhaseWords } from '../ephemeris/moonLook.js';
import { clockToJdUT, describeClockKind, formatClockKind, jdUTToClockMinutes } from '../time/clock.js';
import type { CliIo } from './io.js';
import type { MoonOptions } from './moonSpec.js';
import {
  defaultsLine,
  fixed as f,
  hourSystemText,
  inputRecord,
  jdUTOfMoment,
  momentHeaderLines,
  momentTimes,
  placeRecord,
  readSiteMoment,
  signed,
  type SiteMoment,
} from './siteMoment.js';

/** The caution printed under every answer (docs/moon.md, "Cautions"). */
export const MOON_CAUTION =
  'A painted or drawn moon is often a convention (a crescent of the wrong phase for the hour, lit on the wrong side, ' +
  'too large); weigh it as one piece of evidence among others. These figures are for a level horizon and the air stated.';

/** An instant in words: the civil day at the site in its calendar and the reading of the clock given. */
function instantWords(jdUT: number, inputs: SiteMoment): string {
  const reading = hourSystemText(jdUT, inputs.clock, inputs.site);
  const dayJd0 = reading === null ? Math.floor(jdUT - 0.5) + 0.5 : jdUTToClockMinutes(jdUT, inputs.clock, inputs.site).dayJd0;
  const day = formatCalendarDate(jdToCivilDate(inputs.rule, dayJd0).date);
  return reading === null ? `${day} (UT day; the clock given has no reading then)` : `${day}, ${reading}`;
}

/** Moonrise, transit and moonset of the day asked about, on the clock given. */
function eventsRecord(inputs: SiteMoment) {
  const { site, clock, dayJd0, deltaTModel } = inputs;
  const jd0UT = clockToJdUT(dayJd0, 0, clock, site);
  const events = moonEvents(jd0UT, site, { deltaTModel });
  const show = (jdUT: number | null): string | null => (jdUT === null ? null : hourSystemText(jdUT, clock, site));
  return {
    moonrise: show(events.moonriseJdUT),
    transit: show(events.transitJdUT),
    moonset: show(events.moonsetJdUT),
    moonriseJd: events.moonriseJdUT,
    transitJd: events.transitJdUT,
    moonsetJd: events.moonsetJdUT,
    clockKind: formatClockKind(clock),
  };
}

/** Everything the answer reports, as plain data (also the JSON form). */
function moonRecord(jdUT: number, inputs: SiteMoment, p: MoonPosition) {
  const age = moonAge(jdUT, { deltaTModel: inputs.deltaTModel });
  return {
    ...placeRecord(jdUT, inputs, p),
    distance: p.distanceKm,
    illuminatedFraction: p.illuminatedFraction,
    phase: moonPhaseWords(p.phaseLongitudeDeg),
    phaseAngle: p.phaseAngleDeg,
    elongation: p.elongationDeg,
    phaseLongitude: p.phaseLongitudeDeg,
    waxing: p.waxing,
    age: age.ageDays,
    lastNewMoon: { jd: age.newMoon.jdUT, when: instantWords(age.newMoon.jdUT, inputs) },
    brightLimbPositionAngle: p.brightLimbPositionAngleDeg,
    parallacticAngle: p.parallacticAngleDeg,
    brightLimbTiltFromVertical: p.brightLimbTiltFromVerticalDeg,
    litSide: litSideWords(p.brightLimbTiltFromVerticalDeg),
    events: eventsRecord(inputs),
    ...momentTimes(jdUT, inputs),
  };
}

type MoonRecord = ReturnType<typeof moonRecord>;

/** An event's clock reading, or why there is none. */
function eventWords(reading: string | null, jdUT: number | null): string {
  if (reading !== null) return reading;
  return jdUT === null ? '- (none this day)' : '- (the clock given has no reading then)';
}

function moonText(r: MoonRecord, inputs: SiteMoment): string {
  const { air, clock } = inputs;
  const year = jdToCalendarDate(r.dates.jdOfLocalMidnight, 'julian').date.year;
  const sunAccuracy = sunAccuracyWordsFrom(year);
  const e = r.events;
  const below = r.altitude < 0 ? ' - below the horizon at this moment' : '';
  const lines = [
    ...momentHeaderLines(r, inputs),
    '',
    'Moon (centre of the disc, as seen from the site)',
    `  azimuth              ${f(r.azimuth, 4)} deg (clockwise from true north)`,
    `  altitude             ${f(r.altitude, 4)} deg refracted (${air.pressureHPa} hPa, ${air.temperatureC} C), ${f(r.geometricAltitude, 4)} deg geometric${below}`,
    `  phase                ${r.phase}, ${f(100 * r.illuminatedFraction, 1)}% of the disc lit (${r.waxing ? 'waxing: growing towards full' : 'waning: shrinking towards new'})`,
    `  phase angle          ${f(r.phaseAngle, 2)} deg (the angle sun - moon - earth; 0 full, 180 new)`,
    `  elongation           ${f(r.elongation, 2)} deg from the sun`,
    `  age                  ${f(r.age, 2)} days since the new moon of ${r.lastNewMoon.when} (${describeClockKind(clock)})`,
    `  bright limb          position angle ${f(r.brightLimbPositionAngle, 1)} deg (direction of the lit side on the sky, from north through east)`,
    `  lit side as seen     ${r.litSide} - tilted ${signed(r.brightLimbTiltFromVertical, 1)} deg from straight up (plus towards the left, minus towards the right)`,
    `  distance             ${f(r.distance, 0)} km`,
    '',
    `The moon's day in ${describeClockKind(clock)}: moonrise ${eventWords(e.moonrise, e.moonriseJd)}, transit ${eventWords(e.transit, e.transitJd)}, moonset ${eventWords(e.moonset, e.moonsetJd)}`,
    `(rise and set: upper edge of the disc on a level horizon, standard refraction 34', parallax included; hills, buildings and the air near the horizon move them by minutes; Delta T: ${deltaTModelName(inputs.deltaTModel)})`,
    '',
    `Accuracy: the moon's direction agrees with Meeus ch. 47 (astronomia) within 0.01 deg over 1000-2100 for the same Delta T; ` +
      `the uncertainty of Delta T (+/- ${f(r.deltaT.sigmaSeconds, r.deltaT.sigmaSeconds < 1 ? 2 : 1)} s here) turns the sky by up to ${f((r.deltaT.sigmaSeconds * 360.9856) / 86400, 3)} deg` +
      (year < 1000 ? '; before AD 1000 the moon is checked against the NASA canon of eclipses only (new moons within 2 min of time back to 1128 BC)' : '') +
      (sunAccuracy === null ? '.' : `; sun: ${sunAccuracy}.`),
    `Caution: ${MOON_CAUTION}`,
  ];
  return lines.join('\n');
}

/** Run `heliochron moon`. Throws InvalidInputError on bad options (the CLI exits with 2, nothing written). */
export function run(_args: readonly string[], options: MoonOptions, io: CliIo): void {
  const inputs = readSiteMoment(options);
  const jdUT = jdUTOfMoment(options, inputs, 'this option is required');
  const record = moonRecord(jdUT, inputs, moonPosition(jdUT, inputs.site, inputs.air, { deltaTModel: inputs.deltaTModel }));
  if (options.json) {
    const out = {
      ...record,
      input: inputRecord(options, inputs),
      defaults: options.defaulted,
      units: { angles: 'degrees', distance: 'km', age: 'days', illuminatedFraction: '0 to 1', jd: 'Julian Day, UT' },
      caution: MOON_CAUTION,
    };
    io.out(`${JSON.stringify(out, null, 2)}\n`);
    return;
  }
  io.out(`${moonText(record, inputs)}\n\n${defaultsLine(options)}\n`);
}
