/**
 * The quick moon (src/ephemeris/moonQuick.ts) against the full one (src/ephemeris/moonPosition.ts, itself
 * checked against astronomia in crossCheckAstronomia.test.ts): its stated allowance must hold from 1000 to 2100.
 */
import { describe, expect, it } from 'vitest';
import { quickMoon, QUICK_MOON_ALLOWANCE_DEG } from '../../src/ephemeris/moonQuick.js';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';
import { deltaTSeconds } from '../../src/time/deltaT.js';
import { jdToDecimalYear } from '../../src/time/timeScales.js';
import { createRandom } from '../../src/math/random.js';
import { normalizeDeg180, cosDeg } from '../../src/math/angles.js';

describe('quickMoon', () => {
  it('stays within its stated allowance of the full ephemeris at 1,000 random instants from 1000 to 2100', () => {
    const rnd = createRandom(1234);
    let worstAz = 0;
    let worstAlt = 0;
    const first = 2086308; // 1000 January 1 (Julian)
    const last = 2488070; // 2100 December 31 (Gregorian)
    for (let i = 0; i < 1000; i += 1) {
      const jd = first + rnd.uniform() * (last - first);
      const lat = -60 + 120 * rnd.uniform();
      const lon = -180 + 360 * rnd.uniform();
      const dt = deltaTSeconds(jdToDecimalYear(jd));
      const full = moonPosition(jd, { latitudeDeg: lat, longitudeDeg: lon, elevationM: 0 }, undefined, { deltaTSeconds: dt });
      if (full.altitudeDeg < 2) continue; // the moon low or down: refraction's steep part, no shadows
      const q = quickMoon(jd, lat, lon, dt);
      worstAz = Math.max(worstAz, Math.abs(normalizeDeg180(q.azimuthDeg - full.azimuthDeg)) * cosDeg(full.altitudeDeg));
      worstAlt = Math.max(worstAlt, Math.abs(q.altitudeDeg - full.altitudeDeg));
    }
    console.log(`quick moon against the full ephemeris: largest azimuth difference (times cos altitude) ${worstAz.toFixed(3)} deg, altitude ${worstAlt.toFixed(3)} deg`);
    expect(worstAz).toBeLessThan(QUICK_MOON_ALLOWANCE_DEG);
    expect(worstAlt).toBeLessThan(QUICK_MOON_ALLOWANCE_DEG);
  });
});
