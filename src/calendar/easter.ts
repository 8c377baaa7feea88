/**
 * Easter Sunday in the Gregorian and the Julian reckoning.
 *
 * Method: J. Meeus, Astronomical Algorithms, 2nd ed. (1998), ch. 8 ("Date of Easter"):
 * the Gregorian method on p. 67 (after Spencer Jones / Butcher, valid for every Gregorian
 * year from 1583 on) and the Julian method on p. 69 (valid for every Julian year).
 * Here any integer year is accepted (modulo taken as positive); a Gregorian Easter before
 * 1583 is proleptic, i.e. not a date anyone kept. The result is a date in the same calendar.
 */
import type { CalendarDate, CalendarKind } from './julianDay.js';

/** Remainder in [0, n). */
function mod(a: number, n: number): number {
  return ((a % n) + n) % n;
}

/**
 * Easter Sunday of a year (astronomical numbering) in a calendar.
 * @example easterSunday(1991, 'gregorian') // 1991-03-31 (Meeus (1998) p. 68)
 * @example easterSunday(1243, 'julian') // 1243-04-12 (Meeus (1998) p. 69)
 */
export function easterSunday(year: number, calendar: CalendarKind): CalendarDate {
  if (calendar === 'julian') {
    // Meeus (1998) ch. 8, p. 69.
    const a = mod(year, 4);
    const b = mod(year, 7);
    const c = mod(year, 19);
    const d = mod(19 * c + 15, 30);
    const e = mod(2 * a + 4 * b - d + 34, 7);
    const month = Math.floor((d + e + 114) / 31);
    const day = mod(d + e + 114, 31) + 1;
    return { calendar, year, month, day };
  }
  // Meeus (1998) ch. 8, p. 67.
  const a = mod(year, 19);
  const b = Math.floor(year / 100);
  const c = mod(year, 100);
  const d = Math.floor(b / 4);
  const e = mod(b, 4);
  const f = Math.floor((b + 8) / 25);
  const g = Math.floor((b - f + 1) / 3);
  const h = mod(19 * a + b - d - g + 15, 30);
  const i = Math.floor(c / 4);
  const k = mod(c, 4);
  const l = mod(32 + 2 * e + 2 * i - h - k, 7);
  const m = Math.floor((a + 11 * h + 22 * l) / 451);
  const month = Math.floor((h + l - 7 * m + 114) / 31);
  const day = mod(h + l - 7 * m + 114, 31) + 1;
  return { calendar, year, month, day };
}
