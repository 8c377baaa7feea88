/**
 * The sign convention of brightLimbTiltFromVerticalDeg checked by plain vector geometry, independent of
 * Meeus eqs. 48.5 and 14.1: the lit side of the moon faces the sun, so its direction in the observer's
 * view is the direction towards the sun projected into the plane perpendicular to the line of sight,
 * measured from the projected zenith, positive towards the observer's left (common practice of
 * spherical geometry; the sun and moon directions come from sunPosition and moonPosition).
 */
import { describe, expect, it } from 'vitest';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { sunUnitVector, dot, type EnuVector } from '../../src/geometry/sunVector.js';
import { angleDiffDeg, atan2Deg } from '../../src/math/angles.js';
import { createRandom } from '../../src/math/random.js';

const cross = (a: EnuVector, b: EnuVector): EnuVector => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const minus = (a: EnuVector, b: EnuVector, s: number): EnuVector => [a[0] - s * b[0], a[1] - s * b[1], a[2] - s * b[2]];

/** Tilt of the sun's direction as seen around the moon: from the projected zenith, positive to the observer's left. */
function tiltTowardsSunDeg(moonAz: number, moonAlt: number, sunAz: number, sunAlt: number): number {
  const forward = sunUnitVector(moonAz, moonAlt);
  const zenith: EnuVector = [0, 0, 1];
  const up = minus(zenith, forward, dot(zenith, forward));
  const right = cross(forward, up); // facing north with up = zenith, right = east
  const sun = sunUnitVector(sunAz, sunAlt);
  return atan2Deg(-dot(sun, right), dot(sun, up));
}

describe('brightLimbTiltFromVerticalDeg: sign convention', () => {
  it('agrees within 0.05 deg with the sun direction projected into the view plane at 3,000 random instants and sites (elongation 5-175 deg)', () => {
    const rng = createRandom(4813);
    let worst = 0;
    let n = 0;
    while (n < 3000) {
      const jdUT = 2086302.5 + rng.uniform() * (2488069.5 - 2086302.5); // 1000-2100
      const site = { latitudeDeg: -80 + 160 * rng.uniform(), longitudeDeg: -180 + 360 * rng.uniform(), elevationM: 0 };
      const moon = moonPosition(jdUT, site, 'none');
      if (moon.elongationDeg < 5 || moon.elongationDeg > 175 || moon.geometricAltitudeDeg > 85) continue;
      const sun = sunPosition(jdUT, site, 'none');
      const expected = tiltTowardsSunDeg(moon.azimuthDeg, moon.geometricAltitudeDeg, sun.azimuthDeg, sun.geometricAltitudeDeg);
      worst = Math.max(worst, Math.abs(angleDiffDeg(moon.brightLimbTiltFromVerticalDeg, expected)));
      n += 1;
    }
    console.log(`bright-limb tilt vs projected sun direction, ${n} cases: largest difference ${worst.toFixed(4)} deg`);
    expect(worst).toBeLessThan(0.05);
  });
  it('puts the lit side of a crescent in the lower half of the disc whenever the moon is up and the sun is down (an evening crescent in the west)', () => {
    // sun . up = sin(h_sun) - sin(h_moon) cos(elongation) < 0 when h_sun < 0 < h_moon and elongation < 90 deg (common practice).
    const rng = createRandom(977);
    let n = 0;
    let evening = 0;
    for (let i = 0; i < 40000 && n < 300; i += 1) {
      const jdUT = 2086302.5 + rng.uniform() * (2488069.5 - 2086302.5);
      const site = { latitudeDeg: -60 + 120 * rng.uniform(), longitudeDeg: -180 + 360 * rng.uniform(), elevationM: 0 };
      const moon = moonPosition(jdUT, site, 'none');
      if (moon.elongationDeg > 85 || moon.elongationDeg < 5 || moon.geometricAltitudeDeg < 2) continue;
      const sun = sunPosition(jdUT, site, 'none');
      if (sun.geometricAltitudeDeg > -2) continue;
      expect(Math.abs(moon.brightLimbTiltFromVerticalDeg), `JD ${jdUT}`).toBeGreaterThan(90);
      if (moon.waxing && moon.azimuthDeg > 180) evening += 1;
      n += 1;
    }
    expect(n).toBe(300);
    expect(evening).toBeGreaterThan(50);
  });
});
