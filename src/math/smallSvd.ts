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
  const r = triangularFactor(a, m, n);
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
      const pn = p * n;
      for (let q = p + 1; q < n; q += 1) {
        const qn = q * n;
        let alpha = 0;
        let beta = 0;
        let gamma = 0;
        for (let i = 0; i < n; i += 1) {
          const up = u[pn + i];
          const uq = u[qn + i];
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
          const up = u[pn + i];
          const uq = u[qn + i];
          u[pn + i] = c * up - s * uq;
          u[qn + i] = s * up + c * uq;
          const vp = v[pn + i];
          const vq = v[qn + i];
          v[pn + i] = c * vp - s * vq;
          v[qn + i] = s * vp + c * vq;
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

/**
 * The n x n upper triangle R of A = QR by Householder reflections (Golub and Van Loan, section 5.2),
 * row-major in an m x n array whose rows below n are zero; `a` (m x n, row-major) is left unchanged.
 */
function triangularFactor(a: ArrayLike<number>, m: number, n: number): Float64Array {
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
  return r;
}

/** Most steps of the inverse iteration in smallestRightVector before it gives way to the full SVD. */
export const MAX_INVERSE_STEPS = 30;

/**
 * The right singular vector of the smallest singular value of A (m x n, m >= n): the least-squares
 * null vector, as the normalised DLT needs. Inverse iteration on R^T R with the triangle R of A = QR
 * (two triangular solves a step; Golub and Van Loan, section 8.2.2; it converges by the squared ratio
 * of the two smallest singular values a step, in one or two steps for a homography fit). When it has
 * not settled to 1e-15 in MAX_INVERSE_STEPS steps (two nearly equal smallest singular values) the
 * vector of smallSvd is returned. Sign: as it comes (callers normalise).
 */
export function smallestRightVector(a: ArrayLike<number>, m: number, n: number): number[] {
  const r = triangularFactor(a, m, n);
  let scale = 0;
  for (let i = 0; i < n; i += 1) scale = Math.max(scale, Math.abs(r[i * n + i]));
  const floor = 1e-300 + 1e-30 * scale; // a zero pivot (an exact null vector) made tiny, not zero
  const x = new Float64Array(n).fill(1 / Math.sqrt(n));
  const y = new Float64Array(n);
  for (let step = 0; step < MAX_INVERSE_STEPS; step += 1) {
    // R^T y = x (forward), then R z = y (back), z into y.
    for (let i = 0; i < n; i += 1) {
      let s = x[i];
      for (let k = 0; k < i; k += 1) s -= r[k * n + i] * y[k];
      const d = Math.abs(r[i * n + i]) < floor ? (r[i * n + i] < 0 ? -floor : floor) : r[i * n + i];
      y[i] = s / d;
    }
    for (let i = n - 1; i >= 0; i -= 1) {
      let s = y[i];
      for (let k = i + 1; k < n; k += 1) s -= r[i * n + k] * y[k];
      const d = Math.abs(r[i * n + i]) < floor ? (r[i * n + i] < 0 ? -floor : floor) : r[i * n + i];
      y[i] = s / d;
    }
    let norm = 0;
    for (let i = 0; i < n; i += 1) norm += y[i] * y[i];
    norm = Math.sqrt(norm);
    if (!(norm > 0) || !Number.isFinite(norm)) break;
    let dot = 0;
    for (let i = 0; i < n; i += 1) {
      y[i] /= norm;
      dot += y[i] * x[i];
    }
    x.set(y);
    if (1 - Math.abs(dot) <= 1e-15) return Array.from(x);
  }
  return [...smallSvd(a, m, n).rightVectors[n - 1]];
}
