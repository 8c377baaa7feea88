/**
 * Calendar corners over the whole reform table: every region's gap refused, its
 * neighbouring days accepted, and the days of the gap never produced by the inverse.
 */
import { describe, expect, it } from 'vitest';
import { jdToCalendarDate, calendarDateToJd, isLeapYear } from '../../src/calendar/julianDay.js';
import { civilDateToJd, jdToCivilDate, loadReformTable } from '../../src/calendar/regions.js';
import { InvalidInputError } from '../../src/errors.js';
import type { CalendarRule } from '../../src/scene/types.js';

const table = loadReformTable();

let gapsChecked = 0;

describe('every region of data/calendar-reforms.json', () => {
  it('has at least the regions the reference table names', () => {
    // REFERENCES.md, "Gregorian reform by region" (Grotefend 1941, pp. 26-28, as quoted in the IANA tz file 'calendars').
    const ids = table.map((r) => r.id);
    expect(ids.length).toBeGreaterThan(20);
  });

  for (const region of table) {
    const rule: CalendarRule = { kind: 'region', regionId: region.id };
    region.periods.forEach((period, i) => {
      if (i === 0 || period.firstDay === undefined) return;
      it(`${region.id}: the switch into period ${i} is continuous in Julian Day and its skipped names are refused`, () => {
        const firstJd = civilDateToJd(rule, period.firstDay!);
        expect(firstJd).toBe(period.firstJd);
        // The civil day before the first day is the day before in JD (no day lost, none doubled).
        const before = jdToCivilDate(rule, firstJd - 1);
        expect(civilDateToJd(rule, before.civil)).toBe(firstJd - 1);
        if (period.lastDayBefore) expect(before.civil).toEqual(period.lastDayBefore);
        // Names between the last day before and the first day (a forward jump) never existed.
        const prev = region.periods[i - 1]!;
        if (prev.reckoning !== 'swedish' && period.reckoning !== 'swedish' && prev.reckoning !== period.reckoning) {
          const lastName = jdToCalendarDate(firstJd - 1, prev.reckoning).date;
          const firstName = jdToCalendarDate(firstJd, period.reckoning).date;
          const nameJd = (d: { year: number; month: number; day: number }) =>
            calendarDateToJd({ year: d.year, month: d.month, day: d.day, calendar: 'gregorian' });
          const skipped = nameJd(firstName) - nameJd(lastName) - 1; // number of day names jumped over
          if (skipped > 0 && skipped < 20) {
            const gapName = jdToCalendarDate(nameJd(lastName) + 1, 'gregorian').date;
            const gap = { year: gapName.year, month: gapName.month, day: gapName.day };
            let error: unknown;
            try {
              civilDateToJd(rule, gap, 'window.notBefore');
            } catch (e) {
              error = e;
            }
            // A skipped name is refused, and the message says what the neighbouring days were (common practice).
            expect(error).toBeInstanceOf(InvalidInputError);
            expect((error as Error).message).toMatch(/window\.notBefore/);
            expect((error as Error).message).toMatch(/followed by/);
            gapsChecked += 1;
          }
        }
      });
    });
  }
});

describe('the gap check above', () => {
  it('ran on most switches of the table (it is not vacuous)', () => {
    console.log(`reform gaps refused: ${gapsChecked} of ${table.length} regions`);
    expect(gapsChecked).toBeGreaterThan(20);
  });
});

describe('29 February in years leap in one calendar only', () => {
  // Meeus, Astronomical Algorithms (1998), ch. 7, p. 62: 1700, 1800, 1900 are Julian leap years, not Gregorian ones.
  for (const year of [1700, 1800, 1900]) {
    it(`${year}-02-29 exists in the Julian calendar and is refused in the Gregorian`, () => {
      expect(isLeapYear(year, 'julian')).toBe(true);
      expect(isLeapYear(year, 'gregorian')).toBe(false);
      expect(() => civilDateToJd({ kind: 'julian' }, { year, month: 2, day: 29 })).not.toThrow();
      expect(() => civilDateToJd({ kind: 'gregorian' }, { year, month: 2, day: 29 }, 'date')).toThrow(InvalidInputError);
    });
  }
  it('1700-02-29 is refused in Sweden, whose reckoning skipped that leap day', () => {
    // Grotefend 1941 via the IANA tz file 'calendars' (Brader 1996): Sweden omitted the leap day of 1700.
    expect(() => civilDateToJd({ kind: 'region', regionId: 'sweden' }, { year: 1700, month: 2, day: 29 })).toThrow(
      InvalidInputError,
    );
  });
});

describe('negative years', () => {
  it('round-trip through Julian Day in astronomical numbering', () => {
    // Meeus (1998), ch. 7: -4712 January 1.5 (Julian) is JD 0.0.
    expect(calendarDateToJd({ calendar: 'julian', year: -4712, month: 1, day: 1 }, 0.5)).toBe(0);
    for (const year of [-4712, -1000, -1, 0]) {
      const jd = calendarDateToJd({ calendar: 'julian', year, month: 3, day: 1 });
      expect(jdToCalendarDate(jd, 'julian').date).toEqual({ calendar: 'julian', year, month: 3, day: 1 });
    }
  });
});
