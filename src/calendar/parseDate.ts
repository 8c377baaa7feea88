/**
 * Reading a civil date as a scholar writes it.
 *
 * Accepted forms (month and day may have one or two digits; names in English, three letters or more):
 * - `1582-10-15`, `-0043-03-15` (astronomical year numbering: 0 = 1 BC, -43 = 44 BC)
 * - `44-03-15 BC`, `44 BC-03-15`, `BC 44-03-15`, `AD 1066-10-14`, `1066-10-14 AD`
 * - `15 March 44 BC`, `15 Mar 44 BC`, `14 October AD 1066`, `March 15, 1066`
 * - dual years: `1650/1-02-10`, `10 February 1650/1` (see yearStart.ts)
 *
 * Only the shape is checked here: month 1-12, day 1-31 within the month's longest length
 * (29 for February, except 30 February 1712, which Sweden used). Whether 29 February existed
 * that year depends on the calendar, and is checked by regions.civilDateToJd.
 */
import { InvalidInputError } from '../errors.js';
import type { CivilDay } from '../scene/types.js';
import { MONTH_NAMES } from './julianDay.js';
import { parseDualYear } from './yearStart.js';

const ALLOWED =
  'a date such as 1582-10-15, -0043-03-15 (astronomical years), 44-03-15 BC, "15 March 44 BC" or a dual year such as 1650/1-02-10';

/** Longest length of each month in any calendar heliochron knows (February: 29; 30 only in 1712, Sweden). */
const LONGEST_MONTH = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31] as const;

/** What was read, beyond the day itself. */
export interface ParsedDate {
  /** The day; year = as written for a plain year, the January year for a dual year. */
  readonly day: CivilDay;
  /** True when the year was written as a dual year (then day.year is already the January year). */
  readonly dualYear: boolean;
  /** The year as written ("1650/1", "44 BC", "1582"). */
  readonly yearText: string;
}

function monthFromName(name: string): number | undefined {
  const n = name.toLowerCase().replace(/\.$/, '');
  if (n.length < 3) return undefined;
  const index = MONTH_NAMES.findIndex((m) => m.toLowerCase().startsWith(n));
  return index < 0 ? undefined : index + 1;
}

interface Pieces { yearText: string; era?: 'BC' | 'AD'; month: number; day: number }

function splitText(text: string, field: string): Pieces {
  const t = text.trim().replace(/\s+/g, ' ');
  const era = String.raw`(?:(BC|AD|B\.C\.|A\.D\.|BCE|CE)\s?)`;
  const year = String.raw`([+-]?\d{1,6}(?:\/\d{1,6})?)`;
  const numeric = new RegExp(String.raw`^${era}?${year}-(\d{1,2})-(\d{1,2})(?:\s?(BC|AD|B\.C\.|A\.D\.|BCE|CE))?$`, 'i');
  let m = numeric.exec(t);
  if (m) return { yearText: m[2], era: eraOf(m[1] ?? m[5], text, field), month: Number(m[3]), day: Number(m[4]) };
  const eraInside = new RegExp(String.raw`^(\d{1,6})\s?(BC|AD|B\.C\.|A\.D\.|BCE|CE)-(\d{1,2})-(\d{1,2})$`, 'i');
  m = eraInside.exec(t);
  if (m) return { yearText: m[1], era: eraOf(m[2], text, field), month: Number(m[3]), day: Number(m[4]) };
  const dayFirst = new RegExp(String.raw`^(\d{1,2}) ([A-Za-z]+\.?),? ${era}?${year}(?: (BC|AD|B\.C\.|A\.D\.|BCE|CE))?$`, 'i');
  m = dayFirst.exec(t);
  if (m) return { yearText: m[4], era: eraOf(m[3] ?? m[5], text, field), month: namedMonth(m[2], text, field), day: Number(m[1]) };
  const monthFirst = new RegExp(String.raw`^([A-Za-z]+\.?) (\d{1,2}),? ${era}?${year}(?: (BC|AD|B\.C\.|A\.D\.|BCE|CE))?$`, 'i');
  m = monthFirst.exec(t);
  if (m) return { yearText: m[4], era: eraOf(m[3] ?? m[5], text, field), month: namedMonth(m[1], text, field), day: Number(m[2]) };
  throw new InvalidInputError(field, text, ALLOWED);
}

function eraOf(word: string | undefined, text: string, field: string): 'BC' | 'AD' | undefined {
  if (word === undefined) return undefined;
  const w = word.toUpperCase().replace(/\./g, '');
  if (w === 'BC' || w === 'BCE') return 'BC';
  if (w === 'AD' || w === 'CE') return 'AD';
  throw new InvalidInputError(field, text, ALLOWED);
}

function namedMonth(name: string, text: string, field: string): number {
  const month = monthFromName(name);
  if (month === undefined) throw new InvalidInputError(field, text, ALLOWED, `${JSON.stringify(name)} is not a month name`);
  return month;
}

/**
 * Read a date and report how its year was written.
 * @example parseDateParts('1650/1-02-10', '--date') // { day: { year: 1651, month: 2, day: 10 }, dualYear: true, yearText: '1650/1' }
 */
export function parseDateParts(text: string, field: string): ParsedDate {
  const p = splitText(text, field);
  if (p.month < 1 || p.month > 12) {
    throw new InvalidInputError(field, text, ALLOWED, `Month ${p.month} does not exist: months run from 1 to 12`);
  }
  const longest = LONGEST_MONTH[p.month - 1];
  const monthName = MONTH_NAMES[p.month - 1];
  if (p.day < 1 || p.day > 31) {
    throw new InvalidInputError(field, text, ALLOWED, `Day ${p.day} does not exist: days of a month run from 1 to at most 31`);
  }
  const dual = p.yearText.includes('/');
  let year: number;
  if (dual) {
    if (p.era !== undefined || p.yearText.startsWith('-') || p.yearText.startsWith('+')) {
      throw new InvalidInputError(field, text, ALLOWED, 'A dual year is written with two positive years (AD), without BC/AD');
    }
    year = parseDualYear(p.yearText, p.month, p.day, field, text);
  } else {
    const written = Number(p.yearText);
    if (p.era !== undefined) {
      if (!/^\d+$/.test(p.yearText) || written < 1) {
        throw new InvalidInputError(field, text, ALLOWED, `With ${p.era} the year is counted from 1 (there is no year 0 BC or AD); use a negative year only without BC/AD`);
      }
      year = p.era === 'BC' ? 1 - written : written; // 1 BC = year 0 (astronomical numbering)
    } else {
      year = written;
    }
  }
  const isSwedishLeapDay = p.month === 2 && p.day === 30 && year === 1712;
  if (p.day > longest && !isSwedishLeapDay) {
    throw new InvalidInputError(
      field,
      text,
      ALLOWED,
      p.month === 2
        ? `${monthName} has at most 29 days (30 February was used only in Sweden, in 1712)`
        : `${monthName} has ${longest} days`,
    );
  }
  const yearText = dual ? p.yearText : p.era === undefined ? p.yearText : `${p.yearText} ${p.era}`;
  return { day: { year, month: p.month, day: p.day }, dualYear: dual, yearText };
}

/**
 * Read a civil date (shape only, see the module note).
 * A plain year is returned as written (apply the year-start style with yearStart.historicalToJanuaryYear);
 * a dual year gives the January year.
 * @example parseDateText('44-03-15 BC', '--date') // { year: -43, month: 3, day: 15 }
 * @throws InvalidInputError for month 13, day 32, 30 February (except 1712), malformed text
 */
export function parseDateText(text: string, field: string): CivilDay {
  return parseDateParts(text, field).day;
}
