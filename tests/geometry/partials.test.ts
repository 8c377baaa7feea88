/**
 * Analytic partial derivatives of every residual against central differences
 * (Press et al., Numerical Recipes, 3rd ed. 2007, section 5.7), step 1e-5 deg.
 */
import { describe, it } from 'vitest';
import fc from 'fast-check';
import { evidenceResiduals, type ShadowEvidence } from '../../src/geometry/observationModels.js';
import { centralDifferencePartials } from '../../src/geometry/residuals.js';
import { expectClose } from '../helpers/expectClose.js';

const CASES: readonly ShadowEvidence[] = [
  { kind: 'rod-shadow', slopeDeg: 52, side: 'right', sigmaDeg: 1.5 },
  { kind: 'rod-shadow', slopeDeg: 52, side: 'left', sigmaDeg: 1.5 },
  { kind: 'rod-shadow', slopeDeg: 52, sigmaDeg: 1.5 },
  { kind: 'overhang-shadow', depthRatio: 0.9, sigma: 0.05 },
  { kind: 'fin-shadow', widthRatio: 0.4, side: 'left', sigma: 0.04 },
  { kind: 'fin-shadow', widthRatio: 0.4, sigma: 0.04 },
  { kind: 'pole-shadow', shadowAzimuthDeg: 20, shadowAzimuthSigmaDeg: 2, lengthRatio: 1.3, lengthRatioSigma: 0.05 },
  { kind: 'eave-shadow', distanceRatio: 0.8, sigma: 0.05, projectionRatio: 0.15 },
  { kind: 'shadow-points', caster: [3, 4, 8], shadow: [-2, 11, 0], sigmaM: 0.05 },
  { kind: 'sun-direction', azimuthDeg: 150, azimuthSigmaDeg: 3, altitudeDeg: 35, altitudeSigmaDeg: 2 },
  { kind: 'wall-lit' },
  { kind: 'wall-shaded' },
  { kind: 'sun-up' },
];

describe('partials of every residual', () => {
  for (const evidence of CASES) {
    const label = `${evidence.kind}${'side' in evidence && evidence.side ? ` (${evidence.side})` : 'side' in evidence ? ' (no side)' : ''}`;
    it(`${label}: analytic partials agree with central differences`, () => {
      fc.assert(
        fc.property(
          fc.double({ min: 0, max: 359.9, noNaN: true }),
          fc.double({ min: -30, max: 85, noNaN: true }),
          fc.double({ min: 0, max: 359.9, noNaN: true }),
          (az, alt, wall) => {
            const sun = { azimuthDeg: az, altitudeDeg: alt };
            const hsa = ((az - wall + 540) % 360) - 180;
            // Stay off the kinks that are part of the definitions: |HSA| = 0 (slope or width without a side),
            // the wrap of an angular residual, and the boundaries of the soft penalties.
            if (Math.abs(hsa) < 0.01 || Math.abs(Math.abs(hsa) - 180) < 0.01 || Math.abs(alt) < 0.01) return;
            const r = evidenceResiduals(evidence, sun, wall);
            const numeric = centralDifferencePartials((s, w) => evidenceResiduals(evidence, s, w).residuals, sun, wall);
            for (let i = 0; i < r.residuals.length; i++) {
              for (let j = 0; j < 3; j++) {
                const a = r.partials[i][j];
                const b = numeric[i][j];
                expectClose(a, b, 2e-5 * Math.max(1, Math.abs(b)), `${label} residual ${i} partial ${j} at az ${az} alt ${alt} wall ${wall}`);
              }
            }
          },
        ),
        { seed: 7, numRuns: 400 },
      );
    });
  }
});
