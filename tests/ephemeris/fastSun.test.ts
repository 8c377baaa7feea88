import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/expectClose.js';
import { fastSunPosition } from '../../src/ephemeris/fastSun.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { deltaTAtJdUT } from '../../src/time/timeScales.js';
import { angleDiffDeg, cosDeg } from '../../src/math/angles.js';
import { createRandom } from '../../src/math/random.js';

/** Seeded uniform numbers from the project's one generator (src/math/random.ts), so that a failure can be repeated. */
function mulberry32(seed: number): () => number {
  const rng = createRandom(seed);
  return () => rng.uniform();
}

describe('fastSunPosition reproduces Meeus (1998) Example 25.a', () => {
  it('gives RA 13h13m31.4s and Dec -7 deg 47 min 06 s at JDE 2448908.5 within 0.1 s of time and 1 arcsecond', () => {
    const p = fastSunPosition(2448908.5 - 59 / 86400, { latitudeDeg: 0, longitudeDeg: 0, elevationM: 0 }, 59, 'none');
    expectClose(p.rightAscensionDeg, (13 + 13 / 60 + 31.4 / 3600) * 15, 0.1 / 3600 * 15, 'RA (0.1 s of time)'); // Example 25.a
    expectClose(p.declinationDeg, -(7 + 47 / 60 + 6 / 3600), 1 / 3600, 'Dec'); // Example 25.a
  });
});

describe('fastSunPosition against the full model over 1000-2100', () => {
  it('stays within 0.015 deg in azimuth and altitude and 0.05 min in the equation of time (20,000 random instants and sites)', () => {
    const random = mulberry32(7);
    const jdStart = 2086302.5; // 1000-01-01 (Julian)
    const jdEnd = 2488069.5; // 2100-01-01 (Gregorian)
    let maxAlt = 0;
    let maxAz = 0;
    let maxEot = 0;
    for (let i = 0; i < 20000; i += 1) {
      const jdUT = jdStart + random() * (jdEnd - jdStart);
      const site = { latitudeDeg: -89 + 178 * random(), longitudeDeg: -180 + 360 * random(), elevationM: 0 };
      const dT = deltaTAtJdUT(jdUT).seconds;
      const full = sunPosition(jdUT, site, 'none');
      const fast = fastSunPosition(jdUT, site, dT, 'none');
      maxAlt = Math.max(maxAlt, Math.abs(full.geometricAltitudeDeg - fast.geometricAltitudeDeg));
      maxAz = Math.max(maxAz, Math.abs(angleDiffDeg(full.azimuthDeg, fast.azimuthDeg)) * cosDeg(full.altitudeDeg));
      maxEot = Math.max(maxEot, Math.abs(full.equationOfTimeMinutes - fast.equationOfTimeMinutes));
    }
    console.log(`fastSun vs full model: max |d alt| ${maxAlt.toFixed(5)} deg, max |d az| cos(alt) ${maxAz.toFixed(5)} deg, max |d EoT| ${(maxEot * 60).toFixed(2)} s`);
    expect(maxAlt).toBeLessThan(0.015); // bound stated in src/ephemeris/fastSun.ts
    expect(maxAz).toBeLessThan(0.015);
    expect(maxEot).toBeLessThan(0.05);
  });
});
