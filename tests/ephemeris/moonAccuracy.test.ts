/**
 * The moon's place checked against two sources outside the project:
 * 1. astronomia (npm), a port of Meeus, Astronomical Algorithms, 2nd ed. (1998): moonposition =
 *    Meeus ch. 47, ELP-2000/82 truncated to Tables 47.A/47.B (about 10" in longitude near the present),
 *    with nutation (ch. 22), parallax (ch. 40) and the horizontal frame (ch. 13); same UT, same Delta T,
 *    same site (tests/helpers/astronomiaMoon.ts).
 * 2. The instants of greatest eclipse of the NASA Five Millennium Canon of Solar Eclipses (Espenak and
 *    Meeus 2006, NASA TP-2006-214141; VSOP87 / ELP-2000/82 with n-dot = -25.858"/cy^2), as printed on the
 *    canon's Besselian-element pages (TDT): the instant the shadow axis passes closest to the Earth's
 *    centre, which is the instant of least geocentric separation of the sun's and moon's centres to within
 *    seconds (common practice). They test the moon's secular acceleration over the centuries.
 */
import { describe, expect, it } from 'vitest';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';
import { deltaTAtJdUT } from '../../src/time/timeScales.js';
import { angleDiffDeg, cosDeg } from '../../src/math/angles.js';
import { createRandom } from '../../src/math/random.js';
import { astronomiaMoon } from '../helpers/astronomiaMoon.js';

describe('moonPosition agrees with astronomia (Meeus 1998 ch. 47, ELP-2000/82 truncated) over 1000-2100', () => {
  it('topocentric direction agrees within 0.02 deg at 5,000 random instants and sites, same Delta T and parallax', () => {
    const rng = createRandom(20261202);
    const jdStart = 2086302.5; // 1000-01-01 (Julian), Meeus 1998 ch. 7
    const jdEnd = 2488069.5; // 2100-01-01 (Gregorian)
    let worst = 0;
    let worstJdUT = 0;
    let sum = 0;
    const n = 5000;
    for (let i = 0; i < n; i += 1) {
      const jdUT = jdStart + rng.uniform() * (jdEnd - jdStart);
      const site = { latitudeDeg: -89 + 178 * rng.uniform(), longitudeDeg: -180 + 360 * rng.uniform(), elevationM: 3000 * rng.uniform() };
      const dT = deltaTAtJdUT(jdUT).seconds;
      const ours = moonPosition(jdUT, site, 'none', { deltaTSeconds: dT });
      const theirs = astronomiaMoon(jdUT, dT, site);
      // The angle between the two directions (altitude difference and azimuth difference times cos altitude).
      const d = Math.hypot(ours.geometricAltitudeDeg - theirs.altitudeDeg, angleDiffDeg(ours.azimuthDeg, theirs.azimuthDeg) * cosDeg(theirs.altitudeDeg));
      sum += d;
      if (d > worst) {
        worst = d;
        worstJdUT = jdUT;
      }
    }
    console.log(`moon vs astronomia, ${n} instants 1000-2100: largest difference ${worst.toFixed(4)} deg (JD ${worstJdUT.toFixed(2)} UT), mean ${(sum / n).toFixed(4)} deg`);
    expect(worst).toBeLessThan(0.02);
  });
});

/** Least geocentric sun-moon separation near jdTT (ternary search; Delta T fixed at 0 so that UT = TT). */
function leastSeparationJdTT(jdTT: number): number {
  const sep = (jd: number): number => moonPosition(jd, { latitudeDeg: 0, longitudeDeg: 0, elevationM: 0 }, 'none', { deltaTSeconds: 0, topocentric: false }).elongationDeg;
  let a = jdTT - 0.2;
  let b = jdTT + 0.2;
  for (let i = 0; i < 80; i += 1) {
    const m1 = a + (b - a) / 3;
    const m2 = b - (b - a) / 3;
    if (sep(m1) < sep(m2)) b = m2;
    else a = m1;
  }
  return (a + b) / 2;
}

/** JD of a Julian-calendar date at 0h (Meeus 1998 eq. 7.1 with B = 0) plus the hours. */
function julianCalendarJd(year: number, month: number, day: number, hours: number): number {
  const [y, m] = month > 2 ? [year, month] : [year - 1, month + 12];
  return Math.floor(365.25 * (y + 4716)) + Math.floor(30.6001 * (m + 1)) + day - 1524.5 + hours / 24;
}

// NASA Five Millennium Canon, greatest eclipse in TDT (Besselian-element pages of the canon), Julian calendar.
const ECLIPSES = [
  { name: '1179 Aug 04 (partial)', jdTT: julianCalendarJd(1179, 8, 4, 20 + 37 / 60 + 56 / 3600), withinMin: 1 },
  { name: '1133 Aug 02 (total)', jdTT: julianCalendarJd(1133, 8, 2, 12 + 24 / 60 + 26 / 3600), withinMin: 1 },
  { name: '1128 May 30 (partial)', jdTT: julianCalendarJd(1128, 5, 30, 20 + 45 / 60 + 57 / 3600), withinMin: 1 },
  { name: '-137 May 07 (annular)', jdTT: julianCalendarJd(-137, 5, 7, 14 + 42 / 60 + 41 / 3600), withinMin: 1 },
  { name: '-1127 Jul 30 (annular)', jdTT: julianCalendarJd(-1127, 7, 30, 4 + 57 / 60 + 21 / 3600), withinMin: 2 },
] as const;

describe('the moon keeps the secular acceleration of ELP-2000/82 (NASA Five Millennium Canon of Solar Eclipses)', () => {
  it('reproduces the canon\'s JD for 1133 Aug 02 from its calendar date (JD 2135100.017, canon page)', () => {
    expect(Math.abs(ECLIPSES[1].jdTT - 2135100.017)).toBeLessThan(0.0006);
  });
  for (const e of ECLIPSES) {
    it(`puts the least sun-moon separation of ${e.name} within ${e.withinMin} min of the canon's greatest eclipse`, () => {
      const dMin = (leastSeparationJdTT(e.jdTT) - e.jdTT) * 1440;
      console.log(`eclipse ${e.name}: least separation ${dMin >= 0 ? '+' : ''}${dMin.toFixed(2)} min from the canon`);
      expect(Math.abs(dMin)).toBeLessThan(e.withinMin);
    });
  }
});
