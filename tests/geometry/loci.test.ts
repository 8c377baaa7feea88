/**
 * Inverses for seeding: every locus contains the sun that made the evidence,
 * every point of a locus reproduces the evidence (forward(inverse(x)) = x), and
 * intersecting two loci recovers the true sun among its candidates.
 * Ground truth is made by the forward models, whose closed forms are checked
 * against explicit ray-plane intersection in rayConstruction.test.ts.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evidenceLocus, evidenceResiduals, predictEvidence, type ShadowEvidence } from '../../src/geometry/observationModels.js';
import { intersectLoci } from '../../src/geometry/skyIntersection.js';
import type { SkyLocus } from '../../src/geometry/skyLocus.js';
import type { SunDirection } from '../../src/geometry/sunVector.js';
import { expectClose } from '../helpers/expectClose.js';

const D = Math.PI / 180;
const wrap = (x: number): number => ((x % 360) + 540) % 360 - 180;

/** Exact (noise-free) evidence of each wall kind for a sun and wall, from the forward models. */
function exactEvidence(sun: SunDirection, wall: number): ShadowEvidence[] {
  const rod = predictEvidence({ kind: 'rod-shadow', slopeDeg: 1, sigmaDeg: 1 }, sun, wall);
  const overhang = predictEvidence({ kind: 'overhang-shadow', depthRatio: 1, sigma: 1 }, sun, wall);
  const fin = predictEvidence({ kind: 'fin-shadow', widthRatio: 1, sigma: 1 }, sun, wall);
  const eave = predictEvidence({ kind: 'eave-shadow', distanceRatio: 0, sigma: 1, projectionRatio: 0.3 }, sun, wall);
  if (rod.kind !== 'rod-shadow' || overhang.kind !== 'overhang-shadow' || fin.kind !== 'fin-shadow' || eave.kind !== 'eave-shadow') {
    throw new Error('unexpected prediction kind');
  }
  return [
    { kind: 'rod-shadow', slopeDeg: rod.slopeDeg, side: rod.side ?? undefined, sigmaDeg: 1 },
    { kind: 'rod-shadow', slopeDeg: rod.slopeDeg, sigmaDeg: 1 },
    { kind: 'overhang-shadow', depthRatio: overhang.depthRatio, sigma: 0.05 },
    { kind: 'fin-shadow', widthRatio: fin.widthRatio, side: fin.side ?? undefined, sigma: 0.05 },
    { kind: 'eave-shadow', distanceRatio: eave.distanceRatio, sigma: 0.05, projectionRatio: 0.3 },
    { kind: 'pole-shadow', lengthRatio: 1 / Math.tan(sun.altitudeDeg * D), lengthRatioSigma: 0.05 },
    { kind: 'pole-shadow', shadowAzimuthDeg: (sun.azimuthDeg + 180) % 360, shadowAzimuthSigmaDeg: 2 },
    {
      kind: 'pole-shadow',
      shadowAzimuthDeg: (sun.azimuthDeg + 180) % 360,
      shadowAzimuthSigmaDeg: 2,
      lengthRatio: 1 / Math.tan(sun.altitudeDeg * D),
      lengthRatioSigma: 0.05,
    },
  ];
}

function containsSun(locus: SkyLocus, sun: SunDirection, tol: number): boolean {
  switch (locus.kind) {
    case 'curve': {
      const alt = locus.altitudeAt(sun.azimuthDeg);
      return alt !== null && Math.abs(alt - sun.altitudeDeg) <= tol;
    }
    case 'vertical':
      return locus.azimuthsDeg.some((az) => Math.abs(wrap(az - sun.azimuthDeg)) <= tol);
    case 'point':
      return Math.abs(wrap(locus.sun.azimuthDeg - sun.azimuthDeg)) <= tol && Math.abs(locus.sun.altitudeDeg - sun.altitudeDeg) <= tol;
    default:
      return false;
  }
}

const litSun = fc.record({
  wall: fc.double({ min: 0, max: 359.9, noNaN: true }),
  hsa: fc.oneof(fc.double({ min: -85, max: -1, noNaN: true }), fc.double({ min: 1, max: 85, noNaN: true })),
  alt: fc.double({ min: 2, max: 85, noNaN: true }),
  probe: fc.double({ min: -89, max: 89, noNaN: true }),
});

describe('loci of exact solutions', () => {
  it('contain the true sun, and every point on them reproduces the evidence (forward(inverse(x)) = x)', () => {
    fc.assert(
      fc.property(litSun, ({ wall, hsa, alt, probe }) => {
        const sun = { azimuthDeg: wall + hsa, altitudeDeg: alt };
        for (const evidence of exactEvidence(sun, wall)) {
          const locus = evidenceLocus(evidence, wall);
          expect(containsSun(locus, sun, 1e-9), `${evidence.kind} locus contains the sun`).toBe(true);
          for (const x of evidenceResiduals(evidence, sun, wall).residuals) expectClose(x, 0, 1e-8, `${evidence.kind} residual at the truth`);
          // Another point of the locus: at azimuth wall + probe for curves, at altitude |probe| for vertical lines.
          let other: SunDirection | null = null;
          if (locus.kind === 'curve') {
            const a = locus.altitudeAt(wall + probe);
            if (a !== null) other = { azimuthDeg: wall + probe, altitudeDeg: a };
          } else if (locus.kind === 'vertical') {
            other = { azimuthDeg: locus.azimuthsDeg[0], altitudeDeg: Math.max(1, Math.abs(probe)) };
          }
          if (other !== null) {
            const r = evidenceResiduals(evidence, other, wall);
            for (const x of r.residuals) expectClose(x, 0, 1e-8, `${evidence.kind} residual on its locus`);
          }
        }
      }),
      { seed: 99, numRuns: 400 },
    );
  });

  it('give a pole with azimuth and length, and a sun direction, as the point itself', () => {
    const pole = evidenceLocus({ kind: 'pole-shadow', shadowAzimuthDeg: 10, lengthRatio: 1 });
    expect(pole.kind).toBe('point');
    if (pole.kind === 'point') {
      expectClose(pole.sun.azimuthDeg, 190, 1e-12, 'azimuth'); // opposite the shadow
      expectClose(pole.sun.altitudeDeg, 45, 1e-12, 'altitude'); // 1 / tan 45 = 1
    }
    const direction = evidenceLocus({ kind: 'sun-direction', azimuthDeg: 120, azimuthSigmaDeg: 2, altitudeDeg: 30, altitudeSigmaDeg: 2 });
    expect(direction).toMatchObject({ kind: 'point', sun: { azimuthDeg: 120, altitudeDeg: 30 } });
    const points = evidenceLocus({ kind: 'shadow-points', caster: [0, 0, 10], shadow: [0, 10, 0], sigmaM: 0.05 });
    expect(points.kind).toBe('point');
    if (points.kind === 'point') {
      expectClose(points.sun.azimuthDeg, 180, 1e-12, 'azimuth'); // the caster is south of its shadow
      expectClose(points.sun.altitudeDeg, 45, 1e-12, 'altitude');
    }
  });
});

describe('intersections of two loci', () => {
  it('recover the sun from two rod shadows on walls of different azimuth', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.9, noNaN: true }),
        fc.double({ min: 20, max: 70, noNaN: true }),
        fc.double({ min: -30, max: 30, noNaN: true }),
        fc.double({ min: 5, max: 70, noNaN: true }),
        (wallA, turn, hsaA, alt) => {
          const wallB = wallA + turn; // the second wall turned 20-70 deg from the first
          const sun = { azimuthDeg: wallA + hsaA, altitudeDeg: alt };
          const hsaB = wrap(sun.azimuthDeg - wallB);
          if (Math.abs(hsaA) < 1 || Math.abs(hsaB) < 1 || Math.abs(hsaB) > 85) return;
          const [rodA] = exactEvidence(sun, wallA);
          const [rodB] = exactEvidence(sun, wallB);
          const x = intersectLoci(evidenceLocus(rodA, wallA), evidenceLocus(rodB, wallB));
          expect(x.degenerate).toBe(false);
          const hit = x.candidates.find((c) => Math.abs(wrap(c.azimuthDeg - sun.azimuthDeg)) < 1e-6);
          expect(hit, `true sun among ${JSON.stringify(x.candidates)}`).toBeDefined();
          expectClose(hit!.altitudeDeg, alt, 1e-6, 'altitude');
          for (const c of x.candidates) {
            expect(c.converged).toBe(true);
            expect(c.iterations).toBeLessThanOrEqual(200);
            expectClose(evidenceResiduals(rodA, c, wallA).residuals[0], 0, 1e-6, 'rod A residual at candidate');
            expectClose(evidenceResiduals(rodB, c, wallB).residuals[0], 0, 1e-6, 'rod B residual at candidate');
          }
        },
      ),
      { seed: 5, numRuns: 200 },
    );
  });

  it('find 2, 1 or 0 suns for a rod slope and a pole length as the geometry says', () => {
    // Rod on a south wall (180), slope 50 deg; pole length ratio 1.2 -> altitude atan(1/1.2) = 39.8056 deg.
    // Rod locus: tan(alt) = tan(50) |sin HSA|, so |sin HSA| = tan(39.8056)/tan(50) = 0.8333/1.19175 = 0.69926,
    // HSA = +/-44.37 deg (hand computation): two suns without a side, one with.
    const pole = evidenceLocus({ kind: 'pole-shadow', lengthRatio: 1.2 });
    const both = intersectLoci(evidenceLocus({ kind: 'rod-shadow', slopeDeg: 50, sigmaDeg: 1 }, 180), pole);
    expect(both.candidates.length).toBe(2);
    const azimuths = both.candidates.map((c) => c.azimuthDeg).sort((a, b) => a - b);
    const hsa = Math.asin(Math.tan(Math.atan(1 / 1.2)) / Math.tan(50 * D)) / D;
    expectClose(azimuths[0], 180 - hsa, 1e-7, 'left-hand sun');
    expectClose(azimuths[1], 180 + hsa, 1e-7, 'right-hand sun');
    expectClose(hsa, 44.37, 0.01, 'hand computation');
    const right = intersectLoci(evidenceLocus({ kind: 'rod-shadow', slopeDeg: 50, side: 'right', sigmaDeg: 1 }, 180), pole);
    expect(right.candidates.length).toBe(1);
    expect(right.candidates[0].azimuthDeg).toBeGreaterThan(180); // shadow to the right: sun to the viewer's left, west of south
    // A pole shadow shorter than the rod allows (altitude above the slope): no sun.
    const none = intersectLoci(evidenceLocus({ kind: 'rod-shadow', slopeDeg: 50, sigmaDeg: 1 }, 180), evidenceLocus({ kind: 'pole-shadow', lengthRatio: 0.5 }));
    expect(none.candidates.length).toBe(0);
  });

  it('place a fin (vertical lines) on an overhang curve, and a point on a curve only if it lies there', () => {
    const sun = { azimuthDeg: 160, altitudeDeg: 38 };
    const wall = 135;
    const [, , overhang, fin] = exactEvidence(sun, wall);
    const x = intersectLoci(evidenceLocus(fin, wall), evidenceLocus(overhang, wall));
    expect(x.candidates.length).toBe(1);
    expectClose(x.candidates[0].azimuthDeg, 160, 1e-9, 'azimuth');
    expectClose(x.candidates[0].altitudeDeg, 38, 1e-9, 'altitude');
    const onCurve = intersectLoci({ kind: 'point', sun, description: 'p' }, evidenceLocus(overhang, wall));
    expect(onCurve.candidates.length).toBe(1);
    const offCurve = intersectLoci({ kind: 'point', sun: { azimuthDeg: 160, altitudeDeg: 40 }, description: 'p' }, evidenceLocus(overhang, wall));
    expect(offCurve.candidates.length).toBe(0);
  });

  it('report the same curve twice as degenerate, and an empty locus as no candidates', () => {
    const rod = evidenceLocus({ kind: 'rod-shadow', slopeDeg: 40, sigmaDeg: 1 }, 90);
    expect(intersectLoci(rod, rod).degenerate).toBe(true);
    const fin = evidenceLocus({ kind: 'fin-shadow', widthRatio: 0.3, side: 'left', sigma: 0.1 }, 90);
    expect(intersectLoci(fin, fin).degenerate).toBe(true);
    const empty = evidenceLocus({ kind: 'rod-shadow', slopeDeg: 95, sigmaDeg: 1 }, 90);
    expect(empty.kind).toBe('empty');
    expect(intersectLoci(empty, rod)).toMatchObject({ candidates: [], degenerate: false });
  });
});

describe('intersections near the end of a curve and between lines', () => {
  it('find a crossing that lies between the last sample and the end of a curve', () => {
    // Rod on a south wall, slope 50 right: defined for HSA in (0, 90). A pole length for altitude 49.99 deg
    // crosses it at |sin HSA| = tan(49.99)/tan(50) = 0.99965, HSA = 88.47 deg - with a 2 deg step the last sample
    // before the domain's end at HSA 90 is 88 deg (azimuth 268), so the crossing lies in the final interval.
    const rod = evidenceLocus({ kind: 'rod-shadow', slopeDeg: 50, side: 'right', sigmaDeg: 1 }, 180);
    const pole = { kind: 'curve', altitudeAt: () => 49.99, description: 'altitude 49.99' } as const;
    const x = intersectLoci(rod, pole, { stepDeg: 2 });
    expect(x.candidates.length).toBe(1);
    const hsa = Math.asin(Math.tan(49.99 * D) / Math.tan(50 * D)) / D;
    expectClose(x.candidates[0].azimuthDeg, 180 + hsa, 1e-7, 'azimuth');
    expect(x.candidates[0].converged).toBe(true);
  });
  it('give no candidate for two different vertical lines', () => {
    const a = evidenceLocus({ kind: 'fin-shadow', widthRatio: 0.3, side: 'left', sigma: 0.1 }, 90);
    const b = evidenceLocus({ kind: 'pole-shadow', shadowAzimuthDeg: 10 });
    expect(intersectLoci(a, b)).toMatchObject({ candidates: [], degenerate: false });
  });
});
