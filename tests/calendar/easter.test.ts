import { describe, expect, it } from 'vitest';
import { easterSunday } from '../../src/calendar/easter.js';
import { calendarDateToJd, weekdayOfJd } from '../../src/calendar/julianDay.js';

describe('easterSunday', () => {
  // Meeus, Astronomical Algorithms 2nd ed. (1998) ch. 8, p. 68 (seen in soniakeys/meeus easter_test.go).
  it.each([
    [1991, 3, 31], [1992, 4, 19], [1993, 4, 11], [1954, 4, 18], [2000, 4, 23], [1818, 3, 22],
  ])('gives Gregorian Easter %i on month %i day %i (Meeus (1998) p. 68)', (year, month, day) => {
    expect(easterSunday(year, 'gregorian')).toEqual({ calendar: 'gregorian', year, month, day });
  });

  it('gives Julian Easter 1243 on 12 April (Meeus (1998) p. 69)', () => {
    expect(easterSunday(1243, 'julian')).toEqual({ calendar: 'julian', year: 1243, month: 4, day: 12 });
  });

  describe('edge cases', () => {
    it('always falls on a Sunday between 22 March and 25 April, in both reckonings, years 1583-3000 (common practice: the Paschal limits)', () => {
      for (const calendar of ['julian', 'gregorian'] as const) {
        for (let year = 1583; year <= 3000; year++) {
          const e = easterSunday(year, calendar);
          expect(weekdayOfJd(calendarDateToJd(e)), `${calendar} ${year}`).toBe(0);
          const key = e.month * 100 + e.day;
          expect(key >= 322 && key <= 425, `${calendar} ${year}: ${e.month}/${e.day}`).toBe(true);
        }
      }
    });
    it('repeats the Julian Easter dates every 532 years (common practice: the Dionysian great cycle, 19 x 28)', () => {
      for (let year = 600; year < 1132; year++) {
        const a = easterSunday(year, 'julian');
        const b = easterSunday(year + 532, 'julian');
        expect([b.month, b.day]).toEqual([a.month, a.day]);
      }
    });
  });
});
