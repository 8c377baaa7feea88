/**
 * Profile-likelihood interval: Delta chi2 <= 3.841 for one parameter (NIST/SEMATECH e-Handbook
 * chi-square table, 1 dof, 95%; Press et al., Numerical Recipes 3rd ed. 2007, section 15.6.5).
 * Checked on profiles whose interval is known in closed form.
 */
import { describe, expect, it } from 'vitest';
import { profileScan } from '../../src/uncertainty/profileScan.js';

describe('profile scan', () => {
  it('finds +/- 1.96 sigma for a parabola (sigma 3 steps: the whole steps within 5.88)', () => {
    const s = profileScan((k) => ({ objective: 10 + (k / 3) ** 2, other: 100 + k }), 50);
    expect(s.from).toBe(-5);
    expect(s.to).toBe(5);
    expect(s.open).toBe(false);
    expect(s.otherMin).toBe(95);
    expect(s.otherMax).toBe(105);
  });

  it('handles a flat-bottomed (solstice-like) profile, asymmetric about the start', () => {
    // chi2 = (k - 4)^4 / 100: Delta chi2 <= 3.841 for |k - 4| <= 4.43 -> k in [0, 8].
    const s = profileScan((k) => ({ objective: (k - 4) ** 4 / 100, other: 0 }), 50);
    expect(s.from).toBe(0);
    expect(s.to).toBe(8);
  });

  it('says when the interval is open at the scan limit', () => {
    const s = profileScan((k) => ({ objective: Math.abs(k) * 0.01, other: 0 }), 20);
    expect(s.open).toBe(true);
    expect(s.to).toBe(20);
  });

  describe('edge cases', () => {
    it('skips steps that are not allowed and still brackets the interval', () => {
      const s = profileScan((k) => (k % 2 === 0 ? { objective: k * k, other: 0 } : null), 30);
      expect(s.from).toBe(0);
      expect(s.to).toBe(0);
      expect(s.points.every((p) => p.offset % 2 === 0)).toBe(true);
    });
  });
});
