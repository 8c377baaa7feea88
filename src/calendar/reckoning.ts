/**
 * A "reckoning": the rule by which a region named its days in one period.
 * Besides the Julian and Gregorian calendars there is one special case, the
 * Swedish reckoning of 1 March 1700 to 30 February 1712, in which the leap day of
 * 1700 was left out (so every day is named one day later than in the Julian
 * calendar), 1704 and 1708 were leap years, and February 1712 had 30 days, which
 * brought Sweden back to the Julian calendar. Source: M. Brader (1996), quoted in
 * the IANA tz database file `calendars`, after N. Beckman (1924) and L.-O. Lodén (1968).
 *
 * Outside 1700-03-01 .. 1712-02-30 the Swedish reckoning is not defined and these
 * functions say so (isValidInReckoning is false).
 */
import { calendarDateToJd, daysInMonth, jdToCalendarDate, type CalendarKind } from './julianDay.js';
import type { CivilDay } from '../scene/types.js';

export type Reckoning = CalendarKind | 'swedish';

/** First Swedish-reckoning day (1 March 1700) as a Julian calendar JD of 0h: Julian 29 February 1700. */
const SWEDISH_FIRST_JD = calendarDateToJd({ calendar: 'julian', year: 1700, month: 2, day: 29 });
/** Last Swedish-reckoning day (30 February 1712): Julian 29 February 1712, JD of 0h. */
const SWEDISH_LAST_JD = calendarDateToJd({ calendar: 'julian', year: 1712, month: 2, day: 29 });

/** Compare two civil days by name: negative, 0 or positive. */
export function compareCivilDays(a: CivilDay, b: CivilDay): number {
  return a.year - b.year || a.month - b.month || a.day - b.day;
}

/** Number of days of a month in a reckoning (Swedish: February 1712 has 30 days). */
export function daysInReckoningMonth(year: number, month: number, reckoning: Reckoning): number {
  if (reckoning !== 'swedish') return daysInMonth(year, month, reckoning);
  if (month === 2 && year === 1712) return 30;
  return daysInMonth(year, month, 'julian');
}

/** Whether a day name exists in a reckoning (Swedish: only 1700-03-01 .. 1712-02-30). */
export function isValidInReckoning(day: CivilDay, reckoning: Reckoning): boolean {
  if (!Number.isInteger(day.year) || !Number.isInteger(day.month) || !Number.isInteger(day.day)) return false;
  if (day.month < 1 || day.month > 12 || day.day < 1) return false;
  if (day.day > daysInReckoningMonth(day.year, day.month, reckoning)) return false;
  if (reckoning === 'swedish') {
    return compareCivilDays(day, { year: 1700, month: 3, day: 1 }) >= 0 && compareCivilDays(day, { year: 1712, month: 2, day: 30 }) <= 0;
  }
  return true;
}

/**
 * JD of 0h of a day named in a reckoning (the name is assumed valid there).
 * Swedish: the Julian JD of the same name minus one day (Feb 30, 1712 runs on to Julian Feb 29 by the same rule).
 */
export function reckoningDayToJd(day: CivilDay, reckoning: Reckoning): number {
  if (reckoning === 'swedish') return calendarDateToJd({ calendar: 'julian', ...day }) - 1;
  return calendarDateToJd({ calendar: reckoning, year: day.year, month: day.month, day: day.day });
}

/**
 * Name of the day containing a JD in a reckoning, and the fraction of the day.
 * Swedish outside its period falls back to the Julian name (callers choose the reckoning by period).
 */
export function jdToReckoningDay(jd: number, reckoning: Reckoning): { day: CivilDay; dayFraction: number } {
  if (reckoning !== 'swedish') {
    const { date, dayFraction } = jdToCalendarDate(jd, reckoning);
    return { day: { year: date.year, month: date.month, day: date.day }, dayFraction };
  }
  const jd0 = Math.floor(jd + 0.5) - 0.5;
  if (jd0 === SWEDISH_LAST_JD) {
    return { day: { year: 1712, month: 2, day: 30 }, dayFraction: jd - jd0 };
  }
  const inPeriod = jd0 >= SWEDISH_FIRST_JD && jd0 < SWEDISH_LAST_JD;
  const { date, dayFraction } = jdToCalendarDate(inPeriod ? jd + 1 : jd, 'julian');
  return { day: { year: date.year, month: date.month, day: date.day }, dayFraction };
}

/** Words for a reckoning, as printed. */
export function reckoningName(reckoning: Reckoning): string {
  return reckoning === 'swedish' ? 'Swedish reckoning of 1700-1712' : reckoning === 'julian' ? 'Julian' : 'Gregorian';
}
