/**
 * Small shared pieces of every rendering of an answer (text, JSON, CSV): times of day,
 * civil dates in the site's calendar with Old Style / New Style where both were in use,
 * the uncertainty in words, the assumptions in words, and rounding for stable output.
 *
 * Old Style / New Style: a date is written in both calendars ("9/20 May 1703") when the site's
 * calendar (a region or a switch) changes within the years searched, give or take one year: in
 * those years documents of the site itself use either style (common practice of historians to
 * give both).
 */
import { signedFixed } from '../textUnits.js';
import type { CalendarRule, Scene, YearStartStyle } from '../scene/types.js';
import type { Candidate, CandidateUncertainty, ClockAssumption, DateAnswer, SolverCalendarDate } from '../solver/types.js';
import { calendarDateToJd, jdToCalendarDate } from '../calendar/julianDay.js';
import { formatDayWords, formatDualStyle, formatIsoDay } from '../calendar/format.js';
import { formatDualYear } from '../calendar/yearStart.js';
import { resolveCalendarRule } from '../calendar/regions.js';
import { describeClockKind, formatClockKind } from '../time/clock.js';
import { deltaTAtJdUT } from '../time/timeScales.js';
import { deltaTModelName } from '../time/deltaT.js';
import { STANDARD_AIR } from '../ephemeris/refraction.js';

/**
 * Round for output: at most `digits` decimals, no negative zero.
 * @example roundTo(2.0049, 2) // 2; roundTo(-0.0001, 2) // 0
 */
export function roundTo(x: number, digits: number): number {
  const r = Number(x.toFixed(digits));
  return Object.is(r, -0) ? 0 : r;
}

/**
 * A probability to a number of significant digits (so that 3.7e-239 does not print as 0), keeping null.
 * @example roundProbability(3.71234e-239, 4) // 3.712e-239
 */
export function roundProbability(p: number | null | undefined, significant: number): number | null {
  return p === null || p === undefined || !Number.isFinite(p) ? null : Number(p.toPrecision(significant));
}

/** Like roundTo, keeping null. */
export function roundOrNull(x: number | null | undefined, digits: number): number | null {
  return x === null || x === undefined || !Number.isFinite(x) ? null : roundTo(x, digits);
}

/**
 * Minutes after midnight as hh:mm, rounded to the minute, wrapped to one day.
 * @example hhmm(455.6) // "07:36"; hhmm(1439.8) // "00:00"
 */
export function hhmm(minutes: number): string {
  if (!Number.isFinite(minutes)) return '--:--';
  const m = ((Math.round(minutes) % 1440) + 1440) % 1440;
  return `${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`;
}

/**
 * A range of times "07:35-07:50", one time when both round alike.
 * @example minuteRange(455, 470) // "07:35-07:50"
 */
export function minuteRange(fromMinutes: number, toMinutes: number): string {
  const a = hhmm(fromMinutes);
  const b = hhmm(toMinutes);
  return a === b ? a : `${a}-${b}`;
}

/** "Julian" or "Gregorian". */
export function calendarName(calendar: 'julian' | 'gregorian'): string {
  return calendar === 'julian' ? 'Julian' : 'Gregorian';
}

/** The civil day of a candidate written for a reader, with both styles where both were in use. */
export interface CivilDateRendering {
  /** "30 July 1771 (Gregorian)" or "19/30 July 1771 (Old Style/New Style; New Style in force)". */
  readonly text: string;
  /** Day as written in the calendar in force, year-month-day, astronomical years: "1771-07-30". */
  readonly iso: string;
  readonly calendar: 'julian' | 'gregorian';
  /** Present when both styles are shown. */
  readonly oldStyle?: string;
  readonly newStyle?: string;
  /** The year as written under the scene's year start when it differs from the January year ("1650/1"). */
  readonly dualYear?: string;
}

/**
 * The site's changes of calendar (JD of the first day of each new period) that fall within the
 * years searched, give or take one year: when there is one, the answer writes every date in both
 * styles, since documents of those years at the site use either.
 */
export function switchesNearWindow(scene: Scene): readonly number[] {
  if (scene.calendar.kind !== 'region' && scene.calendar.kind !== 'switch') return [];
  const from = calendarDateToJd({ calendar: 'julian', year: scene.window.fromYear - 1, month: 1, day: 1 });
  const to = calendarDateToJd({ calendar: 'julian', year: scene.window.toYear + 2, month: 1, day: 1 });
  return resolveCalendarRule(scene.calendar)
    .periods.map((p) => p.firstJd)
    .filter((jd) => Number.isFinite(jd) && jd >= from && jd < to);
}

/** Whether Old and New Style are both written for the days of an answer: the site's calendar changes within the years searched. */
export function bothStylesInUse(scene: Scene): boolean {
  return switchesNearWindow(scene).length > 0;
}

/**
 * The candidate's civil day in the site's calendar, written in words.
 * @example civilDateRendering({ calendar: 'gregorian', year: 1771, month: 7, day: 30 }, scene).text
 *   // "30 July 1771 (Gregorian)", or "19/30 July 1771 (New Style)" when the window spans a switch
 */
export function civilDateRendering(date: SolverCalendarDate, scene: Scene): CivilDateRendering {
  const jd0 = calendarDateToJd(date);
  const iso = formatIsoDay(date);
  const dual = scene.yearStart === 'jan1' ? undefined : formatDualYear(date, scene.yearStart);
  const dualYear = dual !== undefined && dual !== String(date.year) ? dual : undefined;
  const yearNote = dualYear === undefined ? '' : `, year written ${dualYear}`;
  if (!bothStylesInUse(scene)) {
    return { text: `${formatDayWords(date)} (${calendarName(date.calendar)}${yearNote})`, iso, calendar: date.calendar, ...(dualYear ? { dualYear } : {}) };
  }
  const oldStyle = jdToCalendarDate(jd0, 'julian').date;
  const newStyle = jdToCalendarDate(jd0, 'gregorian').date;
  const inForce = date.calendar === 'julian' ? 'Old Style' : 'New Style';
  return {
    text: `${formatDualStyle(oldStyle, newStyle)} (${inForce}${yearNote})`,
    iso,
    calendar: date.calendar,
    oldStyle: formatIsoDay(oldStyle),
    newStyle: formatIsoDay(newStyle),
    ...(dualYear ? { dualYear } : {}),
  };
}

/** The sentence explaining the two styles, when the answer writes them. */
export function dualStyleWords(scene: Scene): string | null {
  const switches = switchesNearWindow(scene);
  if (switches.length === 0) return null;
  const days = switches.map((jd) => formatDayWords(jdToCalendarDate(jd, 'gregorian').date)).join(' and ');
  return (
    `Dates are written Old Style/New Style (Julian/Gregorian), since the site changed calendar within the years searched ` +
    `(Gregorian from ${days}); the style in force at the site that day is named in brackets.`
  );
}

/** The calendar rule in words, for the assumptions. */
export function calendarRuleWords(rule: CalendarRule): string {
  return resolveCalendarRule(rule).label;
}

const YEAR_START_WORDS: Record<YearStartStyle, string> = {
  jan1: 'the year begins on 1 January',
  'mar25-forward': 'the year begins on 25 March following 1 January (Annunciation style)',
  'mar25-backward': 'the year begins on 25 March preceding 1 January (Pisan style)',
  mar1: 'the year begins on 1 March (Venetian style)',
  dec25: 'the year begins on 25 December (Nativity style)',
};

export function yearStartWords(style: YearStartStyle): string {
  return YEAR_START_WORDS[style];
}

/** A clock assumption in words. */
export function clockAssumptionWords(a: ClockAssumption): string {
  if (a.kind === 'none') return 'no clock in the picture';
  return `the clock kept ${describeClockKind(a)}${a.stated ? ' (as stated in the scene)' : ' (tried: the scene says it is unknown)'}`;
}

/** A clock assumption as a short code for JSON and CSV: "none", "mean", "zone:Europe/Zurich". */
export function clockAssumptionCode(a: ClockAssumption): string {
  return a.kind === 'none' ? 'none' : formatClockKind(a);
}

/** The 95% day-minute ellipse of an uncertainty, when present. */
export function ellipse95(u: CandidateUncertainty) {
  return u.ellipses.find((e) => Math.abs(e.probability - 0.95) < 0.01) ?? null;
}

/** Why the ellipse of a candidate was replaced, in words ('' when it was not). */
export function replacedReason(c: Candidate): string {
  if (c.uncertainty.method === 'ellipse' && ellipse95(c.uncertainty)) return '';
  return c.uncertainty.invalidReason ?? 'the linearised ellipse failed its check';
}

/** The profile-scan interval of a candidate in words, or null without a scan. */
export function profileWords(c: Candidate): string | null {
  const p = c.uncertainty.profile;
  if (!p) return null;
  const open = p.open ? ', open: the interval runs to the edge of the scan or of the window' : '';
  // A scan that keeps one day is no interval of zero width: the day is fixed to within the whole-day step.
  if (p.fromDays === p.toDays) {
    return `95% profile scan over whole days keeps only ${formatDayWords(p.fromDate)} (the neighbouring days fit worse by more than ${p.deltaChiSquare.toFixed(2)} in chi-square), ${minuteRange(p.fromLocalApparentMinutes, p.toLocalApparentMinutes)} local apparent time`;
  }
  return (
    `95% profile scan ${formatDayWords(p.fromDate)} to ${formatDayWords(p.toDate)} (${signedDays(p.fromDays)} to ${signedDays(p.toDays)} d${open}), ` +
    `${minuteRange(p.fromLocalApparentMinutes, p.toLocalApparentMinutes)} local apparent time`
  );
}

/**
 * The 95% uncertainty of a candidate in words: the ellipse's half-widths, or the
 * profile-scan interval with the reason the ellipse was replaced.
 */
export function uncertaintyWords(c: Candidate): string {
  const e = ellipse95(c.uncertainty);
  if (c.uncertainty.method === 'ellipse' && e) {
    return `+/- ${e.halfWidthDays.toFixed(1)} d, +/- ${e.halfWidthMinutes.toFixed(0)} min (95% ellipse)`;
  }
  if (!c.uncertainty.fixesDayAndHour) return 'not fixed: the evidence does not fix the day and the hour separately, so the day is free along a curve (no ellipse, no interval)';
  const scan = profileWords(c);
  return `${scan ?? 'no interval'}; ellipse replaced because ${replacedReason(c)}`;
}

function signedDays(d: number): string {
  return signedFixed(d, 1);
}

/** Delta T at the candidate and its sigma, naming the scene's Delta T model (through src/time). */
export function deltaTWords(c: Candidate, scene: Scene): string {
  const dT = deltaTAtJdUT(c.jdUT, scene.deltaT);
  const sigma = dT.sigmaSeconds < 1 ? dT.sigmaSeconds.toFixed(2) : dT.sigmaSeconds.toFixed(0);
  return `Delta T ${c.times.deltaTSeconds.toFixed(dT.sigmaSeconds < 1 ? 1 : 0)} s +/- ${sigma} s at the best candidate (${deltaTModelName(scene.deltaT)})`;
}

/** First year from which the sun model is stated to agree with VSOP87 within 0.01 deg (docs/time-keeping.md). */
const SUN_ACCURACY_NOTE_BEFORE_YEAR = 500;

/**
 * For a window reaching before AD 500: how far the sun model is known to depart from a second
 * theory there (measured in tests/ephemeris/sunAccuracyByEra.test.ts); null otherwise.
 */
export function sunAccuracyWords(scene: Scene): string | null {
  return sunAccuracyWordsFrom(scene.window.fromYear);
}

/** The same note for any first year (the sun command passes the year of its date). */
export function sunAccuracyWordsFrom(fromYear: number): string | null {
  if (fromYear >= SUN_ACCURACY_NOTE_BEFORE_YEAR) return null;
  return (
    'before AD 500 the sun model (astronomy-engine) and VSOP87 differ by up to 0.016 deg at AD 500 ' +
    'and 0.042 deg at 500 BC (mostly in declination); read differences in the sun smaller than that as not significant'
  );
}

/** The refraction model and air in words. */
export function refractionWords(scene: Scene): string {
  const air = scene.air ?? STANDARD_AIR;
  const given = scene.air ? 'as stated in the scene' : 'standard air, the scene states none';
  return `refraction by the Bennett / NREL SPA formula for ${air.pressureHPa} hPa and ${air.temperatureC} C (${given})`;
}

/** The caution every answer ends with. */
export const CAUTION =
  'This is an estimate conditional on the stated assumptions (the measurements and their sigmas, the wall orientations, ' +
  'the calendar, the clock and the models above). Weigh it with the documentary evidence and expert judgement; ' +
  'it does not by itself date the picture.';

/**
 * The site in words.
 * @example siteWords(scene) // "47.62 N, 9.35 E, 410 m above sea level"
 */
export function siteWords(scene: Scene): string {
  const { latitudeDeg: lat, longitudeDeg: lon, elevationM } = scene.site;
  return `${Math.abs(lat)} ${lat < 0 ? 'S' : 'N'}, ${Math.abs(lon)} ${lon < 0 ? 'W' : 'E'}, ${elevationM} m above sea level`;
}

/** Month and day as one number for ordering within a year: 7 * 100 + 30 = 730. */
const monthDayKey = (md: { readonly month: number; readonly day: number }): number => md.month * 100 + md.day;

/**
 * The id of the family a candidate belongs to ('' when none): by membership when the members are
 * listed, else the family that has it as its best, else the family with the same clock keeping and
 * calendar whose years and span of days (which may wrap the year end) hold it.
 */
export function familyIdOf(answer: DateAnswer, c: Candidate): string {
  for (const f of answer.families) if (f.best.id === c.id || f.members?.some((m) => m.id === c.id)) return f.id;
  const code = clockAssumptionCode(c.clockAssumption);
  const key = monthDayKey(c.civilDate);
  for (const f of answer.families) {
    const codes = (f.keepings ?? [{ clockAssumption: f.clockAssumption }]).map((k) => clockAssumptionCode(k.clockAssumption));
    if (!codes.includes(code) || f.calendar !== c.civilDate.calendar) continue;
    if (c.civilDate.year < f.fromYear || c.civilDate.year > f.toYear) continue;
    const from = monthDayKey(f.fromMonthDay);
    const to = monthDayKey(f.toMonthDay);
    if (from <= to ? key >= from && key <= to : key >= from || key <= to) return f.id;
  }
  return '';
}
