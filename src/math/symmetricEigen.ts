/**
 * Eigenvalues and eigenvectors of a small real symmetric matrix by the cyclic
 * Jacobi method (Golub and Van Loan, *Matrix Computations*, 4th ed. (2013),
 * sec. 8.5.2-8.5.3, Algorithms 8.5.1 and 8.5.3).
 *
 * Meant for the 2x2 to 4x4 matrices of line fits, vanishing points and
 * rotations: exact to rounding (the off-diagonal mass falls quadratically once
 * small), deterministic, and smooth in the input where the eigenvalues are
 * distinct, so that it may sit inside a function differentiated numerically.
 * Bounded: at most MAX_SWEEPS sweeps; a matrix that has not converged by then
 * (not met with finite symmetric input) is returned as far as it got, with
 * `converged` false.
 */

export interface SymmetricEigen {
  /** Eigenvalues in ascending order. */
  readonly values: readonly number[];
  /** Unit eigenvectors, vectors[k] belonging to values[k]. */
  readonly vectors: readonly (readonly number[])[];
  readonly converged: boolean;
  readonly sweeps: number;
}

/** Sweeps allowed; a 4x4 needs 5 to 7 for full double precision (Golub and Van Loan, sec. 8.5.3). */
const MAX_SWEEPS = 50;

/**
 * Eigen-decomposition of a symmetric matrix (only the upper triangle is read).
 * @example symmetricEigen([[2, 1], [1, 2]]).values // [1, 3]
 */
export function symmetricEigen(matrix: readonly (readonly number[])[]): SymmetricEigen {
  const n = matrix.length;
  const a = matrix.map((row, i) => row.map((_, j) => (j >= i ? matrix[i][j] : matrix[j][i])));
  const v: number[][] = a.map((row, i) => row.map((_, j) => (i === j ? 1 : 0)));
  let scale = 0;
  for (const row of a) for (const x of row) scale += x * x;
  let sweeps = 0;
  let converged = false;
  for (; sweeps < MAX_SWEEPS; sweeps++) {
    let off = 0;
    for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) off += a[p][q] * a[p][q];
    if (off <= 1e-30 * scale || off === 0) {
      converged = true;
      break;
    }
    for (let p = 0; p < n; p++) {
      for (let q = p + 1; q < n; q++) {
        if (a[p][q] === 0) continue;
        // symmetric Schur decomposition of the 2x2 block (Golub and Van Loan, Algorithm 8.5.1)
        const tau = (a[q][q] - a[p][p]) / (2 * a[p][q]);
        const t = (tau >= 0 ? 1 : -1) / (Math.abs(tau) + Math.sqrt(1 + tau * tau));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k][p];
          const akq = a[k][q];
          a[k][p] = c * akp - s * akq;
          a[k][q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p][k];
          const aqk = a[q][k];
          a[p][k] = c * apk - s * aqk;
          a[q][k] = s * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vkp = v[k][p];
          const vkq = v[k][q];
          v[k][p] = c * vkp - s * vkq;
          v[k][q] = s * vkp + c * vkq;
        }
      }
    }
  }
  const order = a.map((_, i) => i).sort((i, j) => a[i][i] - a[j][j]);
  return {
    values: order.map((i) => a[i][i]),
    vectors: order.map((i) => v.map((row) => row[i])),
    converged,
    sweeps,
  };
}
