/**
 * checkProposal: could the scene's light have fallen on a proposed day (with or without a
 * time), in a range of days, or in a season (months)? The best fit inside the proposal, its
 * chi-square, p-value and residuals, and a one-line verdict in plain words.
 *
 * Inside a day, the minute (and the nuisances) are fitted from several starts (every stage-A
 * minimum and every two hours), so that a poor fit is not a poor start. A proposed time is held
 * fixed (only the nuisances are fitted) or, with a tolerance, bounded to that interval. A range
 * or season is searched like the window (stage A and B restricted to it); where the best fit
 * lies outside, the proposal's edge days are fitted directly. The scene's own documentary
 * restrictions (bounds, months, weekday) are not applied to the proposal: it is judged on the
 * light alone, and so is the best fit in the window it is compared with.
 *
 * Judged both ways: against the best in the window (Delta chi-square with as many degrees of freedom
 * as the proposal fixes, its p-value and the likelihood ratio; this gives the verdict: consistent
 * for p >= 0.05 and the facts holding, doubtful for 0.001 <= p < 0.05, inconsistent below or when a
 * fact fails), and on its own (its chi-square with measured numbers minus what is fitted inside it).
 * The fit of the evidence as a whole is said apart.
 *
 * With evidence of the moon, a range or season is searched with the moon fitted at each year's own
 * instants (search.ts, moonYears.ts), the edge days with the moon, and the uncertainty of the best fit
 * with the moon (candidateUncertainty.ts); when the proposal spans several years, the verdict names
 * each year's best fit against the best in the window (moonYearsWords), so that the years the moon
 * rules out are named.
 */
import type { AnswerFreedom, Candidate, CheckAbsoluteFit, CheckAnswer, CheckOverallFit, CheckRelativeFit, CheckVerdict, Proposal } from './types.js';
import type { CivilDay, ClockKind, Scene } from '../scene/types.js';
import { resolvePixelObservations } from '../image/resolvePixels.js';
import { InvalidInputError } from '../errors.js';
import { chiSquarePValue } from '../math/chiSquare.js';
import { covarianceFromJacobian, levenbergMarquardt } from '../math/leastSquares.js';
import { civilDateToJd, jdToCivilDate } from '../calendar/regions.js';
import { YEARS_ALIKE_DELTA_CHI2 } from './families.js';
import { MONTH_NAMES } from '../calendar/julianDay.js';
import { clockToJdUT } from '../time/clock.js';
import { buildEvidenceModel, longitudeOf, splitChiSquare, type EvidenceModel } from './evidenceModel.js';
import { datedPoint, hasMoonEvidence, newDatedContext, refineDated, refineOnDay, type DatedContext } from './fitting.js';
import { searchCandidates, clockAssumptionsOf } from './search.js';
import { stageA } from './stageA.js';
import { lowPrecisionSun } from './seasons.js';
import { exactPoint, type RawCandidate, type RepresentativeFit } from './stageB.js';
import { assumedKind, countWords, dressCandidate, hhmm } from './candidates.js';
import { dayWindowOf, type DayWindow } from './window.js';
import { candidateDayWords, judgeFit, solveDates, FACT_PENALTY_LIMIT, NOTHING_FITS_P, MARGINAL_P } from './solveDates.js';
import { formatYearBcAd } from '../calendar/format.js';
import type { UncertaintyCache } from './candidateUncertainty.js';

function dayText(d: CivilDay): string {
  return `${d.day} ${MONTH_NAMES[d.month - 1]} ${formatYearBcAd(d.year)}`;
}

/** "1775" or "1770-1780". */
function yearSpan(from: number, to: number): string {
  return from === to ? formatYearBcAd(from) : `${formatYearBcAd(from)}-${formatYearBcAd(to)}`;
}

function proposalText(p: Proposal): string {
  switch (p.kind) {
    case 'day':
      return p.timeMinutes !== undefined ? `${dayText(p.day)} at ${hhmm(p.timeMinutes)}` : dayText(p.day);
    case 'range':
      return `A date from ${dayText(p.from)} to ${dayText(p.to)}`;
    case 'season': {
      const names = p.months.map((m) => MONTH_NAMES[m - 1]);
      const months = names.length > 1 ? `${names.slice(0, -1).join(', ')} or ${names[names.length - 1]}` : names[0];
      return `A date in ${months}${p.fromYear !== undefined ? ` of ${yearSpan(p.fromYear, p.toYear ?? p.fromYear)}` : ''}`;
    }
  }
}

/** Best fit on one civil day, under each clock assumption, from several starts; optional fixed or bounded minute. */
function fitOnDay(model: EvidenceModel, dayJd0: number, time?: { apparentMinutes: number; tolerance: number }): RawCandidate | null {
  const assumptions = clockAssumptionsOf(model);
  const obliquityDeg = lowPrecisionSun(dayJd0).obliquityDeg;
  let best: RawCandidate | null = null;
  assumptions.forEach((a, ai) => {
    const kind = assumedKind(a);
    const lon = longitudeOf(model, model.nuisances.map((n) => n.priorDeg));
    const ctx = newDatedContext(model, kind, dayJd0 + 0.5 - lon / 360);
    const seeds = stageA(model, kind, ctx.zoneOffset, obliquityDeg).minima;
    const nuisStarts = seeds.length ? seeds.map((s) => s.nuisances) : [model.nuisances.map((n) => n.priorDeg)];
    const starts: number[][] = [];
    if (time) starts.push([time.apparentMinutes, ...nuisStarts[0]]);
    else {
      for (const s of seeds) starts.push([720 + 4 * s.hourAngleDeg, ...s.nuisances]);
      for (let h = 0; h < 24; h += 2) starts.push([h * 60 + 30, ...nuisStarts[0]]);
    }
    for (const x0 of starts) {
      let rest: number[];
      let iterations: number;
      let converged: boolean;
      if (time && time.tolerance === 0) {
        if (model.nuisances.length === 0) {
          rest = x0;
          iterations = 0;
          converged = true;
        } else {
          const lm = levenbergMarquardt({ residuals: (p) => datedPoint(ctx, dayJd0, x0[0], p).residuals as number[], steps: model.nuisances.map(() => 1e-4) }, x0.slice(1), { maxIterations: 40 });
          rest = [x0[0], ...lm.x];
          iterations = lm.iterations;
          converged = lm.converged;
        }
      } else if (time) {
        const lower = x0.map(() => -Infinity);
        const upper = x0.map(() => Infinity);
        lower[0] = time.apparentMinutes - time.tolerance;
        upper[0] = time.apparentMinutes + time.tolerance;
        const lm = levenbergMarquardt({ residuals: (p) => datedPoint(ctx, dayJd0, p[0], p.slice(1)).residuals as number[], steps: [0.01, ...model.nuisances.map(() => 1e-4)], lower, upper }, x0, { maxIterations: 40 });
        rest = lm.x;
        iterations = lm.iterations;
        converged = lm.converged;
      } else {
        const f = refineOnDay(ctx, dayJd0, x0);
        rest = f.x.slice(1);
        iterations = f.iterations;
        converged = f.converged;
      }
      const { point, sun } = exactPoint(model, kind, ctx.site, dayJd0, rest[0], rest.slice(1), datedPoint(ctx, dayJd0, rest[0], rest.slice(1)).state.equationOfTimeMinutes);
      const s = splitChiSquare(model, point.residuals);
      const objective = s.chiSquare + s.penalty;
      if (best && best.objective <= objective) continue;
      best = {
        assumptionIndex: ai,
        trackKey: `check:${ai}`,
        branch: 'rising',
        cycle: 0,
        dayJd0,
        apparentMinutes: rest[0],
        nuisances: rest.slice(1),
        point,
        sun,
        chiSquare: s.chiSquare,
        penalty: s.penalty,
        objective,
        continuousDay: dayJd0,
        continuousMinutes: rest[0],
        rep: nearestOptimum(ctx, dayJd0, rest),
        fit: { converged, iterations },
        mapped: false,
        atWindowEdge: false, // a proposal's own days are the window here
      };
    }
  });
  return best;
}

/** The nearest continuous optimum (for the uncertainty shown beside a checked day). */
function nearestOptimum(ctx: DatedContext, dayJd0: number, rest: readonly number[]): RepresentativeFit {
  const fit = refineDated(ctx, [dayJd0, ...rest]);
  return { cycle: 0, fit, objective: fit.lm.chiSquare, covariance: covarianceFromJacobian(fit.lm.jacobian, fit.x.length), context: ctx };
}

/** Parameters fitted inside a proposal: none for a day with a fixed time, the minute for a day, day and minute for a range or season. */
function fittedInside(p: Proposal): number {
  if (p.kind !== 'day') return 2;
  return p.timeMinutes !== undefined && !(p.timeToleranceMinutes ?? 0) ? 0 : 1;
}

/** The proposal's own fit: its chi-square with measured numbers minus what is fitted inside it. */
function absoluteFit(model: EvidenceModel, proposal: Proposal, raw: RawCandidate): CheckAbsoluteFit {
  const dof = Math.max(0, model.measuredCount - fittedInside(proposal));
  return { chiSquare: raw.chiSquare, degreesOfFreedom: dof, pValue: dof > 0 ? chiSquarePValue(raw.chiSquare, dof) : null, softPenalty: raw.penalty };
}

/**
 * The proposal against the best fit in the window: Delta chi-square with as many degrees of freedom
 * as the proposal fixes (2 for a day and time, else 1), its p-value and the likelihood ratio
 * exp(-Delta/2) (Wilks 1938; Press et al., Numerical Recipes, 3rd ed. (2007), section 15.6.5).
 */
function relativeFit(proposal: Proposal, proposalObjective: number, bestObjective: number): CheckRelativeFit {
  const dof = proposal.kind === 'day' && proposal.timeMinutes !== undefined ? 2 : 1;
  const delta = Math.max(0, proposalObjective - bestObjective);
  const pValue = chiSquarePValue(delta, dof);
  const region: CheckRelativeFit['region'] = pValue >= ONE_SIGMA_P ? 'as-good' : pValue >= MARGINAL_P ? 'within-95' : pValue >= NOTHING_FITS_P ? 'outside-95' : 'outside-99.9';
  return { deltaChiSquare: delta, degreesOfFreedom: dof, pValue, likelihoodRatio: Math.exp(-delta / 2), region };
}

/** p at the edge of the 68.3% (one-sigma) region. */
const ONE_SIGMA_P = 1 - 0.6827;

function pWords(p: number | null): string {
  return p === null ? 'no degrees of freedom left' : `p = ${p.toPrecision(2)}`;
}

/** How well the evidence as a whole fits: the best fit in the window, judged as the answer of `date` judges it. */
function overallFit(model: EvidenceModel, best: Candidate, freedom: AnswerFreedom | undefined): CheckOverallFit {
  const dof = Math.max(0, model.measuredCount - 2);
  const fit = judgeFit(model, best.chiSquare, best.softPenalty);
  if (freedom && fit !== 'does-not-fit') {
    const words = `the evidence does not fix the day and the hour (${freedom.leftFree}), so many dates fit as well as the proposal; ${freedom.wouldFix}`;
    return { chiSquare: best.chiSquare, degreesOfFreedom: dof, pValue: best.pValue, weak: false, words };
  }
  const numbers = dof > 0 ? `chi-square ${best.chiSquare.toFixed(2)} with ${countWords(dof, 'degree of freedom', 'degrees of freedom')}, ${pWords(best.pValue)}` : `chi-square ${best.chiSquare.toFixed(2)}, no degrees of freedom left`;
  const words =
    fit === 'fits'
      ? `the evidence as a whole fits well (the best fit in the window: ${numbers})`
      : fit === 'marginal'
        ? `the evidence as a whole fits only weakly (the best fit in the window: ${numbers}); treat every verdict with caution`
        : `nothing in the window fits the evidence well (the best fit: ${numbers}${best.softPenalty > FACT_PENALTY_LIMIT ? ', a fact fails' : ''}); a proposal as good as the best is only as good as a poor fit`;
  return { chiSquare: best.chiSquare, degreesOfFreedom: dof, pValue: best.pValue, weak: fit !== 'fits', words };
}

function verdictOf(raw: RawCandidate | null, relative: CheckRelativeFit | null, absolute: CheckAbsoluteFit | null): CheckVerdict {
  if (!raw || raw.penalty > FACT_PENALTY_LIMIT) return 'inconsistent';
  const p = relative ? relative.pValue : (absolute?.pValue ?? chiSquarePValue(raw.chiSquare, 1));
  return p < NOTHING_FITS_P ? 'inconsistent' : p < MARGINAL_P ? 'doubtful' : 'consistent';
}

function civilDay(scene: Scene, day: CivilDay, field: string): number {
  return civilDateToJd(scene.calendar, day, field);
}

/**
 * Judge a proposed date, range or season against the scene's evidence.
 * @example checkProposal(scene, { kind: 'day', day: { year: 1650, month: 9, day: 12 } }).verdictText
 *   // "12 September 1650 is consistent with the evidence: best within the proposal 09:04 local apparent time ..."
 */
export function checkProposal(scene: Scene, proposal: Proposal): CheckAnswer {
  scene = resolvePixelObservations(scene).scene; // pixel forms -> numbers (src/image/resolvePixels.ts)
  const model = buildEvidenceModel(scene);
  const unrestricted: Scene = { ...scene, window: { fromYear: scene.window.fromYear, toYear: scene.window.toYear } };
  let win: DayWindow;
  let best: RawCandidate | null = null;
  let foundInProposal: readonly RawCandidate[] = [];
  const notes: string[] = ['The proposal is judged on the light alone: the scene\'s own documentary restrictions (bounds, months, weekday) are not applied to it.'];
  if (proposal.kind === 'day') {
    const dayJd0 = civilDay(scene, proposal.day, 'proposal.day');
    win = dayWindowOf({ ...unrestricted, window: { fromYear: proposal.day.year, toYear: proposal.day.year } }, { from: proposal.day, to: proposal.day });
    let time: { apparentMinutes: number; tolerance: number } | undefined;
    if (proposal.timeMinutes !== undefined) {
      if (!(proposal.timeMinutes >= 0 && proposal.timeMinutes < 1440)) throw new InvalidInputError('proposal.timeMinutes', proposal.timeMinutes, 'minutes after midnight in [0, 1440)');
      const clock: ClockKind = proposal.timeClock ?? { kind: 'apparent' };
      const site = { longitudeDeg: scene.site.longitudeDeg, latitudeDeg: scene.site.latitudeDeg, elevationM: scene.site.elevationM };
      const jdUT = clockToJdUT(dayJd0, proposal.timeMinutes, clock, site);
      // Local apparent minutes of that instant: LAT = UT + longitude + E (Meeus 1998 ch. 28).
      const ctx = newDatedContext(model, null, jdUT);
      const e = datedPoint(ctx, dayJd0, 720, model.nuisances.map((n) => n.priorDeg)).state.equationOfTimeMinutes;
      const apparent = (jdUT - dayJd0) * 1440 + 4 * scene.site.longitudeDeg + e;
      time = { apparentMinutes: apparent, tolerance: Math.max(0, proposal.timeToleranceMinutes ?? 0) };
    }
    best = fitOnDay(model, dayJd0, time);
  } else {
    let edges: number[];
    if (proposal.kind === 'range') {
      const from = civilDay(scene, proposal.from, 'proposal.from');
      const to = civilDay(scene, proposal.to, 'proposal.to');
      if (!(to >= from)) throw new InvalidInputError('proposal.to', proposal.to, 'a day on or after proposal.from');
      win = dayWindowOf({ ...unrestricted, window: { fromYear: proposal.from.year, toYear: proposal.to.year } }, { from: proposal.from, to: proposal.to });
      edges = [from, to];
    } else {
      if (!proposal.months.length || proposal.months.some((m) => !(Number.isInteger(m) && m >= 1 && m <= 12))) {
        throw new InvalidInputError('proposal.months', proposal.months, 'one or more months 1-12');
      }
      const fromYear = proposal.fromYear ?? scene.window.fromYear;
      const toYear = proposal.toYear ?? scene.window.toYear;
      win = dayWindowOf({ ...unrestricted, window: { fromYear, toYear } }, { months: proposal.months, fromYear, toYear });
      const midYear = Math.round((fromYear + toYear) / 2);
      edges = [];
      for (const m of proposal.months) {
        edges.push(civilDay(scene, { year: midYear, month: m, day: 1 }, 'proposal.months'));
        // Last day of the month: the day before the first of the next month.
        const next = m === 12 ? { year: midYear + 1, month: 1, day: 1 } : { year: midYear, month: m + 1, day: 1 };
        edges.push(civilDay(scene, next, 'proposal.months') - 1);
      }
    }
    const found = searchCandidates(model, win).candidates;
    best = found.length ? found[0] : null;
    foundInProposal = found;
    for (const day of edges) {
      if (best && best.objective < 1e-6) break;
      const f = fitOnDay(model, day);
      if (f && (!best || f.objective < best.objective)) best = f;
    }
  }
  const cache: UncertaintyCache = new Map();
  const assumptions = clockAssumptionsOf(model);
  const candidate: Candidate | null = best ? dressCandidate(best, 'check', 1, 1, { model, win, assumptions, cache, profileScans: true }) : null;
  // The best in the window on the light alone, as the proposal is judged (the scene's restrictions left out).
  const global = solveDates(unrestricted, { consistency: false, maxCandidates: 1, maxFamilies: 1 });
  const globalBest = global.candidates[0] ?? null;
  const absolute = best ? absoluteFit(model, proposal, best) : null;
  const relative = best && globalBest ? relativeFit(proposal, best.objective, globalBest.chiSquare + globalBest.softPenalty) : null;
  const overall = globalBest ? overallFit(model, globalBest, global.freedom) : null;
  const verdict = verdictOf(best, relative, absolute);
  const what = proposalText(proposal);
  let verdictText: string;
  if (!candidate) verdictText = `${what}: no instant there can be judged (no fit was found).`;
  else {
    const where = `best within the proposal ${candidateDayWords(candidate)}${alikeYearsWords(foundInProposal, best, win)}${hasMoonEvidence(model) && globalBest ? moonYearsWords(foundInProposal, globalBest.chiSquare + globalBest.softPenalty, win) : ''}`;
    const failing = candidate.facts.filter((f) => !f.satisfied && f.penalty > 0.01).map((f) => f.note);
    const worst = [...candidate.residuals].sort((a, b) => Math.abs(b.normalised) - Math.abs(a.normalised))[0];
    const against = relative
      ? `Delta chi-square ${relative.deltaChiSquare.toFixed(2)} against the best in the window, p = ${relative.pValue.toPrecision(2)}, likelihood ratio ${relative.likelihoodRatio.toPrecision(2)}`
      : 'no best fit in the window to compare with';
    if (verdict === 'consistent') {
      verdictText =
        relative?.region === 'as-good'
          ? `${what} is consistent: as good as any date in the window (${against}); ${where}.`
          : `${what} is consistent: within the 95% region around the best fit in the window (${against}); ${where}.`;
    } else if (verdict === 'doubtful') verdictText = `${what} is doubtful: it fits clearly worse than the best in the window (${against}); ${where}.`;
    else {
      verdictText =
        `${what} is not consistent with the evidence (${against}): ${where}` +
        (failing.length ? `; a fact fails: ${failing.join('; ')}` : '') +
        (worst ? `; worst misfit: ${worst.observationId} (${worst.normalised.toFixed(1)} sigma)` : '') +
        '.';
    }
    if (absolute) {
      verdictText +=
        absolute.degreesOfFreedom > 0
          ? ` On its own: chi-square ${absolute.chiSquare.toFixed(2)} with ${countWords(absolute.degreesOfFreedom, 'degree of freedom', 'degrees of freedom')}, ${pWords(absolute.pValue)}.`
          : ` On its own: chi-square ${absolute.chiSquare.toFixed(2)}, with no degrees of freedom left to judge it.`;
    }
    if (overall && (overall.weak || global.freedom)) verdictText += ` Apart from the proposal: ${overall.words}.`;
    if (globalBest) {
      const p = globalBest.pValue === null ? 'no degrees of freedom left' : `p = ${globalBest.pValue.toPrecision(2)}`;
      verdictText += ` The best fit anywhere in the window: ${global.headline ?? candidateDayWords(globalBest)} (chi-square ${globalBest.chiSquare.toFixed(2)}, ${p}).`;
    }
  }
  return {
    sceneTitle: scene.title,
    proposal,
    verdict,
    verdictText,
    best: candidate,
    chiSquare: candidate ? candidate.chiSquare : null,
    degreesOfFreedom: absolute ? absolute.degreesOfFreedom : Math.max(0, model.measuredCount - fittedInside(proposal)),
    pValue: absolute ? absolute.pValue : null,
    globalBest,
    globalHeadline: global.headline,
    deltaChiSquareToGlobal: candidate && globalBest ? candidate.chiSquare + candidate.softPenalty - (globalBest.chiSquare + globalBest.softPenalty) : null,
    absolute,
    relative,
    overall,
    notes,
  };
}

/**
 * With the moon's evidence, each year of a proposal that spans several years, judged by its best fit
 * against the best in the window (Delta chi-square with 1 degree of freedom, as for the proposal): the years
 * the moon rules out (p below NOTHING_FITS_P), those only doubtful, those that fit. Empty for a single year.
 */
function moonYearsWords(found: readonly RawCandidate[], bestObjective: number, win: DayWindow): string {
  const byYear = new Map<number, number>();
  for (const c of found) {
    const year = jdToCivilDate(win.calendar, c.dayJd0 + 0.5).civil.year;
    byYear.set(year, Math.min(byYear.get(year) ?? Infinity, c.objective));
  }
  if (byYear.size < 2) return '';
  const years = [...byYear.entries()].sort((a, b) => a[0] - b[0]);
  const words = (list: (readonly [number, number])[]): string =>
    list.map(([y, o]) => `${formatYearBcAd(y)} (Delta chi-square ${Math.max(0, o - bestObjective).toFixed(1)})`).join(', ');
  const p = (o: number): number => chiSquarePValue(Math.max(0, o - bestObjective), 1);
  const out = years.filter(([, o]) => p(o) < NOTHING_FITS_P);
  const doubtful = years.filter(([, o]) => p(o) >= NOTHING_FITS_P && p(o) < MARGINAL_P);
  const fit = years.filter(([, o]) => p(o) >= MARGINAL_P);
  const parts: string[] = [];
  if (out.length) parts.push(`${out.length === years.length ? 'every year of the proposal' : 'the years'} the moon rules out: ${words(out)}`);
  if (doubtful.length) parts.push(`doubtful: ${words(doubtful)}`);
  if (fit.length && out.length + doubtful.length > 0) parts.push(`fitting: ${words(fit)}`);
  return parts.length ? `; with the moon at each year's own instant, ${parts.join('; ')}` : '';
}

/**
 * When a proposal spans several years and the light fits several of them alike (within
 * YEARS_ALIKE_DELTA_CHI2 of the best, as families count years: src/solver/families.ts), the best
 * within the proposal names one year only as an example; say so, with the years.
 */
function alikeYearsWords(found: readonly RawCandidate[], best: RawCandidate | null, win: DayWindow): string {
  if (!best || found.length < 2) return '';
  const years = new Set<number>();
  for (const c of found) {
    if (c.objective <= best.objective + YEARS_ALIKE_DELTA_CHI2) years.add(jdToCivilDate(win.calendar, c.dayJd0 + 0.5).civil.year);
  }
  if (years.size < 2) return '';
  const sorted = [...years].sort((a, b) => a - b);
  const span = sorted[sorted.length - 1] - sorted[0] + 1 === sorted.length ? `${formatYearBcAd(sorted[0])}-${formatYearBcAd(sorted[sorted.length - 1])}` : sorted.map((y) => formatYearBcAd(y)).join(', ');
  return ` (the year is an example: ${sorted.length} years of the proposal fit alike, ${span}; the light alone cannot tell them apart)`;
}
