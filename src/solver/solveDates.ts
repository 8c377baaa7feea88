/**
 * solveDates: scene evidence in, every local best fit in the window out, ranked, with
 * chi-square, p-value, error ellipses (or a profile scan where they fail), families across
 * years, and a leave-one-out consistency test. The method is described in docs/solver.md.
 *
 * Status: 'fits' when the best p >= 0.05 (with no degrees of freedom left, p is taken with
 * 1 dof: chi-square should then be 0); 'marginal' when 0.001 <= p < 0.05; 'nothing-fits' when p < 0.001 or the facts cannot
 * all hold (a soft penalty above FACT_PENALTY_LIMIT at the best candidate: a violation of more
 * than 1 deg); then the search is rerun without each observation and those whose removal lets
 * the rest fit are named. This is an answer, not an error.
 */
import type {
  AnswerStatus,
  Candidate,
  CandidateFamily,
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
import { searchCandidates, type SearchResult } from './search.js';
import { assumedKind, clockAssumptionLabel, dressCandidate, hhmm, type DressContext } from './candidates.js';
import { buildFamily, type FamilyMember } from './families.js';
import { ESTIMATED_RULE_TEXT, EXACT_LEAVE_ONE_OUT_MAX_OBSERVATIONS, improvementPValue, localLeaveOneOut, LOO_P_THRESHOLD } from './consistency.js';
import { estimatedEntry, estimatedWithoutEach } from './largeScenes.js';
import type { RawCandidate } from './stageB.js';
import { dayWindowOf, windowHasAllowedDay, type DayWindow } from './window.js';
import { jdToCivilDate } from '../calendar/regions.js';
import type { UncertaintyCache } from './candidateUncertainty.js';

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
  readonly weights: ReadonlyMap<RawCandidate, number>;
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

export function solveModel(model: EvidenceModel, win: DayWindow, cutoff: number, profileScans = true): Solved {
  const search = searchCandidates(model, win);
  const best = search.candidates.length ? search.candidates[0].objective : 0;
  const withinCutoff = search.candidates.filter((c) => c.objective <= best + cutoff);
  const kept = withinCutoff.filter((c) => c === search.candidates[0] || !c.atWindowEdge || c.objective <= best + EDGE_CANDIDATE_DELTA_CHI2);
  const edgeDropped = withinCutoff.length - kept.length;
  let total = 0;
  for (const c of kept) total += Math.exp(-(c.objective - best) / 2);
  const weights = new Map(kept.map((c) => [c, Math.exp(-(c.objective - best) / 2) / total]));
  const cache: UncertaintyCache = new Map();
  return { model, win, search, kept, edgeDropped, weights, dress: { model, win, assumptions: search.assumptions, cache, profileScans }, dressed: new Map() };
}

export function dressed(s: Solved, raw: RawCandidate): Candidate {
  const hit = s.dressed.get(raw);
  if (hit) return hit;
  const rank = s.kept.indexOf(raw) + 1;
  const c = dressCandidate(raw, `c${rank}`, rank, s.weights.get(raw) ?? 0, s.dress);
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

export function describeCandidate(c: Candidate): string {
  const d = c.civilDate;
  const cal = c.civilReckoning === 'swedish' ? 'Swedish reckoning of 1700-1712' : d.calendar === 'julian' ? 'Julian' : 'Gregorian';
  const p = c.pValue === null ? 'no degrees of freedom left' : `p = ${c.pValue.toPrecision(2)}`;
  return `${d.day} ${MONTH_NAMES[d.month - 1]} ${formatYearBcAd(d.year)} (${cal}, ${c.weekdayName}), ${hhmm(c.times.localApparentMinutes)} local apparent time (chi-square ${c.chiSquare.toFixed(2)}, ${p})`;
}

function familiesOf(s: Solved, maxFamilies: number, perYear: boolean): CandidateFamily[] {
  const groups = new Map<string, RawCandidate[]>();
  for (const raw of s.kept) {
    const cal = jdToCivilDate(s.win.calendar, raw.dayJd0 + 0.5).date.calendar;
    const key = `${raw.trackKey}|${cal}`;
    const list = groups.get(key) ?? [];
    list.push(raw);
    groups.set(key, list);
  }
  const ordered = [...groups.values()].sort((a, b) => a[0].objective - b[0].objective).slice(0, maxFamilies);
  return ordered.map((list, i) => {
    const members: FamilyMember[] = list.map((raw) => {
      const answer = jdToCivilDate(s.win.calendar, raw.dayJd0 + 0.5);
      const civil = { ...answer.civil, calendar: answer.date.calendar };
      return {
        candidate: () => dressed(s, raw),
        objective: raw.objective,
        year: civil.year,
        month: civil.month,
        day: civil.day,
        calendar: civil.calendar,
        apparentMinutes: ((raw.apparentMinutes % 1440) + 1440) % 1440,
        weight: s.weights.get(raw) ?? 0,
        chiSquare: raw.chiSquare,
        pValue: pOf(s.model, raw.chiSquare),
      };
    });
    const assumption = s.search.assumptions[list[0].assumptionIndex];
    return buildFamily(`f${i + 1}`, i + 1, members, clockAssumptionLabel(assumption), assumption, perYear);
  });
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
  const s = solveModel(model, win, opt.chiSquareCutoff, opt.profileScans);
  let progressSteps = 3; // the search, the consistency test (or the reruns), the answer
  const best = s.kept[0];
  const notes: string[] = [
    'Every candidate is an estimate conditional on the stated assumptions (site, wall azimuths, measurements and their sigmas, what a clock kept); weigh it with the documentary evidence and expert judgement.',
    'Relative weights are exp(-chi2/2) normalised over the candidates shown; they do not include the size of each ellipse.',
    'Mapped years share the ellipse of the nearest representative year that was refined in full.',
  ];
  if (s.edgeDropped > 0) {
    notes.push(
      `${s.edgeDropped} candidate${s.edgeDropped === 1 ? '' : 's'} whose best day lies outside the allowed days (months, bounds, weekday) and that fit poorly at the nearest allowed day (chi-square more than ${EDGE_CANDIDATE_DELTA_CHI2.toFixed(1)} above the best) ${s.edgeDropped === 1 ? 'was' : 'were'} left out: ${s.edgeDropped === 1 ? 'it is' : 'they are'} the edge of the window, not a fit.`,
    );
  }
  if (model.measuredCount < 2) notes.push('Fewer than two measured numbers: the evidence cannot fix both the date and the hour; candidates are points along a curve.');

  let consistency: ConsistencyReport = {
    rule: `an observation is flagged when leaving it out lowers chi-square by an amount whose p-value (chi-square with as many degrees of freedom as the observation has numbers) is below ${LOO_P_THRESHOLD}`,
    pThreshold: LOO_P_THRESHOLD,
    entries: [],
    flaggedIds: [],
  };
  let status: AnswerStatus;
  let conflictingIds: string[] = [];
  let verdict: string;
  const monthsText = win.months ? `${[...win.months].sort((a, b) => a - b).map((m) => MONTH_NAMES[m - 1]).join(', ')} of ` : '';
  const weekdayText = win.weekday !== null ? ` (${WEEKDAY_NAMES[win.weekday]}s only)` : '';
  const windowText = `${monthsText}${formatYearBcAd(win.fromYear)}-${formatYearBcAd(win.toYear)}${weekdayText}`;
  if (!best) {
    status = 'no-candidates';
    verdict = windowHasAllowedDay(win)
      ? `No date and hour in ${windowText} put the sun where the evidence needs it (no candidate survived the window and its restrictions).`
      : `No day of ${windowText} passes all the window's restrictions together (notBefore, notAfter, months, weekday): there is nothing to search. Check the restrictions.`;
  } else {
    const bestC = dressed(s, best);
    const p = bestC.pValue;
    const factsHold = best.penalty <= FACT_PENALTY_LIMIT;
    const pj = judgingP(model, best.chiSquare);
    status = !factsHold || pj < NOTHING_FITS_P ? 'nothing-fits' : pj < MARGINAL_P ? 'marginal' : 'fits';
    if (status === 'nothing-fits') {
      // Rerun the whole search without each observation (facts and clocks included).
      const entries: LeaveOneOutEntry[] = [];
      const estimated = estimatedWithoutEach(s, scene, (n, chi, penalty) => penalty <= FACT_PENALTY_LIMIT && chiSquarePValue(chi, n > 2 ? n - 2 : 1) >= NOTHING_FITS_P);
      progressSteps = 2 + (estimated ? [...estimated.values()].filter((e) => e.rerun).length : scene.observations.length);
      let done = 1;
      opt.onProgress?.(done, progressSteps);
      for (const o of scene.observations) {
        const e = estimated?.get(o.id);
        if (e && !e.rerun) {
          entries.push(estimatedEntry(o, e, best.chiSquare, best.objective));
          continue;
        }
        opt.onProgress?.(++done, progressSteps);
        const reduced = buildEvidenceModel(scene, new Set([o.id]));
        const sr = solveModel(reduced, win, opt.chiSquareCutoff, opt.profileScans);
        const b = sr.kept[0];
        const fits = fitsWell(reduced, b);
        const rows = model.measuredCount - reduced.measuredCount;
        const improvement = b ? best.objective - b.objective : 0;
        const bestWithout = b ? dressed(sr, b) : undefined;
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
      conflictingIds = entries.filter((e) => e.flagged).map((e) => e.observationId);
      if (conflictingIds.length === 0) {
        conflictingIds = [...entries].sort((a, b) => b.improvement - a.improvement).slice(0, 2).map((e) => e.observationId);
      }
      consistency = { ...consistency, rule: `${consistency.rule}; when nothing fits, the search is rerun without each observation and those whose removal lets the rest fit are named${estimated ? `${ESTIMATED_RULE_TEXT}; the search is rerun in full only for the observations named` : ''}`, entries, flaggedIds: conflictingIds };
      const violated = bestC.facts.filter((f) => !f.satisfied && f.penalty > 0.01).map((f) => f.note);
      const without = entries
        .filter((e) => conflictingIds.includes(e.observationId) && e.bestWithout)
        .map((e) => `without ${e.observationId} the best fit is ${describeCandidate(e.bestWithout!)}`);
      verdict =
        `Nothing fits: no date and hour in ${windowText} agree with all the observations` +
        ` (best chi-square ${best.chiSquare.toFixed(1)}${p !== null ? `, p = ${p.toPrecision(2)}` : ''}${violated.length ? `; facts that cannot hold there: ${violated.join('; ')}` : ''}).` +
        ` The observations in conflict: ${conflictingIds.join(', ')}.` +
        (without.length ? ` ${without.join('; ')}.` : '');
    } else {
      opt.onProgress?.(1, progressSteps);
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
      }
      // Count families as they are listed (a track split at a calendar switch is two families).
      const trackCount = new Set(s.kept.map((c) => c.trackKey)).size;
      const famCount = Math.min(opt.maxFamilies, new Set(s.kept.map((c) => `${c.trackKey}|${jdToCivilDate(s.win.calendar, c.dayJd0 + 0.5).date.calendar}`)).size);
      const renamed = famCount > trackCount ? ` (${famCount - trackCount} of them the same light as another, named in the other calendar)` : '';
      verdict =
        (status === 'fits' ? 'The evidence fits.' : `The best fit is marginal (p = ${pj.toPrecision(2)}): treat every candidate with caution.`) +
        ` Best: ${describeCandidate(bestC)}.` +
        ` ${famCount} famil${famCount === 1 ? 'y' : 'ies'} of candidates${renamed} in ${windowText}.` +
        (consistency.flaggedIds.length ? ` Flagged as disagreeing with the rest: ${consistency.flaggedIds.join(', ')}.` : '');
    }
  }
  opt.onProgress?.(progressSteps - 1, progressSteps);
  const families = familiesOf(s, opt.maxFamilies, opt.perYear);
  const candidates = s.kept.slice(0, opt.maxCandidates).map((raw) => dressed(s, raw));
  return {
    sceneTitle: scene.title,
    status,
    verdict,
    window: { fromYear: win.fromYear, toYear: win.toYear },
    families,
    candidates,
    consistency,
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
      clockAssumptionsTried: s.search.assumptions.length,
    },
    seed: scene.seed,
  };
}
