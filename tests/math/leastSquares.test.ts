import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/expectClose.js';
import { covarianceFromJacobian, levenbergMarquardt } from '../../src/math/leastSquares.js';

/**
 * NIST Statistical Reference Datasets, nonlinear regression, "Misra1a" (Misra, D., NIST 1978,
 * dental research monomolecular adsorption study; lower level of difficulty):
 * y = b1 (1 - exp(-b2 x)), 14 observations, certified values b1 = 2.3894212918E+02
 * (sd 2.7070075241E+00), b2 = 5.5015643181E-04 (sd 7.2668688436E-06), residual sum of squares
 * 1.2455138894E-01, residual standard deviation 1.0187876330E-01, 12 degrees of freedom;
 * starting values (500, 1e-4) and (250, 5e-4).
 */
const X = [77.6, 114.9, 141.1, 190.8, 239.9, 289.0, 332.8, 378.4, 434.8, 477.3, 536.8, 593.1, 689.1, 760.0];
const Y = [10.07, 14.73, 17.94, 23.93, 29.61, 35.18, 40.02, 44.82, 50.76, 55.05, 61.01, 66.4, 75.47, 81.78];
const CERTIFIED = { b1: 2.3894212918e2, b2: 5.5015643181e-4, sd1: 2.7070075241, sd2: 7.2668688436e-6, rss: 1.2455138894e-1, rsd: 1.018787633e-1 };

const residuals = ([b1, b2]: readonly number[]): number[] => X.map((x, i) => b1 * (1 - Math.exp(-b2 * x)) - Y[i]);
const jacobian = ([b1, b2]: readonly number[]): number[][] => X.map((x) => [1 - Math.exp(-b2 * x), b1 * x * Math.exp(-b2 * x)]);

describe('bounded Levenberg-Marquardt (Numerical Recipes 3rd ed. 15.5)', () => {
  for (const start of [[500, 1e-4], [250, 5e-4]]) {
    it(`reaches the NIST certified Misra1a values from start (${start.join(', ')})`, () => {
      const r = levenbergMarquardt({ residuals, jacobian }, start, { maxIterations: 200, tolerance: 1e-14 });
      expect(r.converged).toBe(true);
      expect(r.iterations).toBeLessThanOrEqual(200);
      // NIST StRD Misra1a certified values (to 11 digits); we ask for 8 significant digits.
      expectClose(r.x[0], CERTIFIED.b1, 1e-8 * CERTIFIED.b1, 'b1');
      expectClose(r.x[1], CERTIFIED.b2, 1e-8 * CERTIFIED.b2, 'b2');
      expectClose(r.chiSquare, CERTIFIED.rss, 1e-9 * CERTIFIED.rss + 1e-12, 'residual sum of squares');
      // Certified standard deviations = sqrt(diag((J^T J)^-1)) * residual sd.
      const cov = covarianceFromJacobian(r.jacobian, 2)!;
      const s2 = r.chiSquare / (X.length - 2);
      expectClose(Math.sqrt(s2), CERTIFIED.rsd, 1e-8, 'residual standard deviation');
      expectClose(Math.sqrt(cov[0][0] * s2), CERTIFIED.sd1, 1e-5 * CERTIFIED.sd1, 'sd of b1');
      expectClose(Math.sqrt(cov[1][1] * s2), CERTIFIED.sd2, 1e-5 * CERTIFIED.sd2, 'sd of b2');
    });
  }

  it('converges with central-difference Jacobians too (NIST Misra1a, start 2)', () => {
    const r = levenbergMarquardt({ residuals, steps: [1e-4, 1e-10] }, [250, 5e-4], { maxIterations: 200, tolerance: 1e-14 });
    expect(r.converged).toBe(true);
    expectClose(r.x[0], CERTIFIED.b1, 1e-6 * CERTIFIED.b1, 'b1');
    expectClose(r.x[1], CERTIFIED.b2, 1e-6 * CERTIFIED.b2, 'b2');
  });

  describe('edge cases', () => {
    it('respects a bound: the minimum of (x - 3)^2 over x <= 2 is at the bound', () => {
      const r = levenbergMarquardt({ residuals: ([x]) => [x - 3], upper: [2] }, [0]);
      expectClose(r.x[0], 2, 1e-12, 'bounded x');
      expect(r.converged).toBe(true);
    });
    it('reports a singular problem as a null covariance', () => {
      // Two parameters that enter only as their sum: J^T J is singular (common practice).
      const r = levenbergMarquardt({ residuals: ([a, b]) => [a + b - 1, a + b - 1.2] }, [0, 0]);
      expect(covarianceFromJacobian(r.jacobian, 2)).toBeNull();
    });
    it('stops within its iteration bound and says so', () => {
      const r = levenbergMarquardt({ residuals, jacobian }, [500, 1e-4], { maxIterations: 2 });
      expect(r.iterations).toBe(2);
      expect(r.converged).toBe(false);
    });
  });
});
