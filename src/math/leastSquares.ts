/**
 * Bounded Levenberg-Marquardt least squares: minimise the sum of squared residuals
 * chi2(x) = sum r_i(x)^2 over a box lower <= x <= upper.
 *
 * Method: Levenberg (1944), Marquardt (1963), as in Press et al., *Numerical Recipes*,
 * 3rd ed. (2007), section 15.5.2: solve (J^T J + lambda diag(J^T J)) dx = -J^T r,
 * accept the step if chi2 falls (lambda /= 10), else reject it (lambda *= 10).
 * Bounds by projection of each trial point onto the box (common practice for small
 * problems). Jacobian: the caller's, or central differences (Numerical Recipes 3rd ed.,
 * section 5.7) with the caller's steps. Linear algebra: solveSmallSystem below (the LU solve of
 * JAMA and ml-matrix on plain arrays), ml-matrix for the covariance's inverse.
 * Bounded: at most maxIterations accepted or rejected steps; the result says whether it
 * converged (relative fall of chi2 below `tolerance` on an accepted step with a small step,
 * or no further fall possible with lambda at its ceiling) and how many iterations it took.
 */
import { Matrix, inverse } from 'ml-matrix';

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
  const rows: number[][] = [];
  const xp = x.slice();
  for (let j = 0; j < n; j += 1) {
    const h = steps?.[j] ?? 1e-6 * (Math.abs(x[j]) + 1e-3);
    xp[j] = x[j] + h;
    const rp = residuals(xp);
    xp[j] = x[j] - h;
    const rm = residuals(xp);
    xp[j] = x[j];
    // Rows filled column by column (one row per residual, as the first column gives their number).
    if (j === 0) for (let i = 0; i < rp.length; i += 1) rows.push(new Array<number>(n));
    for (let i = 0; i < rows.length; i += 1) rows[i][j] = (rp[i] - rm[i]) / (2 * h);
  }
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
    const a = jtj.map((row, i) => row.map((v, j) => (i === j ? v + lambda * (v > 0 ? v : 1e-12) : v)));
    const dx = solveInPlace(a, jtr.map((v) => -v)); // a is this step's own copy
    if (dx === null) {
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
 * by LU decomposition with partial pivoting, in the left-looking (Crout/Doolittle, dot-product)
 * order of JAMA's LUDecomposition (Hicklin, Moler, Webb et al., NIST and MathWorks 1998), the
 * order ml-matrix follows, so that the result is the same to the last bit (Press et al.,
 * Numerical Recipes 3rd ed. 2007, section 2.3 on the method). Plain arrays, no matrix objects.
 * Null when A is singular (a zero pivot) or the result is not finite. A and b are left unchanged.
 * @example solveSmallSystem([[2, 0], [0, 4]], [2, 8]) // [1, 2]
 */
export function solveSmallSystem(a: readonly (readonly number[])[], b: readonly number[]): number[] | null {
  return solveInPlace(a.map((row) => row.slice()), b);
}

/** solveSmallSystem on a matrix the caller gives away: its rows are overwritten by the LU factors. */
function solveInPlace(lu: number[][], b: readonly number[]): number[] | null {
  const n = b.length;
  const piv = Array.from({ length: n }, (_, i) => i);
  const col = new Array<number>(n);
  for (let j = 0; j < n; j += 1) {
    for (let i = 0; i < n; i += 1) col[i] = lu[i][j];
    for (let i = 0; i < n; i += 1) {
      const row = lu[i];
      const kmax = Math.min(i, j);
      let s = 0;
      for (let k = 0; k < kmax; k += 1) s += row[k] * col[k];
      col[i] -= s;
      row[j] = col[i];
    }
    let p = j;
    for (let i = j + 1; i < n; i += 1) if (Math.abs(col[i]) > Math.abs(col[p])) p = i;
    if (p !== j) {
      [lu[p], lu[j]] = [lu[j], lu[p]];
      [piv[p], piv[j]] = [piv[j], piv[p]];
    }
    if (lu[j][j] !== 0) for (let i = j + 1; i < n; i += 1) lu[i][j] /= lu[j][j];
  }
  for (let j = 0; j < n; j += 1) if (lu[j][j] === 0) return null;
  const x = piv.map((i) => b[i]);
  for (let k = 0; k < n; k += 1) for (let i = k + 1; i < n; i += 1) x[i] -= x[k] * lu[i][k];
  for (let k = n - 1; k >= 0; k -= 1) {
    x[k] /= lu[k][k];
    for (let i = 0; i < k; i += 1) x[i] -= x[k] * lu[i][k];
  }
  return x.every(Number.isFinite) ? x : null;
}
