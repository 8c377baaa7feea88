/**
 * `heliochron calendar <date>`: one day in both calendars, its Julian Day and weekday,
 * its civil date under the stated calendar rule, and its year under a year-start style.
 */
import { disputedSwitchIn, isNameDisputed, namesUnderReadings } from '../calendar/disputedSwitch.js';
import { InvalidInputError } from '../errors.js';
import type { CivilDay, YearStartStyle } from '../scene/types.js';
import { MONTH_NAMES, ROME_FIRST_GREGORIAN_JD, WEEKDAY_NAMES, jdToCalendarDate, weekdayOfJd } from '../calendar/julianDay.js';
import { parseDateParts } from '../calendar/parseDate.js';
import {
  civilDateToJd,
  jdToCivilDate,
  loadReformTable,
  parseCalendarRule,
  resolveCalendarRule,
  yearStartInRegion,
  type Region,
} from '../calendar/regions.js';
import { reckoningName } from '../calendar/reckoning.js';
import { formatDayWithYearText, formatDayWords, formatDualStyle, formatIsoDay } from '../calendar/format.js';
import { checkDualYearUnderStyle, formatDualYear, historicalOffset, historicalToJanuaryYear } from '../calendar/yearStart.js';
import type { CliIo } from './io.js';

export interface CalendarOptions {
  readonly calendar: string;
  readonly calendarGiven: boolean;
  readonly yearStart: string;
  readonly yearStartGiven: boolean;
  readonly json: boolean;
  readonly listRegions: boolean;
}

const YEAR_STARTS: readonly YearStartStyle[] = ['jan1', 'mar25-forward', 'mar25-backward', 'mar1', 'dec25'];
const YEAR_START_WORDS: Record<YearStartStyle, string> = {
  jan1: 'year begins 1 January',
  'mar25-forward': 'year begins 25 March after 1 January (Florentine / English)',
  'mar25-backward': 'year begins 25 March before 1 January (Pisan)',
  mar1: 'year begins 1 March (Venetian)',
  dec25: 'year begins 25 December (nativity)',
};
/** Old Style / New Style is printed for days from the first switch (Rome, 1582) to 1923, when both were in civil use in Europe (common practice). */
const DUAL_STYLE_LAST_YEAR = 1923;

function parseYearStart(text: string): YearStartStyle {
  const t = text.trim().toLowerCase() as YearStartStyle;
  if (!YEAR_STARTS.includes(t)) throw new InvalidInputError('--year-start', text, YEAR_STARTS.join(', '));
  return t;
}

function switchText(region: Region): string {
  return region.periods
    .slice(1)
    .map((p) => `${p.lastDayBefore ? formatIsoDay(p.lastDayBefore) : '?'} / ${formatIsoDay(p.firstDay as CivilDay)} ${p.reckoning}`)
    .join('; ');
}

function listRegions(options: CalendarOptions, io: CliIo): void {
  const table = loadReformTable();
  if (options.json) {
    io.out(`${JSON.stringify(table.map((r) => ({ id: r.id, name: r.name, periods: r.periods.map((p) => ({ reckoning: p.reckoning, firstDay: p.firstDay ?? null, lastDayBefore: p.lastDayBefore ?? null })), source: r.source, sourceText: r.sourceText, note: r.note ?? null, yearStarts: r.yearStarts ?? null })), null, 2)}\n`);
    return;
  }
  const lines = table.map(
    (r) => `${r.id.padEnd(20)} ${switchText(r).padEnd(40)} ${r.name} [${r.sourceKey}]` +
      (r.readings === undefined ? '' : `; disputed, also ${r.readings.map((x) => `${r.id}@${x.id}`).join(', ')}`),
  );
  io.out(`Regions (last day of the old reckoning / first day of the new; sources in docs/calendars.md):\n${lines.join('\n')}\n`);
}

export function run(args: readonly string[], options: CalendarOptions, io: CliIo): void {
  if (options.listRegions) {
    listRegions(options, io);
    return;
  }
  const text = args[0];
  if (text === undefined || text.trim() === '') {
    throw new InvalidInputError('<date>', text, 'a date such as 1582-10-15, 44-03-15 BC, 1650/1-02-10 or "JD 2299160.5" (or --list-regions)');
  }
  const style = parseYearStart(options.yearStart);
  const rule = parseCalendarRule(options.calendar, '--calendar');
  const resolved = resolveCalendarRule(rule, '--calendar');

  // The day: a JD, or a date written in the stated calendar and year-start style.
  let civilJd: number; // a count of local civil days, no time scale
  let readAs: string;
  let dualNote: string | null = null;
  const jdMatch = /^JD\s*([-+]?\d+(?:\.\d+)?)$/i.exec(text.trim());
  if (jdMatch) {
    civilJd = Number(jdMatch[1]);
    readAs = `Julian Day ${jdMatch[1]}`;
  } else {
    const parsed = parseDateParts(text, '<date>');
    if (parsed.dualYear) checkDualYearUnderStyle(parsed.day, style, '<date>', text);
    if (parsed.dualYear && style === 'jan1') {
      // No style stated: say which styles write this day with two years, so the reading can be checked.
      const styles = YEAR_STARTS.filter((s) => historicalOffset(parsed.day.month, parsed.day.day, s) !== 0);
      dualNote =
        `a dual year on ${parsed.day.day} ${MONTH_NAMES[parsed.day.month - 1]} is written only under ${styles.map((s) => `${s} (${YEAR_START_WORDS[s]})`).join(' or ')}; ` +
        `read so, it is January year ${parsed.day.year}; add --year-start to state the style of the document`;
    }
    const day: CivilDay = parsed.dualYear ? parsed.day : { ...parsed.day, year: historicalToJanuaryYear(parsed.day, style) };
    civilJd = civilDateToJd(resolved, day, '<date>');
    readAs = parsed.dualYear || style === 'jan1'
      ? `${formatDayWords(day)}${parsed.dualYear ? ` (dual year ${parsed.yearText}: January year ${day.year})` : ''}`
      : `${formatDayWithYearText(day, parsed.yearText)} under ${style} = ${formatDayWords(day)} (January year)`;
  }
  const dayStartJd = Math.floor(civilJd + 0.5) - 0.5;
  const julian = jdToCalendarDate(dayStartJd, 'julian').date;
  const gregorian = jdToCalendarDate(dayStartJd, 'gregorian').date;
  const civil = jdToCivilDate(resolved, dayStartJd);
  const weekday = weekdayOfJd(dayStartJd);
  const showStyles = dayStartJd >= ROME_FIRST_GREGORIAN_JD && gregorian.year <= DUAL_STYLE_LAST_YEAR;
  const dualStyle = showStyles ? formatDualStyle(julian, gregorian) : null;
  const civilDay: CivilDay = civil.civil;
  const dualYear = formatDualYear(civilDay, style);
  const regionStyle = resolved.region ? yearStartInRegion(resolved.region, civilDay.year) : undefined;
  const regionStyleNote =
    regionStyle !== undefined && regionStyle !== style
      ? `in ${resolved.region?.id} the year then usually began by ${regionStyle} (${YEAR_START_WORDS[regionStyle]}), where this day is written ${formatDualYear(civilDay, regionStyle)}; ` +
        `if the year was written that way, add --year-start ${regionStyle}`
      : null;
  // A disputed switch (docs/calendars.md): the day's name under every published reading, when they differ.
  const dispute = disputedSwitchIn(rule, dayStartJd, dayStartJd);
  const readingNames = dispute !== null && isNameDisputed(dispute, dayStartJd)
    ? namesUnderReadings(dispute, dayStartJd).map((n) => ({
        rule: n.main ? dispute.region.id : `${dispute.region.id}@${n.reading.id}`,
        reckoning: n.reckoning,
        text: formatDayWords(n.civil),
        source: n.reading.source,
      }))
    : [];
  const calendarDefaultWords = options.calendarGiven ? '' : ' - the default; state another with --calendar';
  const yearStartDefaultWords = options.yearStartGiven ? '' : ' - the default; state another with --year-start';
  const fraction = civilJd - dayStartJd;

  if (options.json) {
    const out = {
      input: text,
      readAs,
      calendar: { rule: options.calendar, label: resolved.label, isDefault: !options.calendarGiven, source: resolved.region?.source ?? null },
      yearStart: { style, isDefault: !options.yearStartGiven, regionUsualStyle: regionStyle ?? null },
      jd: dayStartJd,
      jdNoon: dayStartJd + 0.5,
      jdNote: 'jd is the Julian Day of 0h (start) of the civil day, jdNoon of its noon; both in the local time of the day, no time scale',
      ...(fraction > 0 ? { jdGiven: civilJd, dayFraction: fraction } : {}),
      julian: { year: julian.year, month: julian.month, day: julian.day, text: formatDayWords(julian) },
      gregorian: { year: gregorian.year, month: gregorian.month, day: gregorian.day, text: formatDayWords(gregorian) },
      weekday: { number: weekday, name: WEEKDAY_NAMES[weekday], numbering: '0 = Sunday ... 6 = Saturday' },
      civil: { reckoning: civil.reckoning, year: civilDay.year, month: civilDay.month, day: civilDay.day, text: formatDayWords(civilDay) },
      oldStyleNewStyle: dualStyle,
      dualYear: { style, text: dualYear },
      notes: [dualNote, regionStyleNote].filter((n): n is string => n !== null),
      disputedReadings: readingNames,
    };
    io.out(`${JSON.stringify(out, null, 2)}\n`);
    return;
  }
  const lines = [
    `Date given:    ${text}, read as ${readAs}`,
    `Calendar:      ${resolved.label}${calendarDefaultWords}`,
    ...(resolved.region ? [`  source:      ${resolved.reading?.source ?? resolved.region.source}`] : []),
    `Year start:    ${style} (${YEAR_START_WORDS[style]})${yearStartDefaultWords}`,
    `Julian:        ${formatDayWords(julian)}`,
    `Gregorian:     ${formatDayWords(gregorian)}`,
    `Julian Day:    ${dayStartJd.toFixed(1)} at 0h (start of the civil day), ${(dayStartJd + 0.5).toFixed(1)} at noon (local time of the day; no time scale)` +
      (fraction > 0 ? `; given ${civilJd} = ${fraction.toFixed(6)} of the day after 0h` : ''),
    `Weekday:       ${WEEKDAY_NAMES[weekday]}`,
    `Civil date:    ${formatDayWords(civilDay)} (${reckoningName(civil.reckoning)}) under ${resolved.label}`,
    ...(dualStyle ? [`Old/New Style: ${dualStyle}`] : []),
    `Year written:  ${dualYear} (${style})`,
    ...(dualNote ? [`Note:          ${dualNote}`] : []),
    ...(regionStyleNote ? [`Note:          ${regionStyleNote}`] : []),
    ...(readingNames.length > 0
      ? [
          `Disputed:      the sources disagree on the day ${dispute?.region.name} changed calendar; this day is named`,
          ...readingNames.map((n) => `                ${n.text} (${reckoningName(n.reckoning)}) under ${n.rule} - ${n.source}`),
        ]
      : []),
  ];
  io.out(`${lines.join('\n')}\n`);
}

