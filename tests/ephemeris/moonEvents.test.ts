/**
 * Moon events: a lunar phase against Meeus, Astronomical Algorithms, 2nd ed. (1998), ch. 49, Example 49.a;
 * moonrise and moonset against an independent computation from astronomia (npm): the moon of Meeus ch. 47
 * (ELP-2000/82 truncated), and the rise condition of Meeus ch. 15 (p. 102): the geocentric altitude of the
 * centre is h0 = 0.7275 pi - 0 deg 34' (pi the horizontal parallax), found here by bisection.
 */
import { describe, expect, it } from 'vitest';
import { lunarPhaseNear, moonAge, moonEvents, SYNODIC_MONTH_DAYS } from '../../src/ephemeris/moonEvents.js';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';
import { deltaTAtJdUT } from '../../src/time/timeScales.js';
import { createRandom } from '../../src/math/random.js';
import { astronomiaMoon } from '../helpers/astronomiaMoon.js';

// Meeus Example 49.a: the new moon of 1977 February, JDE 2443192.65118 = 1977 Feb 18, 3h37m42s TD.
const MEEUS_49A_JDE = 2443192.65118;

describe('lunarPhaseNear and moonAge (Meeus 1998 Example 49.a)', () => {
  it('finds the new moon of 1977 February within 10 s of JDE 2443192.65118 (Meeus Example 49.a)', () => {
    const p = lunarPhaseNear('new', 2443190.0, { deltaTSeconds: 48 });
    console.log(`new moon 1977 Feb: JDE ${p.jdTT.toFixed(5)}, ${((p.jdTT - MEEUS_49A_JDE) * 86400).toFixed(1)} s from Meeus Example 49.a`);
    expect(p.converged).toBe(true);
    expect(Math.abs(p.jdTT - MEEUS_49A_JDE) * 86400).toBeLessThan(10);
    // Meeus notes the exact instant from the full ELP-2000/82 is 3h37m40s TD (Example 49.a): within 10 s too.
    expect(Math.abs(p.jdTT - (2443192.5 + (3 + 37 / 60 + 40 / 3600) / 24)) * 86400).toBeLessThan(10);
  });
  it('takes the same new moon from any instant within half a lunation of it', () => {
    for (const offset of [-14, -7, 0, 7, 14]) {
      const p = lunarPhaseNear('new', MEEUS_49A_JDE + offset, { deltaTSeconds: 48 });
      expect(Math.abs(p.jdTT - MEEUS_49A_JDE)).toBeLessThan(0.001);
    }
  });
  it('gives the age since that new moon, and an age below one synodic month at random instants', () => {
    const a = moonAge(MEEUS_49A_JDE + 3.25, { deltaTSeconds: 48 });
    expect(Math.abs(a.ageDays - 3.25)).toBeLessThan(0.001);
    const rng = createRandom(49);
    for (let i = 0; i < 200; i += 1) {
      const jdUT = 2086302.5 + rng.uniform() * 400000;
      const age = moonAge(jdUT);
      expect(age.ageDays).toBeGreaterThanOrEqual(0);
      expect(age.ageDays).toBeLessThan(SYNODIC_MONTH_DAYS + 0.6); // the synodic month varies by about +/-0.3 d (Meeus ch. 49)
      // The phase longitude grows with the age at 12.19 deg per day on average. It departs from that by the
      // change of the periodic terms since the new moon, at most twice their sum: the moon's equation of the
      // centre 6.29, evection 1.27, variation 0.66 and the sun's equation of the centre 1.92 deg (Meeus 1998,
      // Table 47.A and ch. 25), about 20 deg.
      const phase = moonPosition(jdUT, { latitudeDeg: 0, longitudeDeg: 0, elevationM: 0 }, 'none').phaseLongitudeDeg;
      expect(Math.abs(phase - age.ageDays * (360 / SYNODIC_MONTH_DAYS))).toBeLessThan(20);
    }
  });
  it('orders the four phases of a lunation: new, first quarter, full, last quarter', () => {
    const n = lunarPhaseNear('new', MEEUS_49A_JDE).jdUT;
    const q1 = lunarPhaseNear('first-quarter', n + 7.4).jdUT;
    const f = lunarPhaseNear('full', n + 14.8).jdUT;
    const q3 = lunarPhaseNear('last-quarter', n + 22.1).jdUT;
    expect(n < q1 && q1 < f && f < q3 && q3 < n + SYNODIC_MONTH_DAYS + 0.5).toBe(true);
  });
});

/** Meeus ch. 15 moonrise/moonset by astronomia's moon: bisection of geocentric altitude - h0 in [a, b]. */
function astronomiaCrossing(a: number, b: number, site: { latitudeDeg: number; longitudeDeg: number; elevationM: number }): number | null {
  const f = (jdUT: number): number => {
    const m = astronomiaMoon(jdUT, deltaTAtJdUT(jdUT).seconds, site);
    return m.geocentricAltitudeDeg - (0.7275 * m.horizontalParallaxDeg - 34 / 60);
  };
  let fa = f(a);
  if (Math.sign(fa) === Math.sign(f(b))) return null;
  for (let i = 0; i < 40; i += 1) {
    const c = (a + b) / 2;
    const fc = f(c);
    if (Math.sign(fc) === Math.sign(fa)) [a, fa] = [c, fc];
    else b = c;
  }
  return (a + b) / 2;
}

describe('moonEvents: moonrise and moonset', () => {
  it('agree within 1 min with Meeus ch. 15 on astronomia\'s moon at 150 random days and sites (1600-2100, latitudes to 60 deg)', () => {
    const rng = createRandom(15);
    let worst = 0;
    let n = 0;
    for (let i = 0; i < 150; i += 1) {
      const day = Math.floor(2305447.5 + rng.uniform() * (2488069.5 - 2305447.5)) + 0.5; // 1600-2100, 0h UT
      const site = { latitudeDeg: -60 + 120 * rng.uniform(), longitudeDeg: -180 + 360 * rng.uniform(), elevationM: 0 };
      const ev = moonEvents(day, site);
      for (const [jd, riseOrSet] of [[ev.moonriseJdUT, 'rise'], [ev.moonsetJdUT, 'set']] as const) {
        if (jd === null) continue;
        const theirs = astronomiaCrossing(jd - 20 / 1440, jd + 20 / 1440, site);
        expect(theirs, `${riseOrSet} at JD ${jd}`).not.toBeNull();
        worst = Math.max(worst, Math.abs((theirs as number) - jd) * 1440);
        n += 1;
      }
    }
    console.log(`moonrise/moonset vs Meeus ch. 15 on astronomia's moon, ${n} events: largest difference ${(worst * 60).toFixed(1)} s`);
    expect(n).toBeGreaterThan(200);
    expect(worst).toBeLessThan(1);
  });
  it('puts the transit at hour angle 0 and between rise and set when all three fall in the day', () => {
    const site = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 }; // Velmar
    let seen = 0;
    for (let d = 0; d < 30; d += 1) {
      const day = 2460676.5 + d - 9.35 / 360; // local mean midnight, January 2025
      const ev = moonEvents(day, site);
      if (ev.transitJdUT !== null) {
        expect(Math.abs(moonPosition(ev.transitJdUT, site, 'none').hourAngleDeg)).toBeLessThan(0.05);
        expect(ev.transitJdUT).toBeGreaterThanOrEqual(day);
        expect(ev.transitJdUT).toBeLessThan(day + 1);
      }
      if (ev.moonriseJdUT !== null && ev.moonsetJdUT !== null && ev.transitJdUT !== null && ev.moonriseJdUT < ev.moonsetJdUT) {
        expect(ev.moonriseJdUT < ev.transitJdUT && ev.transitJdUT < ev.moonsetJdUT).toBe(true);
        seen += 1;
      }
    }
    expect(seen).toBeGreaterThan(3);
  });
  it('has about one day a month without a moonrise (the moon rises some 50 min later each day)', () => {
    const site = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 };
    let missing = 0;
    for (let d = 0; d < 59; d += 1) if (moonEvents(2460676.5 + d, site).moonriseJdUT === null) missing += 1;
    expect(missing).toBeGreaterThanOrEqual(1);
    expect(missing).toBeLessThanOrEqual(3);
  });
});
