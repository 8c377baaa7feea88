/**
 * Singular values and right singular vectors of a small dense matrix (m x n, m >= n, n up to a
 * dozen or so: the 2k x 9 system of a homography fit), on plain typed arrays without matrix
 * objects, for loops that fit thousands of times (a Monte Carlo of clicks).
 *
 * Method: Householder QR reduces A to its n x n triangle R (same singular values and right
 * singular vectors: A = QR, Q orthogonal; Golub and Van Loan, Matrix Computations, 4th ed. 2013,
 * section 5.2), then one-sided Jacobi rotations (Hestenes 1958) orthogonalise the columns of R,
 * accumulating the rotations in V (Golub and Van Loan, section 8.6.4; Demmel and Veselic 1992 on
 * its high relative accuracy). The singular values are the norms of the final columns.
 * Bounded: at most MAX_SWEEPS sweeps; `converged` says whether the last sweep found every pair
 * orthogonal to within 1e-15 relative (or negligible against the whole matrix, 1e-30 of its squared norm).
 */

/** Most sweeps of the Jacobi rotations (each sweep visits every pair of columns once). */
export const MAX_SWEEPS = 60;

export interface SmallSvd {
  /** Singular values, largest first. */
  readonly singularValues: readonly number[];
  /** Right singular vectors as columns of V, in the order of the singular values: v[j] is the j-th vector. */
  readonly rightVectors: readonly (readonly number[])[];
  readonly converged: boolean;
  readonly sweeps: number;
}

/**
 * SVD of an m x n matrix given row-major in `a` (length m n), m >= n; `a` is left unchanged.
 * @example smallSvd(Float64Array.from([3, 0, 0, 4]), 2, 2).singularValues // [4, 3]
 */
export function smallSvd(a: ArrayLike<number>, m: number, n: number): SmallSvd {
  // Householder QR, column by column; r holds the working copy (row-major m x n).
  const r = Float64Array.from(a as ArrayLike<number>);
  for (let k = 0; k < n; k += 1) {
    let norm = 0;
    for (let i = k; i < m; i += 1) norm += r[i * n + k] * r[i * n + k];
    norm = Math.sqrt(norm);
    if (norm === 0) continue;
    const alpha = r[k * n + k] > 0 ? -norm : norm;
    // v = x - alpha e1, stored in place below the diagonal; vtv = 2 norm (norm + |x_k|)
    const v0 = r[k * n + k] - alpha;
    const vtv = v0 * v0 + (norm * norm - r[k * n + k] * r[k * n + k]);
    if (vtv === 0) continue;
    for (let j = k + 1; j < n; j += 1) {
      let dot = v0 * r[k * n + j];
      for (let i = k + 1; i < m; i += 1) dot += r[i * n + k] * r[i * n + j];
      const f = (2 * dot) / vtv;
      r[k * n + j] -= f * v0;
      for (let i = k + 1; i < m; i += 1) r[i * n + j] -= f * r[i * n + k];
    }
    r[k * n + k] = alpha;
    for (let i = k + 1; i < m; i += 1) r[i * n + k] = 0;
  }
  // Columns of the n x n triangle, column-major for the rotations.
  const u = new Float64Array(n * n);
  for (let i = 0; i < n; i += 1) for (let j = i; j < n; j += 1) u[j * n + i] = r[i * n + j];
  const v = new Float64Array(n * n);
  for (let j = 0; j < n; j += 1) v[j * n + j] = 1;
  let frobenius2 = 0;
  for (let k = 0; k < n * n; k += 1) frobenius2 += u[k] * u[k];
  // A pair is orthogonal when |gamma| is below 1e-15 of its own scale, or below 1e-30 of the whole
  // matrix's (columns of a rank-deficient matrix shrink to rounding noise, whose angles never settle).
  const negligible = 1e-30 * frobenius2;
  let sweeps = 0;
  let converged = false;
  while (sweeps < MAX_SWEEPS && !converged) {
    sweeps += 1;
    converged = true;
    for (let p = 0; p < n - 1; p += 1) {
      for (let q = p + 1; q < n; q += 1) {
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        for (let i = 0; i < n; i += 1) {
          const up = u[p * n + i];
          const uq = u[q * n + i];
          alpha += up * up;
          beta += uq * uq;
          gamma += up * uq;
        }
        if (Math.abs(gamma) <= 1e-15 * Math.sqrt(alpha * beta) || Math.abs(gamma) <= negligible) continue;
        converged = false;
        // Rotation that makes columns p and q orthogonal (Golub and Van Loan, Algorithm 8.5.1, sym.schur2).
        const zeta = (beta - alpha) / (2 * gamma);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = c * t;
        for (let i = 0; i < n; i += 1) {
          const up = u[p * n + i];
          const uq = u[q * n + i];
          u[p * n + i] = c * up - s * uq;
          u[q * n + i] = s * up + c * uq;
          const vp = v[p * n + i];
          const vq = v[q * n + i];
          v[p * n + i] = c * vp - s * vq;
          v[q * n + i] = s * vp + c * vq;
        }
      }
    }
  }
  const order = Array.from({ length: n }, (_, j) => j);
  const norms = order.map((j) => {
    let s = 0;
    for (let i = 0; i < n; i += 1) s += u[j * n + i] * u[j * n + i];
    return Math.sqrt(s);
  });
  order.sort((x, y) => norms[y] - norms[x]);
  return {
    singularValues: order.map((j) => norms[j]),
    rightVectors: order.map((j) => Array.from(v.subarray(j * n, j * n + n))),
    converged,
    sweeps,
  };
}
