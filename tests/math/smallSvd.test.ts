/**
 * The small SVD (QR, then one-sided Jacobi) against ml-matrix's SingularValueDecomposition (a
 * general-purpose npm reference library, Golub-Reinsch), and a worked example.
 */
import { describe, expect, it } from 'vitest';
import { Matrix, SingularValueDecomposition } from 'ml-matrix';
import { smallestRightVector, smallSvd } from '../../src/math/smallSvd.js';
import { createRandom } from '../../src/math/random.js';
import { expectClose } from '../helpers/expectClose.js';

describe('smallSvd', () => {
  it('gives the singular values 5 and 3 of [[3, 2, 2], [2, 3, -2]] (transposed to 3 x 2)', () => {
    // Worked example: A = [[3, 2, 2], [2, 3, -2]] has singular values 5 and 3 (common textbook
    // example, e.g. Strang, Introduction to Linear Algebra, ch. 7; from memory). A^T is 3 x 2.
    const s = smallSvd([3, 2, 2, 3, 2, -2], 3, 2);
    expectClose(s.singularValues[0], 5, 1e-13, 'sigma1');
    expectClose(s.singularValues[1], 3, 1e-13, 'sigma2');
    expect(s.converged).toBe(true);
  });

  it('agrees with ml-matrix on random m x 9 matrices (singular values and the last right vector)', () => {
    const rng = createRandom(17);
    for (let trial = 0; trial < 200; trial += 1) {
      const m = 9 + Math.floor(rng.uniform() * 12);
      const a = Array.from({ length: m * 9 }, () => rng.normal());
      if (trial % 4 === 0) for (let i = 0; i < m; i += 1) a[i * 9 + 8] = a[i * 9] + 2 * a[i * 9 + 1]; // rank 8: a null vector
      const ours = smallSvd(a, m, 9);
      const ref = new SingularValueDecomposition(new Matrix(Array.from({ length: m }, (_, i) => a.slice(i * 9, i * 9 + 9))));
      expect(ours.converged).toBe(true);
      ref.diagonal.forEach((v, j) => expectClose(ours.singularValues[j], v, 1e-11 * ref.diagonal[0], `sigma${j + 1}, trial ${trial}`));
      const refLast = Array.from({ length: 9 }, (_, i) => ref.rightSingularVectors.get(i, 8));
      const dot = refLast.reduce((s, v, i) => s + v * ours.rightVectors[8][i], 0);
      expectClose(Math.abs(dot), 1, 1e-9, `last right vector, trial ${trial}`);
    }
  });

  it('returns orthonormal right vectors and finds the exact null vector of a rank-deficient 9 x 9 matrix', () => {
    const rng = createRandom(5);
    const a = Array.from({ length: 81 }, (_, k) => (k >= 72 ? 0 : rng.normal())); // last row zero: 8 x 9 padded
    const s = smallSvd(a, 9, 9);
    for (let p = 0; p < 9; p += 1) {
      for (let q = 0; q < 9; q += 1) {
        const dot = s.rightVectors[p].reduce((sum, v, i) => sum + v * s.rightVectors[q][i], 0);
        expectClose(dot, p === q ? 1 : 0, 1e-13, `v${p}.v${q}`);
      }
    }
    for (let i = 0; i < 8; i += 1) {
      const r = s.rightVectors[8].reduce((sum, v, j) => sum + v * a[i * 9 + j], 0);
      expectClose(r, 0, 1e-13, `row ${i} times the null vector`);
    }
  });

  it('smallestRightVector agrees with the last right vector of ml-matrix, also with two nearly equal smallest singular values', () => {
    const rng = createRandom(29);
    for (let trial = 0; trial < 200; trial += 1) {
      const m = 9 + Math.floor(rng.uniform() * 12);
      const a = Array.from({ length: m * 9 }, () => rng.normal());
      if (trial % 4 === 0) for (let i = 0; i < m; i += 1) a[i * 9 + 8] = a[i * 9] - a[i * 9 + 3]; // rank 8
      if (trial % 4 === 1) for (let i = 0; i < m; i += 1) for (const j of [7, 8]) a[i * 9 + j] *= 1e-6; // two small, close values
      const ours = smallestRightVector(a, m, 9);
      const ref = new SingularValueDecomposition(new Matrix(Array.from({ length: m }, (_, i) => a.slice(i * 9, i * 9 + 9))));
      const refLast = Array.from({ length: 9 }, (_, i) => ref.rightSingularVectors.get(i, 8));
      const dot = refLast.reduce((sum, v, i) => sum + v * ours[i], 0);
      expectClose(Math.abs(dot), 1, 1e-9, `smallest right vector, trial ${trial}`);
    }
  });
});
