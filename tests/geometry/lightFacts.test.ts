import { describe, expect, it } from 'vitest';
import { DEFAULT_FACT_TOLERANCE_DEG, isLightFactTrue, lightFactResidual } from '../../src/geometry/lightFacts.js';
import { expectClose } from '../helpers/expectClose.js';

const D = Math.PI / 180;

describe('hard predicates (common practice: lit when |HSA| < 90 and altitude > 0)', () => {
  it.each([
    ['wall-lit', 200, 30, true],
    ['wall-lit', 300, 30, false],
    ['wall-lit', 200, -1, false],
    ['wall-shaded', 300, 30, true],
    ['wall-shaded', 200, 30, false],
    ['wall-shaded', 200, -1, true],
    ['sun-up', 0, 0.01, true],
    ['sun-up', 0, -0.01, false],
  ] as const)('%s with the sun at %d / %d on a wall facing 180: %s', (fact, az, alt, holds) => {
    expect(isLightFactTrue(fact, { azimuthDeg: az, altitudeDeg: alt }, 180)).toBe(holds);
  });
});

describe('soft penalties', () => {
  it('are zero wherever the fact holds', () => {
    for (let az = 0; az < 360; az += 7) {
      for (let alt = -80; alt <= 90; alt += 9) {
        const sun = { azimuthDeg: az, altitudeDeg: alt };
        for (const fact of ['wall-lit', 'wall-shaded', 'sun-up'] as const) {
          if (isLightFactTrue(fact, sun, 180)) expect(lightFactResidual(fact, sun, 180).residuals[0]).toBe(0);
          else expect(lightFactResidual(fact, sun, 180).residuals[0]).toBeGreaterThan(0);
        }
      }
    }
  });

  it('grow with the violation in degrees over the tolerance (default 0.5 deg)', () => {
    expect(DEFAULT_FACT_TOLERANCE_DEG).toBe(0.5);
    expectClose(lightFactResidual('sun-up', { azimuthDeg: 0, altitudeDeg: -1 }).residuals[0], 2, 1e-12);
    // Wall facing 180, sun at HSA 100 deg, altitude 30: the sun is beta = asin(cos 30 cos 100)
    // = asin(0.866025 * -0.173648) = asin(-0.150384) = -0.150959 rad = -8.6492 deg behind the wall plane (by hand),
    // so 'wall-lit' is violated by 8.6492 deg: residual 17.298 at tolerance 0.5.
    const beta = Math.asin(Math.cos(30 * D) * Math.cos(100 * D)) / D;
    expectClose(beta, -8.6492, 1e-4, 'hand value');
    expectClose(lightFactResidual('wall-lit', { azimuthDeg: 280, altitudeDeg: 30 }, 180).residuals[0], -beta / 0.5, 1e-9);
    // Sun below the horizon in front of the wall: the smaller of beta and the altitude (-3 deg) counts.
    expectClose(lightFactResidual('wall-lit', { azimuthDeg: 190, altitudeDeg: -3 }, 180, 1).residuals[0], 3, 1e-9);
    // 'wall-shaded' on a lit wall: the nearer way out (altitude 5 deg) is the violation.
    expectClose(lightFactResidual('wall-shaded', { azimuthDeg: 180, altitudeDeg: 5 }, 180).residuals[0], 10, 1e-9);
  });

  it('are continuous across the boundary of the fact', () => {
    const below = lightFactResidual('wall-lit', { azimuthDeg: 270.000001, altitudeDeg: 20 }, 180).residuals[0];
    const above = lightFactResidual('wall-lit', { azimuthDeg: 269.999999, altitudeDeg: 20 }, 180).residuals[0];
    expect(below).toBeGreaterThan(0);
    expect(below).toBeLessThan(1e-5);
    expect(above).toBe(0);
  });
});
