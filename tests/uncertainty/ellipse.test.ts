/**
 * Ellipses from a 2x2 covariance: Press et al., Numerical Recipes 3rd ed. (2007), section
 * 15.6.5 (the region dx^T C^-1 dx <= Delta chi2, its projections sqrt(Delta chi2 C_ii) on the
 * axes); Delta chi2 for 2 parameters from REFERENCES.md (2.30 for 68.3%, 5.991 for 95%).
 */
import { describe, expect, it } from 'vitest';
import { ellipseAt, ellipseBoundaryPoints, isPositiveDefinite, linearityError, principalAxes } from '../../src/uncertainty/ellipse.js';
import { expectClose } from '../helpers/expectClose.js';

describe('confidence ellipses', () => {
  it('gives axes-aligned semi-axes sqrt(q var) for a diagonal covariance', () => {
    const e = ellipseAt({ xx: 4, xy: 0, yy: 1 }, 5.991);
    expectClose(e.semiMajor, Math.sqrt(5.991 * 4), 1e-12, 'major');
    expectClose(e.semiMinor, Math.sqrt(5.991), 1e-12, 'minor');
    expectClose(e.orientationDeg, 0, 1e-12, 'orientation');
    expectClose(e.halfWidthX, Math.sqrt(5.991 * 4), 1e-12, 'projection on x (Numerical Recipes 15.6.5)');
  });

  it('turns the major axis to 45 deg for equal variances with positive correlation', () => {
    const ax = principalAxes({ xx: 1, xy: 0.5, yy: 1 });
    expectClose(ax.orientationDeg, 45, 1e-9, 'orientation');
    expectClose(ax.majorVariance, 1.5, 1e-12, 'eigenvalue 1 + rho');
    expectClose(ax.minorVariance, 0.5, 1e-12, 'eigenvalue 1 - rho');
  });

  it('puts the boundary points exactly on dx^T C^-1 dx = q', () => {
    const c = { xx: 2.5, xy: -1.2, yy: 0.9 };
    const det = c.xx * c.yy - c.xy * c.xy;
    for (const p of ellipseBoundaryPoints(c, 5.991, 12)) {
      const q = (c.yy * p.x * p.x - 2 * c.xy * p.x * p.y + c.xx * p.y * p.y) / det;
      expectClose(q, 5.991, 1e-9, 'Mahalanobis distance on the boundary');
    }
  });

  it('finds no linearity error for an exact quadratic and a large one for a quartic', () => {
    const c = { xx: 2, xy: 0.3, yy: 0.5 };
    const det = c.xx * c.yy - c.xy * c.xy;
    const quad = (x: number, y: number): number => (c.yy * x * x - 2 * c.xy * x * y + c.xx * y * y) / det;
    expect(linearityError(c, quad)).toBeLessThan(1e-9);
    expect(linearityError(c, (x, y) => quad(x, y) + 0.5 * x ** 4)).toBeGreaterThan(0.25);
  });

  describe('edge cases', () => {
    it('tells a positive-definite covariance from a singular one', () => {
      expect(isPositiveDefinite({ xx: 1, xy: 0.2, yy: 1 })).toBe(true);
      expect(isPositiveDefinite({ xx: 1, xy: 1, yy: 1 })).toBe(false);
      expect(isPositiveDefinite({ xx: NaN, xy: 0, yy: 1 })).toBe(false);
    });
  });
});
