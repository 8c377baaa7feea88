/**
 * Writing civil dates for people: "4 October 1582", "15 March 44 BC", ISO-like
 * "1582-10-04" (astronomical years, "-0043-03-15"), Old Style / New Style pairs
 * ("3/14 September 1752") and dates with a dual year ("10 February 1650/1").
 *
 * BC/AD: astronomical year 0 is 1 BC, -1 is 2 BC (common practice of astronomers;
 * Meeus (1998) ch. 7, p. 60). Years 1 and later print without "AD" unless asked.
 */
import { MONTH_NAMES, type CalendarDate } from './julianDay.js';
import type { CivilDay } from '../scene/types.js';

/**
 * A year in BC/AD words.
 * @example formatYearBcAd(-43) // "44 BC"; formatYearBcAd(1066, true) // "AD 1066"
 */
export function formatYearBcAd(year: number, alwaysEra = false): string {
  if (year <= 0) return `${1 - year} BC`;
  return alwaysEra ? `AD ${year}` : String(year);
}

/**
 * A day as year-month-day with astronomical year numbering, at least four year digits.
 * @example formatIsoDay({ year: -43, month: 3, day: 15 }) // "-0043-03-15"
 */
export function formatIsoDay(day: CivilDay): string {
  const sign = day.year < 0 ? '-' : '';
  const y = String(Math.abs(day.year)).padStart(4, '0');
  return `${sign}${y}-${String(day.month).padStart(2, '0')}-${String(day.day).padStart(2, '0')}`;
}

/**
 * A day in words, BC/AD years.
 * @example formatDayWords({ year: 1582, month: 10, day: 4 }) // "4 October 1582"
 */
export function formatDayWords(day: CivilDay): string {
  return `${day.day} ${MONTH_NAMES[day.month - 1]} ${formatYearBcAd(day.year)}`;
}

/**
 * A calendar date in words with its calendar named.
 * @example formatCalendarDate({ calendar: 'julian', year: 1582, month: 10, day: 4 }) // "4 October 1582 (Julian)"
 */
export function formatCalendarDate(date: CalendarDate): string {
  return `${formatDayWords(date)} (${date.calendar === 'julian' ? 'Julian' : 'Gregorian'})`;
}

/**
 * The same day in the Julian (Old Style) and Gregorian (New Style) calendars, written
 * the way dual-dated documents write it: shared parts once, Old Style first.
 * @example formatDualStyle({ calendar: 'julian', year: 1752, month: 9, day: 3 }, { calendar: 'gregorian', year: 1752, month: 9, day: 14 })
 *   // "3/14 September 1752"
 * @example  (1582-12-22 Julian, 1583-01-01 Gregorian) // "22 December 1582/1 January 1583"
 */
export function formatDualStyle(oldStyle: CivilDay, newStyle: CivilDay): string {
  const monthOld = MONTH_NAMES[oldStyle.month - 1];
  const monthNew = MONTH_NAMES[newStyle.month - 1];
  if (oldStyle.year !== newStyle.year) {
    return `${formatDayWords(oldStyle)}/${formatDayWords(newStyle)}`;
  }
  const year = formatYearBcAd(newStyle.year);
  if (oldStyle.month !== newStyle.month) return `${oldStyle.day} ${monthOld}/${newStyle.day} ${monthNew} ${year}`;
  return `${oldStyle.day}/${newStyle.day} ${monthNew} ${year}`;
}

/**
 * A day written with a year other than its January year (a dual year such as "1650/1", see yearStart.ts).
 * @example formatDayWithYearText({ year: 1651, month: 2, day: 10 }, '1650/1') // "10 February 1650/1"
 */
export function formatDayWithYearText(day: CivilDay, yearText: string): string {
  return `${day.day} ${MONTH_NAMES[day.month - 1]} ${yearText}`;
}
