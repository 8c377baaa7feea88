/**
 * How far the full sun model (astronomy-engine) departs from a second published theory,
 * era by era: VSOP87D for the Earth as implemented in astronomia (Meeus, Astronomical
 * Algorithms, 2nd ed. 1998, ch. 25 "higher accuracy", with the FK5 correction of eq. 25.9,
 * IAU 1980 nutation and Meeus's mean obliquity eq. 22.2). Both get the same TT instant.
 * The figures printed here are the ones docs/time-keeping.md states; the bounds below are
 * those figures with a small margin, so that a change of either library shows up.
 */
import { describe, expect, it } from 'vitest';
// @ts-expect-error astronomia ships no type declarations
import { solar, planetposition, sidereal } from 'astronomia';
// @ts-expect-error astronomia ships no type declarations
import vsop87Dearth from 'astronomia/data/vsop87Dearth';
import { EquatorFromVector, SiderealTime } from 'astronomy-engine';
import { geocentricSunOfDate } from '../../src/ephemeris/sunPosition.js';
import { astroTimeFromJdUT } from '../../src/ephemeris/engine.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';

const RAD = Math.PI / 180;

/** Angle between two directions given as (ra, dec) in radians, degrees (Meeus 1998 eq. 17.1, haversine form). */
function separationDeg(ra1: number, dec1: number, ra2: number, dec2: number): number {
  const s = Math.sin((dec2 - dec1) / 2) ** 2 + Math.cos(dec1) * Math.cos(dec2) * Math.sin((ra2 - ra1) / 2) ** 2;
  return (2 * Math.asin(Math.sqrt(s))) / RAD;
}

/**
 * Largest separation of the sun's direction in the Earth-fixed frame (Greenwich hour angle and
 * declination: what a shadow sees) over 73 instants spread through the year (every 5 days); both sides get the same UT and TT. */
function largestDifferenceDeg(year: number): number {
  const earth = new planetposition.Planet(vsop87Dearth);
  const start = calendarDateToJd({ calendar: year < 1583 ? 'julian' : 'gregorian', year, month: 1, day: 1 });
  let worst = 0;
  for (let i = 0; i < 73; i += 1) {
    const jd = start + 5 * i + 0.3;
    const time = astroTimeFromJdUT(jd);
    const ours = EquatorFromVector(geocentricSunOfDate(time));
    const theirs = solar.apparentEquatorialVSOP87(earth, time.tt + 2451545.0);
    // Greenwich hour angles: apparent sidereal time minus right ascension (Meeus 1998 ch. 12, 13).
    const ourHa = (SiderealTime(time) - ours.ra) * 15 * RAD;
    const theirHa = (sidereal.apparent(jd) / 240) * RAD - theirs.ra;
    const d = separationDeg(ourHa, ours.dec * RAD, theirHa, theirs.dec);
    worst = Math.max(worst, d);
  }
  return worst;
}

describe('the sun model departs from VSOP87 (astronomia) by an amount that grows with distance from 2000', () => {
  // Bounds: the measured value of this test (printed) rounded up; docs/time-keeping.md quotes the printed values.
  it.each([
    [-500, 0.045],
    [500, 0.018],
    [1000, 0.009],
    [1400, 0.0045],
    [2000, 0.0006],
  ])('year %d: largest difference below %d deg', (year, bound) => {
    const worst = largestDifferenceDeg(year);
    console.log(`sun model vs VSOP87 (astronomia), year ${year}: largest difference ${worst.toFixed(4)} deg`);
    expect(worst).toBeLessThan(bound);
  });
});

describe('an answer whose window lies before AD 500 states the measured accuracy', () => {
  it('names the figures measured above for AD 500 and 500 BC, and says nothing from AD 500 on', async () => {
    const { sunAccuracyWordsFrom } = await import('../../src/report/formatTimes.js');
    expect(sunAccuracyWordsFrom(1500)).toBeNull();
    expect(sunAccuracyWordsFrom(500)).toBeNull();
    const words = sunAccuracyWordsFrom(100) ?? '';
    expect(words).toContain('0.016 deg at AD 500');
    expect(words).toContain('0.042 deg at 500 BC');
    // The stated figures cover the measurement of this file (0.0162 at 500, 0.0418 at -500), rounded to 3 decimals.
    expect(largestDifferenceDeg(500)).toBeLessThan(0.0165);
    expect(largestDifferenceDeg(-500)).toBeLessThan(0.0425);
  });
});
