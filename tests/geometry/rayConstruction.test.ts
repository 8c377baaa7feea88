/**
 * Independent check of the closed forms and of the left/right conventions:
 * every shadow is built here by explicit 3-D ray-plane intersection, from vectors
 * written out in this file (site east-north-up; wall normal n at azimuth W,
 * e_u at azimuth W - 90 as docs/conventions.md states, up), and compared with the
 * closed forms of src/geometry within 1e-9.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { predictEaveShadow, predictPoleShadow } from '../../src/geometry/groundShadows.js';
import { predictShadowPoints, shadowPointsResidual } from '../../src/geometry/pointShadows.js';
import { predictFinShadow, predictOverhangShadow, predictRodShadow } from '../../src/geometry/wallShadows.js';
import { expectClose } from '../helpers/expectClose.js';

type V = [number, number, number];
const D = Math.PI / 180;
const horizontalAt = (azDeg: number): V => [Math.sin(azDeg * D), Math.cos(azDeg * D), 0];
const UP: V = [0, 0, 1];
const dotV = (a: V, b: V): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const add = (a: V, b: V, k = 1): V => [a[0] + k * b[0], a[1] + k * b[1], a[2] + k * b[2]];
const scale = (a: V, k: number): V => [a[0] * k, a[1] * k, a[2] * k];
/** Sun vector written out: horizontal part towards the azimuth, times cos(alt), plus sin(alt) up. */
const sunVec = (az: number, alt: number): V => add(scale(horizontalAt(az), Math.cos(alt * D)), UP, Math.sin(alt * D));

/** Where the ray from point p away from the sun (direction -s) meets the plane { x : normal . x = offset }. */
function castOnPlane(p: V, s: V, normal: V, offset: number): V {
  const t = (dotV(normal, p) - offset) / dotV(normal, s);
  return add(p, s, -t);
}

/** A sunlit wall: wall azimuth, HSA in (-85, 85) away from 0 by 0.5, altitude in (2, 88). */
const litCase = fc.record({
  wall: fc.double({ min: 0, max: 359.999, noNaN: true }),
  hsa: fc.oneof(fc.double({ min: -85, max: -0.5, noNaN: true }), fc.double({ min: 0.5, max: 85, noNaN: true })),
  alt: fc.double({ min: 2, max: 88, noNaN: true }),
  depth: fc.double({ min: 0.1, max: 3, noNaN: true }),
});
const RUNS = { seed: 20261202, numRuns: 400 };
const relTol = (x: number): number => 1e-9 * Math.max(1, Math.abs(x));

describe('wall shadows by explicit ray-plane intersection', () => {
  it('a rod of length P along the normal: slope below horizontal and side match the closed form', () => {
    fc.assert(
      fc.property(litCase, ({ wall, hsa, alt, depth }) => {
        const az = wall + hsa;
        const n = horizontalAt(wall);
        const eU = horizontalAt(wall - 90);
        const s = sunVec(az, alt);
        const tip = scale(n, depth); // the rod's root is at the origin, on the wall plane n . x = 0
        const hit = castOnPlane(tip, s, n, 0);
        const u = dotV(hit, eU);
        const v = dotV(hit, UP);
        const slope = Math.atan2(-v, Math.abs(u)) / D;
        const p = predictRodShadow({ azimuthDeg: az, altitudeDeg: alt }, wall);
        expectClose(p.slopeDeg, slope, 1e-9, 'slope');
        expect(p.side).toBe(u > 0 ? 'right' : 'left');
        expectClose(p.directionDeg, Math.atan2(v, u) / D, 1e-9, 'direction');
        // The stated closed form tan(slope) = tan(alt) / sin|HSA|.
        expectClose(Math.tan(slope * D), Math.tan(alt * D) / Math.abs(Math.sin(hsa * D)), relTol(Math.tan(slope * D)), 'tan slope');
        expect(p.defined).toBe(true);
      }),
      RUNS,
    );
  });

  it('an overhang edge P out from the wall: depth below the edge / P = tan(VSA)', () => {
    fc.assert(
      fc.property(litCase, ({ wall, hsa, alt, depth }) => {
        const n = horizontalAt(wall);
        const hit = castOnPlane(scale(n, depth), sunVec(wall + hsa, alt), n, 0);
        const ratio = -dotV(hit, UP) / depth;
        const p = predictOverhangShadow({ azimuthDeg: wall + hsa, altitudeDeg: alt }, wall);
        expectClose(p.depthRatio, ratio, relTol(ratio), 'depth ratio');
      }),
      RUNS,
    );
  });

  it('a fin P deep: sideways width / P = tan|HSA|, to the right of a viewer facing the wall when HSA > 0', () => {
    fc.assert(
      fc.property(litCase, ({ wall, hsa, alt, depth }) => {
        const n = horizontalAt(wall);
        const edgePoint = add(scale(n, depth), UP, 1.7); // any point of the fin's vertical outer edge
        const hit = castOnPlane(edgePoint, sunVec(wall + hsa, alt), n, 0);
        const u = dotV(hit, horizontalAt(wall - 90));
        const p = predictFinShadow({ azimuthDeg: wall + hsa, altitudeDeg: alt }, wall);
        expectClose(p.widthRatio, Math.abs(u) / depth, relTol(u / depth), 'width ratio');
        expect(p.side).toBe(u > 0 ? 'right' : 'left');
      }),
      RUNS,
    );
  });
});

describe('ground shadows by explicit ray-plane intersection', () => {
  it('a vertical pole: the tip shadow lies at azimuth sun + 180 and length / height = 1 / tan(alt)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.999, noNaN: true }),
        fc.double({ min: 2, max: 88, noNaN: true }),
        fc.double({ min: 0.5, max: 30, noNaN: true }),
        (az, alt, height) => {
          const hit = castOnPlane([0, 0, height], sunVec(az, alt), UP, 0);
          const shadowAz = ((Math.atan2(hit[0], hit[1]) / D) % 360 + 360) % 360;
          const p = predictPoleShadow({ azimuthDeg: az, altitudeDeg: alt });
          const dAz = Math.abs(((p.shadowAzimuthDeg - shadowAz + 540) % 360) - 180);
          expectClose(dAz, 0, 1e-9, 'shadow azimuth');
          const ratio = Math.hypot(hit[0], hit[1]) / height;
          expectClose(p.lengthRatio, ratio, relTol(ratio), 'length ratio');
        },
      ),
      RUNS,
    );
  });

  it('an eave edge at height h standing out p: the ground line distance along the normal / h matches', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.999, noNaN: true }),
        fc.double({ min: -179, max: 179, noNaN: true }),
        fc.double({ min: 5, max: 85, noNaN: true }),
        fc.double({ min: 2, max: 15, noNaN: true }),
        fc.double({ min: 0, max: 3, noNaN: true }),
        (wall, hsa, alt, h, projection) => {
          const n = horizontalAt(wall);
          const edgePoint = add(add(scale(n, projection), UP, h), horizontalAt(wall - 90), 4.2); // any point of the edge
          const hit = castOnPlane(edgePoint, sunVec(wall + hsa, alt), UP, 0);
          const ratio = dotV(hit, n) / h;
          const p = predictEaveShadow({ azimuthDeg: wall + hsa, altitudeDeg: alt }, wall, projection / h);
          expectClose(p.distanceRatio, ratio, relTol(ratio), 'distance ratio');
          expect(p.defined).toBe(ratio >= 0);
        },
      ),
      RUNS,
    );
  });
});

describe('caster and shadow point by explicit construction', () => {
  it('a shadow point cast along the sun ray gives zero misfit and is recovered on its horizontal plane', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.999, noNaN: true }),
        fc.double({ min: 3, max: 87, noNaN: true }),
        fc.double({ min: 1, max: 40, noNaN: true }),
        (az, alt, t) => {
          const caster: V = [12.3, -4.5, 9.1];
          const shadow = add(caster, sunVec(az, alt), -t);
          const m = { caster, shadow, sigmaM: 0.05 };
          const sun = { azimuthDeg: az, altitudeDeg: alt };
          const r = shadowPointsResidual(m, sun);
          expectClose(r.residuals[0], 0, 1e-6, 'residual 1');
          expectClose(r.residuals[1], 0, 1e-6, 'residual 2');
          const p = predictShadowPoints(m, sun);
          expect(p.predictedShadow).not.toBeNull();
          for (let i = 0; i < 3; i++) expectClose(p.predictedShadow![i], shadow[i], 1e-9 * t + 1e-12, `point ${i}`);
          expectClose(p.misfitM!, 0, 1e-9 * t + 1e-12, 'metric misfit');
        },
      ),
      RUNS,
    );
  });

  it('the residual vector length times sigma is the angle between trial sun and observed ray', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 359.999, noNaN: true }),
        fc.double({ min: 3, max: 80, noNaN: true }),
        fc.double({ min: -40, max: 40, noNaN: true }),
        fc.double({ min: -8, max: 8, noNaN: true }),
        (az, alt, dAz, dAlt) => {
          const caster: V = [0, 0, 10];
          const distance = 17;
          const shadow = add(caster, sunVec(az, alt), -distance);
          const m = { caster, shadow, sigmaM: 0.02 };
          const trial = { azimuthDeg: az + dAz, altitudeDeg: alt + dAlt };
          const r = shadowPointsResidual(m, trial);
          const a = sunVec(az, alt);
          const b = sunVec(trial.azimuthDeg, trial.altitudeDeg);
          const cross = Math.hypot(a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]);
          const angle = Math.atan2(cross, dotV(a, b)); // accurate near 0, unlike acos
          const sigmaRad = (Math.SQRT2 * 0.02) / distance;
          expectClose(Math.hypot(r.residuals[0], r.residuals[1]) * sigmaRad, angle, 1e-9, 'angle');
          expectClose(predictShadowPoints(m, trial).misfitDeg, angle / D, 1e-7, 'misfit deg');
        },
      ),
      RUNS,
    );
  });
});
