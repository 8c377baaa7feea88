/**
 * The quick phase estimate (Meeus, Astronomical Algorithms, 2nd ed. 1998, eq. 48.4) against the
 * book's Example 48.a and against the full moon ephemeris (src/ephemeris/moonPosition.ts).
 */
import { describe, expect, it } from 'vitest';
import { moonPhaseLongitudeApproxDeg, MOON_PHASE_APPROX_ALLOWANCE_DEG } from '../../src/ephemeris/moonPhaseApprox.js';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';
import { expectClose } from '../helpers/expectClose.js';

describe('moonPhaseLongitudeApproxDeg', () => {
  it('gives the illuminated fraction of Meeus Example 48.a (1992 April 12, 0h TD: k = 0.6786) within 0.005', () => {
    // Meeus 1998, Example 48.a: k = 0.6786 (i = 69.0756 deg) at JDE 2448724.5; the moon waxing.
    const l = moonPhaseLongitudeApproxDeg(2448724.5);
    expectClose((1 - Math.cos((l * Math.PI) / 180)) / 2, 0.6786, 0.005, 'illuminated fraction');
    expect(l).toBeLessThan(180);
  });

  it('stays within a fifth of its allowance of the full ephemeris at 3,000 instants from 1000 to 2125', () => {
    const site = { latitudeDeg: 0, longitudeDeg: 0, elevationM: 0 };
    let worst = 0;
    for (let i = 0; i < 3000; i += 1) {
      const jd = 2086000 + i * 137.31;
      const d = Math.abs(((moonPhaseLongitudeApproxDeg(jd) - moonPosition(jd, site).phaseLongitudeDeg + 540) % 360) - 180);
      worst = Math.max(worst, d);
    }
    console.log(`quick phase estimate: largest difference from moonPosition ${worst.toFixed(2)} deg`);
    expect(worst).toBeLessThan(MOON_PHASE_APPROX_ALLOWANCE_DEG / 4);
  });

  describe('edge cases', () => {
    it('returns a longitude in [0, 360) far from J2000', () => {
      for (const jd of [1721424.5, 2816787.5]) {
        const l = moonPhaseLongitudeApproxDeg(jd);
        expect(l).toBeGreaterThanOrEqual(0);
        expect(l).toBeLessThan(360);
      }
    });
  });
});
