/**
 * Values of the residuals away from the truth: the wrap and side conventions of
 * the rod, and the first-order equivalence of the angle-scale residuals of ratio
 * evidence with (predicted ratio - observed ratio) / sigma (Taylor, An Introduction
 * to Error Analysis, 2nd ed. 1997, ch. 3: first-order propagation).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evidenceResiduals, predictEvidence, type ShadowEvidence } from '../../src/geometry/observationModels.js';
import { expectClose } from '../helpers/expectClose.js';
import { predictFinShadow, predictRodShadow } from '../../src/geometry/wallShadows.js';

describe('rod residuals', () => {
  // Sun 210 / 40 on a south wall: slope 59.2103 deg to the right (hand value in shadowAngles.test.ts).
  const sun = { azimuthDeg: 210, altitudeDeg: 40 };
  it('compare slopes on the same side as a plain difference over sigma', () => {
    const r = evidenceResiduals({ kind: 'rod-shadow', slopeDeg: 55, side: 'right', sigmaDeg: 2 }, sun, 180);
    // Directions on the frontal view: predicted -59.2103, observed -55; on the right the direction is
    // minus the slope, so the residual is taken as slopes, (59.2103 - 55) / 2 = +2.1051, the same sign
    // as without a side (docs/conventions.md: one sign for every measured number).
    expectClose(r.residuals[0], 2.10513, 1e-4);
    const noSide = evidenceResiduals({ kind: 'rod-shadow', slopeDeg: 55, sigmaDeg: 2 }, sun, 180);
    expectClose(noSide.residuals[0], 2.10513, 1e-4); // slopes: (59.2103 - 55) / 2
  });
  it('count a shadow on the wrong side as the whole turn between the two directions', () => {
    // Observed 55 deg to the left: direction 55 - 180 = -125; predicted -59.2103; (-59.2103 + 125) / 2 = 32.8949.
    const r = evidenceResiduals({ kind: 'rod-shadow', slopeDeg: 55, side: 'left', sigmaDeg: 2 }, sun, 180);
    expectClose(r.residuals[0], 32.8949, 1e-4);
  });
});

describe('one sign on both sides of the wall', () => {
  // docs/conventions.md: every residual runs as (predicted - measured) / sigma inside the solver and is shown
  // as (measured - predicted) / sigma; a shadow to the right or to the left must not turn it (common practice).
  const suns = [{ azimuthDeg: 210, altitudeDeg: 40 }, { azimuthDeg: 150, altitudeDeg: 40 }];
  it('a rod: a measured slope below the predicted one gives a negative shown residual on either side', () => {
    for (const s of suns) {
      const p = predictRodShadow(s, 180);
      const r = evidenceResiduals({ kind: 'rod-shadow', slopeDeg: p.slopeDeg - 3, side: p.side ?? undefined, sigmaDeg: 2 }, s, 180);
      expectClose(r.residuals[0], 1.5, 1e-9);
    }
  });
  it('a fin: a measured width below the predicted one gives a positive solver residual on either side', () => {
    for (const s of suns) {
      const p = predictFinShadow(s, 180);
      const r = evidenceResiduals({ kind: 'fin-shadow', widthRatio: p.widthRatio * 0.8, side: p.side ?? undefined, sigma: 0.03 }, s, 180);
      expect(r.residuals[0]).toBeGreaterThan(0);
    }
  });
});

describe('ratio evidence on the angle scale', () => {
  const cases: ((ratio: number) => ShadowEvidence)[] = [
    (ratio) => ({ kind: 'overhang-shadow', depthRatio: ratio, sigma: 0.05 }),
    (ratio) => ({ kind: 'fin-shadow', widthRatio: ratio, side: 'right', sigma: 0.05 }),
    (ratio) => ({ kind: 'pole-shadow', lengthRatio: ratio, lengthRatioSigma: 0.05 }),
    (ratio) => ({ kind: 'eave-shadow', distanceRatio: ratio, sigma: 0.05, projectionRatio: 0.2 }),
  ];
  const predictedRatio = (e: ShadowEvidence, sun: { azimuthDeg: number; altitudeDeg: number }, wall: number): number => {
    const p = predictEvidence(e, sun, wall);
    if (p.kind === 'overhang-shadow') return p.depthRatio;
    if (p.kind === 'fin-shadow') return p.widthRatio;
    if (p.kind === 'pole-shadow') return p.lengthRatio;
    if (p.kind === 'eave-shadow') return p.distanceRatio;
    throw new Error('not a ratio kind');
  };
  for (const make of cases) {
    it(`${make(1).kind}: equals (predicted - observed) / sigma to first order for a small misfit`, () => {
      fc.assert(
        fc.property(
          fc.double({ min: 0, max: 359, noNaN: true }),
          fc.double({ min: 5, max: 70, noNaN: true }),
          fc.double({ min: 5, max: 70, noNaN: true }),
          fc.double({ min: -1e-4, max: 1e-4, noNaN: true }),
          (wall, hsa, alt, delta) => {
            const sun = { azimuthDeg: wall + hsa, altitudeDeg: alt };
            const truth = predictedRatio(make(1), sun, wall);
            const observed = truth - delta;
            const r = evidenceResiduals(make(observed), sun, wall).residuals[0];
            const expected = delta / 0.05;
            expectClose(r, expected, 1e-3 * Math.abs(expected) + 1e-9, 'residual');
          },
        ),
        { seed: 3, numRuns: 300 },
      );
    });
  }
});
