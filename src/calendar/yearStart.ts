/**
 * Year-start styles: on which day the numbered year began, and the dual years
 * ("1650/1") that documents and historians write for the days between two year starts.
 *
 * A "historical year" is the year number as written under a style; the "January year"
 * is the number under a year that begins on 1 January (what CivilDay holds inside heliochron).
 * Month and day are the same under every style; only the year number changes.
 *
 * Styles (common practice of chronology, e.g. Grotefend, Taschenbuch der Zeitrechnung (1941),
 * "Jahresanfang"; C. R. Cheney, A Handbook of Dates (2000), ch. 1):
 * - jan1: 1 January (circumcision style, modern).
 * - mar25-forward: 25 March following 1 January (annunciation, Florentine and English): 1 Jan - 24 Mar belong to the year before.
 * - mar25-backward: 25 March preceding 1 January (Pisan): 25 Mar - 31 Dec carry the next year's number.
 * - mar1: 1 March following 1 January (Venetian, more veneto): 1 Jan - 28/29 Feb belong to the year before.
 * - dec25: 25 December preceding 1 January (nativity): 25 - 31 Dec carry the next year's number.
 */
import { InvalidInputError } from '../errors.js';
import type { CivilDay, YearStartStyle } from '../scene/types.js';
import { formatYearBcAd } from './format.js';

/** Whether (month, day) falls before (m, d) within a year. */
function before(month: number, day: number, m: number, d: number): boolean {
  return month < m || (month === m && day < d);
}

/**
 * Difference historical year minus January year for a month and day under a style: -1, 0 or +1.
 * @example historicalOffset(2, 10, 'mar25-forward') // -1 (10 February 1651 is written 1650)
 */
export function historicalOffset(month: number, day: number, style: YearStartStyle): number {
  switch (style) {
    case 'jan1':
      return 0;
    case 'mar25-forward':
      return before(month, day, 3, 25) ? -1 : 0;
    case 'mar25-backward':
      return before(month, day, 3, 25) ? 0 : 1;
    case 'mar1':
      return month < 3 ? -1 : 0;
    case 'dec25':
      return month === 12 && day >= 25 ? 1 : 0;
  }
}

/**
 * January year of a day written with a historical year under a style.
 * @example historicalToJanuaryYear({ year: 1650, month: 2, day: 10 }, 'mar25-forward') // 1651
 * @example historicalToJanuaryYear({ year: 1650, month: 3, day: 25 }, 'mar25-forward') // 1650
 */
export function historicalToJanuaryYear(day: CivilDay, style: YearStartStyle): number {
  return day.year - historicalOffset(day.month, day.day, style);
}

/**
 * Historical year under a style of a day given with its January year.
 * @example januaryYearToHistorical({ year: 1651, month: 2, day: 10 }, 'mar25-forward') // 1650
 */
export function januaryYearToHistorical(day: CivilDay, style: YearStartStyle): number {
  return day.year + historicalOffset(day.month, day.day, style);
}

/**
 * Two year numbers written the dual way: the earlier in full, then the later one's digits
 * from the first that differs, or in full across a century (common practice: 1650/1, 1659/60, 1699/1700).
 * @example dualYearText(1650, 1651) // "1650/1"
 */
export function dualYearText(earlier: number, later: number): string {
  const a = String(earlier);
  const b = String(later);
  if (earlier < 1 || a.length !== b.length) return `${a}/${b}`;
  let i = 0;
  while (i < a.length && a[i] === b[i]) i++;
  // A change of century is written in full (1699/1700), else from the first differing digit.
  return i < a.length - 2 ? `${a}/${b}` : `${a}/${b.slice(i)}`;
}

/**
 * The year of a day written under a style: plain when the style and January reckoning agree,
 * else the dual form "1650/1" (the two numbers the day carries, earlier first). Years before AD 1 print as BC.
 * @example formatDualYear({ year: 1651, month: 2, day: 10 }, 'mar25-forward') // "1650/1"
 * @example formatDualYear({ year: 1651, month: 5, day: 10 }, 'mar25-forward') // "1651"
 */
export function formatDualYear(day: CivilDay, style: YearStartStyle): string {
  const historical = januaryYearToHistorical(day, style);
  if (historical === day.year) return formatYearBcAd(day.year);
  return dualYearText(Math.min(historical, day.year), Math.max(historical, day.year));
}

/**
 * Read a dual year "A/B" (B = A + 1, written in full or by its last digits) for a given month and day,
 * and return the January year. Under every style the days carrying two numbers are:
 * 1 January - 24 March (a later start: January year B) and 25 March - 31 December (Pisan or nativity,
 * an earlier start: January year A); so month and day decide.
 * @example parseDualYear('1650/1', 2, 10, 'date') // 1651
 * @example parseDualYear('1699/1700', 3, 1, 'date') // 1700
 * @param quoted the whole text to quote in an error message (default: text)
 */
export function parseDualYear(text: string, month: number, day: number, field: string, quoted: string = text): number {
  const match = /^(\d{1,5})\/(\d{1,5})$/.exec(text.trim());
  const allowed = 'a dual year such as 1650/1 (the later year by its last digits or in full, one more than the first)';
  if (!match) throw new InvalidInputError(field, quoted, allowed);
  const earlier = Number(match[1]);
  const tail = match[2];
  const full = tail.length >= match[1].length ? Number(tail) : Number(match[1].slice(0, match[1].length - tail.length) + tail);
  if (full !== earlier + 1) {
    throw new InvalidInputError(field, quoted, allowed, `In ${text}, ${tail} does not read as ${earlier + 1}, the year after ${earlier}`);
  }
  return before(month, day, 3, 25) ? full : earlier;
}

/** The days that carry two year numbers under each style (none under jan1). */
const DUAL_SPAN: Record<YearStartStyle, string> = {
  jan1: 'no days',
  'mar25-forward': '1 January to 24 March',
  'mar25-backward': '25 March to 31 December',
  mar1: '1 January to the end of February',
  dec25: '25 to 31 December',
};

/**
 * Refuse a dual year written on a day that carries only one year number under the stated style:
 * `1650/1-03-30` under mar25-forward (the year began on 25 March, so 30 March is plainly 1650 or 1651).
 * Under jan1, the default when no style is stated, a dual year is read as written (it names the
 * style of its document itself).
 * @param day the day as read, with its January year (parseDualYear's result)
 * @param quoted the whole date as written, for the message
 * @throws InvalidInputError naming the field, quoting the date, saying which days are dual under the style
 * @example checkDualYearUnderStyle({ year: 1650, month: 3, day: 30 }, 'mar25-forward', '<date>', '1650/1-03-30') // throws
 */
export function checkDualYearUnderStyle(day: CivilDay, style: YearStartStyle, field: string, quoted: string): void {
  if (style === 'jan1' || historicalOffset(day.month, day.day, style) !== 0) return;
  // The two January years the dual year names (parseDualYear took the later before 25 March, else the earlier).
  const [earlier, later] = before(day.month, day.day, 3, 25) ? [day.year - 1, day.year] : [day.year, day.year + 1];
  const iso = (year: number): string => `${year}-${String(day.month).padStart(2, '0')}-${String(day.day).padStart(2, '0')}`;
  throw new InvalidInputError(
    field,
    quoted,
    `a single year for a day that carries one year number under ${style}`,
    `Under ${style} only ${DUAL_SPAN[style]} are written with two years; write ${iso(earlier)} or ${iso(later)}, ` +
      'or state the year start the document used.',
  );
}
