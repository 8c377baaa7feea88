/**
 * The moon's stage of the search: every year's candidate of the sun's evidence (stage B) fitted
 * again with the moon, at that year's own instants.
 *
 * The sun's light repeats every year, so stage B maps most years from a few representative ones;
 * the moon does not repeat (its phase on a calendar day returns after 19 years, 235 lunations, and
 * roughly after 8 years, 99 lunations), so it is evaluated per year and never mapped. For each
 * stage-B candidate (one per family track and year):
 * 1. screen: every allowed whole day within 3 sigma of the year's sun-only optimum (at least 1, at
 *    most MAX_MOON_DAYS days either side), at the minute the sun's fit predicts for that day (its
 *    conditional mean), one evaluation with the full sun and moon each;
 * 2. refine: the two best screened days of each year whose best screened objective lies within
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

/** Most days either side of a year's sun-only optimum screened for the moon. */
export const MAX_MOON_DAYS = 20;
/** Years whose best screened objective is within this of the best year's are refined. */
export const MOON_REFINE_CUTOFF = 400;
/** Screened days refined per year. */
const REFINED_DAYS = 2;

interface Screened {
  readonly day: number;
  readonly minutes: number;
  readonly objective: number;
}

export interface MoonStageResult {
  readonly candidates: RawCandidate[];
  readonly moonEvaluations: number;
  readonly refinedYears: number;
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
  const sd = cov && cov[0][0] > 0 && Number.isFinite(cov[0][0]) ? Math.sqrt(cov[0][0]) : 1;
  const reach = Math.min(MAX_MOON_DAYS, Math.max(1, Math.ceil(3 * sd)));
  const centre = nearestDayJd0(c.continuousDay);
  const out: Screened[] = [];
  for (let day = centre - reach; day <= centre + reach; day += 1) {
    if (!isDayAllowed(win, day)) continue;
    const minutes = minuteOnDay(c, day);
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
    if (days[0].objective <= best + MOON_REFINE_CUTOFF) {
      refinedYears += 1;
      for (const d of days.slice(0, REFINED_DAYS)) {
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
    });
  }
  for (const s of screened) moonEvaluations += s.ctx.moonCalls;
  return { candidates: out, moonEvaluations, refinedYears };
}
