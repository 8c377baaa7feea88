/**
 * When the scene's window touches a calendar switch that published tables date differently
 * (src/calendar/disputedSwitch.ts), the scene is solved once under every reading, as the
 * solver tries every clock keeping when a clock's keeping is unknown. Only the civil calendar
 * changes between the runs: the window's years, its documentary bounds and its months are read
 * under each reading, and the answer's days are named under each. The outcome says which reading
 * fits the evidence best and that the sources disagree; it never hides a reading.
 *
 * Additive: the main answer (the table's main reading) is computed as always by the caller;
 * this module adds the other readings and a comparison. Pure: no clock, no console.
 */
import { disputedSwitchIn, type DisputedReading } from '../calendar/disputedSwitch.js';
import { formatDayWords } from '../calendar/format.js';
import { HeliochronError } from '../errors.js';
import type { Scene } from '../scene/types.js';
import type { Candidate, DateAnswer, SolverCalendarDate } from './types.js';
import { dayWindowOf } from './window.js';

/** What one reading of the switch gives. */
export interface ReadingOutcome {
  readonly readingId: string;
  /** The switch under this reading, in words. */
  readonly switchWords: string;
  readonly source: string;
  readonly sourceText: string;
  readonly main: boolean;
  /** The calendar rule to state for this reading, e.g. `holland@placaet`. */
  readonly ruleText: string;
  /** The best candidate under this reading; null when none (or the scene cannot be read under it). */
  readonly best: {
    readonly jdUT: number;
    readonly civilDate: SolverCalendarDate;
    readonly chiSquare: number;
    readonly pValue: number | null;
  } | null;
  /** Why the scene could not be read under this reading (a written day that did not exist under it), else null. */
  readonly refusal: string | null;
}

/** The comparison of readings for a scene whose window touches a disputed switch. */
export interface CalendarReadings {
  readonly regionId: string;
  readonly regionName: string;
  readonly outcomes: readonly ReadingOutcome[];
  /** Ids of the readings whose best fit is the best overall (within 1 in chi-square), or [] when none fits. */
  readonly fitting: readonly string[];
  /** True when the readings' best candidates are the same instant (within half a day) named differently. */
  readonly sameInstant: boolean;
  /** One or two sentences in plain words. */
  readonly verdict: string;
}

/** Chi-square margin within which two readings fit equally well (one sigma for one parameter; common practice). */
const EQUAL_FIT_CHI_SQUARE = 1;

function dateWords(d: SolverCalendarDate): string {
  return `${formatDayWords(d)} (${d.calendar === 'julian' ? 'Julian' : 'Gregorian'})`;
}

/** The switch of a reading in words: "21 December 1582 (Julian) followed by 1 January 1583 (Gregorian)". */
function switchWords(r: DisputedReading): string {
  const last = r.calendar.periods[r.calendar.periods.length - 1];
  if (last.firstDay === undefined) return r.reading.label;
  const before = last.lastDayBefore === undefined ? '' : `${formatDayWords(last.lastDayBefore)} (Julian) followed by `;
  return `${before}${formatDayWords(last.firstDay)} (Gregorian)`;
}

function bestOf(answer: DateAnswer): ReadingOutcome['best'] {
  const c: Candidate | undefined = answer.candidates[0];
  return c === undefined ? null : { jdUT: c.jdUT, civilDate: c.civilDate, chiSquare: c.chiSquare, pValue: c.pValue };
}

/**
 * Solve the scene under every reading of a disputed switch its window touches; null when it
 * touches none. `mainAnswer` is the caller's answer under the table's main reading (the scene as
 * written); `solve` solves one scene (solveDates with the caller's options).
 * @example calendarReadings(scene, solveDates(scene), (s) => solveDates(s))?.verdict
 */
export function calendarReadings(scene: Scene, mainAnswer: DateAnswer, solve: (scene: Scene) => DateAnswer): CalendarReadings | null {
  const win = dayWindowOf(scene);
  const dispute = disputedSwitchIn(scene.calendar, win.firstDayJd0 - 366, win.lastDayJd0 + 366);
  if (dispute === null) return null;
  const outcomes = dispute.readings.map((r): ReadingOutcome => {
    const base = {
      readingId: r.reading.id,
      switchWords: switchWords(r),
      source: r.reading.source,
      sourceText: r.reading.sourceText,
      main: r.main,
      ruleText: r.main ? dispute.region.id : `${dispute.region.id}@${r.reading.id}`,
    };
    if (r.main) return { ...base, best: bestOf(mainAnswer), refusal: null };
    try {
      return { ...base, best: bestOf(solve({ ...scene, calendar: r.rule })), refusal: null };
    } catch (error) {
      if (error instanceof HeliochronError && error.kind === 'invalid-input') return { ...base, best: null, refusal: error.message };
      throw error;
    }
  });
  const scored = outcomes.filter((o) => o.best !== null);
  const lowest = Math.min(...scored.map((o) => (o.best as NonNullable<ReadingOutcome['best']>).chiSquare));
  const fitting = scored.filter((o) => (o.best as NonNullable<ReadingOutcome['best']>).chiSquare <= lowest + EQUAL_FIT_CHI_SQUARE).map((o) => o.readingId);
  const instants = scored.map((o) => (o.best as NonNullable<ReadingOutcome['best']>).jdUT);
  const sameInstant = instants.length > 1 && Math.max(...instants) - Math.min(...instants) < 0.5;
  return { regionId: dispute.region.id, regionName: dispute.region.name, outcomes, fitting, sameInstant, verdict: verdictWords(dispute.region.name, outcomes, fitting, sameInstant) };
}

function verdictWords(regionName: string, outcomes: readonly ReadingOutcome[], fitting: readonly string[], sameInstant: boolean): string {
  const head = `The sources disagree on the day ${regionName} changed to the Gregorian calendar, and the window touches it; the scene was solved under each reading.`;
  if (fitting.length === 0) return `${head} No reading gives a candidate.`;
  if (fitting.length === outcomes.length) {
    return sameInstant
      ? `${head} The light fits equally under every reading: the instant is the same, only the name of the day depends on the reading.`
      : `${head} Every reading gives an equally good fit; the evidence does not choose between them.`;
  }
  const names = outcomes.filter((o) => fitting.includes(o.readingId)).map((o) => `"${o.ruleText}" (${o.switchWords})`);
  return `${head} The evidence fits best under ${names.join(' and ')}; read that as a hint about the calendar in use, not as proof.`;
}

/** The comparison as lines of text, for the date command's answer. */
export function calendarReadingsLines(r: CalendarReadings): string[] {
  const main = r.outcomes.find((o) => o.main);
  const lines = ['', `Calendar switch in dispute (${r.regionName}):`, `  ${r.verdict}`, `  The rest of this answer uses the table's main reading ("${main?.ruleText ?? r.regionId}").`];
  for (const o of r.outcomes) {
    const fits = r.fitting.includes(o.readingId) ? 'fits' : 'fits worse';
    const result = o.best === null
      ? o.refusal ?? 'no candidate'
      : `best candidate ${dateWords(o.best.civilDate)}, chi2 ${o.best.chiSquare.toFixed(2)} (${fits})`;
    lines.push(`  - ${o.ruleText}: ${o.switchWords}${o.main ? ' [the table\'s main reading]' : ''}`);
    lines.push(`      ${result}`);
    lines.push(`      source: ${o.source}`);
  }
  lines.push(`  State one reading with --calendar/calendar: to use it alone (${r.outcomes.map((o) => o.ruleText).join(', ')}).`);
  return lines;
}
