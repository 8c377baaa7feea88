import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
// @ts-expect-error astronomia ships no type declarations; only CalendarToJD(y, m, d, isJulian) is used below.
import * as astronomiaJulian from 'astronomia/julian';
import {
  ROME_FIRST_GREGORIAN_JD,
  calendarDateToJd,
  calendarYearOfJd,
  civilDayToJd,
  dayOfYear,
  daysInMonth,
  isLeapYear,
  jdToCalendarDate,
  weekdayOfJd,
  type CalendarKind,
} from '../../src/calendar/julianDay.js';
import { expectClose } from '../helpers/expectClose.js';

interface Case { calendar: CalendarKind; year: number; month: number; day: number; jd: number; source: string }

// Day is a decimal day of the month as in Meeus; split into integer day + fraction.
const CASES: Case[] = [
  { calendar: 'gregorian', year: 1957, month: 10, day: 4.81, jd: 2436116.31, source: 'Meeus (1998) Example 7.a, p. 61' },
  { calendar: 'julian', year: 333, month: 1, day: 27.5, jd: 1842713.0, source: 'Meeus (1998) Example 7.b, p. 61' },
  { calendar: 'gregorian', year: 2000, month: 1, day: 1.5, jd: 2451545.0, source: 'Meeus (1998) p. 62 (J2000.0)' },
  { calendar: 'gregorian', year: 1999, month: 1, day: 1, jd: 2451179.5, source: 'Meeus (1998) p. 62' },
  { calendar: 'gregorian', year: 1987, month: 1, day: 27, jd: 2446822.5, source: 'Meeus (1998) p. 62' },
  { calendar: 'gregorian', year: 1987, month: 6, day: 19.5, jd: 2446966.0, source: 'Meeus (1998) p. 62' },
  { calendar: 'gregorian', year: 1988, month: 1, day: 27, jd: 2447187.5, source: 'Meeus (1998) p. 62' },
  { calendar: 'gregorian', year: 1988, month: 6, day: 19.5, jd: 2447332.0, source: 'Meeus (1998) p. 62' },
  { calendar: 'gregorian', year: 1900, month: 1, day: 1, jd: 2415020.5, source: 'Meeus (1998) p. 62' },
  { calendar: 'gregorian', year: 1600, month: 1, day: 1, jd: 2305447.5, source: 'Meeus (1998) p. 62' },
  { calendar: 'gregorian', year: 1600, month: 12, day: 31, jd: 2305812.5, source: 'Meeus (1998) p. 62' },
  { calendar: 'julian', year: 837, month: 4, day: 10.3, jd: 2026871.8, source: 'Meeus (1998) p. 62' },
  { calendar: 'julian', year: -123, month: 12, day: 31, jd: 1676496.5, source: 'Meeus (1998) p. 62' },
  { calendar: 'julian', year: -122, month: 1, day: 1, jd: 1676497.5, source: 'Meeus (1998) p. 62' },
  { calendar: 'julian', year: -1000, month: 7, day: 12.5, jd: 1356001.0, source: 'Meeus (1998) p. 62' },
  { calendar: 'julian', year: -1000, month: 2, day: 29, jd: 1355866.5, source: 'Meeus (1998) p. 62' },
  { calendar: 'julian', year: -1001, month: 8, day: 17.9, jd: 1355671.4, source: 'Meeus (1998) p. 62' },
  { calendar: 'julian', year: -4712, month: 1, day: 1.5, jd: 0.0, source: 'Meeus (1998) p. 62 (JD 0)' },
  { calendar: 'julian', year: 1582, month: 10, day: 4, jd: 2299159.5, source: 'Meeus (1998) p. 61, last Julian day in Rome' },
  { calendar: 'gregorian', year: 1582, month: 10, day: 15, jd: 2299160.5, source: 'Meeus (1998) p. 61, first Gregorian day' },
  { calendar: 'julian', year: -584, month: 5, day: 28.63, jd: 1507900.13, source: 'Meeus (1998) ch. 7, p. 64 (seen in soniakeys/meeus julian_test.go)' },
];

describe('calendarDateToJd and jdToCalendarDate: published values', () => {
  it.each(CASES)('$year-$month-$day ($calendar) is JD $jd - $source', (c) => {
    const day = Math.floor(c.day);
    const fraction = c.day - day;
    const jd = calendarDateToJd({ calendar: c.calendar, year: c.year, month: c.month, day }, fraction);
    expectClose(jd, c.jd, 1e-6, 'JD');
    const back = jdToCalendarDate(c.jd, c.calendar);
    expect(back.date).toEqual({ calendar: c.calendar, year: c.year, month: c.month, day });
    expectClose(back.dayFraction, fraction, 1e-6, 'day fraction');
  });

  it('gives 27689 days between 1910 April 20 and 1986 February 9 (Meeus (1998) ch. 7, p. 64: interval between two returns of Halley\'s comet)', () => {
    const a = calendarDateToJd({ calendar: 'gregorian', year: 1910, month: 4, day: 20 });
    const b = calendarDateToJd({ calendar: 'gregorian', year: 1986, month: 2, day: 9 });
    expect(b - a).toBe(27689);
  });

  it('names the Roman cut-over JD (Meeus (1998) p. 61)', () => {
    expect(ROME_FIRST_GREGORIAN_JD).toBe(2299160.5);
    expect(calendarDateToJd({ calendar: 'gregorian', year: 1582, month: 10, day: 15 })).toBe(ROME_FIRST_GREGORIAN_JD);
  });
});

describe('leap years, days in month, day of year, weekday', () => {
  it.each([
    [900, true], [1236, true], [750, false], [1429, false], // Meeus (1998) p. 62, Julian
  ] as const)('Julian year %i leap = %s (Meeus (1998) p. 62)', (year, leap) => {
    expect(isLeapYear(year, 'julian')).toBe(leap);
  });
  it.each([
    [1700, false], [1800, false], [1900, false], [2100, false], [1600, true], [2000, true], [2400, true], // Meeus (1998) p. 62
  ] as const)('Gregorian year %i leap = %s (Meeus (1998) p. 62)', (year, leap) => {
    expect(isLeapYear(year, 'gregorian')).toBe(leap);
  });
  it('counts 1 BC (year 0) and 5 BC (year -4) as Julian leap years (Meeus (1998) p. 62: astronomical years divisible by 4)', () => {
    expect(isLeapYear(0, 'julian')).toBe(true);
    expect(isLeapYear(-4, 'julian')).toBe(true);
    expect(isLeapYear(-1, 'julian')).toBe(false);
  });
  it('gives February 29 days in 1700, 1800, 1900 only in the Julian calendar (Meeus (1998) p. 62)', () => {
    for (const y of [1700, 1800, 1900]) {
      expect(daysInMonth(y, 2, 'julian')).toBe(29);
      expect(daysInMonth(y, 2, 'gregorian')).toBe(28);
    }
  });
  it('gives day of year 318 for 1978 November 14 and 113 for 1988 April 22 (Meeus (1998) Examples 7.f, 7.g, p. 65)', () => {
    expect(dayOfYear({ calendar: 'gregorian', year: 1978, month: 11, day: 14 })).toBe(318);
    expect(dayOfYear({ calendar: 'gregorian', year: 1988, month: 4, day: 22 })).toBe(113);
  });
  it('gives Wednesday for JD 2434923.5, 1954 June 30 (Meeus (1998) Example 7.e, p. 65)', () => {
    expect(weekdayOfJd(2434923.5)).toBe(3);
    expect(weekdayOfJd(2434923.5 + 0.99)).toBe(3); // same civil day
  });
  it('gives Friday for 15 October 1582, the day after Thursday 4 October (E. Poulsen, Rundetaarn table of the transition)', () => {
    expect(weekdayOfJd(ROME_FIRST_GREGORIAN_JD)).toBe(5);
    expect(weekdayOfJd(ROME_FIRST_GREGORIAN_JD - 1)).toBe(4);
  });
});

describe('edge cases', () => {
  it('agrees with astronomia (a port of Meeus) on random days from -4712 to +3000 (cross-check with a reference library)', () => {
    fc.assert(
      fc.property(fc.integer({ min: -4712, max: 3000 }), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 28 }), fc.boolean(), (year, month, day, julian) => {
        const calendar: CalendarKind = julian ? 'julian' : 'gregorian';
        const ours = calendarDateToJd({ calendar, year, month, day });
        const theirs = astronomiaJulian.CalendarToJD(year, month, day, julian);
        return Math.abs(ours - theirs) < 1e-9;
      }),
      { numRuns: 2000, seed: 20261202 },
    );
  });
  it('keeps working far outside -4712..3000 by whole 400-year cycles', () => {
    for (const calendar of ['julian', 'gregorian'] as const) {
      const a = calendarDateToJd({ calendar, year: -20000, month: 3, day: 1 });
      const b = calendarDateToJd({ calendar, year: -19600, month: 3, day: 1 });
      expect(b - a).toBe(calendar === 'julian' ? 146100 : 146097);
      expect(jdToCalendarDate(a, calendar).date).toEqual({ calendar, year: -20000, month: 3, day: 1 });
      const far = calendarDateToJd({ calendar, year: 100000, month: 12, day: 31 });
      expect(jdToCalendarDate(far, calendar).date).toEqual({ calendar, year: 100000, month: 12, day: 31 });
    }
  });
});

describe('number-only helpers for hot loops', () => {
  // The same arithmetic as the object forms (Meeus 1998, eq. 7.1 and ch. 7 p. 63); checked against them exactly.
  it('calendarYearOfJd is the year of jdToCalendarDate, and civilDayToJd is calendarDateToJd, at random instants -4000..3000', () => {
    fc.assert(
      fc.property(fc.double({ min: 260000, max: 2817000, noNaN: true }), fc.constantFrom<CalendarKind>('julian', 'gregorian'), (jd, calendar) => {
        const { date } = jdToCalendarDate(jd, calendar);
        expect(calendarYearOfJd(jd, calendar)).toBe(date.year);
        expect(civilDayToJd(calendar, date.year, date.month, date.day)).toBe(calendarDateToJd(date));
      }),
      { numRuns: 5000 },
    );
  });
});
