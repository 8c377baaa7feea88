/**
 * The minute shift that brings the moon nearest its drawn place (src/solver/moonYears.ts,
 * moonMinuteShift), checked against the moon's full ephemeris (src/ephemeris/moonPosition.ts, itself
 * checked against published values and an independent library in tests/ephemeris): the moon drawn
 * where the ephemeris puts it a known number of minutes later must give back that number of minutes,
 * near the horizon and near the zenith, where the azimuth sweeps fast. The linearised turn of the sky
 * is common practice; the tolerance (0.5 minute plus 3% of the shift) covers the moon's own motion
 * departing from its mean rate and the curvature over half an hour.
 */
import { describe, expect, it } from 'vitest';
import { moonMinuteShift } from '../../src/solver/moonYears.js';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';
import { createRandom } from '../../src/math/random.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';

describe('moonMinuteShift: the minute that puts the moon at its drawn place', () => {
  it('gives back the minutes between two instants of the full ephemeris, at 300 random sites and instants with the moon up', () => {
    const rng = createRandom(20261202);
    let checked = 0;
    let nearZenith = 0;
    let worst = 0;
    while (checked < 300) {
      const site = { latitudeDeg: -60 + 120 * rng.uniform(), longitudeDeg: -180 + 360 * rng.uniform(), elevationM: 0 };
      const jd = calendarDateToJd({ calendar: 'gregorian', year: 1500 + Math.floor(500 * rng.uniform()), month: 1, day: 1 }) + 365 * rng.uniform();
      const minutes = -30 + 60 * rng.uniform();
      const now = moonPosition(jd, site);
      const later = moonPosition(jd + minutes / 1440, site);
      if (now.altitudeDeg < 5 || later.altitudeDeg < 5) continue;
      checked += 1;
      if (now.altitudeDeg > 80) nearZenith += 1;
      const shift = moonMinuteShift(later, now, site.latitudeDeg);
      worst = Math.max(worst, Math.abs(shift - minutes));
      expect(Math.abs(shift - minutes)).toBeLessThanOrEqual(0.5 + 0.03 * Math.abs(minutes));
    }
    console.log(`moonMinuteShift: 300 instants (${nearZenith} with the moon above 80 deg), largest miss ${worst.toFixed(2)} min`);
  });
  it('is 0 without a drawn direction, and held to 120 minutes for a moon drawn across the sky', () => {
    const now = { azimuthDeg: 100, altitudeDeg: 30 };
    expect(moonMinuteShift(undefined, now, 47)).toBe(0);
    expect(Math.abs(moonMinuteShift({ azimuthDeg: 280, altitudeDeg: 10 }, now, 47))).toBeLessThanOrEqual(120);
  });
  it('moves a moon standing east of the meridian later to bring it higher at a northern site (the sky turns west)', () => {
    // Due east, low, at 47 deg north: an hour later it stands higher and further south.
    expect(moonMinuteShift({ azimuthDeg: 100, altitudeDeg: 20 }, { azimuthDeg: 95, altitudeDeg: 10 }, 47)).toBeGreaterThan(0);
  });
});
