import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { linearScale, niceStep, niceTicks } from '../../src/charts/scale.js';
import { expectClose } from '../helpers/expectClose.js';

describe('linearScale', () => {
  it('maps the domain ends onto the range ends, also for an upward y axis', () => {
    const x = linearScale([0, 10], [100, 200]);
    expect(x(0)).toBe(100);
    expect(x(10)).toBe(200);
    expect(x(5)).toBe(150);
    const y = linearScale([0, 90], [400, 60]);
    expect(y(0)).toBe(400);
    expect(y(90)).toBe(60);
  });
  it('invert undoes the scale', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e4, max: 1e4, noNaN: true }), fc.double({ min: 1, max: 1e3, noNaN: true }), fc.double({ min: -1e4, max: 1e4, noNaN: true }), (d0, span, v) => {
        const s = linearScale([d0, d0 + span], [500, 20]);
        expectClose(s.invert(s(v)), v, 1e-6 * Math.max(1, Math.abs(v)), 'invert(scale(v))');
      }),
    );
  });
  describe('edge cases', () => {
    it('an empty domain does not divide by zero', () => {
      const s = linearScale([3, 3], [0, 100]);
      expect(Number.isFinite(s(3))).toBe(true);
      expect(Number.isFinite(s.invert(50))).toBe(true);
    });
  });
});

describe('nice ticks', () => {
  // Steps of 1, 2 or 5 x 10^n: the rule of Heckbert, "Nice numbers for graph labels", Graphics Gems (1990).
  it('chooses steps of 1, 2 or 5 times a power of ten', () => {
    expect(niceStep(0, 100, 5)).toBe(20);
    expect(niceStep(0, 90, 4)).toBe(20);
    expect(niceStep(0, 1, 10)).toBe(0.1);
    expect(niceStep(0, 7, 2)).toBe(5);
    fc.assert(
      fc.property(fc.double({ min: -1e5, max: 1e5, noNaN: true }), fc.double({ min: 1e-3, max: 1e5, noNaN: true }), fc.integer({ min: 1, max: 20 }), (lo, span, count) => {
        const step = niceStep(lo, lo + span, count);
        const mantissa = step / 10 ** Math.floor(Math.log10(step) + 1e-12);
        expect([1, 2, 5, 10].some((m) => Math.abs(mantissa - m) < 1e-9)).toBe(true);
      }),
    );
  });
  it('lists the multiples of the step inside the range, without binary noise', () => {
    expect(niceTicks(0, 90, 4)).toEqual([0, 20, 40, 60, 80]);
    expect(niceTicks(0.05, 0.35, 3)).toEqual([0.1, 0.2, 0.3]);
    expect(niceTicks(-3, 3, 6, 1)).toEqual([-3, -2, -1, 0, 1, 2, 3]);
    expect(niceTicks(180, 1260, 9, 120)).toEqual([240, 360, 480, 600, 720, 840, 960, 1080, 1200]);
  });
});
