/**
 * Cross-check of the full sun model against astronomia (npm), a port of Meeus,
 * Astronomical Algorithms (1998): solar.apparentEquatorialVSOP87 (ch. 25, VSOP87D Earth,
 * FK5 correction, IAU 1980 nutation, aberration), sidereal.apparent (ch. 12) and
 * coord.Equatorial.toHorizontal (eqs. 13.5, 13.6). Both sides get the same UT and TT.
 */
import { describe, expect, it } from 'vitest';
// @ts-expect-error astronomia ships no type declarations
import { solar, sidereal, coord, globe, planetposition } from 'astronomia';
// @ts-expect-error astronomia ships no type declarations
import vsop87Dearth from 'astronomia/data/vsop87Dearth';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { deltaTAtJdUT } from '../../src/time/timeScales.js';
import { angleDiffDeg, cosDeg } from '../../src/math/angles.js';
import { createRandom } from '../../src/math/random.js';

/** Seeded uniform numbers from the project's one generator (src/math/random.ts), so that a failure can be repeated. */
function mulberry32(seed: number): () => number {
  const rng = createRandom(seed);
  return () => rng.uniform();
}

const RAD = Math.PI / 180;

describe('sunPosition agrees with astronomia (Meeus 1998 ch. 12, 13, 25) over 1000-2100', () => {
  it('geocentric geometric azimuth and altitude agree within 0.01 deg at 10,000 random instants and sites', () => {
    const earth = new planetposition.Planet(vsop87Dearth);
    const random = mulberry32(20240617);
    const jdStart = 2086302.5; // 1000-01-01 (Julian), Meeus 1998 ch. 7
    const jdEnd = 2488069.5; // 2100-01-01 (Gregorian)
    let maxAlt = 0;
    let maxAz = 0;
    let worstJdUT = 0;
    const n = 10000;
    for (let i = 0; i < n; i += 1) {
      const jdUT = jdStart + random() * (jdEnd - jdStart);
      const site = { latitudeDeg: -89 + 178 * random(), longitudeDeg: -180 + 360 * random(), elevationM: 0 };
      const dT = deltaTAtJdUT(jdUT).seconds;
      const ours = sunPosition(jdUT, site, 'none', { deltaTSeconds: dT, topocentric: false });
      const eq = solar.apparentEquatorialVSOP87(earth, jdUT + dT / 86400);
      const st = sidereal.apparent(jdUT); // seconds of time
      // astronomia's longitude is positive west (Meeus's convention).
      const h = new coord.Equatorial(eq.ra, eq.dec).toHorizontal(new globe.Coord(site.latitudeDeg * RAD, -site.longitudeDeg * RAD), st);
      const theirAlt = h.alt / RAD;
      const theirAz = h.az / RAD + 180; // Meeus measures azimuth from the south
      const dAlt = Math.abs(ours.geometricAltitudeDeg - theirAlt);
      // Azimuth difference as an arc on the sky (times cos altitude), so that a sun near the zenith does not dominate.
      const dAz = Math.abs(angleDiffDeg(ours.azimuthDeg, theirAz)) * cosDeg(theirAlt);
      if (dAlt > maxAlt) worstJdUT = jdUT;
      maxAlt = Math.max(maxAlt, dAlt);
      maxAz = Math.max(maxAz, dAz);
    }
    console.log(`astronomia cross-check, ${n} instants: max |d altitude| = ${maxAlt.toFixed(6)} deg (at JD ${worstJdUT.toFixed(1)}), max |d azimuth| cos(alt) = ${maxAz.toFixed(6)} deg`);
    expect(maxAlt).toBeLessThan(0.01);
    expect(maxAz).toBeLessThan(0.01);
  });
});
