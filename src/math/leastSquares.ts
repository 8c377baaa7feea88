/**
 * Bounded Levenberg-Marquardt least squares: minimise the sum of squared residuals
 * chi2(x) = sum r_i(x)^2 over a box lower <= x <= upper.
 *
 * Method: Levenberg (1944), Marquardt (1963), as in Press et al., *Numerical Recipes*,
 * 3rd ed. (2007), section 15.5.2: solve (J^T J + lambda diag(J^T J)) dx = -J^T r,
 * accept the step if chi2 falls (lambda /= 10), else reject it (lambda *= 10).
 * Bounds by projection of each trial point onto the box (common practice for small
 * problems). Jacobian: the caller's, or central differences (Numerical Recipes 3rd ed.,
 * section 5.7) with the caller's steps. Linear algebra: ml-matrix (LU solve, inverse).
 * Bounded: at most maxIterations accepted or rejected steps; the result says whether it
 * converged (relative fall of chi2 below `tolerance` on an accepted step with a small step,
 * or no further fall possible with lambda at its ceiling) and how many iterations it took.
 */
import { Matrix, solve, inverse } from 'ml-matrix';

export interface LeastSquaresProblem {
  /** Residuals at x (already divided by their sigmas). */
  readonly residuals: (x: readonly number[]) => number[];
  /** Jacobian rows d r_i / d x_j; if absent, central differences with `steps`. */
  readonly jacobian?: (x: readonly number[], r: readonly number[]) => number[][];
  /** Finite-difference step per parameter (default 1e-6 (|x_j| + 1e-3)). */
  readonly steps?: readonly number[];
  readonly lower?: readonly number[];
  readonly upper?: readonly number[];
}

export interface LeastSquaresOptions {
  readonly maxIterations?: number; // default 100
  readonly tolerance?: number; // relative chi2 change, default 1e-10
  readonly initialLambda?: number; // default 1e-3
}

export interface LeastSquaresResult {
  readonly x: number[];
  readonly residuals: number[];
  readonly chiSquare: number;
  readonly jacobian: number[][];
  readonly converged: boolean;
  readonly iterations: number;
}

const LAMBDA_CEILING = 1e12;

function sumSquares(r: readonly number[]): number {
  let s = 0;
  for (const v of r) s += v * v;
  return s;
}

function clampToBox(x: number[], lower?: readonly number[], upper?: readonly number[]): number[] {
  for (let j = 0; j < x.length; j += 1) {
    if (lower && x[j] < lower[j]) x[j] = lower[j];
    if (upper && x[j] > upper[j]) x[j] = upper[j];
  }
  return x;
}

/** Central-difference Jacobian d r_i / d x_j (Numerical Recipes 3rd ed., section 5.7). */
export function centralDifferenceJacobian(
  residuals: (x: readonly number[]) => number[],
  x: readonly number[],
  steps?: readonly number[],
): number[][] {
  const n = x.length;
  const columns: number[][] = [];
  for (let j = 0; j < n; j += 1) {
    const h = steps?.[j] ?? 1e-6 * (Math.abs(x[j]) + 1e-3);
    const xp = x.slice();
    const xm = x.slice();
    xp[j] += h;
    xm[j] -= h;
    const rp = residuals(xp);
    const rm = residuals(xm);
    columns.push(rp.map((v, i) => (v - rm[i]) / (2 * h)));
  }
  const m = columns.length > 0 ? columns[0].length : 0;
  const rows: number[][] = [];
  for (let i = 0; i < m; i += 1) rows.push(columns.map((c) => c[i]));
  return rows;
}

/** J^T J and J^T r of a Jacobian given by rows. */
function normalEquations(jac: readonly number[][], r: readonly number[], n: number): { jtj: number[][]; jtr: number[] } {
  const jtj = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const jtr = new Array<number>(n).fill(0);
  for (let i = 0; i < jac.length; i += 1) {
    const row = jac[i];
    for (let a = 0; a < n; a += 1) {
      if (row[a] === 0) continue;
      jtr[a] += row[a] * r[i];
      for (let b = a; b < n; b += 1) jtj[a][b] += row[a] * row[b];
    }
  }
  for (let a = 0; a < n; a += 1) for (let b = 0; b < a; b += 1) jtj[a][b] = jtj[b][a];
  return { jtj, jtr };
}

/**
 * Minimise sum r(x)^2 from x0 by bounded Levenberg-Marquardt.
 * @example levenbergMarquardt({ residuals: ([a]) => [a - 3] }, [0]).x // [3]
 */
export function levenbergMarquardt(
  problem: LeastSquaresProblem,
  x0: readonly number[],
  options: LeastSquaresOptions = {},
): LeastSquaresResult {
  const maxIterations = options.maxIterations ?? 100;
  const tolerance = options.tolerance ?? 1e-10;
  const n = x0.length;
  const jacobianAt = (x: readonly number[], r: readonly number[]): number[][] =>
    problem.jacobian ? problem.jacobian(x, r) : centralDifferenceJacobian(problem.residuals, x, problem.steps);
  let x = clampToBox(x0.slice(), problem.lower, problem.upper);
  let r = problem.residuals(x);
  let chi2 = sumSquares(r);
  let jac = jacobianAt(x, r);
  let { jtj, jtr } = normalEquations(jac, r, n);
  let lambda = options.initialLambda ?? 1e-3;
  let iterations = 0;
  let converged = false;
  while (iterations < maxIterations) {
    iterations += 1;
    const a = new Matrix(jtj.map((row, i) => row.map((v, j) => (i === j ? v + lambda * (v > 0 ? v : 1e-12) : v))));
    let dx: number[];
    try {
      dx = solve(a, Matrix.columnVector(jtr.map((v) => -v))).to1DArray();
    } catch {
      lambda *= 10;
      if (lambda > LAMBDA_CEILING) break;
      continue;
    }
    if (dx.some((v) => !Number.isFinite(v))) {
      lambda *= 10;
      if (lambda > LAMBDA_CEILING) break;
      continue;
    }
    const trial = clampToBox(x.map((v, j) => v + dx[j]), problem.lower, problem.upper);
    const rTrial = problem.residuals(trial);
    const chi2Trial = sumSquares(rTrial);
    if (Number.isFinite(chi2Trial) && chi2Trial <= chi2) {
      const fall = chi2 - chi2Trial;
      let stepSmall = true;
      for (let j = 0; j < n; j += 1) {
        const scale = problem.steps?.[j] ?? 1e-6 * (Math.abs(x[j]) + 1e-3);
        if (Math.abs(trial[j] - x[j]) > 10 * scale) stepSmall = false;
      }
      x = trial;
      r = rTrial;
      chi2 = chi2Trial;
      jac = jacobianAt(x, r);
      ({ jtj, jtr } = normalEquations(jac, r, n));
      lambda = Math.max(lambda / 10, 1e-12);
      if (fall <= tolerance * Math.max(chi2, 1e-300) || (stepSmall && fall <= 1e-6 * Math.max(chi2, 1e-12)) || chi2 < 1e-28) {
        converged = true;
        break;
      }
    } else {
      lambda *= 10;
      if (lambda > LAMBDA_CEILING) {
        converged = true; // no step lowers chi2 any more: a (possibly bounded) minimum
        break;
      }
    }
  }
  return { x, residuals: r, chiSquare: chi2, jacobian: jac, converged, iterations };
}

/**
 * Covariance (J^T J)^-1 of the parameters at a least-squares minimum with unit-sigma
 * residuals (Numerical Recipes 3rd ed., section 15.5, eq. 15.5.15); null when J^T J is singular.
 */
export function covarianceFromJacobian(jac: readonly number[][], n: number): number[][] | null {
  const { jtj } = normalEquations(jac, new Array<number>(jac.length).fill(0), n);
  for (let a = 0; a < n; a += 1) if (!(jtj[a][a] > 0)) return null;
  try {
    const inv = inverse(new Matrix(jtj)).to2DArray();
    for (let a = 0; a < n; a += 1) {
      // inv[a][a] jtj[a][a] >= 1 for a positive-definite matrix; a huge value means near-singular.
      if (!(inv[a][a] > 0) || !Number.isFinite(inv[a][a]) || inv[a][a] * jtj[a][a] > 1e12) return null;
    }
    return inv;
  } catch {
    return null;
  }
}

/**
 * Solution of a small dense linear system A x = b (A n x n given by rows, n up to a few dozen)
 * by Gaussian elimination with partial pivoting (Press et al., Numerical Recipes 3rd ed. 2007,
 * section 2.1); plain arrays, no matrix objects. Null when A is singular (a pivot below
 * 1e-300 or a non-finite result). A and b are left unchanged.
 * @example solveSmallSystem([[2, 0], [0, 4]], [2, 8]) // [1, 2]
 */
export function solveSmallSystem(a: readonly (readonly number[])[], b: readonly number[]): number[] | null {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]]);
  for (let col = 0; col < n; col += 1) {
    let pivot = col;
    for (let i = col + 1; i < n; i += 1) if (Math.abs(m[i][col]) > Math.abs(m[pivot][col])) pivot = i;
    if (!(Math.abs(m[pivot][col]) > 1e-300)) return null;
    if (pivot !== col) [m[pivot], m[col]] = [m[col], m[pivot]];
    const rowCol = m[col];
    for (let i = col + 1; i < n; i += 1) {
      const f = m[i][col] / rowCol[col];
      if (f === 0) continue;
      const row = m[i];
      for (let j = col; j <= n; j += 1) row[j] -= f * rowCol[j];
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let i = n - 1; i >= 0; i -= 1) {
    let s = m[i][n];
    for (let j = i + 1; j < n; j += 1) s -= m[i][j] * x[j];
    x[i] = s / m[i][i];
    if (!Number.isFinite(x[i])) return null;
  }
  return x;
}
