/**
 * solveDates: scene evidence in, every local best fit in the window out, ranked, with
 * chi-square, p-value, error ellipses (or a profile scan where they fail), families across
 * years, and a leave-one-out consistency test. The method is described in docs/solver.md.
 *
 * Status: 'fits' when the best p >= 0.05 (with no degrees of freedom left, p is taken with
 * 1 dof: chi-square should then be 0); 'marginal' when 0.001 <= p < 0.05; 'nothing-fits' when p < 0.001 or the facts cannot
 * all hold (a soft penalty above FACT_PENALTY_LIMIT at the best candidate: a violation of more
 * than 1 deg); then the search is rerun without each observation and those whose removal lets
 * the rest fit are named (and, when every azimuth turned by 180 deg fits, that is said). This is an
 * answer, not an error. 'undetermined' when the fit holds but the evidence cannot fix day and hour
 * (src/solver/freedom.ts).
 */
import type {
  AnswerFreedom,
  ClockAssumption,
  AnswerStatus,
  Candidate,
  CandidateFamily,
  FamilyKeeping,
  TurnedAzimuthsHint,
  ConsistencyReport,
  DateAnswer,
  LeaveOneOutEntry,
  SolveOptions,
} from './types.js';
import type { Scene } from '../scene/types.js';
import { resolvePixelObservations } from '../image/resolvePixels.js';
import { chiSquarePValue } from '../math/chiSquare.js';
import { MONTH_NAMES, WEEKDAY_NAMES } from '../calendar/julianDay.js';
import { formatYearBcAd } from '../calendar/format.js';
import { buildEvidenceModel, type EvidenceModel } from './evidenceModel.js';
import { searchCandidates, type SearchResult, type StageAGrids } from './search.js';
import { assumedKind, dressCandidate, hhmm, type DressContext } from './candidates.js';
import { buildFamily, joinKeepings, SAME_MINUTES, YEARS_ALIKE_DELTA_CHI2, type FamilyContext, type FamilyMember } from './families.js';
import { evidenceFixesDayAndHour, freedomOf, undeterminedVerdict } from './freedom.js';
import { turnedAzimuthScene, turnedAzimuthWords } from './turnedAzimuths.js';
import { ESTIMATED_RULE_TEXT, EXACT_LEAVE_ONE_OUT_MAX_OBSERVATIONS, improvementPValue, localLeaveOneOut, LOO_P_THRESHOLD } from './consistency.js';
import { estimatedEntry, estimatedWithoutEach } from './largeScenes.js';
import { CANNOT_TELL_WHICH, groupConsistency, type GroupTest } from './groupConsistency.js';
import type { RawCandidate } from './stageB.js';
import { dayWindowOf, windowHasAllowedDay, type DayWindow } from './window.js';
import { calendarInForce, jdToCivilDayAndCalendar } from '../calendar/regions.js';
import type { UncertaintyCache } from './candidateUncertainty.js';
import { hasMoonEvidence } from './fitting.js';
import { moonYearsAnswer } from './moonAnswer.js';
import { moonlightWords } from './moonSearch.js';

/** Soft penalty above which the facts are said not to hold (a violation of 2 tolerances = 1 deg). */
export const FACT_PENALTY_LIMIT = 4;
/** p below which nothing fits. */
export const NOTHING_FITS_P = 0.001;
/** p below which the fit is marginal. */
export const MARGINAL_P = 0.05;

const DEFAULTS = { perYear: false, maxCandidates: 20, maxFamilies: 10, consistency: true, chiSquareCutoff: 50, profileScans: true };

/** Internal: one solve over a model and window. */
export interface Solved {
  readonly model: EvidenceModel;
  readonly win: DayWindow;
  readonly search: SearchResult;
  readonly kept: readonly RawCandidate[];
  /** Candidates left out because they were pressed against the edge of the allowed days and fit poorly. */
  readonly edgeDropped: number;
  /** The best objective and the sum of exp(-(objective - best) / 2) over the kept candidates: their weights (weightOf). */
  readonly bestObjective: number;
  readonly weightTotal: number;
  readonly dress: DressContext;
  readonly dressed: Map<RawCandidate, Candidate>;
}

/**
 * A candidate pressed against the edge of the allowed days (its own optimum lies outside them) is
 * kept only within this Delta chi-square of the best: 11.83 bounds the 3-sigma (99.73%) region for
 * 2 parameters (Press et al., Numerical Recipes, 3rd ed. (2007), section 15.6.5, Delta chi2 table).
 * Beyond it such a candidate is the window's edge, not a fit.
 */
export const EDGE_CANDIDATE_DELTA_CHI2 = -2 * Math.log(1 - 0.9973);

/**
 * One search over a model and window, its candidates kept within `cutoff` and weighed.
 * @param reuse stage A's grids of a model of the same scene with more observations (a rerun without some)
 * @param onProgress called as the search advances: the fraction done (0 to 1) and the stage in words
 */
export function solveModel(model: EvidenceModel, win: DayWindow, cutoff: number, profileScans = true, reuse?: StageAGrids, onProgress?: (fraction: number, stage: string) => void): Solved {
  const search = searchCandidates(model, win, reuse, onProgress);
  const best = search.candidates.length ? search.candidates[0].objective : 0;
  const withinCutoff = search.candidates.filter((c) => c.objective <= best + cutoff);
  const kept = withinCutoff.filter((c) => c === search.candidates[0] || !c.atWindowEdge || c.objective <= best + EDGE_CANDIDATE_DELTA_CHI2);
  const edgeDropped = withinCutoff.length - kept.length;
  let total = 0;
  for (const c of kept) total += Math.exp(-(c.objective - best) / 2);
  const cache: UncertaintyCache = new Map();
  return { model, win, search, kept, edgeDropped, bestObjective: best, weightTotal: total, dress: { model, win, assumptions: search.assumptions, cache, profileScans }, dressed: new Map() };
}

/** The relative weight of a kept candidate, exp(-chi2/2) normalised over the kept ones (taken when asked for, not held for each). */
function weightOf(s: Solved, raw: RawCandidate): number {
  return Math.exp(-(raw.objective - s.bestObjective) / 2) / s.weightTotal;
}

export function dressed(s: Solved, raw: RawCandidate): Candidate {
  const hit = s.dressed.get(raw);
  if (hit) return hit;
  const rank = s.kept.indexOf(raw) + 1;
  const c = dressCandidate(raw, `c${rank}`, rank, rank > 0 ? weightOf(s, raw) : 0, s.dress);
  s.dressed.set(raw, c);
  return c;
}

function pOf(model: EvidenceModel, chi: number): number | null {
  const dof = model.measuredCount - 2;
  return dof > 0 ? chiSquarePValue(chi, dof) : null;
}

/**
 * p-value used to judge the fit: with degrees of freedom left, the usual one; with none
 * (as many numbers as unknowns), chi-square should be 0, and anything above the 1-dof point
 * is judged as if it had 1 degree of freedom (heliochron's conservative rule).
 */
function judgingP(model: EvidenceModel, chi: number): number {
  return pOf(model, chi) ?? chiSquarePValue(chi, 1);
}

function fitsWell(model: EvidenceModel, raw: RawCandidate | undefined): boolean {
  if (!raw) return false;
  return raw.penalty <= FACT_PENALTY_LIMIT && judgingP(model, raw.chiSquare) >= NOTHING_FITS_P;
}

/** A candidate's day and hour in words, without its fit: "2 April 1775 (Gregorian, Sunday), 09:08 local apparent time". */
export function candidateDayWords(c: Candidate): string {
  const d = c.civilDate;
  const cal = c.civilReckoning === 'swedish' ? 'Swedish reckoning of 1700-1712' : d.calendar === 'julian' ? 'Julian' : 'Gregorian';
  return `${d.day} ${MONTH_NAMES[d.month - 1]} ${formatYearBcAd(d.year)} (${cal}, ${c.weekdayName}), ${hhmm(c.times.localApparentMinutes)} local apparent time`;
}

/** A candidate's day, hour and fit in words. */
export function describeCandidate(c: Candidate): string {
  const p = c.pValue === null ? 'no degrees of freedom left' : `p = ${c.pValue.toPrecision(2)}`;
  return `${candidateDayWords(c)} (chi-square ${c.chiSquare.toFixed(2)}, ${p})`;
}

const capitalised = (t: string): string => t.charAt(0).toUpperCase() + t.slice(1);

/** How a fit is judged: 'fits', 'marginal' or 'does-not-fit' (the rule of the answer's status). */
export function judgeFit(model: EvidenceModel, chiSquare: number, penalty: number): FamilyKeeping['fit'] {
  const pj = judgingP(model, chiSquare);
  return penalty > FACT_PENALTY_LIMIT || pj < NOTHING_FITS_P ? 'does-not-fit' : pj < MARGINAL_P ? 'marginal' : 'fits';
}

/** The window's restrictions on days in words, or null. */
function restrictionWords(scene: Scene, win: DayWindow): string | null {
  const parts: string[] = [];
  const w = scene.window;
  if (w.notBefore || w.notAfter) {
    const day = (d: { year: number; month: number; day: number }) => `${d.day} ${MONTH_NAMES[d.month - 1]} ${formatYearBcAd(d.year)}`;
    parts.push(`the documentary bounds: ${[w.notBefore ? `not before ${day(w.notBefore)}` : '', w.notAfter ? `not after ${day(w.notAfter)}` : ''].filter(Boolean).join(', ')}`);
  }
  if (win.months) parts.push(`the months: ${[...win.months].sort((a, b) => a - b).map((m) => MONTH_NAMES[m - 1]).join(', ')}`);
  if (win.weekday !== null) parts.push(`the weekday: ${WEEKDAY_NAMES[win.weekday]}s only`);
  return parts.length ? parts.join('; ') : null;
}

/**
 * A kept candidate as a family member. A class, not an object literal with a getter: the search keeps
 * a member for every year of the window, and a literal with a getter is built by a slow path.
 */
class KeptMember implements FamilyMember {
  // Fields declared only (`declare`: nothing emitted) and set once in the constructor: emitted ES2022 class
  // fields would first hold undefined, and V8 would then widen them to untyped fields when the numbers come.
  private declare readonly s: Solved;
  private declare readonly raw: RawCandidate;
  declare readonly year: number;
  declare readonly month: number;
  declare readonly day: number;
  declare readonly calendar: 'julian' | 'gregorian';
  declare readonly apparentMinutes: number;
  constructor(s: Solved, raw: RawCandidate, year: number, month: number, day: number, calendar: 'julian' | 'gregorian') {
    this.s = s;
    this.raw = raw;
    this.year = year;
    this.month = month;
    this.day = day;
    this.calendar = calendar;
    this.apparentMinutes = ((raw.apparentMinutes % 1440) + 1440) % 1440;
  }
  get objective(): number {
    return this.raw.objective;
  }
  get chiSquare(): number {
    return this.raw.chiSquare;
  }
  get penalty(): number {
    return this.raw.penalty;
  }
  get weight(): number {
    return weightOf(this.s, this.raw); // a member is a kept candidate
  }
  get assumptionIndex(): number {
    return this.raw.assumptionIndex;
  }
  get assumption(): ClockAssumption {
    return this.s.search.assumptions[this.raw.assumptionIndex];
  }
  candidate(): Candidate {
    return dressed(this.s, this.raw);
  }
  /** Taken only for the members a family names (its best, each keeping's best): a p-value costs an incomplete gamma function. */
  get pValue(): number | null {
    return pOf(this.s.model, this.raw.chiSquare);
  }
}

/** All families, best first (keepings of one light joined), before the maxFamilies cut. */
function familiesOf(s: Solved, perYear: boolean): CandidateFamily[] {
  // One group per track and calendar, in the order of their first members; found by track, then by
  // calendar (no key string made for every kept candidate).
  const groups: FamilyMember[][] = [];
  const byTrack = new Map<string, Map<string, FamilyMember[]>>();
  for (const raw of s.kept) {
    const civil = jdToCivilDayAndCalendar(s.win.calendar, raw.dayJd0 + 0.5);
    const calendar = civil.calendar;
    const member = new KeptMember(s, raw, civil.year, civil.month, civil.day, calendar);
    let byCalendar = byTrack.get(raw.trackKey);
    if (byCalendar === undefined) byTrack.set(raw.trackKey, (byCalendar = new Map()));
    const group = byCalendar.get(calendar);
    if (group) group.push(member);
    else {
      const started = [member];
      byCalendar.set(calendar, started);
      groups.push(started);
    }
  }
  const ctx: FamilyContext = {
    fromYear: s.win.fromYear,
    toYear: s.win.toYear,
    restrictions: restrictionWords(s.model.scene, s.win),
    judge: (chi, penalty) => judgeFit(s.model, chi, penalty),
    moonEvidence: hasMoonEvidence(s.model),
  };
  return joinKeepings(groups).map((list, i) => buildFamily(`f${i + 1}`, i + 1, list, ctx, perYear));
}

/** The solver's later stages in words, for progress shown to the user (the search's own: SEARCH_STAGE_WORDS). */
export const SOLVE_STAGE_WORDS = {
  consistency: 'testing each observation against the rest',
  rerun: 'searching again without',
  answer: 'writing the answer',
} as const;

/** A progress callback that never goes back (where stages join, rounding could move it back by a hair). */
function forwardOnly(report: (done: number, total: number, stage?: string) => void): (done: number, total: number, stage?: string) => void {
  let most = 0;
  return (done, total, stage) => {
    most = Math.max(most, done);
    report(most, total, stage);
  };
}

/**
 * The dates and hours at which the scene's light could have fallen, ranked.
 * @example solveDates(scene).families[0].summary // "any year 1640-1690: 10-16 September (Gregorian), 07:35-07:50 local apparent time; no clock"
 */
export function solveDates(scene: Scene, options: SolveOptions = {}): DateAnswer {
  scene = resolvePixelObservations(scene).scene; // pixel forms -> numbers (src/image/resolvePixels.ts)
  const opt = { ...DEFAULTS, ...options };
  const model = buildEvidenceModel(scene);
  const win = dayWindowOf(scene);
  // Progress in 3 steps: the search (0 to 1), the consistency test or the reruns (1 to 2, the reruns
  // sharing it evenly), the answer; so that what is done never goes back.
  const progressSteps = 3;
  const onProgress = opt.onProgress && forwardOnly(opt.onProgress);
  const s = solveModel(model, win, opt.chiSquareCutoff, opt.profileScans, undefined, onProgress && ((fraction, stage) => onProgress!(fraction, progressSteps, stage)));
  const best = s.kept[0];
  const notes: string[] = [
    'Every candidate is an estimate conditional on the stated assumptions (site, wall azimuths, measurements and their sigmas, what a clock kept); weigh it with the documentary evidence and expert judgement.',
    'Relative weights are exp(-chi2/2) normalised over the candidates shown; they do not include the size of each ellipse.',
    // With the moon no year is mapped for its uncertainty: each candidate has its own fit with the moon
    // (candidateUncertainty.ts fitFor), so the note on shared ellipses is given only for the sun's evidence alone.
    hasMoonEvidence(model)
      ? "Each candidate's error ellipse and day interval come from its own fit with the moon's evidence, in its own year; none is shared with another year."
      : 'Mapped years share the ellipse of the nearest representative year that was refined in full.',
  ];
  if (s.edgeDropped > 0) {
    notes.push(
      `${s.edgeDropped} candidate${s.edgeDropped === 1 ? '' : 's'} whose best day lies outside the allowed days (months, bounds, weekday) and that fit poorly at the nearest allowed day (chi-square more than ${EDGE_CANDIDATE_DELTA_CHI2.toFixed(1)} above the best) ${s.edgeDropped === 1 ? 'was' : 'were'} left out: ${s.edgeDropped === 1 ? 'it is' : 'they are'} the edge of the window, not a fit.`,
    );
  }

  let consistency: ConsistencyReport = {
    rule: `an observation is flagged when leaving it out lowers chi-square by an amount whose p-value (chi-square with as many degrees of freedom as the observation has numbers) is below ${LOO_P_THRESHOLD}`,
    pThreshold: LOO_P_THRESHOLD,
    entries: [],
    flaggedIds: [],
  };
  let status: AnswerStatus;
  let conflictingIds: string[] = [];
  let verdict: string;
  let freedom: AnswerFreedom | undefined;
  let turnedAzimuths: TurnedAzimuthsHint | undefined;
  let groupTests: GroupTest[] = [];
  const allFamilies = familiesOf(s, opt.perYear);
  const families = allFamilies.slice(0, opt.maxFamilies);
  const candidates = s.kept.slice(0, opt.maxCandidates).map((raw) => dressed(s, raw));
  const monthsText = win.months ? `${[...win.months].sort((a, b) => a - b).map((m) => MONTH_NAMES[m - 1]).join(', ')} of ` : '';
  const weekdayText = win.weekday !== null ? ` (${WEEKDAY_NAMES[win.weekday]}s only)` : '';
  const yearsSpan = win.fromYear === win.toYear ? formatYearBcAd(win.fromYear) : `${formatYearBcAd(win.fromYear)}-${formatYearBcAd(win.toYear)}`;
  const windowText = `${monthsText}${yearsSpan}${weekdayText}`;
  if (!best) {
    status = 'no-candidates';
    verdict = windowHasAllowedDay(win)
      ? `No date and hour in ${windowText} put the sun where the evidence needs it (no candidate survived the window and its restrictions).`
      : `No day of ${windowText} passes all the window's restrictions together (notBefore, notAfter, months, weekday): there is nothing to search. Check the restrictions.`;
  } else {
    const bestC = dressed(s, best);
    const p = bestC.pValue;
    const pj = judgingP(model, best.chiSquare);
    const fit = judgeFit(model, best.chiSquare, best.penalty);
    status = fit === 'does-not-fit' ? 'nothing-fits' : !evidenceFixesDayAndHour(model, bestC, s.kept) ? 'undetermined' : fit === 'marginal' ? 'marginal' : 'fits';
    if (status === 'nothing-fits') {
      // Rerun the whole search without each observation (facts and clocks included).
      const entries: LeaveOneOutEntry[] = [];
      const estimated = estimatedWithoutEach(s, scene, (n, chi, penalty) => penalty <= FACT_PENALTY_LIMIT && chiSquarePValue(chi, n > 2 ? n - 2 : 1) >= NOTHING_FITS_P);
      const reruns = estimated ? [...estimated.values()].filter((e) => e.rerun).length : scene.observations.length;
      let rerun = 0;
      onProgress?.(1, progressSteps, SOLVE_STAGE_WORDS.consistency);
      const withoutWords = new Map<string, string>();
      for (const o of scene.observations) {
        const e = estimated?.get(o.id);
        if (e && !e.rerun) {
          entries.push(estimatedEntry(o, e, best.chiSquare, best.objective));
          continue;
        }
        const rerunStage = `${SOLVE_STAGE_WORDS.rerun} ${o.id} (${rerun + 1} of ${reruns})`;
        const rerunFrom = 1 + rerun / reruns;
        onProgress?.(rerunFrom, progressSteps, rerunStage);
        rerun += 1;
        const reduced = buildEvidenceModel(scene, new Set([o.id]));
        const sr = solveModel(reduced, win, opt.chiSquareCutoff, opt.profileScans, s.search.stageAGrids, onProgress && ((fraction) => onProgress!(rerunFrom + fraction / reruns, progressSteps, rerunStage)));
        const b = sr.kept[0];
        const fits = fitsWell(reduced, b);
        const rows = model.measuredCount - reduced.measuredCount;
        const improvement = b ? best.objective - b.objective : 0;
        const bestWithout = b ? dressed(sr, b) : undefined;
        // In words as the verdict names an answer: the family's days and years, a single year only when singled out.
        if (bestWithout) withoutWords.set(o.id, `${familiesOf(sr, false)[0].headline} (chi-square ${bestWithout.chiSquare.toFixed(2)}, ${bestWithout.pValue === null ? 'no degrees of freedom left' : `p = ${bestWithout.pValue.toPrecision(2)}`})`);
        entries.push({
          observationId: o.id,
          observationKind: o.kind,
          residualCount: rows,
          chiSquareAll: best.chiSquare,
          chiSquareWithout: b ? b.chiSquare : NaN,
          improvement,
          pValue: improvementPValue(improvement, rows),
          flagged: fits,
          bestWithout,
          note: bestWithout
            ? `without ${o.id}: ${fits ? 'the rest fits' : 'still nothing fits'}; best ${describeCandidate(bestWithout)}`
            : `without ${o.id}: no candidate`,
        });
      }
      const flaggedIds = entries.filter((e) => e.flagged).map((e) => e.observationId);
      const noSingleCulprit = flaggedIds.length === 0;
      conflictingIds = noSingleCulprit ? [...entries].sort((a, b) => b.improvement - a.improvement).slice(0, 2).map((e) => e.observationId) : flaggedIds;
      consistency = { ...consistency, rule: `${consistency.rule}; when nothing fits, the search is rerun without each observation and those whose removal lets the rest fit are named${estimated ? `${ESTIMATED_RULE_TEXT}; the search is rerun in full only for the observations named` : ''}`, entries, flaggedIds };
      groupTests = groupConsistency(scene, model, best, assumedKind(s.search.assumptions[best.assumptionIndex]), win);
      const violated = bestC.facts.filter((f) => !f.satisfied && f.penalty > 0.01).map((f) => f.note);
      const without = entries
        .filter((e) => conflictingIds.includes(e.observationId) && e.bestWithout)
        .map((e) => `without ${e.observationId} the best fit is ${withoutWords.get(e.observationId) ?? describeCandidate(e.bestWithout!)}`);
      turnedAzimuths = turnedAzimuthHint(scene, win, opt.chiSquareCutoff);
      verdict =
        `Nothing fits: no date and hour in ${windowText} agree with all the observations` +
        ` (best chi-square ${best.chiSquare.toFixed(1)}${p !== null ? `, p = ${p.toPrecision(2)}` : ''}${violated.length ? `; facts that cannot hold there: ${violated.join('; ')}` : ''}).` +
        (turnedAzimuths ? ` ${turnedAzimuths.words}` : '') +
        (noSingleCulprit
          ? ` No single observation explains it: without any one of them nothing fits still; the largest falls come from leaving out ${conflictingIds.join(' or ')}.`
          : ` The observations in conflict: ${conflictingIds.join(', ')}.`) +
        (without.length ? ` ${capitalised(without.join('; '))}.` : '') +
        groupVerdictWords(groupTests);
    } else if (status === 'undetermined') {
      onProgress?.(1, progressSteps, SOLVE_STAGE_WORDS.answer);
      freedom = freedomOf(model);
      verdict = undeterminedVerdict(freedom, candidates, windowText, model, 0.5 * (win.firstDayJd0 + win.lastDayJd0));
      notes.push('The evidence does not fix the day and the hour: the candidates are examples along a curve of equally good fits, and their families are not separate answers.');
      consistency = { ...consistency, rule: `${consistency.rule}; not run here: the evidence does not fix the day and the hour, so leaving an observation out tests nothing` };
    } else {
      onProgress?.(1, progressSteps, SOLVE_STAGE_WORDS.consistency);
      if (opt.consistency && model.measuredCount > 0) {
        const loo = localLeaveOneOut(scene, model, best, assumedKind(s.search.assumptions[best.assumptionIndex]), win);
        const entries: LeaveOneOutEntry[] = loo.map((l) => {
          const improvement = best.objective - l.objectiveWithout;
          const pv = improvementPValue(improvement, l.residualCount);
          return {
            observationId: l.observationId,
            observationKind: l.observationKind,
            residualCount: l.residualCount,
            chiSquareAll: best.chiSquare,
            chiSquareWithout: l.chiSquareWithout,
            improvement,
            pValue: pv,
            flagged: pv < LOO_P_THRESHOLD,
            note:
              pv < LOO_P_THRESHOLD
                ? `${l.observationId} disagrees with the rest: leaving it out lowers chi-square by ${improvement.toFixed(1)} (p = ${pv.toPrecision(2)})`
                : `${l.observationId} agrees with the rest (leaving it out lowers chi-square by ${Math.max(0, improvement).toFixed(2)}, p = ${pv.toPrecision(2)})`,
          };
        });
        const estimatedRule = scene.observations.length > EXACT_LEAVE_ONE_OUT_MAX_OBSERVATIONS ? ESTIMATED_RULE_TEXT : '';
        consistency = { ...consistency, rule: `${consistency.rule}${estimatedRule}`, entries, flaggedIds: entries.filter((e) => e.flagged).map((e) => e.observationId) };
        groupTests = groupConsistency(scene, model, best, assumedKind(s.search.assumptions[best.assumptionIndex]), win);
      }
      // Count families as they are listed (a light split at a calendar switch is two families).
      const famCount = allFamilies.length;
      const calendarsOfTrack = new Map<string, Set<string>>();
      for (const c of s.kept) {
        const cal = calendarInForce(s.win.calendar, c.dayJd0 + 0.5); // jdToCivilDate(...).date.calendar, without the date
        calendarsOfTrack.set(c.trackKey, (calendarsOfTrack.get(c.trackKey) ?? new Set()).add(cal));
      }
      const renamed = [...calendarsOfTrack.values()].some((cals) => cals.size > 1) ? ' (some of them the same light as another, named in the other calendar)' : '';
      const top = families[0];
      const pText = p === null ? 'no degrees of freedom left' : `p = ${p.toPrecision(2)}`;
      verdict =
        (status === 'fits' ? 'The evidence fits.' : `The best fit is marginal (p = ${pj.toPrecision(2)}): treat every candidate with caution.`) +
        ` Best: ${top.headline}${top.clockAssumption.kind === 'none' ? '' : `, ${top.clockAssumptionLabel}`}; chi-square ${best.chiSquare.toFixed(2)}, ${pText}.` +
        sameLightElsewhere(top, families) +
        ` ${famCount} famil${famCount === 1 ? 'y' : 'ies'} of candidates${renamed} (days searched: ${windowText}).` +
        (consistency.flaggedIds.length ? ` Flagged as disagreeing with the rest: ${consistency.flaggedIds.join(', ')}.` : '');
      if (!top.yearsTold.singledOut && top.yearsTold.alikeYears.length > 1) {
        notes.push(
          `The years of a family fit alike (family 1: within ${top.yearsTold.alikeSpreadChiSquare.toFixed(2)} in chi-square): the order of its years among the candidates is no preference` +
            (hasMoonEvidence(model) ? '; the light and the moon together leave these years open.' : ', and the light alone does not date the picture to one year.'),
        );
      }
    }
  }
  onProgress?.(progressSteps - 1, progressSteps, SOLVE_STAGE_WORDS.answer);
  const top = families[0];
  const moon = best && hasMoonEvidence(model) ? moonYearsAnswer(s, dressed(s, best)) : undefined;
  const moonlight = best ? moonlightWords(model, best.point) : null;
  if (moonlight) {
    notes.push(moonlight.words);
    if (moonlight.sunUp && (status === 'fits' || status === 'marginal')) verdict += ` ${moonlight.words}`;
  }
  if (moon) {
    notes.push(...moon.cautions);
    if (status === 'fits' || status === 'marginal') verdict += ` ${moon.words}`;
    else if (moon.impossible.length > 0) verdict += ` ${moon.impossible.join(' ')}`;
  }
  return {
    sceneTitle: scene.title,
    status,
    verdict,
    window: { fromYear: win.fromYear, toYear: win.toYear },
    headline: top ? top.headline : null,
    yearsWords: top ? (top.yearsTold.singledOut ? formatYearBcAd(top.best.civilDate.year) : top.yearsTold.words.replace(/ \(.*\)$/, '')) : null,
    ...(freedom ? { freedom } : {}),
    ...(turnedAzimuths ? { turnedAzimuths } : {}),
    familyCount: allFamilies.length,
    families,
    candidates,
    consistency,
    ...(groupTests.length > 0 ? { groupTests } : {}),
    ...(moon ? { moon } : {}),
    conflictingIds,
    clockAssumptions: s.search.assumptions,
    measuredResiduals: model.measuredCount,
    notes,
    diagnostics: {
      stageAGridPoints: s.search.stageAGridPoints,
      stageAMinima: s.search.stageAMinima,
      fullRefinements: s.search.fullRefinements,
      mappedYears: s.search.mappedYears,
      chiSquareEvaluations: s.search.evaluations,
      ...(s.search.moonEvaluations > 0 ? { moonEvaluations: s.search.moonEvaluations, moonScreenedDays: s.search.moonScreenedDays, moonRefinedYears: s.search.moonRefinedYears } : {}),
      clockAssumptionsTried: s.search.assumptions.length,
    },
    seed: scene.seed,
  };
}

/**
 * The same light as the best family named in the other calendar (a window across a calendar switch):
 * families of the other calendar at the same hour (within SAME_MINUTES) that fit as well (within 3.841).
 */
function sameLightElsewhere(top: CandidateFamily, families: readonly CandidateFamily[]): string {
  const same = families.filter(
    (f) => f !== top && f.calendar !== top.calendar && Math.abs(f.fromLocalApparentMinutes - top.fromLocalApparentMinutes) <= SAME_MINUTES && f.bestChiSquare <= top.bestChiSquare + YEARS_ALIKE_DELTA_CHI2,
  );
  return same.length ? ` The same light in the other calendar: ${same.map((f) => f.headline).join('; ')}.` : '';
}

/** When nothing fits: the best fit with every stated azimuth turned by 180 deg, if that fits. */
function turnedAzimuthHint(scene: Scene, win: DayWindow, cutoff: number): TurnedAzimuthsHint | undefined {
  const turned = turnedAzimuthScene(scene);
  if (!turned) return undefined;
  const model = buildEvidenceModel(turned);
  const s = solveModel(model, win, cutoff, false);
  const b = s.kept[0];
  if (!fitsWell(model, b)) return undefined;
  const c = dressed(s, b);
  const p = c.pValue === null ? 'no degrees of freedom left' : `p = ${c.pValue.toPrecision(2)}`;
  return { best: c, words: turnedAzimuthWords(`${familiesOf(s, false)[0].headline} (chi-square ${c.chiSquare.toFixed(2)}, ${p})`) };
}

/**
 * When parts of the picture (its groups) do not share one light, the verdict says so, since it
 * may explain why nothing fits better than any single observation does (groupConsistency.ts).
 */
function groupVerdictWords(tests: readonly GroupTest[]): string {
  const differing = tests.filter((t) => t.differs).sort((a, b) => b.deltaChiSquare - a.deltaChiSquare);
  if (differing.length === 0) return '';
  const which = differing[0].cannotTellWhich ? `; ${CANNOT_TELL_WHICH.replace('with two groups ', '')}` : '';
  return ` The parts of the picture do not share one light (see "Parts of the picture"): ${differing[0].finding}${which}.`;
}
