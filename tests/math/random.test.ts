/** The seeded generator used by every Monte Carlo run. */
import { describe, expect, test } from 'vitest';
import { createRandom } from '../../src/math/random.js';

describe('createRandom', () => {
  test('the same seed gives the same sequence, another seed another one', () => {
    const a = createRandom(123);
    const b = createRandom(123);
    const c = createRandom(124);
    const sa = Array.from({ length: 5 }, () => a.uniform());
    expect(Array.from({ length: 5 }, () => b.uniform())).toEqual(sa);
    expect(Array.from({ length: 5 }, () => c.uniform())).not.toEqual(sa);
  });

  test('uniforms lie in [0, 1) and normals have mean 0 and sigma 1 within sampling error', () => {
    // sampling error of a mean of N standard normals: 1 / sqrt(N); of a variance: sqrt(2 / N) (common practice)
    const rng = createRandom(7);
    const n = 40000;
    let sum = 0;
    let sumSq = 0;
    for (let i = 0; i < n; i++) {
      const u = rng.uniform();
      expect(u >= 0 && u < 1).toBe(true);
      const z = rng.normal();
      sum += z;
      sumSq += z * z;
    }
    expect(Math.abs(sum / n)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(sumSq / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
  });
});
