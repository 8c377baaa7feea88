/**
 * The data of the date-and-hour map: the civil year of the best candidate (in the site's
 * calendar), the fit of every (day, local apparent minute) cell as Delta chi-square above the
 * best, the month boundaries, and the candidates of that year with their error ellipses or
 * profile-scan intervals. Rendering is in dateHourMap.ts.
 *
 * A scene lit by the moon alone (src/solver/moonSearch.ts isLitByMoonAlone) gets the map of the moon: the moon's
 * place at a day and hour differs from year to year, so the map holds for the best candidate's year alone. Its
 * cells come from the same evidence model and evaluation as the solver's (chiSquareGrid.ts: the moon of the full
 * ephemeris at every cell), its hours run from the earliest sunset of the year to the latest sunrise (a night is one
 * column, under the day on whose evening it begins), and candidates of other years are not placed on it.
 */
import { calendarReadingNote } from './calendarReadingLabel.js';
import type { Scene } from '../scene/types.js';
import type { Candidate, DateAnswer } from '../solver/types.js';
import { MONTH_NAMES } from '../calendar/julianDay.js';
import { civilDateToJd, jdToCivilDate, resolveCalendarRule, type ResolvedCalendar } from '../calendar/regions.js';
import { formatYearBcAd } from '../calendar/format.js';
import { resolvePixelObservations } from '../image/resolvePixels.js';
import { buildEvidenceModel, type EvidenceModel } from '../solver/evidenceModel.js';
import { assumedClockOfCandidate, chiSquareOnDayMinuteGrid, nuisancesOfCandidate, type DayMinuteGridSpec } from '../solver/chiSquareGrid.js';
import { isLitByMoonAlone } from '../solver/moonSearch.js';
import { mapGrid } from './mapGrid.js';
import { rowMinimum } from './contour.js';
import { FIT_BANDS } from './palette.js';
import { ellipsePoints } from './ellipse.js';
import { markedCandidates, type MarkedCandidate } from './markedCandidates.js';

export interface MapEllipse {
  readonly probability: number;
  /** Closed outline, (day offset, minute) points. */
  readonly points: readonly (readonly [number, number])[];
}

export interface MapMarker {
  /** "F1" (best of family 1) or a candidate rank. */
  readonly label: string;
  readonly id: string;
  /** True for the first marked candidate (the best). */
  readonly best: boolean;
  /** False when the candidate is of another year, placed on its month and day in the map's year. */
  readonly inMapYear: boolean;
  /** Days after 1 January of the map's year (local 0h of the candidate's day). */
  readonly dayOffset: number;
  readonly minutes: number;
  /** Present when the linearised ellipse holds. */
  readonly ellipses: readonly MapEllipse[];
  /** Present when the ellipse is invalid: the profile-scan interval. */
  readonly interval?: {
    readonly fromDayOffset: number;
    readonly toDayOffset: number;
    readonly fromMinutes: number;
    readonly toMinutes: number;
    readonly open: boolean;
    readonly valley: readonly (readonly [number, number])[];
  };
}

export interface DateHourMapData {
  /** The light the map is about: 'moon' for a scene lit by the moon alone (the hours of the night, the map's year alone). */
  readonly light: 'sun' | 'moon';
  readonly year: number;
  readonly yearLabel: string;
  /** The years for the title: the drawn year only when the evidence singles it out, else "any year 1760-1790 (drawn on the days of 1784)". */
  readonly titleYears: string;
  readonly calendarLabel: string;
  /** Which reading of a disputed calendar switch names the days (src/charts/calendarReadingLabel.ts), or null. */
  readonly calendarReadingNote: readonly string[] | null;
  readonly clockLabel: string;
  /** Number of days in the civil year (x domain [0, dayCount]). */
  readonly dayCount: number;
  readonly minuteRange: readonly [number, number];
  /** Day offsets (x), minutes (y) and Delta chi-square values[j][i]. */
  readonly dayOffsets: readonly number[];
  readonly minutes: readonly number[];
  readonly deltaChiSquare: readonly (readonly number[])[];
  readonly dayStep: number;
  readonly minuteStep: number;
  readonly months: readonly { readonly fromOffset: number; readonly toOffset: number; readonly name: string; readonly excluded: boolean }[];
  readonly markers: readonly MapMarker[];
  /** A finer grid around the best candidate (absent without candidates). */
  readonly closeUp?: {
    readonly dayRange: readonly [number, number];
    readonly minuteRange: readonly [number, number];
    readonly dayOffsets: readonly number[];
    readonly minutes: readonly number[];
    readonly deltaChiSquare: readonly (readonly number[])[];
    readonly dayStep: number;
    readonly minuteStep: number;
    /** Day offset -> "12 Jun" in the site's calendar. */
    readonly dayLabels: readonly { readonly offset: number; readonly label: string }[];
  };
  /** Marked candidates of other years (placed on their month and day; for the moon, not placed at all): how many. */
  readonly fromOtherYears: number;
  readonly evaluations: number;
}

export interface DateHourMapOptions {
  /** Grid step in days (default 1) and minutes (default 5). */
  readonly dayStep?: number;
  readonly minuteStep?: number;
  /** The evidence model of the scene as the solver used it (default: built from the scene). */
  readonly model?: EvidenceModel;
  readonly onProgress?: (done: number, total: number) => void;
}

/** Minutes of local apparent time from the earliest sunrise to the latest sunset of the year, whole hours, with a margin. */
export function daylightMinuteRange(latitudeDeg: number): [number, number] {
  // Sunrise hour angle: cos H0 = -tan(phi) tan(dec) (Meeus 1998, eq. 15.1 with h0 = 0), dec = 23.44 deg (obliquity, common practice).
  const c = -Math.tan((latitudeDeg * Math.PI) / 180) * Math.tan((23.44 * Math.PI) / 180);
  if (c <= -1 || c >= 1) return [0, 1440];
  const h0Minutes = (Math.acos(c) * 180) / Math.PI * 4 + 20; // 4 min per degree of hour angle; 20 min for refraction and margin
  return [Math.max(0, Math.floor((720 - h0Minutes) / 60) * 60), Math.min(1440, Math.ceil((720 + h0Minutes) / 60) * 60)];
}

function bestCandidate(answer: DateAnswer): Candidate | undefined {
  return markedCandidates(answer, 1)[0]?.candidate;
}

/** Days after 1 January of the map's year of a candidate's day; another year's day goes on its month and day. */
function dayOffsetOf(c: Candidate, year: number, jan1: number, rule: ResolvedCalendar): number {
  if (c.civilDate.year === year) return civilDateToJd(rule, c.civilDate) - jan1;
  const ownJan1 = civilDateToJd(rule, { year: c.civilDate.year, month: 1, day: 1 });
  return Math.min(civilDateToJd(rule, c.civilDate) - ownJan1, 365);
}

/**
 * Minutes of local apparent time of the moon's map: from the earliest sunset of the year to the latest sunrise
 * (whole hours, with a margin), counted on from the evening's day (so past midnight above 1440); noon to noon
 * where the sun does not rise or set every day. The nights outside it are never dark.
 */
export function nightMinuteRange(latitudeDeg: number): [number, number] {
  // The shortest day's sunrise hour angle: cos H0 = |tan(phi)| tan(23.44 deg) (Meeus 1998, eq. 15.1 with h0 = 0, the
  // declination of the winter solstice of the site's hemisphere; obliquity 23.44 deg, common practice).
  const c = Math.abs(Math.tan((latitudeDeg * Math.PI) / 180)) * Math.tan((23.44 * Math.PI) / 180);
  if (c >= 1) return [720, 2160];
  const h0Minutes = ((Math.acos(c) * 180) / Math.PI) * 4 - 20; // 4 min per degree of hour angle; 20 min for refraction and margin
  return [Math.max(720, Math.floor((720 + h0Minutes) / 60) * 60), Math.min(2160, Math.ceil((2160 - h0Minutes) / 60) * 60)];
}

/** Where a candidate sits on the moon's map: an hour before noon belongs to the night that began the day before. */
function nightShift(minutes: number): { days: number; minutes: number } {
  return minutes < 720 ? { days: -1, minutes: 1440 } : { days: 0, minutes: 0 };
}

function markerOf(mark: MarkedCandidate, index: number, year: number, jan1: number, rule: ResolvedCalendar, byMoon: boolean): MapMarker {
  const c = mark.candidate;
  const shift = byMoon ? nightShift(c.times.localApparentMinutes) : { days: 0, minutes: 0 };
  const dayOffset = dayOffsetOf(c, year, jan1, rule) + shift.days;
  const m = c.times.localApparentMinutes + shift.minutes;
  const u = c.uncertainty;
  const ellipses: MapEllipse[] = [];
  let interval: MapMarker['interval'];
  if (u.ellipseValid) {
    for (const e of u.ellipses) {
      const [a, b] = e.semiAxes;
      ellipses.push({ probability: e.probability, points: ellipsePoints([dayOffset, m], [a.days, a.minutes], [b.days, b.minutes]) });
    }
  } else if (u.profile) {
    const p = u.profile;
    interval = {
      fromDayOffset: dayOffset + p.fromDays,
      toDayOffset: dayOffset + p.toDays,
      fromMinutes: p.fromLocalApparentMinutes + shift.minutes,
      toMinutes: p.toLocalApparentMinutes + shift.minutes,
      open: p.open,
      valley: p.points.map((q) => [dayOffset + q.days, q.localApparentMinutes + shift.minutes] as const),
    };
  }
  return { label: mark.label, id: c.id, best: index === 0, inMapYear: c.civilDate.year === year, dayOffset, minutes: m, ellipses, interval };
}

/**
 * Everything the date-and-hour map draws, computed from the scene and the solver's answer.
 * The year is that of the best candidate (the best family's best member for a multi-year window).
 */
export function dateHourMapData(scene: Scene, answer: DateAnswer, options: DateHourMapOptions = {}): DateHourMapData {
  const best = bestCandidate(answer);
  const rule = resolveCalendarRule(scene.calendar);
  const year = best ? best.civilDate.year : scene.window.fromYear;
  const jan1 = civilDateToJd(rule, { year, month: 1, day: 1 });
  const nextJan1 = civilDateToJd(rule, { year: year + 1, month: 1, day: 1 });
  const dayCount = nextJan1 - jan1;
  // Observations measured in pixels become numbers first, as the solver takes them (src/image/resolvePixels.ts).
  const model = options.model ?? buildEvidenceModel(resolvePixelObservations(scene).scene);
  const byMoon = isLitByMoonAlone(model);
  const dayStep = options.dayStep ?? 1;
  const minuteStep = options.minuteStep ?? 5;
  const minuteRange: readonly [number, number] = byMoon ? nightMinuteRange(scene.site.latitudeDeg) : daylightMinuteRange(scene.site.latitudeDeg);
  const dayOffsets: number[] = [];
  for (let d = 0; d < dayCount; d += dayStep) dayOffsets.push(d);
  const minutes: number[] = [];
  for (let m = minuteRange[0]; m <= minuteRange[1] + 1e-9; m += minuteStep) minutes.push(m);

  const closeUp = best ? closeUpGrid(model, best, rule, jan1, byMoon ? { ...nightShift(best.times.localApparentMinutes), moon: true } : { days: 0, minutes: 0, moon: false }) : undefined;
  // The reference (the lowest value) is at most this before the whole year is computed.
  const referenceBound = Math.min(closeUp ? closeUp.minimum : Infinity, best ? best.chiSquare + best.softPenalty : Infinity);
  const spec = {
    dayJd0s: dayOffsets.map((d) => jan1 + d),
    minutes,
    assumedClock: assumedClockOfCandidate(best),
    nuisances: nuisancesOfCandidate(model, best),
    onProgress: options.onProgress,
    ...(Number.isFinite(referenceBound) ? { ceiling: referenceBound + beyondBandsMargin(referenceBound) } : {}),
  };
  const grid = gridOf(model, spec, referenceBound);
  const reference = Math.min(grid.minimum, referenceBound);
  const deltaChiSquare = grid.values.map((row) => deltaRow(row, reference));

  const allowed = scene.window.months && scene.window.months.length > 0 ? new Set(scene.window.months) : null;
  const months = MONTH_NAMES.map((name, k) => {
    const from = k === 0 ? 0 : safeOffset(rule, year, k + 1, jan1);
    const to = k === 11 ? dayCount : safeOffset(rule, year, k + 2, jan1);
    return { fromOffset: from, toOffset: to, name: name.slice(0, 3), excluded: allowed !== null && !allowed.has(k + 1) };
  });

  // The moon's map holds for its year alone: candidates of other years are counted, not placed.
  const marked = markedCandidates(answer);
  const shown = byMoon ? marked.filter((mark) => mark.candidate.civilDate.year === year) : marked;
  const markers = shown.map((mark, k) => markerOf(mark, k, year, jan1, rule, byMoon));

  return {
    light: byMoon ? 'moon' : 'sun',
    year,
    yearLabel: formatYearBcAd(year),
    titleYears: byMoon
      ? formatYearBcAd(year)
      : answer.moon
      ? `${answer.moon.years.length > 1 ? `the years that fit with the moon: ${answer.moon.years.map((y) => formatYearBcAd(y)).join(', ')}` : `${formatYearBcAd(answer.moon.bestYear)}, the year the moon names`} (drawn on the days of ${formatYearBcAd(year)})`
      : answer.yearsWords && answer.yearsWords !== formatYearBcAd(year) ? `${answer.yearsWords} (drawn on the days of ${formatYearBcAd(year)})` : formatYearBcAd(year),
    calendarLabel: best ? (best.civilDate.calendar === 'julian' ? 'Julian calendar' : 'Gregorian calendar') : 'calendar of the site',
    calendarReadingNote: calendarReadingNote(scene),
    clockLabel: best ? best.clockAssumptionLabel : 'no clock',
    dayCount,
    minuteRange,
    dayOffsets,
    minutes,
    deltaChiSquare,
    dayStep,
    minuteStep,
    months,
    markers,
    closeUp: closeUp ? { ...closeUp.data, deltaChiSquare: closeUp.values.map((row) => deltaRow(row, reference)) } : undefined,
    fromOtherYears: byMoon ? marked.length - shown.length : markers.filter((m) => !m.inMapYear).length,
    evaluations: grid.evaluations + (closeUp ? closeUp.evaluations : 0),
  };
}

/**
 * The grid of a spec: with a ceiling, mapGrid.ts (points far beyond the palest band left unfinished, by
 * blocks, and every point a contour line could run next to finished); without, every point.
 */
function gridOf(model: EvidenceModel, spec: DayMinuteGridSpec, referenceBound: number): { readonly values: readonly (readonly number[])[]; readonly minimum: number; readonly evaluations: number } {
  return spec.ceiling !== undefined ? mapGrid(model, { ...spec, ceiling: spec.ceiling }, { referenceBound, level: HIGHEST_CONTOUR }) : chiSquareOnDayMinuteGrid(model, spec);
}

/** A row of values less the reference; a row wholly unfinished (+Infinity) stays so without a pass over it. */
function deltaRow(row: readonly number[], reference: number): readonly number[] {
  if (Number.isFinite(reference) && rowMinimum(row) === Infinity) return row; // the grid's own row, read only (+Infinity less the reference is +Infinity)
  // A loop over a copy rather than map: no call per point (the same values, a packed array of doubles as the row is).
  const out = row.slice();
  for (let i = 0; i < out.length; i += 1) out[i] -= reference;
  return out;
}

/**
 * How far above the reference a point can be left unfinished: beyond the palest band drawn
 * (palette.ts), with a margin for rounding, so that it is drawn exactly as its true value would be.
 */
function beyondBandsMargin(reference: number): number {
  return FIT_BANDS[FIT_BANDS.length - 1].maxDeltaChiSquare + 1e-6 * (1 + Math.abs(reference));
}

/** The largest level at which the map draws a contour (dateHourMap.ts: the 68% and 95% bounds). */
const HIGHEST_CONTOUR = Math.max(FIT_BANDS[0].maxDeltaChiSquare, FIT_BANDS[1].maxDeltaChiSquare);

/** Offset of the first day of a month from 1 January; a month whose 1st fell in a reform gap starts at its first existing day. */
function safeOffset(rule: ResolvedCalendar, year: number, month: number, jan1: number): number {
  for (let day = 1; day <= 28; day += 1) {
    try {
      return civilDateToJd(rule, { year, month, day }) - jan1;
    } catch {
      // a day skipped at a reform: try the next
    }
  }
  return 0;
}

/** Columns and rows of the close-up grid. */
const CLOSE_UP_COLUMNS = 61;
const CLOSE_UP_ROWS = 61;

/**
 * A finer grid around the best candidate: +/- three times the 95% half-widths (at least 8 days
 * and 30 minutes, at most 60 days and 180 minutes), or the profile-scan interval when the
 * ellipse is invalid. Days are continuous here: between whole days the solver's dated model
 * interpolates the sun smoothly (src/solver/fitting.ts).
 */
function closeUpGrid(model: EvidenceModel, best: Candidate, rule: ResolvedCalendar, jan1: number, shift: { readonly days: number; readonly minutes: number; readonly moon: boolean }) {
  const centreDay = civilDateToJd(rule, best.civilDate) - jan1 + shift.days;
  const u = best.uncertainty;
  const e95 = u.ellipses.find((e) => e.probability > 0.9) ?? u.ellipses[u.ellipses.length - 1];
  let halfDays = e95 ? 3 * e95.halfWidthDays : 8;
  let halfMinutes = e95 ? 3 * e95.halfWidthMinutes : 30;
  if (!u.ellipseValid && u.profile) {
    halfDays = 1.3 * Math.max(Math.abs(u.profile.fromDays), Math.abs(u.profile.toDays));
    halfMinutes = Math.max(halfMinutes, 1.3 * Math.abs(u.profile.toLocalApparentMinutes - u.profile.fromLocalApparentMinutes));
  }
  // The moon fixes the day (its place moves some 13 deg a day at a fixed hour): its close-up spans a few days only.
  const minHalfDays = shift.moon ? 2 : 8;
  halfDays = Math.min(60, Math.max(minHalfDays, Number.isFinite(halfDays) ? halfDays : minHalfDays));
  halfMinutes = Math.min(180, Math.max(30, Number.isFinite(halfMinutes) ? halfMinutes : 30));
  const m0 = best.times.localApparentMinutes + shift.minutes;
  const dayRange: [number, number] = [centreDay - halfDays, centreDay + halfDays];
  const minuteRange: [number, number] = [m0 - halfMinutes, m0 + halfMinutes];
  const dayStep = (2 * halfDays) / (CLOSE_UP_COLUMNS - 1);
  const minuteStep = (2 * halfMinutes) / (CLOSE_UP_ROWS - 1);
  const dayOffsets = Array.from({ length: CLOSE_UP_COLUMNS }, (_, i) => dayRange[0] + i * dayStep);
  const minutes = Array.from({ length: CLOSE_UP_ROWS }, (_, j) => minuteRange[0] + j * minuteStep);
  // The reference is at most the best candidate's value: points far above it are left unfinished as in the whole year.
  const referenceBound = best.chiSquare + best.softPenalty;
  const spec = {
    dayJd0s: dayOffsets.map((d) => jan1 + d),
    minutes,
    assumedClock: assumedClockOfCandidate(best),
    nuisances: nuisancesOfCandidate(model, best),
    ...(Number.isFinite(referenceBound) ? { ceiling: referenceBound + beyondBandsMargin(referenceBound) } : {}),
  };
  const grid = gridOf(model, spec, referenceBound);
  const tickStep = [1, 2, 3, 5, 7, 10, 14, 21, 30].find((step) => (2 * halfDays) / step <= 5) ?? 30;
  const dayLabels: { offset: number; label: string }[] = [];
  for (let d = Math.ceil(dayRange[0] / tickStep) * tickStep; d <= dayRange[1]; d += tickStep) {
    const c = jdToCivilDate(rule, jan1 + d).civil;
    dayLabels.push({ offset: d, label: `${c.day} ${MONTH_NAMES[c.month - 1].slice(0, 3)}` });
  }
  return {
    data: { dayRange, minuteRange, dayOffsets, minutes, dayStep, minuteStep, dayLabels },
    values: grid.values,
    minimum: grid.minimum,
    evaluations: grid.evaluations,
  };
}
