import { describe, expect, it } from 'vitest';
import {
  horizontalShadowAngleDeg,
  isWallSunlit,
  sunElevationAboveWallDeg,
  sunInWallFrame,
  verticalShadowAngleDeg,
} from '../../src/geometry/shadowAngles.js';
import { predictFinShadow, predictOverhangShadow, predictRodShadow } from '../../src/geometry/wallShadows.js';
import { expectClose } from '../helpers/expectClose.js';

const D = Math.PI / 180;

describe('handbook shading formulas', () => {
  // Worked example, by hand. Wall facing south (normal 180), sun at azimuth 210, altitude 40.
  //   HSA = 210 - 180 = 30 deg.
  //   tan 40 = 0.839100, cos 30 = 0.866025, sin 30 = 0.5, tan 30 = 0.577350.
  //   tan VSA = 0.839100 / 0.866025 = 0.968909  ->  VSA = atan(0.968909) = 44.0953 deg.
  //   Overhang of depth P = 0.6 m: shadow 0.6 * 0.968909 = 0.581345 m below its edge.
  //   Fin of depth P = 0.6 m: shadow 0.6 * 0.577350 = 0.346410 m sideways.
  //   Rod: tan slope = 0.839100 / 0.5 = 1.678199 -> slope = 59.2103 deg, to the right (HSA > 0).
  const sun = { azimuthDeg: 210, altitudeDeg: 40 };
  const wall = 180;

  it('horizontal shadow angle = sun azimuth - wall normal (Szokolay, Solar Geometry, PLEA Note 1)', () => {
    expect(horizontalShadowAngleDeg(210, 180)).toBe(30);
    expect(horizontalShadowAngleDeg(10, 350)).toBe(20);
    expect(horizontalShadowAngleDeg(350, 10)).toBe(-20);
    expect(horizontalShadowAngleDeg(0, 180)).toBe(180); // wrapped to (-180, 180]
  });

  it('profile angle tan(VSA) = tan(alt) / cos(HSA) (ASHRAE Handbook - Fundamentals, Fenestration; Szokolay, PLEA Note 1)', () => {
    expectClose(verticalShadowAngleDeg(40, 30), 44.0953, 5e-5, 'VSA of the worked example');
    expectClose(Math.tan(verticalShadowAngleDeg(40, 30) * D), 0.968909, 1e-6, 'tan VSA');
    // HSA = 0: the profile angle equals the altitude (same sources).
    expectClose(verticalShadowAngleDeg(33, 0), 33, 1e-12);
  });

  it('overhang shadow = P tan(VSA) (ASHRAE Handbook - Fundamentals, Fenestration; Szokolay, PLEA Note 1)', () => {
    expectClose(0.6 * predictOverhangShadow(sun, wall).depthRatio, 0.581345, 1e-6, 'overhang shadow, m');
  });

  it('fin shadow = P tan(HSA) (ASHRAE Handbook - Fundamentals, Fenestration; Szokolay, PLEA Note 1)', () => {
    const fin = predictFinShadow(sun, wall);
    expectClose(0.6 * fin.widthRatio, 0.346410, 1e-6, 'fin shadow, m');
    expect(fin.side).toBe('right');
  });

  it('rod shadow slope tan(slope) = tan(alt) / sin|HSA| (derived from the profile angle, docs/observations.md)', () => {
    const rod = predictRodShadow(sun, wall);
    expectClose(rod.slopeDeg, 59.2103, 5e-5, 'slope of the worked example');
    expect(rod.side).toBe('right');
    const mirrored = predictRodShadow({ azimuthDeg: 150, altitudeDeg: 40 }, wall);
    expectClose(mirrored.slopeDeg, 59.2103, 5e-5);
    expect(mirrored.side).toBe('left');
  });
});

describe('sunlit test (common practice: |HSA| < 90 and altitude > 0)', () => {
  it.each([
    [180, 30, 180, true],
    [269, 30, 180, true],
    [271, 30, 180, false],
    [180, -0.1, 180, false],
    [0, 30, 180, false],
  ])('sun at %d/%d on a wall facing %d: lit = %s', (az, alt, wall, lit) => {
    expect(isWallSunlit({ azimuthDeg: az, altitudeDeg: alt }, wall)).toBe(lit);
  });

  it('resolves the sun on the wall axes with u towards azimuth (normal - 90)', () => {
    // Sun due east (90) on the horizon, wall facing south (180): u points to azimuth 90, so u = +1.
    const c = sunInWallFrame({ azimuthDeg: 90, altitudeDeg: 0 }, 180);
    expectClose(c.u, 1, 1e-15, 'u');
    expectClose(c.normal, 0, 1e-15, 'normal');
    // Sun's elevation above the wall plane: asin(cos 30 cos 60) = asin(0.4330) = 25.659 deg (by hand).
    expectClose(sunElevationAboveWallDeg({ azimuthDeg: 240, altitudeDeg: 30 }, 180), 25.6589, 1e-4);
  });
});
