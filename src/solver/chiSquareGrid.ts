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
import { longitudeOf, splitChiSquare, type EvidenceModel } from './evidenceModel.js';
import { datedPoint, ensureTrack, newDatedContext } from './fitting.js';

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
}

export interface DayMinuteGrid {
  readonly dayJd0s: readonly number[];
  readonly minutes: readonly number[];
  /** chi-square + soft penalty at (minutes[j], dayJd0s[i]): values[j][i]. */
  readonly values: readonly (readonly number[])[];
  readonly minimum: number;
  readonly evaluations: number;
}

/**
 * The grid of chi-square + penalty values.
 * @example chiSquareOnDayMinuteGrid(model, { dayJd0s: [2323000.5], minutes: [600, 660], assumedClock: null, nuisances: priorsOf(model) })
 */
export function chiSquareOnDayMinuteGrid(model: EvidenceModel, spec: DayMinuteGridSpec): DayMinuteGrid {
  const values: number[][] = spec.minutes.map(() => new Array<number>(spec.dayJd0s.length).fill(NaN));
  let minimum = Infinity;
  let evaluations = 0;
  if (spec.dayJd0s.length === 0) return { dayJd0s: [], minutes: spec.minutes, values, minimum, evaluations };
  const lon = longitudeOf(model, spec.nuisances);
  const context = newDatedContext(model, spec.assumedClock, spec.dayJd0s[0] + 0.5 - lon / 360);
  spec.dayJd0s.forEach((dayJd0, i) => {
    ensureTrack(context, dayJd0 + 0.5 - lon / 360);
    spec.minutes.forEach((m, j) => {
      const p = datedPoint(context, dayJd0, m, spec.nuisances);
      const s = splitChiSquare(model, p.residuals);
      const v = s.chiSquare + s.penalty;
      values[j][i] = v;
      if (v < minimum) minimum = v;
      evaluations += 1;
    });
    spec.onProgress?.(i + 1, spec.dayJd0s.length);
  });
  return { dayJd0s: spec.dayJd0s, minutes: spec.minutes, values, minimum, evaluations };
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
