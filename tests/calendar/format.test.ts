import { describe, expect, it } from 'vitest';
import { formatCalendarDate, formatDayWords, formatDualStyle, formatIsoDay, formatYearBcAd } from '../../src/calendar/format.js';
import { calendarDateToJd, jdToCalendarDate } from '../../src/calendar/julianDay.js';

describe('formatting dates', () => {
  it('writes BC/AD years from astronomical years (Meeus (1998) p. 60: year 0 = 1 BC)', () => {
    expect(formatYearBcAd(-43)).toBe('44 BC');
    expect(formatYearBcAd(0)).toBe('1 BC');
    expect(formatYearBcAd(1)).toBe('1');
    expect(formatYearBcAd(1066, true)).toBe('AD 1066');
    expect(formatDayWords({ year: -43, month: 3, day: 15 })).toBe('15 March 44 BC');
  });
  it('writes ISO-like days with astronomical years', () => {
    expect(formatIsoDay({ year: -43, month: 3, day: 15 })).toBe('-0043-03-15');
    expect(formatIsoDay({ year: 1582, month: 10, day: 4 })).toBe('1582-10-04');
  });
  it('edge cases: year 0 is 1 BC, a negative ISO year keeps four digits', () => {
    expect(formatDayWords({ year: 0, month: 12, day: 31 })).toBe('31 December 1 BC');
    expect(formatIsoDay({ year: -4712, month: 1, day: 1 })).toBe('-4712-01-01');
    expect(formatIsoDay({ year: 5, month: 1, day: 1 })).toBe('0005-01-01');
  });
  it('names the calendar', () => {
    expect(formatCalendarDate({ calendar: 'julian', year: 1582, month: 10, day: 4 })).toBe('4 October 1582 (Julian)');
  });
  it('writes the same day Old Style / New Style, computed through JD (Calendar (New Style) Act 1750: 11 days in 1752)', () => {
    const jd = calendarDateToJd({ calendar: 'julian', year: 1752, month: 9, day: 3 });
    const ns = jdToCalendarDate(jd, 'gregorian').date;
    expect(formatDualStyle({ year: 1752, month: 9, day: 3 }, ns)).toBe('3/14 September 1752');
    const jd2 = calendarDateToJd({ calendar: 'julian', year: 1612, month: 8, day: 22 });
    expect(formatDualStyle({ year: 1612, month: 8, day: 22 }, jdToCalendarDate(jd2 + 0, 'gregorian').date)).toBe('22 August/1 September 1612');
    const jd3 = calendarDateToJd({ calendar: 'julian', year: 1582, month: 12, day: 22 });
    expect(formatDualStyle({ year: 1582, month: 12, day: 22 }, jdToCalendarDate(jd3, 'gregorian').date)).toBe('22 December 1582/1 January 1583');
  });
});
