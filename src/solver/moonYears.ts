/**
 * The moon's stage of the search: every year's candidate of the sun's evidence (stage B) fitted
 * again with the moon, at that year's own instants.
 *
 * The sun's light repeats every year, so stage B maps most years from a few representative ones;
 * the moon does not repeat (its phase on a calendar day returns after 19 years, 235 lunations, and
 * roughly after 8 years, 99 lunations), so it is evaluated per year and never mapped. For each
 * stage-B candidate (one per family track and year):
 * 1. screen: every allowed whole day within 4 sigma of the year's sun-only optimum (at least 2, at
 *    most MAX_MOON_DAYS days either side), at the minute the sun's fit predicts for that day (its
 *    conditional mean): days whose quick phase (Meeus eq. 48.4) misses a drawn phase by more than
 *    4 sigma are passed over, the others evaluated once with the full sun and moon;
 * 2. refine: the best screened day (and the second best, when it screened within SECOND_DAY_CUTOFF
 *    of it) of each year whose best screened objective lies within
 *    MOON_REFINE_CUTOFF of the best of all years, by Levenberg-Marquardt in (minute, nuisances) on
 *    that day with the whole evidence (src/solver/fitting.ts refineOnDay); the other years keep
 *    their best screened day (they fit far worse: their objective is an upper bound of their best).
 * Every kept candidate is verified by one exact evaluation (stageB.ts exactPoint).
 * The ellipses of a candidate (candidateUncertainty.ts) stay those of the sun's evidence alone.
 */
import type { ClockKind } from '../scene/types.js';
import { splitChiSquare, type EvidenceModel } from './evidenceModel.js';
import { datedPoint, ensureTrack, newDatedContext, refineOnDay, type DatedContext } from './fitting.js';
import { exactPoint, type RawCandidate } from './stageB.js';
import { isDayAllowed, nearestDayJd0, type DayWindow } from './window.js';
import { moonPhaseLongitudeApproxDeg, MOON_PHASE_APPROX_ALLOWANCE_DEG } from '../ephemeris/moonPhaseApprox.js';
import { normalizeDeg180, sinDeg, cosDeg } from '../math/angles.js';
import type { MoonTerm } from './moonEvidence.js';

/** Most days either side of a year's sun-only optimum screened for the moon (beyond, the other branch of the solstice takes over). */
export const MAX_MOON_DAYS = 45;
/** Days screened either side: this many sigmas of the sun's day (at least 2 days). */
const DAY_REACH_SIGMAS = 4;
/** Years whose best screened objective is within this of the best year's are refined. */
export const MOON_REFINE_CUTOFF = 30;
/** Screened days refined per year. */
const REFINED_DAYS = 2;
const SECOND_DAY_CUTOFF = 10;
/**
 * A day whose quick phase (Meeus eq. 48.4, src/ephemeris/moonPhaseApprox.ts) misses the drawn phase by
 * more than this in chi-square, with its sigma widened by the quick phase's allowance, is not screened
 * with the full ephemeris (4 sigma: a true day is passed over with probability below 1e-4).
 */
const PHASE_SCREEN_CHI2 = 16;

/** Chi-square of the drawn phases against the quick phase longitude l (sigmas widened by its allowance). */
function quickPhaseChiSquare(terms: readonly MoonTerm[], l: number): number {
  let chi = 0;
  for (const t of terms) {
    const e = t.evidence;
    if (e.kind === 'moon-fraction') {
      // k = (1 - cos L) / 2 (Meeus eq. 48.1 with i = 180 - L); dk/dL = sin(L) / 2 per radian.
      const k = (1 - cosDeg(l)) / 2;
      const sigma = e.sigma + (MOON_PHASE_APPROX_ALLOWANCE_DEG * Math.PI) / 360;
      chi += ((k - e.illuminatedFraction) / sigma) ** 2;
    } else if (e.kind === 'moon-named-phase') {
      const predicted = e.folded ? Math.min(l, 360 - l) : l;
      chi += (normalizeDeg180(predicted - e.phaseLongitudeDeg) / (e.sigmaDeg + MOON_PHASE_APPROX_ALLOWANCE_DEG)) ** 2;
    }
  }
  return chi;
}

interface Screened {
  readonly day: number;
  readonly minutes: number;
  readonly objective: number;
}

export interface MoonStageResult {
  readonly candidates: RawCandidate[];
  readonly moonEvaluations: number;
  readonly refinedYears: number;
  /** Days evaluated with the full moon ephemeris in the screening. */
  readonly screenedDays: number;
}

function objectiveOf(model: EvidenceModel, r: readonly number[]): { chiSquare: number; penalty: number; objective: number } {
  const s = splitChiSquare(model, r);
  return { chiSquare: s.chiSquare, penalty: s.penalty, objective: s.chiSquare + s.penalty };
}

/** The minute the sun's fit predicts on `day` (its conditional mean; the optimum's minute when the covariance is unusable). */
function minuteOnDay(c: RawCandidate, day: number): number {
  const cov = c.rep.covariance;
  if (!cov || !(cov[0][0] > 0)) return c.continuousMinutes;
  const shift = (cov[1][0] / cov[0][0]) * (day - c.continuousDay);
  return Number.isFinite(shift) && Math.abs(shift) <= 240 ? c.continuousMinutes + shift : c.continuousMinutes;
}

function screenYear(model: EvidenceModel, ctx: DatedContext, c: RawCandidate, win: DayWindow): Screened[] {
  const cov = c.rep.covariance;
  // Near a solstice the sun hardly fixes the day (the covariance is huge or singular): then the widest reach.
  const sd = cov && cov[0][0] > 0 && Number.isFinite(cov[0][0]) ? Math.sqrt(cov[0][0]) : Infinity;
  const reach = Math.min(MAX_MOON_DAYS, Math.max(2, Math.ceil(DAY_REACH_SIGMAS * sd)));
  const centre = nearestDayJd0(c.continuousDay);
  const phased = model.moons.some((t) => t.evidence.kind === 'moon-fraction' || t.evidence.kind === 'moon-named-phase');
  const days: { day: number; minutes: number; quick: number }[] = [];
  for (let day = centre - reach; day <= centre + reach; day += 1) {
    if (!isDayAllowed(win, day)) continue;
    const minutes = minuteOnDay(c, day);
    // The instant, near enough for the quick phase: local apparent time less the longitude (the equation of time left out).
    const quick = phased ? quickPhaseChiSquare(model.moons, moonPhaseLongitudeApproxDeg(day + minutes / 1440 - model.scene.site.longitudeDeg / 360)) : 0;
    days.push({ day, minutes, quick });
  }
  // Every day that passes the quick phase, or else the year's best by it, is screened in full.
  let passing = days.filter((d) => d.quick <= PHASE_SCREEN_CHI2);
  if (passing.length === 0 && days.length > 0) passing = [days.reduce((a, b) => (b.quick < a.quick ? b : a))];
  const out: Screened[] = [];
  for (const { day, minutes } of passing) {
    ensureTrack(ctx, day + minutes / 1440);
    const p = datedPoint(ctx, day, minutes, c.nuisances);
    out.push({ day, minutes, objective: objectiveOf(model, p.residuals).objective });
  }
  return out.sort((a, b) => a.objective - b.objective);
}

/** The stage-B candidates of one clock assumption, each year fitted again with the moon. */
export function moonStage(model: EvidenceModel, assumed: ClockKind | null, sunOnly: readonly RawCandidate[], win: DayWindow): MoonStageResult {
  let moonEvaluations = 0;
  let refinedYears = 0;
  const screened = sunOnly.map((c) => {
    const ctx = newDatedContext(model, assumed, c.point.jdUT);
    const days = screenYear(model, ctx, c, win);
    return { c, ctx, days };
  });
  const best = Math.min(...screened.map((s) => (s.days.length ? s.days[0].objective : Infinity)));
  const out: RawCandidate[] = [];
  for (const { c, ctx, days } of screened) {
    if (days.length === 0) continue;
    let pick = { day: days[0].day, rest: [days[0].minutes, ...c.nuisances], iterations: 0, converged: true };
    let pickObjective = days[0].objective;
    const refine = days[0].objective <= best + MOON_REFINE_CUTOFF;
    if (refine) {
      refinedYears += 1;
      for (const d of days.slice(0, REFINED_DAYS).filter((x) => x.objective <= days[0].objective + SECOND_DAY_CUTOFF)) {
        const fit = refineOnDay(ctx, d.day, [d.minutes, ...c.nuisances]);
        const o = objectiveOf(model, fit.point.residuals).objective;
        if (o < pickObjective) {
          pickObjective = o;
          pick = { day: d.day, rest: fit.x.slice(1), iterations: fit.iterations, converged: fit.converged };
        }
      }
    }
    const ex = exactPoint(model, assumed, ctx.site, pick.day, pick.rest[0], pick.rest.slice(1), datedPoint(ctx, pick.day, pick.rest[0], pick.rest.slice(1), false).state.equationOfTimeMinutes);
    moonEvaluations += 1;
    const o = objectiveOf(model, ex.point.residuals);
    out.push({
      ...c,
      dayJd0: pick.day,
      apparentMinutes: pick.rest[0],
      nuisances: pick.rest.slice(1),
      point: ex.point,
      sun: ex.sun,
      chiSquare: o.chiSquare,
      penalty: o.penalty,
      objective: o.objective,
      fit: { converged: c.fit.converged && pick.converged, iterations: c.fit.iterations + pick.iterations },
      atWindowEdge: c.atWindowEdge && pick.day === c.dayJd0,
      moonRefined: refine,
    });
  }
  for (const s of screened) moonEvaluations += s.ctx.moonCalls;
  return { candidates: out, moonEvaluations, refinedYears, screenedDays: screened.reduce((n, x) => n + x.days.length, 0) };
}
