import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { sunUnitVector, vectorToSunDirection } from '../../src/geometry/sunVector.js';
import { expectClose } from '../helpers/expectClose.js';

describe('sunUnitVector', () => {
  // Cardinal directions: azimuth clockwise from north (docs/conventions.md; common practice).
  it.each([
    [0, 0, [0, 1, 0]],
    [90, 0, [1, 0, 0]],
    [180, 0, [0, -1, 0]],
    [270, 0, [-1, 0, 0]],
    [123, 90, [0, 0, 1]],
  ] as const)('points to azimuth %d, altitude %d as east-north-up %j', (az, alt, expected) => {
    const v = sunUnitVector(az, alt);
    for (let i = 0; i < 3; i++) expectClose(v[i], expected[i], 1e-15, `component ${i}`);
  });

  it('gives altitude 30 deg a vertical component of exactly 1/2 (sin 30 deg; common practice)', () => {
    expectClose(sunUnitVector(200, 30)[2], 0.5, 1e-15);
  });

  it('is a unit vector and round-trips through vectorToSunDirection', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 359.999, noNaN: true }), fc.double({ min: -89.9, max: 89.9, noNaN: true }), (az, alt) => {
        const v = sunUnitVector(az, alt);
        expectClose(Math.hypot(...v), 1, 1e-14, 'norm');
        const back = vectorToSunDirection(v);
        expectClose(Math.abs(((back.azimuthDeg - az + 540) % 360) - 180), 0, 1e-9, 'azimuth');
        expectClose(back.altitudeDeg, alt, 1e-9, 'altitude');
      }),
      { seed: 11, numRuns: 500 },
    );
  });
});

describe('vectorToSunDirection edge cases', () => {
  it('accepts any length and gives the zenith azimuth 0', () => {
    expect(vectorToSunDirection([0, -3, 3])).toEqual({ azimuthDeg: 180, altitudeDeg: 45 });
    expect(vectorToSunDirection([0, 0, 2])).toEqual({ azimuthDeg: 0, altitudeDeg: 90 });
  });
  it('refuses a zero vector with a message naming it', () => {
    expect(() => vectorToSunDirection([0, 0, 0])).toThrow(/vector: \[0,0,0\] is not allowed/);
  });
});
