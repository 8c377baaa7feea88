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
 *
 * Large scenes (more than EXACT_LEAVE_ONE_OUT_MAX_OBSERVATIONS observations): a refit per
 * observation costs as much as the whole fit, so the test would grow with the square of the
 * number of observations. There each fall is estimated from the full fit instead: the normal
 * equations J^T J and J^T r of all residual rows at the fitted point are built once, the rows
 * of one observation are subtracted (an exact downdate of the normal equations), and one
 * Gauss-Newton step in (minute, nuisances) on the same civil day gives the chi-square without it
 * (Press et al., Numerical Recipes 3rd ed. 2007, sections 15.4-15.5 on the normal equations;
 * the downdate by subtracting rows: Golub and Van Loan, Matrix Computations, 4th ed. 2013,
 * section 6.5, on downdating least-squares problems). Linear in the number of observations.
 */
import { buildEvidenceModel, residualRowsByObservation, WALL_SHADOW_KINDS, type EvidenceModel } from './evidenceModel.js';
import { chiSquarePValue } from '../math/chiSquare.js';
import { centralDifferenceJacobian, solveSmallSystem } from '../math/leastSquares.js';
import { datedPoint, datedSteps, newDatedContext, refineDated, refineOnDay, type DatedPoint } from './fitting.js';
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

/**
 * Scenes with more observations than this have their leave-one-out falls estimated from the full
 * fit (downdate and one Gauss-Newton step, see the header); up to it every refit is done in full.
 * With more than 20 observations one of them carries on average under a twentieth of the
 * evidence, so leaving it out moves the fit little (common practice; the choice of 20 is ours).
 */
export const EXACT_LEAVE_ONE_OUT_MAX_OBSERVATIONS = 20;

/** Added to the consistency rule of a large scene, so that the answer says how its figures were found. */
export const ESTIMATED_RULE_TEXT =
  `; with more than ${EXACT_LEAVE_ONE_OUT_MAX_OBSERVATIONS} observations the chi-square without each is estimated from the full fit (its rows taken out of the normal equations, then one Gauss-Newton step on the same day), not refitted`;

/** Chi-square without one observation, estimated at one fitted point. */
export interface EstimatedWithout {
  /** Chi-square (measured and priors) plus soft penalty without the observation. */
  readonly objective: number;
  readonly chiSquare: number;
  readonly penalty: number;
}

/** A fitted point to estimate at: the exact residuals there and the clock assumption of its fit. */
export interface FittedPlace {
  readonly point: DatedPoint;
  readonly assumed: ClockKind | null;
}

/**
 * The residual rows that disappear with each observation: its measured rows, the facts it states,
 * and the facts it alone implies (a wall lit by its only shadow on that wall, the sun up by the
 * only shadow). Rows are numbered as in evidenceResidualVector. A wall's prior stays: with no
 * other row on that wall the step moves its azimuth onto the prior, as a refit without it would.
 */
export function rowsRemovedWith(model: EvidenceModel): Map<string, number[]> {
  const rows = new Map<string, number[]>();
  for (const o of model.scene.observations) rows.set(o.id, []);
  for (const [id, list] of residualRowsByObservation(model)) rows.set(id, [...list]);
  const wallSupport = new Map<string, Set<string>>();
  const shadowIds = new Set<string>();
  for (const t of model.shadows) {
    shadowIds.add(t.observationId);
    if (t.wallId !== undefined && WALL_SHADOW_KINDS.has(t.observationKind)) {
      const set = wallSupport.get(t.wallId) ?? new Set<string>();
      set.add(t.observationId);
      wallSupport.set(t.wallId, set);
    }
  }
  const factStart = model.measuredCount + model.nuisances.length;
  model.facts.forEach((f, k) => {
    const support = !f.implicit ? 1 : f.fact === 'sun-up' ? shadowIds.size : (wallSupport.get(f.wallId ?? '')?.size ?? 1);
    if (support === 1) rows.get(f.observationId)?.push(factStart + k);
  });
  const moonFactStart = factStart + model.facts.length;
  model.moonFacts.forEach((f, k) => {
    const support = f.implicit ? model.moons.length : 1;
    if (support === 1) rows.get(f.observationId)?.push(moonFactStart + k);
  });
  return rows;
}

/** Sums of squares, J^T r and J^T J over a set of rows (the fixed-day parameters). */
interface NormalSums {
  c: number;
  g: number[];
  h: number[][];
}

function emptySums(n: number): NormalSums {
  return { c: 0, g: new Array<number>(n).fill(0), h: Array.from({ length: n }, () => new Array<number>(n).fill(0)) };
}

function addRow(s: NormalSums, jRow: readonly number[], r: number, sign: 1 | -1): void {
  const n = jRow.length;
  s.c += sign * r * r;
  for (let a = 0; a < n; a += 1) {
    const ja = jRow[a];
    if (ja === 0) continue;
    s.g[a] += sign * ja * r;
    for (let b = 0; b < n; b += 1) s.h[a][b] += sign * ja * jRow[b];
  }
}

function copySums(s: NormalSums): NormalSums {
  return { c: s.c, g: s.g.slice(), h: s.h.map((row) => row.slice()) };
}

/** Value of the linearised sum of squares c + 2 g.dx + dx^T H dx. */
function quadraticAt(s: NormalSums, dx: readonly number[]): number {
  let v = s.c;
  for (let a = 0; a < dx.length; a += 1) {
    v += 2 * s.g[a] * dx[a];
    for (let b = 0; b < dx.length; b += 1) v += dx[a] * s.h[a][b] * dx[b];
  }
  return v;
}

/**
 * Chi-square without each observation, estimated at one fitted point by downdating the normal
 * equations and one Gauss-Newton step in (minute, nuisances) on the point's civil day (see the
 * header). Cost: one Jacobian of the full model plus a small solve per observation.
 */
export function downdatedLeaveOneOut(model: EvidenceModel, place: FittedPlace, removed: ReadonlyMap<string, readonly number[]>): Map<string, EstimatedWithout> {
  const p = place.point;
  const ctx = newDatedContext(model, place.assumed, p.jdUT);
  const x0 = [p.apparentMinutes, ...p.nuisances];
  const jac = centralDifferenceJacobian((x) => datedPoint(ctx, p.dayJd0, x[0], x.slice(1)).residuals as number[], x0, datedSteps(model).slice(1));
  const r = p.residuals;
  const n = x0.length;
  const chiRows = model.measuredCount + model.nuisances.length;
  const chi = emptySums(n);
  const fact = emptySums(n);
  for (let i = 0; i < r.length; i += 1) addRow(i < chiRows ? chi : fact, jac[i], r[i], 1);
  const out = new Map<string, EstimatedWithout>();
  for (const [id, rows] of removed) {
    const c = copySums(chi);
    const f = copySums(fact);
    for (const i of rows) addRow(i < chiRows ? c : f, jac[i], r[i], -1);
    const h = c.h.map((row, a) => row.map((v, b) => v + f.h[a][b]));
    const dx = solveSmallSystem(h, c.g.map((v, a) => -(v + f.g[a]))) ?? new Array<number>(n).fill(0);
    const chiSquare = Math.max(0, quadraticAt(c, dx));
    const penalty = Math.max(0, quadraticAt(f, dx));
    out.set(id, { objective: chiSquare + penalty, chiSquare, penalty });
  }
  return out;
}

/**
 * Estimated chi-square without each observation: the smallest over several fitted points (the
 * best candidate of each family when nothing fits), each by downdatedLeaveOneOut.
 */
export function estimatedLeaveOneOut(model: EvidenceModel, places: readonly FittedPlace[]): Map<string, EstimatedWithout> {
  const removed = rowsRemovedWith(model);
  const best = new Map<string, EstimatedWithout>();
  for (const place of places) {
    for (const [id, e] of downdatedLeaveOneOut(model, place, removed)) {
      const had = best.get(id);
      if (!had || e.objective < had.objective) best.set(id, e);
    }
  }
  return best;
}

/** Local leave-one-out refits at the best candidate, one per measured observation (estimated in large scenes). */
export function localLeaveOneOut(scene: Scene, model: EvidenceModel, best: RawCandidate, assumed: ClockKind | null, win: DayWindow): LocalRefit[] {
  const rows = residualRowsByObservation(model);
  const out: LocalRefit[] = [];
  if (scene.observations.length > EXACT_LEAVE_ONE_OUT_MAX_OBSERVATIONS) {
    const est = downdatedLeaveOneOut(model, { point: best.point, assumed }, rowsRemovedWith(model));
    const kinds = new Map(scene.observations.map((o) => [o.id, o.kind]));
    for (const [id, list] of rows) {
      const e = est.get(id);
      if (!e) continue;
      const kind = kinds.get(id) ?? 'unknown';
      out.push({ observationId: id, observationKind: kind, residualCount: list.length, objectiveWithout: e.objective, chiSquareWithout: e.chiSquare });
    }
    return out;
  }
  for (const [id, list] of rows) {
    const refit = localRefitWithout(scene, model, best, assumed, win, new Set([id]));
    const kind = scene.observations.find((o) => o.id === id)?.kind ?? 'unknown';
    out.push({ observationId: id, observationKind: kind, residualCount: list.length, objectiveWithout: refit.objective, chiSquareWithout: refit.chiSquare });
  }
  return out;
}

/**
 * The fit redone without the observations `omit`, starting from the best candidate: a local refit in
 * (d, m, nuisances), then the best allowed whole day near it. Objective = chi-square + soft penalty.
 */
export function localRefitWithout(
  scene: Scene,
  model: EvidenceModel,
  best: RawCandidate,
  assumed: ClockKind | null,
  win: DayWindow,
  omit: ReadonlySet<string>,
): { readonly objective: number; readonly chiSquare: number; readonly model: EvidenceModel; readonly nuisancesByName: ReadonlyMap<string, number> } {
  const reduced = buildEvidenceModel(scene, omit);
  const nuis = reduced.nuisances.map((n) => {
    const k = model.nuisances.findIndex((m) => m.name === n.name);
    return k >= 0 ? best.nuisances[k] : n.priorDeg;
  });
  const ctx = newDatedContext(reduced, assumed, best.point.jdUT);
  const fit = refineDated(ctx, [best.continuousDay, best.continuousMinutes, ...nuis]);
  const centre = nearestDayJd0(fit.x[0]);
  let bestObjective = Infinity;
  let bestChi = Infinity;
  let bestNuisances: readonly number[] = nuis;
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
      bestNuisances = onDay.x.slice(2);
    }
  }
  return { objective: bestObjective, chiSquare: bestChi, model: reduced, nuisancesByName: new Map(reduced.nuisances.map((n, k) => [n.name, bestNuisances[k]])) };
}

/** p-value of a chi-square fall with k degrees of freedom. */
export function improvementPValue(improvement: number, k: number): number {
  return chiSquarePValue(Math.max(0, improvement), Math.max(1, k));
}
