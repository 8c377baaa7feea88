/**
 * A sundial in the picture (kind: sundial) and clocks on 12- and 6-hour dials.
 * Synthetic truth (invented scene at Velmar, 47.62 N 9.35 E, 410 m): the instant 1 August 1720
 * (Gregorian), 10:30 local apparent time; the sun's direction there from the library's sunPosition
 * (NREL SPA-checked, tests/ephemeris), the readings in Italian and Babylonian hours from the
 * project's sunrise and sunset (src/ephemeris/riseSet.ts, checked in tests/ephemeris/riseSet.test.ts)
 * through jdUTToClockMinutes. The construction: Italian reading = apparent time - previous sunset;
 * Babylonian = apparent time - sunrise (docs/time-keeping.md). The solver must recover the instant
 * from these readings.
 */
import { describe, expect, it } from 'vitest';
import { readSceneText } from '../../src/scene/readScene.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';
import { clockToJdUT, jdUTToClockMinutes } from '../../src/time/clock.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { sunEvents } from '../../src/ephemeris/riseSet.js';
import { hourAngleAtAltitudeDeg } from '../../src/time/hourSystems.js';
import { InvalidInputError } from '../../src/errors.js';
import { dialCountWords } from '../../src/report/text.js';

const SITE = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 };
const DAY = calendarDateToJd({ calendar: 'gregorian', year: 1720, month: 8, day: 1 });
const APPARENT_MINUTES = 630;
const JD_UT = clockToJdUT(DAY, APPARENT_MINUTES, { kind: 'apparent' }, SITE);
const SUN = sunPosition(JD_UT, SITE);
const ITALIAN = jdUTToClockMinutes(JD_UT, { kind: 'italian', origin: 'sunset', offsetMinutes: 0 }, SITE).minutesOfDay;
const BABYLONIAN = jdUTToClockMinutes(JD_UT, { kind: 'babylonian' }, SITE).minutesOfDay;

const hm = (m: number): string => {
  const r = Math.round(m * 60) / 60;
  const h = Math.floor(r / 60);
  const min = Math.floor(r - 60 * h);
  const s = Math.round((r - 60 * h - min) * 60);
  return `${h}:${String(min).padStart(2, '0')}:${String(s).padStart(2, '0')}`;
};

const scene = (observations: string, months = '[7, 8, 9]'): string => `heliochron: 1
title: Test scene, a sundial at Velmar (invented data)
site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 }
calendar: gregorian
window: { fromYear: 1720, toYear: 1720, months: ${months} }
observations:
${observations}`;

const shadowAzimuth = `  - { id: post, kind: pole-shadow, shadowAzimuthDeg: ${((SUN.azimuthDeg + 180) % 360).toFixed(3)}, shadowAzimuthSigmaDeg: 0.2 }\n`;

/** The candidate on the true day (1 August 1720), or undefined. */
const onTrueDay = (answer: ReturnType<typeof solveDates>) => answer.candidates.find((c) => c.civilDate.month === 8 && c.civilDate.day === 1);

describe('the synthetic truth', () => {
  it('Babylonian hours plus the Italian hours still to run to sunset make the length of the day (the gnomonic rule of the two line families)', () => {
    // The rule that Babylonian hours plus the hours left to sunset (24 - Italian) give the daylight:
    // macmillanhunter.co.uk, "Babylonian and Italian hours measure the day" (its equinox example: 3.5 + 8.5 = 12 h).
    // Daylight here from the project's sunrise and sunset; the Italian count runs from the previous evening,
    // whose sunset comes about 2 minutes later than this one's in August, hence the tolerance.
    const ev = sunEvents(DAY - SITE.longitudeDeg / 360, SITE);
    const daylight = (ev.sunsetJdUT! - ev.sunriseJdUT!) * 1440;
    expect(Math.abs(BABYLONIAN + (1440 - ITALIAN) - daylight)).toBeLessThan(3);
    // Sunrise at 4:31 apparent time: hour angle 112.2 deg at -0.833 deg altitude for declination 18.0 deg (Meeus 1998 eq. 15.1, worked by hand).
    expect(Math.abs(BABYLONIAN - (APPARENT_MINUTES - 271))).toBeLessThan(3);
  });
});

describe('a published worked example of Babylonian and Italian hours', () => {
  it('at the equinox 9:30 apparent time is 3 1/2 Babylonian hours and 8 1/2 hours before sunset (15 1/2 Italian), less the horizon correction of the project\'s sunrise', () => {
    // macmillanhunter.co.uk, "Babylonian and Italian hours measure the day": on a dial at the equinox, 9:30 am is
    // 3 1/2 Babylonian hours and 8 1/2 hours before sunset. That reading takes sunrise and sunset at 6:00 and 18:00
    // (the sun's centre on the horizon, declination 0); heliochron takes them with the centre 0.8333 deg below
    // (Meeus 1998 ch. 15), which moves sunrise earlier and sunset later by 4 (H0 - 90) minutes, H0 from Meeus eq. 15.1.
    const equinox = calendarDateToJd({ calendar: 'gregorian', year: 1720, month: 3, day: 20 }); // declination -0.03 deg at 9:30 (sun command)
    const jdUT = clockToJdUT(equinox, 570, { kind: 'apparent' }, SITE);
    const babylonian = jdUTToClockMinutes(jdUT, { kind: 'babylonian' }, SITE).minutesOfDay;
    const italian = jdUTToClockMinutes(jdUT, { kind: 'italian', origin: 'sunset', offsetMinutes: 0 }, SITE).minutesOfDay;
    const h0 = hourAngleAtAltitudeDeg(-0.8333, 0, SITE.latitudeDeg)!;
    const horizon = 4 * (h0 - 90); // 4.9 minutes at 47.62 N
    expect(Math.abs(babylonian - (210 + horizon))).toBeLessThan(0.5);
    // The Italian count runs from the previous evening, whose sunset came about 1.5 minutes earlier near the equinox.
    expect(Math.abs(italian - (930 - horizon))).toBeLessThan(2);
  });
});

describe('a sundial of equal hours', () => {
  it('with the direction of a post\'s shadow recovers the day and the hour; no clock assumption is tried', () => {
    const answer = solveDates(readSceneText(scene(`${shadowAzimuth}  - { id: dial, kind: sundial, reading: "${hm(APPARENT_MINUTES)}", hours: apparent, precisionMinutes: 2 }\n`), 'dial.yaml'));
    expect(answer.clockAssumptions.map((a) => a.kind)).toEqual(['none']);
    const truth = onTrueDay(answer);
    expect(truth).toBeDefined();
    expect(Math.abs(truth!.times.localApparentMinutes - APPARENT_MINUTES)).toBeLessThan(3);
    expect(truth!.chiSquare).toBeLessThan(1);
    const row = truth!.residuals.find((r) => r.observationId === 'dial');
    expect(row?.observationKind).toBe('sundial');
  }, 120000);
  it('is evidence about the hour angle alone: the reading an hour off moves the fitted hour by an hour', () => {
    const answer = solveDates(readSceneText(scene(`  - { id: dial, kind: sundial, reading: "${hm(APPARENT_MINUTES + 60)}", hours: equal, precisionMinutes: 2 }\n`), 'dial.yaml'));
    expect(answer.candidates.length).toBeGreaterThan(0);
    for (const c of answer.candidates.slice(0, 5)) expect(Math.abs(c.times.localApparentMinutes - (APPARENT_MINUTES + 60))).toBeLessThan(3);
  }, 120000);
});

describe('a sundial of Italian and Babylonian hours', () => {
  it('Italian lines with the shadow direction recover the hour, and the day within the few days over which sunset moves less than the reading\'s sigma', () => {
    const answer = solveDates(readSceneText(scene(`${shadowAzimuth}  - { id: dial, kind: sundial, reading: "${hm(ITALIAN)}", hours: italian, precisionMinutes: 3 }\n`), 'dial.yaml'));
    const best = answer.candidates[0];
    const days = Math.abs(calendarDateToJd(best.civilDate) - DAY);
    expect(days).toBeLessThanOrEqual(3);
    expect(Math.abs(best.times.localApparentMinutes - APPARENT_MINUTES)).toBeLessThan(5);
    expect(best.chiSquare).toBeLessThan(2);
  }, 120000);
  it('Italian and Babylonian lines of one dial together fix the length of the day, so the day (or its mirror across the solstice) and the hour', () => {
    const answer = solveDates(readSceneText(scene(
      `  - { id: dial-it, kind: sundial, reading: "${hm(ITALIAN)}", hours: italian, precisionMinutes: 2 }\n` +
      `  - { id: dial-bab, kind: sundial, reading: "${hm(BABYLONIAN)}", hours: babylonian, precisionMinutes: 2 }\n`,
      '[8]',
    ), 'dial.yaml'));
    const best = answer.candidates[0];
    expect(best.civilDate.month).toBe(8);
    expect(Math.abs(best.civilDate.day - 1)).toBeLessThanOrEqual(3);
    expect(Math.abs(best.times.localApparentMinutes - APPARENT_MINUTES)).toBeLessThan(5);
  }, 120000);
  it('the Italian reading taken as equal hours does not fit with the shadow', () => {
    const answer = solveDates(readSceneText(scene(`${shadowAzimuth}  - { id: dial, kind: sundial, reading: "${hm(ITALIAN)}", hours: apparent, precisionMinutes: 3 }\n`), 'dial.yaml'));
    expect(answer.candidates.every((c) => c.chiSquare > 20)).toBe(true);
  }, 120000);
});

describe('the sundial reader', () => {
  const read = (obs: string) => readSceneText(scene(obs), 'dial.yaml');
  it('reads 24:00 on an Italian dial as 0 (sunset) and 12:00 in unequal hours as the end of the day', () => {
    const a = read('  - { id: d, kind: sundial, reading: "24:00", hours: italian, precisionMinutes: 5 }\n').observations[0];
    expect(a).toMatchObject({ kind: 'sundial', readingMinutes: 0, hours: { kind: 'italian' } });
    const b = read('  - { id: d, kind: sundial, reading: "12:00", hours: temporal, precisionMinutes: 5 }\n').observations[0];
    expect(b).toMatchObject({ kind: 'sundial', readingMinutes: 720, hours: { kind: 'unequal' } });
  });
  it.each([
    ['hours: roman', 'observations[0].hours', /"roman".*hour lines of the dial/],
    ['hours: babilonian', 'observations[0].hours', /Did you mean "babylonian"/],
    ['hours: italian, reading: "24:30"', 'observations[0].reading', /"24:30".*0:00" to "24:00"/],
    ['hours: unequal, reading: "12:30"', 'observations[0].reading', /"12:30".*sunset/],
  ])('refuses %s naming the field, the value and what is allowed', (fields, field, says) => {
    const text = `  - { id: d, kind: sundial, precisionMinutes: 5, ${fields.includes('reading') ? '' : 'reading: "10:00", '}${fields} }\n`;
    let caught: unknown;
    try { read(text); } catch (e) { caught = e; }
    expect(caught).toBeInstanceOf(InvalidInputError);
    expect((caught as InvalidInputError).field).toBe(field);
    expect((caught as Error).message).toMatch(says);
  });
  it('needs its hour lines stated', () => {
    expect(() => read('  - { id: d, kind: sundial, reading: "10:00", precisionMinutes: 5 }\n')).toThrow(/observations\[0\]\.hours/);
  });
});

describe('Italian hours on 12- and 6-hour dials', () => {
  const sunDirection = `  - { id: sun, kind: sun-direction, azimuthDeg: ${SUN.azimuthDeg.toFixed(3)}, azimuthSigmaDeg: 0.3, altitudeDeg: ${SUN.altitudeDeg.toFixed(3)}, altitudeSigmaDeg: 0.3 }\n`;
  const clock = (dial: number, kept: string) =>
    `  - { id: tower, kind: clock, reading: "${hm(ITALIAN % (dial * 60))}", precisionMinutes: 3, dialHours: ${dial}${kept} }\n`;
  it('a 6-hour dial of unknown keeping is tried in Italian hours only, fits, and says which turn of the dial fits', () => {
    const answer = solveDates(readSceneText(scene(sunDirection + clock(6, '')), 'six.yaml'));
    expect(answer.clockAssumptions.map((a) => a.kind)).toEqual(['italian']);
    const truth = onTrueDay(answer);
    expect(truth).toBeDefined();
    expect(Math.abs(truth!.times.localApparentMinutes - APPARENT_MINUTES)).toBeLessThan(5);
    const row = truth!.residuals.find((r) => r.observationId === 'tower')!;
    // ITALIAN is between 15 and 16 hours: the dial shows it after two full turns of six hours (12 h).
    expect(row.fullCount).toEqual({ minutes: expect.closeTo(ITALIAN, 0), turnsOfDial: 2, dialHours: 6 });
    expect(dialCountWords(row)).toMatch(/a 6-hour dial shows 03:\d\d four times a day; the one that fits is 15:\d\d of the 24-hour count \(the reading plus 12 h\)/);
  }, 120000);
  it('a 12-hour dial of unknown keeping tries apparent, mean and Italian hours; Italian fits best', () => {
    const answer = solveDates(readSceneText(scene(sunDirection + clock(12, '')), 'twelve.yaml'));
    expect(answer.clockAssumptions.map((a) => a.kind)).toEqual(['apparent', 'mean', 'italian']);
    expect(answer.candidates[0].clockAssumption.kind).toBe('italian');
    const row = answer.candidates[0].residuals.find((r) => r.observationId === 'tower')!;
    expect(row.fullCount?.turnsOfDial).toBe(1);
  }, 120000);
  it('a 6-hour dial reads "6:30" as 0:30 (as a 12-hour dial reads 12:30) and refuses "7:00" and a dial of 8 hours', () => {
    const ok = readSceneText(scene('  - { id: c, kind: clock, reading: "6:30", precisionMinutes: 3, dialHours: 6, kept: italian }\n'), 's.yaml').observations[0];
    expect(ok).toMatchObject({ readingMinutes: 30, dialHours: 6 });
    expect(() => readSceneText(scene('  - { id: c, kind: clock, reading: "7:00", precisionMinutes: 3, dialHours: 6 }\n'), 's.yaml')).toThrow(/"7:00".*6-hour dial/);
    expect(() => readSceneText(scene('  - { id: c, kind: clock, reading: "7:00", precisionMinutes: 3, dialHours: 8 }\n'), 's.yaml')).toThrow(/dialHours.*6, 12 or 24/);
  });
});
