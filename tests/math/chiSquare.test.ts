import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/expectClose.js';
import {
  chiSquarePValue,
  chiSquareQuantile,
  DELTA_CHI2_1DOF_95,
  DELTA_CHI2_2DOF_68,
  DELTA_CHI2_2DOF_95,
  lnGamma,
  regularizedGammaP,
  regularizedGammaQ,
} from '../../src/math/chiSquare.js';

/**
 * Upper-tail critical values of the chi-square distribution, NIST/SEMATECH e-Handbook of
 * Statistical Methods, section 1.3.6.7.4 ("Critical Values of the Chi-Square Distribution"),
 * printed to three decimals. Rows: [degrees of freedom, upper-tail probability, value].
 * (Values as in that table, also listed for 2 dof in /work/shared/REFERENCES.md.)
 */
const NIST_TABLE: readonly (readonly [number, number, number])[] = [
  [1, 0.05, 3.841],
  [1, 0.01, 6.635],
  [1, 0.001, 10.828],
  [2, 0.05, 5.991],
  [2, 0.01, 9.21],
  [2, 0.001, 13.816],
  [3, 0.05, 7.815],
  [4, 0.05, 9.488],
  [5, 0.05, 11.07],
  [5, 0.01, 15.086],
  [10, 0.05, 18.307],
  [10, 0.01, 23.209],
  [15, 0.05, 24.996],
  [30, 0.05, 43.773],
];

describe('chi-square p-values (regularised incomplete gamma, Numerical Recipes 3rd ed. 6.2)', () => {
  it('gives the tabulated upper-tail probability at each NIST critical value', () => {
    for (const [dof, p, x] of NIST_TABLE) {
      // The table rounds x to 3 decimals: allow the p change of that rounding (density * 0.0005).
      expectClose(chiSquarePValue(x, dof), p, 0.0005 * 0.1 + p * 0.002, `Q(${dof}/2, ${x}/2)`);
    }
  });

  it('inverts to the NIST critical values', () => {
    for (const [dof, p, x] of NIST_TABLE) expectClose(chiSquareQuantile(p, dof), x, 0.0006, `quantile ${p} with ${dof} dof`);
  });

  it('matches the closed form exp(-x/2) for 2 degrees of freedom', () => {
    // Chi-square with 2 dof is exponential: Q = exp(-x / 2) (common practice; REFERENCES.md, error ellipses).
    for (const x of [0, 0.1, 1, 2.3, 5.991, 9.21, 20, 60]) expectClose(chiSquarePValue(x, 2), Math.exp(-x / 2), 1e-13, `x = ${x}`);
    expectClose(DELTA_CHI2_2DOF_95, 5.991, 0.0005, '95% for 2 parameters (REFERENCES.md)');
    expectClose(DELTA_CHI2_2DOF_68, 2.3, 0.005, '68.3% for 2 parameters (Numerical Recipes 15.6: 2.30)');
    expectClose(DELTA_CHI2_1DOF_95, 3.841, 0.0005, '95% for 1 parameter (NIST table)');
    // REFERENCES.md: the 1-sigma ellipse (Delta chi2 = 1) holds 39.35%.
    expectClose(1 - chiSquarePValue(1, 2), 0.3935, 0.00005, 'Delta chi2 = 1 with 2 dof');
  });

  it('matches the closed form for 1 degree of freedom: Q(1/2, x/2) = erfc(sqrt(x/2))', () => {
    // Pr(|Z| > 1) = 0.3173, Pr(|Z| > 2) = 0.0455, Pr(|Z| > 3) = 0.0027 (normal tail areas, common practice).
    expectClose(chiSquarePValue(1, 1), 0.31731, 0.00001, '1 sigma');
    expectClose(chiSquarePValue(4, 1), 0.0455, 0.0001, '2 sigma');
    expectClose(chiSquarePValue(9, 1), 0.0027, 0.0001, '3 sigma');
  });

  describe('edge cases', () => {
    it('is 1 at zero and falls to 0 far in the tail', () => {
      expect(chiSquarePValue(0, 3)).toBe(1);
      expect(chiSquarePValue(1e4, 3)).toBeLessThan(1e-300 + 1e-200);
    });
    it('P + Q = 1 on both sides of the series/fraction switch (x = a + 1)', () => {
      for (const [a, x] of [[0.5, 0.2], [0.5, 3], [5, 5.9], [5, 6.1], [50, 40], [50, 70]] as const) {
        expectClose(regularizedGammaP(a, x) + regularizedGammaQ(a, x), 1, 1e-14, `a ${a}, x ${x}`);
      }
    });
    it('ln Gamma matches factorials (Gamma(n) = (n - 1)!)', () => {
      expectClose(lnGamma(1), 0, 1e-14, 'ln 0!');
      expectClose(lnGamma(5), Math.log(24), 1e-13, 'ln 4!');
      expectClose(lnGamma(11), Math.log(3628800), 1e-12, 'ln 10!');
      expectClose(lnGamma(0.5), 0.5 * Math.log(Math.PI), 1e-13, 'Gamma(1/2) = sqrt(pi)');
    });
  });
});

describe('chi-square p-values far in the tail', () => {
  it('are 0 for an enormous or infinite chi-square, not a convergence error', async () => {
    const { chiSquarePValue } = await import('../../src/math/chiSquare.js');
    // 2 dof closed form: Q = exp(-x/2) (NIST/SEMATECH e-Handbook, chi-square distribution); exp(-1e6) underflows to 0.
    expect(chiSquarePValue(2e6, 2)).toBe(0);
    expect(chiSquarePValue(Infinity, 4)).toBe(0);
    expect(chiSquarePValue(1e300, 1)).toBe(0);
    // Still exact below the cut: 2 dof, chi2 = 1000 gives exp(-500).
    expect(chiSquarePValue(1000, 2) / Math.exp(-500)).toBeCloseTo(1, 9);
  });
});
