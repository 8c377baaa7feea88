import { describe, expect, it } from 'vitest';
import { hypot2 } from '../../src/math/angles.js';
import { createRandom } from '../../src/math/random.js';

describe('hypot2', () => {
  it('gives 5 for 3 and 4 (the 3-4-5 right triangle, common practice)', () => {
    expect(hypot2(3, 4)).toBe(5);
  });

  it('equals Math.hypot to the last bit at 200,000 random pairs over 40 orders of magnitude (ECMAScript Math.hypot, from its definition)', () => {
    const random = createRandom(14);
    let unequal = 0;
    for (let i = 0; i < 100000; i += 1) {
      const a = (2 * random.uniform() - 1) * 10 ** Math.floor(40 * random.uniform() - 20);
      const b = (2 * random.uniform() - 1) * 10 ** Math.floor(40 * random.uniform() - 20);
      if (!Object.is(hypot2(a, b), Math.hypot(a, b))) unequal += 1;
      // The sun's unit vector on a wall's axes, as the solver takes it (src/geometry/shadowAngles.ts).
      const u = -Math.cos(random.uniform()) * Math.sin(7 * random.uniform());
      const up = Math.sin(2 * random.uniform() - 1);
      if (!Object.is(hypot2(u, up), Math.hypot(u, up))) unequal += 1;
    }
    expect(unequal).toBe(0);
  });

  describe('edge cases', () => {
    it('follows the ECMAScript special cases: infinity before NaN, +0 for two zeros (ECMAScript Math.hypot)', () => {
      for (const [a, b] of [[Infinity, NaN], [NaN, -Infinity], [NaN, 1], [0, -0], [-0, -0], [1e308, 1e308], [5e-324, 5e-324], [-3, 0]] as const) {
        expect(Object.is(hypot2(a, b), Math.hypot(a, b))).toBe(true);
      }
    });
  });
});
