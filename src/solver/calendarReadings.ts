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
import { disputedSwitchIn, type DisputedReading, type DisputedSwitch } from '../calendar/disputedSwitch.js';
import { formatDayWords } from '../calendar/format.js';
import { HeliochronError } from '../errors.js';
import type { Scene } from '../scene/types.js';
import type { Candidate, CheckAnswer, CheckVerdict, DateAnswer, Proposal, SolverCalendarDate } from './types.js';
import { civilDateToJd } from '../calendar/regions.js';
import { dayWindowOf } from './window.js';

/** A reading of a disputed switch as every comparison names it. */
interface ReadingHeader {
  readonly readingId: string;
  /** The switch under this reading, in words. */
  readonly switchWords: string;
  readonly source: string;
  readonly main: boolean;
  /** The calendar rule to state for this reading, e.g. `holland@placaet`. */
  readonly ruleText: string;
  /** Why the scene (or proposal) could not be read under this reading (a written day that did not exist under it), else null. */
  readonly refusal: string | null;
}

/** What one reading of the switch gives. */
export interface ReadingOutcome extends ReadingHeader {
  readonly sourceText: string;
  /** The best candidate under this reading; null when none (or the scene cannot be read under it). */
  readonly best: {
    readonly jdUT: number;
    readonly civilDate: SolverCalendarDate;
    readonly chiSquare: number;
    readonly pValue: number | null;
  } | null;
}

/** The readings of a switch compared: which fit best, and the verdict in words. */
interface ReadingsComparison<O> {
  readonly regionId: string;
  readonly regionName: string;
  readonly outcomes: readonly O[];
  /** Ids of the readings whose best fit is the best overall (within 1 in chi-square), or [] when none fits. */
  readonly fitting: readonly string[];
  /** One or two sentences in plain words. */
  readonly verdict: string;
}

/** The comparison of readings for a scene whose window touches a disputed switch. */
export interface CalendarReadings extends ReadingsComparison<ReadingOutcome> {
  /** True when the readings' best candidates are the same instant (within half a day) named differently. */
  readonly sameInstant: boolean;
}

/** Chi-square margin within which two readings fit equally well (one sigma for one parameter; common practice). */
const EQUAL_FIT_CHI_SQUARE = 1;

function dateWords(d: SolverCalendarDate): string {
  return `${formatDayWords(d)} (${d.calendar === 'julian' ? 'Julian' : 'Gregorian'})`;
}

/** The switch of a reading in words: "21 December 1582 (Julian) followed by 1 January 1583 (Gregorian)". */
export function switchWords(r: DisputedReading): string {
  const last = r.calendar.periods[r.calendar.periods.length - 1];
  if (last.firstDay === undefined) return r.reading.label;
  const before = last.lastDayBefore === undefined ? '' : `${formatDayWords(last.lastDayBefore)} (Julian) followed by `;
  return `${before}${formatDayWords(last.firstDay)} (Gregorian)`;
}

/** The names of a reading, without its outcome. */
function headerOf(dispute: DisputedSwitch, r: DisputedReading): Omit<ReadingHeader, 'refusal'> {
  return {
    readingId: r.reading.id,
    switchWords: switchWords(r),
    source: r.reading.source,
    main: r.main,
    ruleText: r.main ? dispute.region.id : `${dispute.region.id}@${r.reading.id}`,
  };
}

/** The ids of the readings whose best chi-square is within EQUAL_FIT_CHI_SQUARE of the lowest. */
function fittingOf(outcomes: readonly { readonly readingId: string; readonly best: { readonly chiSquare: number } | null }[]): string[] {
  const scored = outcomes.filter((o) => o.best !== null);
  const lowest = Math.min(...scored.map((o) => o.best!.chiSquare));
  return scored.filter((o) => o.best!.chiSquare <= lowest + EQUAL_FIT_CHI_SQUARE).map((o) => o.readingId);
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
    const base = { ...headerOf(dispute, r), sourceText: r.reading.sourceText };
    if (r.main) return { ...base, best: bestOf(mainAnswer), refusal: null };
    try {
      return { ...base, best: bestOf(solve({ ...scene, calendar: r.rule })), refusal: null };
    } catch (error) {
      if (error instanceof HeliochronError && error.kind === 'invalid-input') return { ...base, best: null, refusal: error.message };
      throw error;
    }
  });
  const scored = outcomes.filter((o) => o.best !== null);
  const fitting = fittingOf(outcomes);
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

// ------------------------------------------------------------ check: a proposal under every reading

/** What one reading of the switch makes of a proposal. */
export interface CheckReadingOutcome extends ReadingHeader {
  /** The check's verdict under this reading; null when the proposal names no day under it. */
  readonly verdict: CheckVerdict | null;
  readonly verdictText: string | null;
  /** The best fit inside the proposal under this reading (its day named under the reading). */
  readonly best: { readonly jdUT: number; readonly civilDate: SolverCalendarDate; readonly chiSquare: number } | null;
}

/** A proposal judged under every reading of a disputed switch it (or the scene's window) touches. */
export interface CheckReadings extends ReadingsComparison<CheckReadingOutcome> {
  /** True when the proposal names the same days under every reading (only the window's best differs). */
  readonly sameDays: boolean;
}

/** The first and last civil days (JD of 0h) a proposal names under a rule; the Julian name when the rule skips it. */
function proposalSpan(scene: Scene, proposal: Proposal): [number, number] {
  const jdOf = (d: { year: number; month: number; day: number }): number => {
    try {
      return civilDateToJd(scene.calendar, d);
    } catch {
      return civilDateToJd({ kind: 'julian' }, d);
    }
  };
  if (proposal.kind === 'day') return [jdOf(proposal.day), jdOf(proposal.day)];
  if (proposal.kind === 'range') return [jdOf(proposal.from), jdOf(proposal.to)];
  const from = proposal.fromYear ?? scene.window.fromYear;
  const to = proposal.toYear ?? scene.window.toYear;
  return [jdOf({ year: from, month: 1, day: 1 }), jdOf({ year: to, month: 12, day: 31 })];
}

/** The days a proposal names under one reading (JD of 0h of its first and last day), or null when it names none. */
function daysUnder(scene: Scene, proposal: Proposal, rule: Scene['calendar']): string | null {
  try {
    const s = { ...scene, calendar: rule };
    if (proposal.kind === 'day') return String(civilDateToJd(s.calendar, proposal.day));
    if (proposal.kind === 'range') return `${civilDateToJd(s.calendar, proposal.from)}-${civilDateToJd(s.calendar, proposal.to)}`;
    return null;
  } catch {
    return null;
  }
}

/**
 * Judge a proposal under every reading of a disputed switch that its days or the scene's window
 * touch; null when it touches none. `mainAnswer` is the caller's check under the scene as written
 * (the table's main reading), or its refusal when the proposal names a day that reading skipped
 * (`proposal` is then null); `check` checks one scene (the same options read under its calendar).
 * The proposal's civil days are read under each reading, so the same written day can be a
 * different day (and fit differently) under each.
 * @example checkUnderReadings(scene, proposal, checkProposal(scene, proposal), (s) => checkProposal(s, proposal))?.verdict
 */
export function checkUnderReadings(scene: Scene, proposal: Proposal | null, mainAnswer: CheckAnswer | { readonly refusal: string }, check: (scene: Scene) => CheckAnswer): CheckReadings | null {
  const win = dayWindowOf(scene);
  // A proposal refused under the main reading (a day it skipped) is judged under the others wherever it falls.
  const [from, to] = proposal === null ? [-Infinity, Infinity] : proposalSpan(scene, proposal);
  const dispute = disputedSwitchIn(scene.calendar, Math.min(from, win.firstDayJd0) - 366, Math.max(to, win.lastDayJd0) + 366);
  if (dispute === null) return null;
  const outcomeOf = (answer: CheckAnswer) => ({
    verdict: answer.verdict,
    verdictText: answer.verdictText,
    best: answer.best === null ? null : { jdUT: answer.best.jdUT, civilDate: answer.best.civilDate, chiSquare: answer.best.chiSquare },
    refusal: null,
  });
  const outcomes = dispute.readings.map((r): CheckReadingOutcome => {
    const base = headerOf(dispute, r);
    if (r.main) return 'refusal' in mainAnswer ? { ...base, verdict: null, verdictText: null, best: null, refusal: mainAnswer.refusal } : { ...base, ...outcomeOf(mainAnswer) };
    try {
      return { ...base, ...outcomeOf(check({ ...scene, calendar: r.rule })) };
    } catch (error) {
      if (error instanceof HeliochronError && error.kind === 'invalid-input') return { ...base, verdict: null, verdictText: null, best: null, refusal: error.message };
      throw error;
    }
  });
  const fitting = fittingOf(outcomes);
  const days = proposal === null ? [null] : dispute.readings.map((r) => daysUnder(scene, proposal, r.rule));
  const sameDays = days.every((d) => d !== null && d === days[0]);
  return { regionId: dispute.region.id, regionName: dispute.region.name, outcomes, fitting, sameDays, verdict: checkVerdictWords(dispute.region.name, outcomes, fitting, sameDays) };
}

function checkVerdictWords(regionName: string, outcomes: readonly CheckReadingOutcome[], fitting: readonly string[], sameDays: boolean): string {
  const head = `The sources disagree on the day ${regionName} changed to the Gregorian calendar, and the proposal or the window touches it; the proposal was judged under each reading.`;
  const each = outcomes.map((o) => `under "${o.ruleText}" it is ${o.verdict ?? 'not a day of that calendar'}`).join('; ');
  if (fitting.length === 0) return `${head} ${capitalise(each)}.`;
  const agree = outcomes.every((o) => o.verdict === outcomes[0].verdict);
  if (sameDays && agree) return `${head} The proposal names the same days under every reading and the verdict is the same: ${outcomes[0].verdict}.`;
  const scored = outcomes.filter((o) => o.best !== null);
  if (scored.length === 1) return `${head} ${capitalise(each)}: only "${scored[0].ruleText}" (${scored[0].switchWords}) has such a day.`;
  if (fitting.length === scored.length) return `${head} ${capitalise(each)}; the best fits inside the proposal are equally good under every reading.`;
  const names = outcomes.filter((o) => fitting.includes(o.readingId)).map((o) => `"${o.ruleText}" (${o.switchWords})`);
  return `${head} ${capitalise(each)}. The proposal fits best under ${names.join(' and ')}; read that as a hint about the calendar in use, not as proof.`;
}

function capitalise(text: string): string {
  return text.length === 0 ? text : text[0].toUpperCase() + text.slice(1);
}

/** The comparison as lines of text, for the check command's answer. */
export function checkReadingsLines(r: CheckReadings): string[] {
  const main = r.outcomes.find((o) => o.main);
  const used = main?.verdict !== null ? main : r.outcomes.find((o) => o.verdict !== null);
  const lines = ['', `Calendar switch in dispute (${r.regionName}):`, `  ${r.verdict}`, `  The verdict above uses ${used?.main ? "the table's main reading" : "another reading, because the table's main reading has no such day"} ("${used?.ruleText ?? r.regionId}").`];
  for (const o of r.outcomes) {
    const fits = r.outcomes.length > 1 && r.fitting.length < r.outcomes.length ? (r.fitting.includes(o.readingId) ? 'the best of the readings' : 'worse than another reading') : 'alike under every reading';
    const result = o.best === null
      ? o.refusal ?? 'no fit inside the proposal'
      : `${o.verdict}: best inside the proposal ${dateWords(o.best.civilDate)}, chi2 ${o.best.chiSquare.toFixed(2)} (${fits})`;
    lines.push(`  - ${o.ruleText}: ${o.switchWords}${o.main ? ' [the table\'s main reading]' : ''}`);
    lines.push(`      ${result}`);
    lines.push(`      source: ${o.source}`);
  }
  lines.push(`  State one reading with --calendar/calendar: to use it alone (${r.outcomes.map((o) => o.ruleText).join(', ')}).`);
  return lines;
}
