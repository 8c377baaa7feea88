/**
 * Which civil calendar a region used on a given day, from the table in
 * data/calendar-reforms.json (one published source per row, see docs/calendars.md).
 *
 * A region is an ordered list of periods; each period has a reckoning (julian,
 * gregorian, or the special Swedish reckoning of 1700-1712, see reckoning.ts) and
 * the first day it was used, written in that reckoning. Going back to an older
 * calendar (Sweden 1712) is simply another period. A user may also state a fixed
 * calendar ('julian', 'gregorian') or a switch of their own ('switch:A/B').
 *
 * Day names that a region skipped at a switch (a "reform gap") are refused with a
 * message naming the neighbouring days. All JDs here are of local civil 0h: no time scale.
 */
import { InvalidInputError } from '../errors.js';
import type { CalendarRule, CivilDay, YearStartStyle } from '../scene/types.js';
import { type CalendarDate, type CalendarKind, calendarDateToJd, jdToCalendarDate } from './julianDay.js';
import {
  compareCivilDays,
  daysInReckoningMonth,
  isValidInReckoning,
  jdToReckoningDay,
  reckoningDayToJd,
  reckoningName,
  type Reckoning,
} from './reckoning.js';
import { formatDayWords, formatIsoDay } from './format.js';
import { CALENDAR_REFORMS_JSON } from './calendarReformsJson.generated.js';

/** One period of a region's civil reckoning. */
export interface ReformPeriod {
  readonly reckoning: Reckoning;
  /** First day of the period, named in its own reckoning; absent for the first period (from the beginning). */
  readonly firstDay?: CivilDay;
  /** The day before firstDay, named in the previous period's reckoning, as the source gives it (when it does). */
  readonly lastDayBefore?: CivilDay;
  /** JD of 0h of firstDay; -Infinity for the first period. */
  readonly firstJd: number;
}

/** A year-start style in use from a January year on (absent fromYear: from the beginning). */
export interface YearStartPeriod {
  readonly style: YearStartStyle;
  readonly fromYear?: number;
}

/** One published reading of a region's switch, with its own source (data/calendar-reforms.json `readings`). */
export interface RegionReading {
  /** Short id, written after the region id: `holland@placaet`. The main reading's id is its source key. */
  readonly id: string;
  /** The switch in words, e.g. "1 January 1583 (Julian) followed by 12 January 1583". */
  readonly label: string;
  readonly periods: readonly ReformPeriod[];
  readonly sourceKey: string;
  readonly source: string;
  readonly sourceText: string;
  readonly note?: string;
}

export interface Region {
  readonly id: string;
  readonly name: string;
  readonly periods: readonly ReformPeriod[];
  /** Key of the source in the table's `sources`, and the full reference. */
  readonly sourceKey: string;
  readonly source: string;
  /** The source's own words for this row. */
  readonly sourceText: string;
  readonly note?: string;
  readonly yearStarts?: readonly YearStartPeriod[];
  readonly yearStartSource?: string;
  /** Other published readings of the switch (the row's periods are its main reading); absent: undisputed. */
  readonly readings?: readonly RegionReading[];
}

/** A region that left a calendar other than the Julian: refused, its calendar is outside heliochron's scope. */
export interface OutOfScopeRegion {
  readonly id: string;
  readonly name: string;
  /** The calendar it left, in words. */
  readonly left: string;
  readonly year: number;
}

/** A rule made ready for repeated use: its periods with their JDs. Build it once with resolveCalendarRule for loops. */
export interface ResolvedCalendar {
  readonly label: string;
  readonly periods: readonly ReformPeriod[];
  readonly region?: Region;
  /** The reading of a disputed switch in use (absent: the row's main reading, or no region). */
  readonly reading?: RegionReading;
}

const RECKONINGS: readonly Reckoning[] = ['julian', 'gregorian', 'swedish'];
const YEAR_STARTS: readonly YearStartStyle[] = ['jan1', 'mar25-forward', 'mar25-backward', 'mar1', 'dec25'];

function tableDefect(message: string): Error {
  return new Error(`data/calendar-reforms.json: ${message}`);
}

function parseTableDay(text: unknown, where: string): CivilDay {
  const match = typeof text === 'string' ? /^(-?\d{1,5})-(\d{2})-(\d{2})$/.exec(text) : null;
  if (!match) throw tableDefect(`${where}: ${JSON.stringify(text)} is not YYYY-MM-DD`);
  return { year: Number(match[1]), month: Number(match[2]), day: Number(match[3]) };
}

interface RawPeriod { reckoning: string; firstDay?: string; lastDayBefore?: string }
interface RawReading { id: string; label: string; periods: RawPeriod[]; source: string; sourceText: string; note?: string }
interface RawRegion {
  id: string; name: string; periods: RawPeriod[]; source: string; sourceText: string; note?: string;
  yearStarts?: { style: string; fromYear?: number }[]; yearStartSource?: string; readings?: RawReading[];
}
interface RawOutOfScope { id: string; name: string; left: string; year: number; source: string }

/** Build the periods of a region and check each stated day against the days computed from the calendars. */
function buildPeriods(raw: readonly RawPeriod[], where: string): ReformPeriod[] {
  const periods: ReformPeriod[] = [];
  raw.forEach((p, i) => {
    const reckoning = p.reckoning as Reckoning;
    if (!RECKONINGS.includes(reckoning)) throw tableDefect(`${where}.periods[${i}]: unknown reckoning ${JSON.stringify(p.reckoning)}`);
    if (i === 0) {
      if (p.firstDay !== undefined) throw tableDefect(`${where}.periods[0] must have no firstDay (it runs from the beginning)`);
      periods.push({ reckoning, firstJd: -Infinity });
      return;
    }
    const firstDay = parseTableDay(p.firstDay, `${where}.periods[${i}].firstDay`);
    if (!isValidInReckoning(firstDay, reckoning)) throw tableDefect(`${where}.periods[${i}].firstDay ${p.firstDay} is no ${reckoning} day`);
    const firstJd = reckoningDayToJd(firstDay, reckoning);
    const previous = periods[i - 1];
    if (firstJd <= previous.firstJd) throw tableDefect(`${where}.periods[${i}] does not follow the period before it`);
    let lastDayBefore: CivilDay | undefined;
    if (p.lastDayBefore !== undefined) {
      lastDayBefore = parseTableDay(p.lastDayBefore, `${where}.periods[${i}].lastDayBefore`);
      const computed = jdToReckoningDay(firstJd - 1, previous.reckoning).day;
      if (compareCivilDays(computed, lastDayBefore) !== 0) {
        throw tableDefect(`${where}.periods[${i}]: the day before ${p.firstDay} (${reckoning}) is ${formatIsoDay(computed)} (${previous.reckoning}), not ${p.lastDayBefore}`);
      }
    }
    periods.push({ reckoning, firstDay, lastDayBefore, firstJd });
  });
  return periods;
}

/**
 * Read and check the table of regions (data/calendar-reforms.json, whose text reaches the library
 * through calendarReformsJson.generated.ts: no file is read). Parsed and checked afresh on each
 * call: keep the result (or a ResolvedCalendar) when calling in a loop.
 * Throws an Error (a defect of the data file, not of the user's input) when a row is inconsistent.
 */
export function loadReformTable(): readonly Region[] {
  return parseReformTable(JSON.parse(CALENDAR_REFORMS_JSON));
}

/** The regions that left a calendar other than the Julian (data/calendar-reforms.json `outOfScope`). */
export function loadOutOfScopeRegions(): readonly OutOfScopeRegion[] {
  const json = JSON.parse(CALENDAR_REFORMS_JSON) as { outOfScope?: RawOutOfScope[] };
  return (json.outOfScope ?? []).map((o) => Object.freeze({ id: o.id, name: o.name, left: o.left, year: o.year }));
}

/**
 * Check and build a reform table from its JSON form (the content of data/calendar-reforms.json).
 * Throws an Error naming the row when a stated day does not fit the calendars.
 */
export function parseReformTable(data: unknown): readonly Region[] {
  const json = data as { sources: Record<string, string>; regions: RawRegion[] };
  const sourceOf = (key: string, where: string): string => {
    const text = json.sources[key];
    if (text === undefined) throw tableDefect(`${where}: unknown source ${JSON.stringify(key)}`);
    return text;
  };
  const seen = new Set<string>();
  return json.regions.map((raw, index) => {
    const where = `regions[${index}] (${raw.id})`;
    if (seen.has(raw.id)) throw tableDefect(`${where}: id used twice`);
    seen.add(raw.id);
    const source = json.sources[raw.source];
    if (source === undefined) throw tableDefect(`${where}: unknown source ${JSON.stringify(raw.source)}`);
    const yearStarts = raw.yearStarts?.map((y) => {
      if (!YEAR_STARTS.includes(y.style as YearStartStyle)) throw tableDefect(`${where}: unknown year start ${y.style}`);
      return y.fromYear === undefined ? { style: y.style as YearStartStyle } : { style: y.style as YearStartStyle, fromYear: y.fromYear };
    });
    const yearStartSource = raw.yearStartSource === undefined ? undefined : json.sources[raw.yearStartSource];
    if (raw.yearStartSource !== undefined && yearStartSource === undefined) throw tableDefect(`${where}: unknown yearStartSource`);
    const readings = raw.readings?.map((r, i): RegionReading => {
      const at = `${where}.readings[${i}] (${r.id})`;
      if (r.id === raw.source || raw.readings?.findIndex((o) => o.id === r.id) !== i) throw tableDefect(`${at}: reading id used twice`);
      return Object.freeze({
        id: r.id,
        label: r.label,
        periods: buildPeriods(r.periods, at),
        sourceKey: r.source,
        source: sourceOf(r.source, at),
        sourceText: r.sourceText,
        ...(r.note === undefined ? {} : { note: r.note }),
      });
    });
    const region: Region = {
      id: raw.id,
      name: raw.name,
      periods: buildPeriods(raw.periods, where),
      sourceKey: raw.source,
      source,
      sourceText: raw.sourceText,
      ...(raw.note === undefined ? {} : { note: raw.note }),
      ...(yearStarts === undefined ? {} : { yearStarts }),
      ...(yearStartSource === undefined ? {} : { yearStartSource }),
      ...(readings === undefined ? {} : { readings }),
    };
    return Object.freeze(region);
  });
}

/** Edit distance between two strings (Levenshtein), for "did you mean". */
function editDistance(a: string, b: string): number {
  const row = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    let diagonal = row[0];
    row[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const above = row[j];
      row[j] = Math.min(row[j] + 1, row[j - 1] + 1, diagonal + (a[i - 1] === b[j - 1] ? 0 : 1));
      diagonal = above;
    }
  }
  return row[b.length];
}

const RULE_ALLOWED =
  "'gregorian', 'julian', a region id (list them with: heliochron calendar --list-regions) or 'switch:YYYY-MM-DD/YYYY-MM-DD' (last Julian day / first Gregorian day)";

/**
 * The region with this id (case-insensitive).
 * @throws InvalidInputError naming near misses ("did you mean ...").
 * @example findRegion('great-britain').periods[1].firstDay // { year: 1752, month: 9, day: 14 }
 */
export function findRegion(id: string, field = 'calendar', table: readonly Region[] = loadReformTable()): Region {
  const wanted = id.trim().toLowerCase();
  const found = table.find((r) => r.id === wanted);
  if (found) return found;
  const outside = loadOutOfScopeRegions().find((r) => r.id === wanted || r.name.toLowerCase() === wanted);
  if (outside) {
    throw new InvalidInputError(
      field,
      id,
      RULE_ALLOWED,
      `${outside.name} left ${outside.left} in ${outside.year}, not the Julian calendar; that calendar is outside heliochron's scope. ` +
        `Give dates from ${outside.year} on with --calendar gregorian, and convert earlier dates to the Julian or Gregorian calendar first.`,
    );
  }
  // No region id is longer than 40 characters: a longer text has no near miss (and the edit distance would cost time).
  const near = (wanted.length > 40 ? [] : table)
    .map((r) => ({ id: r.id, score: Math.min(editDistance(wanted, r.id), r.id.includes(wanted) || (wanted.length >= 4 && r.name.toLowerCase().includes(wanted)) ? 1 : 99) }))
    .filter((c) => c.score <= Math.max(2, Math.floor(wanted.length / 3)))
    .sort((a, b) => a.score - b.score || a.id.localeCompare(b.id))
    .slice(0, 3)
    .map((c) => `"${c.id}"`);
  throw new InvalidInputError(field, id, RULE_ALLOWED, near.length > 0 ? `Did you mean ${near.join(' or ')}?` : 'No region of that name is in the table.');
}

function parseSwitchDay(text: string, field: string, whole: string): CivilDay {
  const match = /^(-?\d{1,5})-(\d{1,2})-(\d{1,2})$/.exec(text.trim());
  if (!match) throw new InvalidInputError(field, whole, RULE_ALLOWED, `${JSON.stringify(text)} is not a date YYYY-MM-DD`);
  return { year: Number(match[1]), month: Number(match[2]), day: Number(match[3]) };
}

/**
 * Read a calendar rule as the user writes it: `julian`, `gregorian`, a region id, or
 * `switch:YYYY-MM-DD/YYYY-MM-DD` (last Julian civil day / first Gregorian civil day).
 * A switch must name two consecutive days (the day after the last Julian day must carry the first Gregorian name).
 * @example parseCalendarRule('switch:1700-02-18/1700-03-01', '--calendar') // { kind: 'switch', ... }
 */
export function parseCalendarRule(text: string, field: string): CalendarRule {
  const t = text.trim().toLowerCase();
  if (t === 'julian') return { kind: 'julian' };
  if (t === 'gregorian') return { kind: 'gregorian' };
  if (t.startsWith('switch:')) {
    const parts = t.slice('switch:'.length).split('/');
    if (parts.length !== 2) throw new InvalidInputError(field, text, RULE_ALLOWED, 'A switch names two days separated by "/".');
    const lastJulian = parseSwitchDay(parts[0], field, text);
    const firstGregorian = parseSwitchDay(parts[1], field, text);
    if (!isValidInReckoning(lastJulian, 'julian')) throw new InvalidInputError(field, text, RULE_ALLOWED, `${parts[0]} is not a day of the Julian calendar.`);
    if (!isValidInReckoning(firstGregorian, 'gregorian')) throw new InvalidInputError(field, text, RULE_ALLOWED, `${parts[1]} is not a day of the Gregorian calendar.`);
    const rule: CalendarRule = { kind: 'switch', lastJulian, firstGregorian };
    checkSwitch(rule, field, text);
    return rule;
  }
  const at = t.indexOf('@');
  if (at >= 0) {
    const region = findRegion(t.slice(0, at), field);
    const reading = readingOf(region, t.slice(at + 1), field, text);
    return { kind: 'region', regionId: region.id, ...(reading === undefined ? {} : { reading: reading.id }) };
  }
  return { kind: 'region', regionId: findRegion(t, field).id };
}

/** Every reading of a region's switch: its main reading (id = its source key) first, then the others. */
export function regionReadings(region: Region): readonly RegionReading[] {
  const main: RegionReading = {
    id: region.sourceKey,
    label: 'the table\'s main reading',
    periods: region.periods,
    sourceKey: region.sourceKey,
    source: region.source,
    sourceText: region.sourceText,
  };
  return [main, ...(region.readings ?? [])];
}

/** The named reading of a region (undefined for its main reading); refuses an unknown id, listing the readings. */
function readingOf(region: Region, id: string, field: string, text: string): RegionReading | undefined {
  const wanted = id.trim().toLowerCase();
  if (wanted === region.sourceKey.toLowerCase()) return undefined;
  const found = region.readings?.find((r) => r.id === wanted);
  if (found) return found;
  const ids = regionReadings(region).map((r) => `${region.id}@${r.id}`);
  throw new InvalidInputError(field, text, RULE_ALLOWED, `${region.name} has the readings ${ids.join(', ')}.`);
}

function checkSwitch(rule: Extract<CalendarRule, { kind: 'switch' }>, field: string, text: string): void {
  const jdLast = calendarDateToJd({ calendar: 'julian', ...rule.lastJulian });
  const jdFirst = calendarDateToJd({ calendar: 'gregorian', ...rule.firstGregorian });
  if (jdFirst !== jdLast + 1) {
    const dayAfter = jdToCalendarDate(jdLast + 1, 'gregorian').date;
    const dayBefore = jdToCalendarDate(jdFirst - 1, 'julian').date;
    throw new InvalidInputError(
      field,
      text,
      RULE_ALLOWED,
      `The two days are not consecutive: the day after ${formatIsoDay(rule.lastJulian)} (Julian) is ${formatIsoDay(dayAfter)} (Gregorian), ` +
        `and the day before ${formatIsoDay(rule.firstGregorian)} (Gregorian) is ${formatIsoDay(dayBefore)} (Julian); ` +
        `did you mean switch:${formatIsoDay(rule.lastJulian)}/${formatIsoDay(dayAfter)} or switch:${formatIsoDay(dayBefore)}/${formatIsoDay(rule.firstGregorian)}?`,
    );
  }
}

function isResolved(rule: CalendarRule | ResolvedCalendar): rule is ResolvedCalendar {
  return (rule as ResolvedCalendar).periods !== undefined;
}

/**
 * Turn a rule into its list of periods (reads the table for a region rule). Keep the result for loops.
 * @example resolveCalendarRule({ kind: 'region', regionId: 'france' }).periods.length // 2
 */
export function resolveCalendarRule(rule: CalendarRule | ResolvedCalendar, field = 'calendar'): ResolvedCalendar {
  if (isResolved(rule)) return rule;
  switch (rule.kind) {
    case 'julian':
      return { label: 'Julian calendar (proleptic before AD 8, as astronomers count it)', periods: [{ reckoning: 'julian', firstJd: -Infinity }] };
    case 'gregorian':
      return { label: 'Gregorian calendar (proleptic before 1582)', periods: [{ reckoning: 'gregorian', firstJd: -Infinity }] };
    case 'region': {
      const region = findRegion(rule.regionId, field);
      const reading = rule.reading === undefined ? undefined : readingOf(region, rule.reading, field, `${rule.regionId}@${rule.reading}`);
      if (reading === undefined) return { label: `${region.name} (region "${region.id}")`, periods: region.periods, region };
      return { label: `${region.name} (region "${region.id}", reading "${reading.id}": ${reading.label})`, periods: reading.periods, region, reading };
    }
    case 'switch': {
      const text = `switch:${formatIsoDay(rule.lastJulian)}/${formatIsoDay(rule.firstGregorian)}`;
      checkSwitch(rule, field, text);
      return {
        label: `Julian calendar to ${formatIsoDay(rule.lastJulian)}, Gregorian from ${formatIsoDay(rule.firstGregorian)} (${text})`,
        periods: [
          { reckoning: 'julian', firstJd: -Infinity },
          {
            reckoning: 'gregorian',
            firstDay: rule.firstGregorian,
            lastDayBefore: rule.lastJulian,
            firstJd: calendarDateToJd({ calendar: 'gregorian', ...rule.firstGregorian }),
          },
        ],
      };
    }
  }
}

/** Index of the period containing the civil day of a JD. */
function periodIndexAt(periods: readonly ReformPeriod[], jd: number): number {
  const jd0 = Math.floor(jd + 0.5) - 0.5;
  let index = 0;
  for (let i = 1; i < periods.length; i++) if (jd0 >= periods[i].firstJd) index = i;
  return index;
}

/**
 * The reckoning in force on the civil day containing a JD (including 'swedish').
 * @example reckoningInForce({ kind: 'region', regionId: 'sweden' }, 2342000) // 'swedish' (1700-1712)
 */
export function reckoningInForce(rule: CalendarRule | ResolvedCalendar, jd: number): Reckoning {
  const resolved = resolveCalendarRule(rule);
  return resolved.periods[periodIndexAt(resolved.periods, jd)].reckoning;
}

/**
 * The calendar in force on the civil day containing a JD. The Swedish reckoning of
 * 1700-1712 is counted as 'julian' here (it is the Julian calendar with one leap day
 * moved); use jdToCivilDate for the day's name there, or reckoningInForce.
 * @example calendarInForce({ kind: 'region', regionId: 'rome' }, 2299160.5) // 'gregorian'
 */
export function calendarInForce(rule: CalendarRule | ResolvedCalendar, jd: number): CalendarKind {
  const reckoning = reckoningInForce(rule, jd);
  return reckoning === 'swedish' ? 'julian' : reckoning;
}

/** A JD's civil day as the region named it. */
export interface CivilDateAnswer {
  /** The day as a Julian or Gregorian calendar date (in the Swedish period: the Julian date). */
  readonly date: CalendarDate;
  readonly dayFraction: number;
  /** The reckoning in force. */
  readonly reckoning: Reckoning;
  /** The day's name as written in the region (equals date, except in the Swedish period: one day later). */
  readonly civil: CivilDay;
}

/**
 * The civil date of a JD in the calendar in force that day.
 * @example jdToCivilDate({ kind: 'region', regionId: 'great-britain' }, 2361221.5).civil // 14 September 1752
 */
export function jdToCivilDate(rule: CalendarRule | ResolvedCalendar, jd: number): CivilDateAnswer {
  const reckoning = reckoningInForce(rule, jd);
  const calendar: CalendarKind = reckoning === 'swedish' ? 'julian' : reckoning;
  const { date, dayFraction } = jdToCalendarDate(jd, calendar);
  const civil = jdToReckoningDay(jd, reckoning).day;
  return { date, dayFraction, reckoning, civil };
}

/**
 * The civil day of jdToCivilDate(rule, jd) and the calendar of its date, in one object: one conversion
 * of the JD (jdToCivilDate converts twice outside the Swedish period), for loops over many days.
 * @example jdToCivilDayAndCalendar({ kind: 'region', regionId: 'great-britain' }, 2361221.5) // 14 September 1752, 'gregorian'
 */
export function jdToCivilDayAndCalendar(rule: CalendarRule | ResolvedCalendar, jd: number): CivilDay & { readonly calendar: CalendarKind } {
  const reckoning = reckoningInForce(rule, jd);
  if (reckoning === 'swedish') {
    const { day } = jdToReckoningDay(jd, reckoning);
    return { year: day.year, month: day.month, day: day.day, calendar: 'julian' };
  }
  const { date } = jdToCalendarDate(jd, reckoning);
  return { year: date.year, month: date.month, day: date.day, calendar: reckoning };
}

/**
 * The civil day (its name in the reckoning in force) of a JD: jdToCivilDate(rule, jd).civil alone,
 * without the calendar date beside it (for loops over many days, such as the solver's allowed months).
 * @example jdToCivilDay({ kind: 'region', regionId: 'great-britain' }, 2361221.5) // 14 September 1752
 */
export function jdToCivilDay(rule: CalendarRule | ResolvedCalendar, jd: number): CivilDay {
  return jdToReckoningDay(jd, reckoningInForce(rule, jd)).day;
}

const DATE_ALLOWED = 'a day that was in civil use under the stated calendar';

/**
 * JD of local 0h of a civil day written in the calendar in force in its period.
 * @throws InvalidInputError for a day name skipped at a reform (naming the neighbouring days),
 *   a day that does not exist in the calendar then in force (29 February 1700 in a Gregorian region),
 *   and a name used twice (a switch back), asking for an explicit calendar.
 * @example civilDateToJd({ kind: 'region', regionId: 'rome' }, { year: 1582, month: 10, day: 15 }) // 2299160.5
 */
export function civilDateToJd(rule: CalendarRule | ResolvedCalendar, day: CivilDay, field = 'date'): number {
  const resolved = resolveCalendarRule(rule, field);
  const { periods } = resolved;
  const matches: number[] = [];
  periods.forEach((period, i) => {
    if (!isValidInReckoning(day, period.reckoning)) return;
    const jd = reckoningDayToJd(day, period.reckoning);
    const end = i + 1 < periods.length ? periods[i + 1].firstJd : Infinity;
    if (jd >= period.firstJd && jd < end) matches.push(jd);
  });
  const written = formatIsoDay(day);
  if (matches.length === 1) return matches[0];
  if (matches.length > 1) {
    throw new InvalidInputError(field, written, DATE_ALLOWED, `Under ${resolved.label} this name was used for two different days; state the calendar as 'julian' or 'gregorian'.`);
  }
  // A skipped name lies between the last day of one period and the first day of the next, by name.
  for (let i = 1; i < periods.length; i++) {
    const before = jdToReckoningDay(periods[i].firstJd - 1, periods[i - 1].reckoning).day;
    const first = periods[i].firstDay as CivilDay;
    if (compareCivilDays(before, day) < 0 && compareCivilDays(day, first) < 0) {
      throw new InvalidInputError(
        field,
        written,
        DATE_ALLOWED,
        `${formatDayWords(day)} was never used under ${resolved.label}: at the change of calendar ` +
          `${formatDayWords(before)} (${reckoningName(periods[i - 1].reckoning)}) was followed by ${formatDayWords(first)} (${reckoningName(periods[i].reckoning)})`,
      );
    }
  }
  const inForce = periods.filter((p) => isWithinNamesOf(day, p, periods)).map((p) => p.reckoning);
  const reckoning = inForce[0] ?? periods[periods.length - 1].reckoning;
  const monthDays = daysInReckoningMonth(day.year, day.month, reckoning);
  throw new InvalidInputError(
    field,
    written,
    DATE_ALLOWED,
    `${formatIsoDay(day)} does not exist in the ${reckoningName(reckoning)} calendar in force then under ${resolved.label}` +
      (day.month >= 1 && day.month <= 12 ? ` (that month had ${monthDays} days)` : ''),
  );
}

/** Whether a day name lies, by name, within a period (for messages only). */
function isWithinNamesOf(day: CivilDay, period: ReformPeriod, periods: readonly ReformPeriod[]): boolean {
  const i = periods.indexOf(period);
  const startsOk = period.firstDay === undefined || compareCivilDays(day, period.firstDay) >= 0;
  const next = periods[i + 1];
  const endsOk = next === undefined || compareCivilDays(day, next.firstDay as CivilDay) < 0;
  return startsOk && endsOk;
}

/**
 * The year-start style a region used in a January year, when the table names one.
 * @example yearStartInRegion(findRegion('great-britain'), 1700) // 'mar25-forward'
 */
export function yearStartInRegion(region: Region, januaryYear: number): YearStartStyle | undefined {
  if (region.yearStarts === undefined) return undefined;
  let style: YearStartStyle | undefined;
  for (const y of region.yearStarts) if (y.fromYear === undefined || januaryYear >= y.fromYear) style = y.style;
  return style;
}
