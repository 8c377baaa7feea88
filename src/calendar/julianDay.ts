/**
 * Julian Day <-> civil date in the Julian and the (proleptic) Gregorian calendar.
 *
 * Method: J. Meeus, Astronomical Algorithms, 2nd ed. (1998), ch. 7 ("Julian Day"),
 * formulas (7.1) p. 61 and the inverse on p. 63, with Math.floor for Meeus's INT.
 * Meeus states the inverse is not valid for negative Julian Days; here every date
 * is first moved by whole 400-year cycles (146097 days Gregorian, 146100 days Julian)
 * into the range where the book's formulas hold, so any finite JD or year works.
 *
 * Years use astronomical numbering (1 BC = year 0, 2 BC = -1). A JD here is of no
 * time scale: the caller decides whether it is UT, TT or a local civil day count.
 * The Julian calendar is proleptic before AD 8 and the Gregorian before 1582: these
 * functions never switch calendar by themselves (regions.ts does that).
 */

export type CalendarKind = 'julian' | 'gregorian';

/** A civil date: astronomical year, month 1-12, integer day of month, and its calendar. */
export interface CalendarDate {
  readonly calendar: CalendarKind;
  readonly year: number;
  readonly month: number;
  readonly day: number;
}

/**
 * JD of 0h of 15 October 1582 (Gregorian), the first day of the Gregorian calendar in Rome;
 * the day before was 4 October 1582 (Julian). Meeus (1998) ch. 7, p. 59-61.
 */
export const ROME_FIRST_GREGORIAN_JD = 2299160.5;

/** Days in 400 Gregorian years: 400 * 365 + 97 leap days. */
const GREGORIAN_CYCLE_DAYS = 146097;
/** Days in 400 Julian years: 400 * 365 + 100 leap days. */
const JULIAN_CYCLE_DAYS = 146100;
/** Meeus's formulas are used only for years from this one on (Meeus (1998) p. 61: valid from -4712). */
const SAFE_MIN_YEAR = -4000;

function cycleDays(calendar: CalendarKind): number {
  return calendar === 'gregorian' ? GREGORIAN_CYCLE_DAYS : JULIAN_CYCLE_DAYS;
}

/**
 * Whether a year (astronomical numbering) is a leap year.
 * Julian: every year divisible by 4 (year 0 = 1 BC is leap). Gregorian: divisible by 4,
 * except centurial years not divisible by 400. Meeus (1998) ch. 7, p. 62.
 * @example isLeapYear(1900, 'julian') // true; isLeapYear(1900, 'gregorian') // false
 */
export function isLeapYear(year: number, calendar: CalendarKind): boolean {
  const mod = (a: number, n: number): number => ((a % n) + n) % n;
  if (mod(year, 4) !== 0) return false;
  if (calendar === 'julian') return true;
  return mod(year, 100) !== 0 || mod(year, 400) === 0;
}

const MONTH_DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31] as const;

/**
 * Number of days in a month (1-12) of a year in a calendar.
 * @example daysInMonth(1700, 2, 'julian') // 29
 */
export function daysInMonth(year: number, month: number, calendar: CalendarKind): number {
  if (month === 2) return isLeapYear(year, calendar) ? 29 : 28;
  return MONTH_DAYS[month - 1];
}

/**
 * Day of the year, 1 January = 1. Meeus (1998) ch. 7, p. 65:
 * N = INT(275 M / 9) - K INT((M + 9) / 12) + D - 30, K = 1 in a leap year, else 2.
 * @example dayOfYear({ calendar: 'gregorian', year: 1978, month: 11, day: 14 }) // 318
 */
export function dayOfYear(date: CalendarDate): number {
  const k = isLeapYear(date.year, date.calendar) ? 1 : 2;
  return Math.floor((275 * date.month) / 9) - k * Math.floor((date.month + 9) / 12) + date.day - 30;
}

/**
 * Julian Day of 0h of a civil date, plus an optional fraction of a day.
 * The date is not validated here (day 30 February simply runs on into March);
 * validation belongs to the edges (parseDate.ts, regions.ts).
 * Meeus (1998) eq. (7.1): JD = INT(365.25 (Y + 4716)) + INT(30.6001 (M + 1)) + D + B - 1524.5,
 * with Y, M moved to the previous year's months 13, 14 for January and February,
 * B = 2 - A + INT(A / 4), A = INT(Y / 100) in the Gregorian calendar and B = 0 in the Julian.
 * @example calendarDateToJd({ calendar: 'gregorian', year: 2000, month: 1, day: 1 }, 0.5) // 2451545
 */
export function calendarDateToJd(date: CalendarDate, dayFraction = 0): number {
  return civilDayToJd(date.calendar, date.year, date.month, date.day) + dayFraction;
}

/** calendarDateToJd from plain numbers (no date object), for hot loops: the same arithmetic, Meeus (1998) eq. (7.1). */
export function civilDayToJd(calendar: CalendarKind, year: number, month: number, day: number): number {
  // Move early years forward by whole 400-year cycles (same weekday pattern and leap pattern).
  const shiftCycles = year < SAFE_MIN_YEAR ? Math.ceil((SAFE_MIN_YEAR - year) / 400) : 0;
  let y = year + 400 * shiftCycles;
  let m = month;
  if (m <= 2) {
    y -= 1;
    m += 12;
  }
  let b = 0;
  if (calendar === 'gregorian') {
    const a = Math.floor(y / 100);
    b = 2 - a + Math.floor(a / 4);
  }
  const jd0 = Math.floor(365.25 * (y + 4716)) + Math.floor(30.6001 * (m + 1)) + day + b - 1524.5;
  return jd0 - shiftCycles * cycleDays(calendar);
}

/**
 * Civil date containing a Julian Day, and the fraction of that day since 0h, in [0, 1).
 * Meeus (1998) ch. 7, p. 63: Z = INT(JD + 0.5), F = fraction; Gregorian: alpha =
 * INT((Z - 1867216.25) / 36524.25), A = Z + 1 + alpha - INT(alpha / 4); Julian: A = Z;
 * B = A + 1524, C = INT((B - 122.1) / 365.25), D = INT(365.25 C), E = INT((B - D) / 30.6001).
 * @example jdToCalendarDate(2436116.31, 'gregorian') // 1957-10-04, dayFraction 0.81
 */
export function jdToCalendarDate(jd: number, calendar: CalendarKind): { date: CalendarDate; dayFraction: number } {
  const z0 = Math.floor(jd + 0.5);
  splitDayNumber(z0, calendar);
  return { date: { calendar, year: splitYear, month: splitMonth, day: splitDay }, dayFraction: jd + 0.5 - z0 };
}

/** The year (astronomical numbering) of the civil date containing jd: jdToCalendarDate's year without its objects, for hot loops. */
export function calendarYearOfJd(jd: number, calendar: CalendarKind): number {
  splitDayNumber(Math.floor(jd + 0.5), calendar);
  return splitYear;
}

// The civil date of day number Z, left here by splitDayNumber (no object made: it runs in the solver's loops).
let splitYear = 0;
let splitMonth = 0;
let splitDay = 0;

/** Meeus (1998) ch. 7, p. 63, for Z = INT(JD + 0.5): see jdToCalendarDate. Writes splitYear, splitMonth, splitDay. */
function splitDayNumber(z0: number, calendar: CalendarKind): void {
  // Bring Z to a positive range by whole cycles, where the book's method holds.
  const safeZ = 1000000; // JD about -1975, well inside the valid range
  const shiftCycles = z0 < safeZ ? Math.ceil((safeZ - z0) / cycleDays(calendar)) : 0;
  const z = z0 + shiftCycles * cycleDays(calendar);
  let a = z;
  if (calendar === 'gregorian') {
    const alpha = Math.floor((z - 1867216.25) / 36524.25);
    a = z + 1 + alpha - Math.floor(alpha / 4);
  }
  const b = a + 1524;
  const c = Math.floor((b - 122.1) / 365.25);
  const d = Math.floor(365.25 * c);
  const e = Math.floor((b - d) / 30.6001);
  splitDay = b - d - Math.floor(30.6001 * e);
  splitMonth = e < 14 ? e - 1 : e - 13;
  splitYear = (splitMonth > 2 ? c - 4716 : c - 4715) - 400 * shiftCycles;
}

/**
 * Weekday of the civil day containing a JD: 0 = Sunday ... 6 = Saturday.
 * Meeus (1998) ch. 7, p. 65: the weekday of the JD of 0h, plus 1.5, modulo 7.
 * @example weekdayOfJd(2434923.5) // 3 (Wednesday, 1954 June 30; Meeus Example 7.e)
 */
export function weekdayOfJd(jd: number): number {
  const z = Math.floor(jd + 0.5); // the day number whose 0h is z - 0.5
  return (((z + 1) % 7) + 7) % 7;
}

/** English weekday names, index 0 = Sunday. */
export const WEEKDAY_NAMES = ['Sunday', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'] as const;

/** English month names, index 0 = January. */
export const MONTH_NAMES = [
  'January', 'February', 'March', 'April', 'May', 'June',
  'July', 'August', 'September', 'October', 'November', 'December',
] as const;
