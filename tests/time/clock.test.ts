import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/expectClose.js';
import { clockToJdUT, formatClockKind, jdUTToClockMinutes, parseClockKind, zoneReading } from '../../src/time/clock.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { equationOfTimeMinutes } from '../../src/ephemeris/equationOfTime.js';
import { InvalidInputError, UnsupportedError } from '../../src/errors.js';
import type { ClockKind } from '../../src/scene/types.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';

// Velmar, the demo town: 47.62 N, 9.35 E, 410 m.
const velmar = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 };
const DAY_1890_06_15 = calendarDateToJd({ calendar: 'gregorian', year: 1890, month: 6, day: 15 }); // 2411533.5
const DAY_1650_03_10 = calendarDateToJd({ calendar: 'gregorian', year: 1650, month: 3, day: 10 });

describe('clock round trips', () => {
  const kinds: ClockKind[] = [
    { kind: 'ut' },
    { kind: 'mean' },
    { kind: 'apparent' },
    { kind: 'meridian', longitudeDeg: 2.3372 },
    { kind: 'zone', zone: 'Europe/Zurich' },
    { kind: 'zone', zone: 'Europe/Berlin' },
  ];
  for (const clock of kinds) {
    it(`reads back ${formatClockKind(clock)}: minutes -> jdUT -> minutes within 0.01 s`, () => {
      for (const minutes of [0.5, 333.25, 720, 1111.1, 1439]) {
        const jdUT = clockToJdUT(DAY_1890_06_15, minutes, clock, velmar);
        const back = jdUTToClockMinutes(jdUT, clock, velmar);
        expect(back.dayJd0).toBe(DAY_1890_06_15);
        expectClose(back.minutesOfDay, minutes, 0.01 / 60, `${formatClockKind(clock)} ${minutes}`);
      }
    });
  }
});

describe('clock definitions', () => {
  it('local mean time is UT + longitude/15 h (Explanatory Supplement 1992, sec. 2.24)', () => {
    const jdUT = clockToJdUT(DAY_1890_06_15, 720, { kind: 'mean' }, velmar);
    expectClose((jdUT - DAY_1890_06_15) * 1440, 720 - 4 * 9.35, 1e-6, 'UT minutes of mean noon');
  });
  it('apparent noon is the sun on the meridian (hour angle 0 within 0.005 deg; parallax, common practice)', () => {
    const jdUT = clockToJdUT(DAY_1650_03_10, 720, { kind: 'apparent' }, velmar);
    expectClose(sunPosition(jdUT, velmar).hourAngleDeg, 0, 0.005, 'hour angle at apparent noon');
  });
  it('apparent minus mean is the equation of time, sundial ahead in November (Meeus 1998 ch. 28)', () => {
    const day = 2411673.5; // 1890-11-02
    const jdUT = clockToJdUT(day, 720, { kind: 'mean' }, velmar);
    const apparent = jdUTToClockMinutes(jdUT, { kind: 'apparent' }, velmar).minutesOfDay;
    expectClose(apparent - 720, equationOfTimeMinutes(jdUT), 1e-6, 'apparent - mean');
    expect(apparent - 720).toBeGreaterThan(16); // about +16.4 min in early November (common practice)
  });
  it('Europe/Berlin kept local mean time of Berlin before 1893 and CET (+1 h) after (tz database)', () => {
    const early = zoneReading('Europe/Berlin', DAY_1890_06_15);
    expect(early.localMeanTime).toBe(true);
    expectClose(early.meridianDeg ?? NaN, 13.37, 0.01, 'Berlin LMT meridian'); // tz database: +0:53:28
    expect(zoneReading('Europe/Berlin', 2451545).offsetMinutes).toBe(60);
  });
  it('refuses a zone before 1847 whose earliest entry is not local mean time, and accepts one that is', () => {
    expect(() => clockToJdUT(DAY_1650_03_10, 600, { kind: 'zone', zone: 'UTC' }, velmar)).toThrow(UnsupportedError);
    expect(() => clockToJdUT(DAY_1650_03_10, 600, { kind: 'zone', zone: 'Europe/Zurich' }, velmar)).not.toThrow();
  });
  it('refuses a zone time skipped by summer time (Europe/Zurich 2024-03-31 02:30)', () => {
    // Central European summer time began 2024-03-31 at 02:00 local (EU directive 2000/84/EC).
    expect(() => clockToJdUT(2460400.5, 150, { kind: 'zone', zone: 'Europe/Zurich' }, velmar)).toThrow(InvalidInputError);
  });
});

describe('parseClockKind', () => {
  it('reads every kind and writes it back', () => {
    for (const text of ['apparent', 'mean', 'ut', 'meridian:-0.0015', 'zone:Europe/Zurich']) {
      expect(formatClockKind(parseClockKind(text, '--clock'))).toBe(text);
    }
  });
  it.each(['sundial', 'meridian:east', 'meridian:200', 'zone:Mars/Olympus', ''])('refuses %j naming the field and quoting the value', (text) => {
    expect(() => parseClockKind(text, '--clock')).toThrow(InvalidInputError);
    try {
      parseClockKind(text, '--clock');
    } catch (error) {
      expect((error as Error).message).toContain('--clock');
      expect((error as Error).message).toContain(JSON.stringify(text));
    }
  });
});
