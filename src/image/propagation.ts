/**
 * First-order propagation of clicking errors into a derived measurement, and
 * a Monte Carlo run of the same clicks to check it.
 *
 * Criminisi, A., Reid, I. and Zisserman, A., "A plane measuring device",
 * BMVC 1997 (and Image and Vision Computing 17, 1999, sec. 3): the
 * covariance of a measurement on a rectified plane has two parts, the error
 * of the homography (from the pixel errors of the correspondences) and the
 * errors of the measured points themselves, each carried through by its
 * Jacobian, Lambda_f = J Lambda_p J^T. Here the measurement is written as one
 * function of every clicked coordinate (correspondences and measured points,
 * the homography refitted inside), so one Jacobian carries both parts at once
 * and keeps their correlation (the two points of a segment share one
 * homography). The Jacobian is taken by central differences with a step of
 * 1e-3 sigma (error O(step^2), far below the sigma); clicks are taken as
 * independent with the given sigma per coordinate.
 *
 * Angular outputs are differenced on the circle (angleDiffDeg) so that a
 * direction near north does not jump by 360 degrees.
 */
import { angleDiffDeg } from '../math/angles.js';
import type { RandomSource } from '../math/random.js';

/** A measurement as a function of the input parameters (clicked coordinates, lengths). */
export type MeasurementFunction = (params: readonly number[]) => readonly number[];

export interface FirstOrderResult {
  readonly values: readonly number[];
  /** Standard deviation of each output. */
  readonly sigmas: readonly number[];
  /** Output covariance, outputs x outputs. */
  readonly covariance: readonly (readonly number[])[];
  /** Sigma of each output from each group of inputs alone (groups as labelled by the caller). */
  readonly sigmasByGroup: Readonly<Record<string, readonly number[]>>;
  /**
   * Departure from linearity of each output over +/-2 sigma along its steepest direction in the
   * inputs (scaled by their sigmas): max(|secant / tangent - 1|, |f+ + f- - 2 f0| / |f+ - f-|).
   * Near 0 when f is nearly linear over the clicking error; above ~0.1 the first-order sigma is not
   * to be trusted (common practice of checking a linearisation; the Monte Carlo spread decides).
   */
  readonly nonlinearity: readonly number[];
}

function difference(a: number, b: number, angular: boolean): number {
  return angular ? angleDiffDeg(a, b) : a - b;
}

/**
 * First-order covariance of f at p0 for independent inputs with the given sigmas.
 * @param angular per output: true for an angle in degrees (differenced on the circle)
 * @param groups per input: a label (e.g. 'plane', 'points', 'length') for the split of the sigma
 */
export function propagateFirstOrder(
  f: MeasurementFunction,
  p0: readonly number[],
  sigmas: readonly number[],
  angular: readonly boolean[],
  groups: readonly string[],
): FirstOrderResult {
  const values = f(p0);
  const m = values.length;
  const covariance = values.map(() => new Array<number>(m).fill(0));
  const byGroup: Record<string, number[]> = {};
  for (const g of groups) byGroup[g] ??= new Array<number>(m).fill(0);
  const columns: number[][] = [];
  const params = [...p0];
  for (let i = 0; i < p0.length; i++) {
    const sigma = sigmas[i];
    if (!(sigma > 0)) {
      columns.push(values.map(() => 0));
      continue;
    }
    const step = 1e-3 * sigma;
    params[i] = p0[i] + step;
    const plus = f(params);
    params[i] = p0[i] - step;
    const minus = f(params);
    params[i] = p0[i];
    // central difference dF/dp_i times sigma_i: one column of J * sqrt(Lambda_p)
    const column = values.map((_, k) => (difference(plus[k], minus[k], angular[k]) / (2 * step)) * sigma);
    columns.push(column);
    for (let a = 0; a < m; a++) {
      byGroup[groups[i]][a] += column[a] * column[a];
      for (let b = 0; b < m; b++) covariance[a][b] += column[a] * column[b];
    }
  }
  const sigmasByGroup: Record<string, number[]> = {};
  for (const [g, v] of Object.entries(byGroup)) sigmasByGroup[g] = v.map(Math.sqrt);
  const outSigmas = covariance.map((row, k) => Math.sqrt(row[k]));
  const t = 2; // sigmas along the steepest direction
  const nonlinearity = outSigmas.map((sk, k) => {
    if (!(sk > 0)) return 0;
    const plus = f(p0.map((p, i) => p + (t * sigmas[i] * columns[i][k]) / sk))[k];
    const minus = f(p0.map((p, i) => p - (t * sigmas[i] * columns[i][k]) / sk))[k];
    const dPlus = difference(plus, values[k], angular[k]);
    const dMinus = difference(minus, values[k], angular[k]);
    const secant = (dPlus - dMinus) / (2 * t);
    const spread = Math.abs(dPlus - dMinus);
    return Math.max(Math.abs(secant / sk - 1), spread > 0 ? Math.abs(dPlus + dMinus) / spread : Infinity);
  });
  return { values, sigmas: outSigmas, covariance, sigmasByGroup, nonlinearity };
}

export interface MonteCarloResult {
  readonly values: readonly number[];
  /** Mean of each output over the samples. */
  readonly means: readonly number[];
  /** Sample standard deviation of each output about its sample mean. */
  readonly sigmas: readonly number[];
  readonly samples: number;
}

/**
 * The spread of f when every input is perturbed by a normal error of its sigma.
 * @param rng a seeded generator (src/math/random.ts); the caller owns the seed
 */
export function monteCarloSpread(
  f: MeasurementFunction,
  p0: readonly number[],
  sigmas: readonly number[],
  angular: readonly boolean[],
  rng: RandomSource,
  samples: number,
): MonteCarloResult {
  const values = f(p0);
  const m = values.length;
  const sum = new Array<number>(m).fill(0);
  const sumSq = new Array<number>(m).fill(0);
  const params = [...p0];
  for (let s = 0; s < samples; s++) {
    for (let i = 0; i < p0.length; i++) params[i] = p0[i] + sigmas[i] * rng.normal();
    const out = f(params);
    for (let k = 0; k < m; k++) {
      const d = difference(out[k], values[k], angular[k]);
      sum[k] += d;
      sumSq[k] += d * d;
    }
  }
  const means = values.map((v, k) => v + sum[k] / samples); // angles: nominal plus the mean circular deviation
  const spread = sum.map((sk, k) => Math.sqrt(Math.max(0, (sumSq[k] - (sk * sk) / samples) / (samples - 1))));
  return { values, means, sigmas: spread, samples };
}
