/**
 * The "nothing fits" test of a large scene. When nothing fits, the whole search is rerun without
 * each observation (solveDates.ts); with more than EXACT_LEAVE_ONE_OUT_MAX_OBSERVATIONS
 * observations that would cost one search per observation, growing with the square of their
 * number. Here the chi-square without each observation is first estimated from the full search
 * (consistency.ts: downdated normal equations and one Gauss-Newton step at the best candidate of
 * each family), and the whole search is rerun only for the few observations that the estimate
 * names: those whose removal is estimated to let the rest fit (at most MAX_RERUNS, largest fall
 * first), or, when none is, the two whose removal lowers chi-square most. The other entries carry
 * the estimate and say so.
 */
import type { LeaveOneOutEntry } from './types.js';
import type { Observation, Scene } from '../scene/types.js';
import type { Solved } from './solveDates.js';
import type { RawCandidate } from './stageB.js';
import { assumedKind } from './candidates.js';
import { EXACT_LEAVE_ONE_OUT_MAX_OBSERVATIONS, estimatedLeaveOneOut, improvementPValue, rowsRemovedWith, type EstimatedWithout, type FittedPlace } from './consistency.js';
import { residualRowsByObservation } from './evidenceModel.js';

/** Most observations whose whole search is rerun in a large scene. */
export const MAX_RERUNS = 3;
/** Most families (their best candidates) at which the estimate is made. */
export const MAX_ESTIMATE_PLACES = 10;

export interface EstimatedEntry extends EstimatedWithout {
  /** Measured residuals of the observation. */
  readonly residualCount: number;
  /** The rest is estimated to fit without the observation. */
  readonly fits: boolean;
  /** The whole search is to be rerun without it (the estimate only chose it). */
  readonly rerun: boolean;
}

/**
 * Estimates for every observation of a large scene, or null when the scene is small enough for
 * the whole search to be rerun without each.
 * @param fits the rule of solveDates: does a fit with this many measured residuals, this
 *   chi-square and this soft penalty fit?
 */
export function estimatedWithoutEach(
  s: Solved,
  scene: Scene,
  fits: (measuredCount: number, chiSquare: number, penalty: number) => boolean,
): Map<string, EstimatedEntry> | null {
  if (scene.observations.length <= EXACT_LEAVE_ONE_OUT_MAX_OBSERVATIONS || s.search.candidates.length === 0) return null;
  const seen = new Set<string>();
  const places: FittedPlace[] = [];
  for (const c of s.search.candidates) {
    if (seen.has(c.trackKey)) continue;
    seen.add(c.trackKey);
    places.push({ point: c.point, assumed: assumedKind(s.search.assumptions[c.assumptionIndex]) });
    if (places.length >= MAX_ESTIMATE_PLACES) break;
  }
  const estimates = estimatedLeaveOneOut(s.model, places);
  const measuredRows = residualRowsByObservation(s.model);
  const removed = rowsRemovedWith(s.model);
  const best: RawCandidate = s.search.candidates[0];
  const rows = new Map<string, EstimatedEntry>();
  for (const o of scene.observations) {
    const e = estimates.get(o.id) ?? { objective: best.objective, chiSquare: best.chiSquare, penalty: best.penalty };
    const residualCount = measuredRows.get(o.id)?.length ?? 0;
    const ok = (removed.get(o.id)?.length ?? 0) > 0 && fits(s.model.measuredCount - residualCount, e.chiSquare, e.penalty);
    rows.set(o.id, { ...e, residualCount, fits: ok, rerun: false });
  }
  const byFall = [...rows.entries()].sort((a, b) => a[1].objective - b[1].objective);
  const fitting = byFall.filter(([, e]) => e.fits);
  const chosen = fitting.length > 0 ? fitting.slice(0, MAX_RERUNS) : byFall.slice(0, 2);
  for (const [id, e] of chosen) rows.set(id, { ...e, rerun: true });
  return rows;
}

/** The leave-one-out entry of an observation whose chi-square without it was estimated, not refitted. */
export function estimatedEntry(o: Observation, e: EstimatedEntry, chiSquareAll: number, objectiveAll: number): LeaveOneOutEntry {
  const improvement = objectiveAll - e.objective;
  return {
    observationId: o.id,
    observationKind: o.kind,
    residualCount: e.residualCount,
    chiSquareAll,
    chiSquareWithout: e.chiSquare,
    improvement,
    pValue: improvementPValue(improvement, e.residualCount),
    flagged: e.fits,
    note: `without ${o.id}: ${e.fits ? 'the rest fits' : 'still nothing fits'} (estimated from the full fit, not refitted: chi-square about ${e.chiSquare.toFixed(1)})`,
  };
}
