/**
 * The calendar parts of a scene file, read through src/calendar: the calendar
 * rule, the year-start style and the civil dates of the date window.
 */
import { InvalidInputError } from '../errors.js';
import { civilDateToJd, findRegion, parseCalendarRule, yearStartInRegion } from '../calendar/regions.js';
import { parseDateParts, parseDateText } from '../calendar/parseDate.js';
import { checkDualYearUnderStyle, historicalToJanuaryYear } from '../calendar/yearStart.js';
import { closestWord } from './didYouMean.js';
import { checkChoice, keyPath, openFields, raw, has, missing } from './fields.js';
import type { CalendarRule, CivilDay, YearStartStyle } from './types.js';

export const YEAR_START_STYLES: readonly YearStartStyle[] = ['jan1', 'mar25-forward', 'mar25-backward', 'mar1', 'dec25'];

const CALENDAR_WORDS =
  '"julian", "gregorian", a region id of data/calendar-reforms.json, or a map { lastJulian: YYYY-MM-DD, firstGregorian: YYYY-MM-DD }';

/** `calendar`: a word, a region id, or the two days of a switch. */
export function readCalendar(value: unknown, path: string): CalendarRule {
  if (typeof value === 'string') {
    try {
      return parseCalendarRule(value, path);
    } catch (error) {
      // A near miss of the two plain words gets its suggestion here (the region table knows only region ids).
      const near = error instanceof InvalidInputError ? closestWord(value, ['julian', 'gregorian']) : undefined;
      if (near === undefined || !(error instanceof InvalidInputError)) throw error;
      throw new InvalidInputError(path, value, error.allowed, `Did you mean "${near}"?`);
    }
  }
  if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
    const f = openFields(value, path, 'a calendar switch', ['lastJulian', 'firstGregorian']);
    for (const k of ['lastJulian', 'firstGregorian']) {
      if (!has(f, k)) throw missing(f, k, 'a day written YYYY-MM-DD');
      const text = raw(f, k);
      if (typeof text !== 'string') {
        throw new InvalidInputError(keyPath(path, k), text, 'a day written YYYY-MM-DD');
      }
      parseDateText(text, keyPath(path, k));
    }
    return parseCalendarRule(`switch:${String(raw(f, 'lastJulian'))}/${String(raw(f, 'firstGregorian'))}`, path);
  }
  throw new InvalidInputError(path, value, CALENDAR_WORDS);
}

/**
 * `yearStart` as written, or the style the region's data names for the window's years, else 1 January.
 * A region whose style changed within the window asks for an explicit yearStart.
 */
export function readYearStart(
  value: unknown,
  present: boolean,
  path: string,
  rule: CalendarRule,
  years: { readonly fromYear: number; readonly toYear: number },
): YearStartStyle {
  if (present) return checkChoice(value, path, YEAR_START_STYLES, 'where the numbered year began');
  if (rule.kind !== 'region') return 'jan1';
  const region = findRegion(rule.regionId, 'calendar');
  const first = yearStartInRegion(region, years.fromYear) ?? 'jan1';
  const last = yearStartInRegion(region, years.toYear) ?? 'jan1';
  if (first !== last) {
    throw new InvalidInputError(
      path,
      undefined,
      `a stated yearStart: one of ${YEAR_START_STYLES.map((y) => `"${y}"`).join(', ')}`,
      `In ${region.name} the year began in the "${first}" style in ${years.fromYear} and in the "${last}" style in ${years.toYear}; say which style the dates of this file are written in.`,
    );
  }
  return first;
}

/**
 * A civil date of the file, as a CivilDay of the January-start year, checked to exist in the calendar in force.
 * @returns the day and its JD of local 0h (for ordering)
 */
export function readCivilDate(value: unknown, path: string, rule: CalendarRule, style: YearStartStyle): { day: CivilDay; jd0: number } {
  if (typeof value !== 'string') {
    throw new InvalidInputError(path, value, 'a civil date written YYYY-MM-DD (in quotes in JSON), e.g. 1652-03-01 or 1650/1-02-10');
  }
  // A dual year such as 1650/1-02-10 names the January year itself; a single year is read in the scene's style.
  const written = parseDateParts(value, path);
  if (written.dualYear) checkDualYearUnderStyle(written.day, style, path, value);
  const day = style === 'jan1' || written.dualYear ? written.day : { ...written.day, year: historicalToJanuaryYear(written.day, style) };
  const jd0 = civilDateToJd(rule, day, path);
  return { day, jd0 };
}
