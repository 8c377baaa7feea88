/**
 * Consistency of the evidence: leave-one-out over the measured observations.
 *
 * For each measured observation the fit is redone without it, starting from the best
 * candidate (a local refit in (d, m, nuisances), then the best allowed whole day near it).
 * The fall of chi-square is, for a consistent observation, distributed as chi-square with as
 * many degrees of freedom as the observation has residuals (Press et al., Numerical Recipes
 * 3rd ed. 2007, section 15.6, on Delta chi2 of nested fits); the observation is flagged when
 * that fall has p < 0.01.
 * When nothing fits, the whole search is rerun without each observation (facts included):
 * the observations whose removal lets the rest fit are named as the ones in conflict.
 */
import { buildEvidenceModel, residualRowsByObservation, type EvidenceModel } from './evidenceModel.js';
import { chiSquarePValue } from '../math/chiSquare.js';
import { newDatedContext, refineDated, refineOnDay } from './fitting.js';
import { exactPoint, type RawCandidate } from './stageB.js';
import { splitChiSquare } from './evidenceModel.js';
import { isDayAllowed, nearestDayJd0, type DayWindow } from './window.js';
import type { ClockKind, Scene } from '../scene/types.js';

/** Threshold of the leave-one-out test. */
export const LOO_P_THRESHOLD = 0.01;

export interface LocalRefit {
  readonly observationId: string;
  readonly observationKind: string;
  readonly residualCount: number;
  readonly objectiveWithout: number;
  readonly chiSquareWithout: number;
}

/** Local leave-one-out refits at the best candidate, one per measured observation. */
export function localLeaveOneOut(scene: Scene, model: EvidenceModel, best: RawCandidate, assumed: ClockKind | null, win: DayWindow): LocalRefit[] {
  const rows = residualRowsByObservation(model);
  const out: LocalRefit[] = [];
  for (const [id, list] of rows) {
    const reduced = buildEvidenceModel(scene, new Set([id]));
    const nuis = reduced.nuisances.map((n) => {
      const k = model.nuisances.findIndex((m) => m.name === n.name);
      return k >= 0 ? best.nuisances[k] : n.priorDeg;
    });
    const ctx = newDatedContext(reduced, assumed, best.point.jdUT);
    const fit = refineDated(ctx, [best.continuousDay, best.continuousMinutes, ...nuis]);
    const centre = nearestDayJd0(fit.x[0]);
    let bestObjective = Infinity;
    let bestChi = Infinity;
    // The candidate's own day (allowed by the window) is always tried too, from the candidate's
    // minute: the refit without an observation can drift out of the window (with the only
    // measured observation left out nothing holds it), and chi-square without it is never above.
    const starts: [number, number[]][] = [centre, centre - 1, centre + 1].map((day) => [day, fit.x.slice(1)]);
    starts.push([best.dayJd0, [best.apparentMinutes, ...nuis]]);
    for (const [day, start] of starts) {
      if (!isDayAllowed(win, day)) continue;
      const onDay = refineOnDay(ctx, day, start);
      const exact = exactPoint(reduced, assumed, ctx.site, day, onDay.x[1], onDay.x.slice(2), fit.point.state.equationOfTimeMinutes);
      const s = splitChiSquare(reduced, exact.point.residuals);
      if (s.chiSquare + s.penalty < bestObjective) {
        bestObjective = s.chiSquare + s.penalty;
        bestChi = s.chiSquare;
      }
    }
    const kind = scene.observations.find((o) => o.id === id)?.kind ?? 'unknown';
    out.push({ observationId: id, observationKind: kind, residualCount: list.length, objectiveWithout: bestObjective, chiSquareWithout: bestChi });
  }
  return out;
}

/** p-value of a chi-square fall with k degrees of freedom. */
export function improvementPValue(improvement: number, k: number): number {
  return chiSquarePValue(Math.max(0, improvement), Math.max(1, k));
}
