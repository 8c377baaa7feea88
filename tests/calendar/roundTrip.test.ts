import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { calendarDateToJd, daysInMonth, jdToCalendarDate, weekdayOfJd, type CalendarKind } from '../../src/calendar/julianDay.js';

// The round trip JD -> civil date -> JD is the inverse check of Meeus (1998) ch. 7 (p. 61 and p. 63);
// the day-by-day succession check uses the month lengths of Meeus (1998) p. 62 (common practice).
const CALENDARS: readonly CalendarKind[] = ['julian', 'gregorian'];

describe('every day from -4712 to +3000 round-trips and follows the day before', () => {
  it.each(CALENDARS)('%s calendar: JD -> date -> JD is exact, dates succeed one another, weekday advances by one', (calendar) => {
    const first = calendarDateToJd({ calendar, year: -4712, month: 1, day: 1 });
    const last = calendarDateToJd({ calendar, year: 3000, month: 12, day: 31 });
    let failures = 0;
    let firstFailure = '';
    let previous = jdToCalendarDate(first - 1, calendar).date;
    let previousWeekday = weekdayOfJd(first - 1);
    let days = 0;
    for (let jd = first; jd <= last; jd += 1) {
      const { date, dayFraction } = jdToCalendarDate(jd, calendar);
      const back = calendarDateToJd(date);
      const lastOfMonth = previous.day === daysInMonth(previous.year, previous.month, calendar);
      const expected = !lastOfMonth
        ? { year: previous.year, month: previous.month, day: previous.day + 1 }
        : previous.month === 12
          ? { year: previous.year + 1, month: 1, day: 1 }
          : { year: previous.year, month: previous.month + 1, day: 1 };
      const weekday = weekdayOfJd(jd);
      const ok =
        back === jd &&
        dayFraction === 0 &&
        date.year === expected.year &&
        date.month === expected.month &&
        date.day === expected.day &&
        weekday === (previousWeekday + 1) % 7;
      if (!ok) {
        failures += 1;
        if (firstFailure === '') firstFailure = `JD ${jd}: ${JSON.stringify(date)} back ${back}, expected ${JSON.stringify(expected)}`;
      }
      previous = date;
      previousWeekday = weekday;
      days += 1;
    }
    expect(firstFailure).toBe('');
    expect(failures).toBe(0);
    // 7713 years: 7713 * 365 days plus the leap days (1929 Julian; 1870 Gregorian: 1929 less the 59 centurial years -4700..3000 not divisible by 400).
    expect(days).toBe(7713 * 365 + (calendar === 'julian' ? 1929 : 1870));
  });
});

describe('random instants (with fractions of a day) round-trip', () => {
  it('JD -> date + fraction -> JD within 1e-6 day for any JD from -1e7 to +1e7 (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e7, max: 1e7, noNaN: true }), fc.constantFrom(...CALENDARS), (jd, calendar) => {
        const { date, dayFraction } = jdToCalendarDate(jd, calendar);
        return dayFraction >= 0 && dayFraction < 1 && Math.abs(calendarDateToJd(date, dayFraction) - jd) < 1e-6;
      }),
      { numRuns: 20000, seed: 42 },
    );
  });
});
