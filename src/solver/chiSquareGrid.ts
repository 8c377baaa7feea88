/**
 * Chi-square of the evidence on a grid of (civil day, local apparent minute) points, for the
 * date-and-hour map. Built only on the solver's own evaluation (fitting.ts `datedPoint`,
 * evidenceModel.ts `splitChiSquare`): at each point the sun is that of the full ephemeris at
 * that hour of that day (through a short track, sunModel.ts), the nuisance parameters (wall
 * azimuths, site) are held at the values given - normally those fitted at the best candidate -
 * and the soft penalties of the facts (wall lit, sun up) are added, so that a point where a
 * fact fails shows as a poor fit.
 *
 * Holding the nuisances fixed makes the map a conditional one: at a point far from the best
 * candidate, re-fitting the wall azimuths could lower chi-square a little. Near the candidates,
 * where the bands are drawn, the difference is second order.
 */
import type { ClockKind } from '../scene/types.js';
import type { Candidate } from './types.js';
import { evidenceResidualValues, type ShadowEvidence } from '../geometry/observationModels.js';
import { factResidual, longitudeOf, splitChiSquare, termEvidence, wallAzimuthOf, type EvaluationContext, type EvidenceModel } from './evidenceModel.js';
import { datedPoint, datedSun, ensureTrack, newDatedContext, type DatedContext } from './fitting.js';
import type { SunTrack } from './sunModel.js';

export interface DayMinuteGridSpec {
  /** Julian Days of local 0h of each civil day, ascending (x of the grid). */
  readonly dayJd0s: readonly number[];
  /** Minutes of local apparent time (y of the grid). */
  readonly minutes: readonly number[];
  /** What a clock of unknown kind is taken to have kept (null: no such clock). */
  readonly assumedClock: ClockKind | null;
  /** Nuisance values in the order of model.nuisances. */
  readonly nuisances: readonly number[];
  /** Called after each day column: (columns done, columns in all). */
  readonly onProgress?: (done: number, total: number) => void;
  /**
   * Points whose chi-square + penalty certainly exceeds this may be left unfinished: their value
   * is +Infinity and they are listed in `unfinished` (absent: every point is computed). Every
   * point at or under the ceiling is computed.
   */
  readonly ceiling?: number;
}

export interface DayMinuteGrid {
  readonly dayJd0s: readonly number[];
  readonly minutes: readonly number[];
  /** chi-square + soft penalty at (minutes[j], dayJd0s[i]): values[j][i]. */
  readonly values: readonly (readonly number[])[];
  /** The smallest finished value. */
  readonly minimum: number;
  readonly evaluations: number;
  /** Points left above the spec's ceiling, as [j, i] (minutes index, day index); empty without a ceiling. */
  readonly unfinished: readonly (readonly [number, number])[];
  /** The sun track each day column was evaluated with (finishing a point reuses it). */
  readonly tracks: readonly SunTrack[];
}

/**
 * The grid of chi-square + penalty values.
 * @example chiSquareOnDayMinuteGrid(model, { dayJd0s: [2323000.5], minutes: [600, 660], assumedClock: null, nuisances: priorsOf(model) })
 */
export function chiSquareOnDayMinuteGrid(model: EvidenceModel, spec: DayMinuteGridSpec): DayMinuteGrid {
  const values: number[][] = spec.minutes.map(() => new Array<number>(spec.dayJd0s.length).fill(NaN));
  const unfinished: [number, number][] = [];
  const tracks: SunTrack[] = [];
  let minimum = Infinity;
  let evaluations = 0;
  if (spec.dayJd0s.length === 0) return { dayJd0s: [], minutes: spec.minutes, values, minimum, evaluations, unfinished, tracks };
  const lon = longitudeOf(model, spec.nuisances);
  const context = newDatedContext(model, spec.assumedClock, spec.dayJd0s[0] + 0.5 - lon / 360);
  const ceiling = spec.ceiling;
  const shadows = shadowTermsAt(model, spec.nuisances);
  const rowsOut = rowsBufferFor(model);
  spec.dayJd0s.forEach((dayJd0, i) => {
    ensureTrack(context, dayJd0 + 0.5 - lon / 360);
    tracks.push(context.track);
    let belowBefore = false; // the point below in the column was at or under the ceiling
    spec.minutes.forEach((m, j) => {
      evaluations += 1;
      // Next to a point under the ceiling the test would most likely fail and its work be done twice: skipped there.
      if (ceiling !== undefined && !belowBefore && exceedsCeiling(context, shadows, dayJd0, m, spec.nuisances, ceiling, rowsOut)) {
        values[j][i] = Infinity;
        unfinished.push([j, i]);
        return;
      }
      const v = valueAt(context, dayJd0, m, spec.nuisances);
      values[j][i] = v;
      if (v < minimum) minimum = v;
      belowBefore = ceiling !== undefined && v <= ceiling;
    });
    spec.onProgress?.(i + 1, spec.dayJd0s.length);
  });
  return { dayJd0s: spec.dayJd0s, minutes: spec.minutes, values, minimum, evaluations, unfinished, tracks };
}

/** chi-square + soft penalty of the dated model at one point. */
function valueAt(context: DatedContext, dayJd0: number, minutes: number, nuisances: readonly number[]): number {
  const s = splitChiSquare(context.model, datedPoint(context, dayJd0, minutes, nuisances).residuals);
  return s.chiSquare + s.penalty;
}

/**
 * True when the point's chi-square + penalty is certainly above the ceiling (exceedsAtContext).
 */
function exceedsCeiling(context: DatedContext, shadows: readonly ShadowTermAt[], dayJd0: number, minutes: number, nuisances: readonly number[], ceiling: number, rowsOut: Float64Array): boolean {
  const { state, sun } = datedSun(context, dayJd0, minutes, nuisances);
  const ctx: EvaluationContext = {
    sun,
    nuisances,
    apparentMinutes: minutes,
    equationOfTimeMinutes: state.equationOfTimeMinutes,
    assumedClock: context.assumed,
    zoneOffsetMinutes: context.zoneOffset,
    moon: undefined, // the shape of datedPoint's context (src/solver/fitting.ts)
  };
  return exceedsAtContext(context.model, ctx, shadows, ceiling, rowsOut);
}

/**
 * True when a point's chi-square + penalty is certainly above the ceiling, judged from a part of
 * its residual rows summed in the order splitChiSquare sums them: first the soft penalties of the
 * facts (cheap; large wherever the sun is down or a wall whose shadow is measured is in shade), then
 * the shadows' rows, which open the measured chi-square. `rowsOut` holds one shadow's rows
 * (rowsBufferFor); the solver's grid and the report's map (src/charts/mapGrid.ts) both test with it.
 */
export function exceedsAtContext(model: EvidenceModel, ctx: EvaluationContext, shadows: readonly ShadowTermAt[], ceiling: number, rowsOut: Float64Array): boolean {
  let penalty = 0;
  for (const f of model.facts) {
    const r = factResidual(model, f, ctx);
    penalty += r * r;
    if (penalty > ceiling) return true;
  }
  let sum = 0;
  for (const t of shadows) {
    const n = evidenceResidualValues(t.evidence, ctx.sun, t.wallAzimuthDeg, rowsOut, 0);
    for (let k = 0; k < n; k += 1) sum += rowsOut[k] * rowsOut[k];
    if (sum > ceiling) return true;
  }
  return false;
}

/** Room for the rows of any one shadow of the model (none has more rows than the model's measured values). */
export function rowsBufferFor(model: EvidenceModel): Float64Array {
  return new Float64Array(Math.max(8, model.measuredCount));
}

/** A shadow term's evidence and wall azimuth at fixed nuisances, as evidenceResidualVector takes them. */
export interface ShadowTermAt {
  readonly evidence: ShadowEvidence;
  readonly wallAzimuthDeg: number;
}

/** The sun's shadows of the model at fixed nuisances. */
export function shadowTermsAt(model: EvidenceModel, nuisances: readonly number[]): ShadowTermAt[] {
  // The sun's shadows only: a shadow cast by moonlight is taken against the moon (evidenceModel.ts lightDirectionOf),
  // which this quick test does not evaluate; leaving its rows out keeps the partial sum a lower bound.
  return model.shadows.filter((t) => t.light !== 'moon').map((t) => ({ evidence: termEvidence(model, t, nuisances), wallAzimuthDeg: wallAzimuthOf(model, t.wallId, nuisances) }));
}

/**
 * The grid with the listed unfinished points computed exactly, each on the sun track its day column
 * was evaluated with, so that the values are those a grid without a ceiling gives.
 */
export function finishDayMinuteCells(model: EvidenceModel, spec: DayMinuteGridSpec, grid: DayMinuteGrid, cells: readonly (readonly [number, number])[]): DayMinuteGrid {
  if (cells.length === 0) return grid;
  const values = grid.values.map((row) => row.slice());
  const done = new Set<number>();
  let minimum = grid.minimum;
  let context: DatedContext | undefined;
  for (const [j, i] of [...cells].sort((a, b) => a[1] - b[1] || a[0] - b[0])) {
    const key = j * spec.dayJd0s.length + i;
    if (done.has(key) || values[j][i] !== Infinity) continue;
    done.add(key);
    const track = grid.tracks[i];
    if (context === undefined || context.track !== track) context = newDatedContext(model, spec.assumedClock, track.anchorJdUT, true, track);
    const v = valueAt(context, spec.dayJd0s[i], spec.minutes[j], spec.nuisances);
    values[j][i] = v;
    if (v < minimum) minimum = v;
  }
  const unfinished = grid.unfinished.filter(([j, i]) => values[j][i] === Infinity && !done.has(j * spec.dayJd0s.length + i));
  return { ...grid, values, minimum, unfinished };
}

/** Nuisance values of a candidate in the order of model.nuisances (the prior where the candidate has none). */
export function nuisancesOfCandidate(model: EvidenceModel, candidate: Candidate | undefined): number[] {
  return model.nuisances.map((n) => candidate?.nuisances.find((e) => e.name === n.name)?.fittedDeg ?? n.priorDeg);
}

/** The clock kind assumed by a candidate for clocks of unknown kind (null: none). */
export function assumedClockOfCandidate(candidate: Candidate | undefined): ClockKind | null {
  const a = candidate?.clockAssumption;
  if (!a || a.kind === 'none') return null;
  const { stated: _stated, ...kind } = a;
  return kind as ClockKind;
}
