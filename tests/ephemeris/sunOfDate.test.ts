import { describe, expect, it } from 'vitest';
import { sunPosition, sunPositionByEngine, type SunPosition, type SunPositionOptions, type SunSite } from '../../src/ephemeris/sunPosition.js';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';
import { withDeltaT } from '../../src/ephemeris/engine.js';
import type { Air } from '../../src/scene/types.js';

// The reference throughout is astronomy-engine 2.1.19 itself (sunPositionByEngine: GeoVector,
// Rotation_EQJ_EQD, ObserverVector, EquatorFromVector, Horizon, SiderealTime); sunPosition must
// give the same doubles (Object.is), field by field (src/ephemeris/sunOfDate.ts).

type Case = readonly [number, SunSite, Air | 'none' | undefined, SunPositionOptions | undefined];

/** mulberry32, a small seeded generator (common practice), so that a failure can be replayed. */
function generator(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const J2000 = 2451545;
const FAR: Case = [1000000.5, { latitudeDeg: 0, longitudeDeg: 0, elevationM: 0 }, 'none', undefined];

/** Random instants from -3000 to +3000, random sites, Delta T models or stated values, topocentric or not, three airs; some instants repeated within 1e-6 day (the library's reuse window for nutation). */
function randomCases(count: number, seed: number): Case[] {
  const rnd = generator(seed);
  const cases: Case[] = [];
  while (cases.length < count) {
    const year = -3000 + 6000 * rnd();
    const jdUT = J2000 + (year - 2000) * 365.25;
    const site = { latitudeDeg: -90 + 180 * rnd(), longitudeDeg: -180 + 360 * rnd(), elevationM: -400 + 5400 * rnd() };
    const k = Math.floor(4 * rnd());
    const topocentric = rnd() < 0.75;
    const deltaT: SunPositionOptions =
      k === 0 ? {} : k === 1 ? { deltaTModel: 'espenak-meeus-2006' } : k === 2 ? { deltaTModel: 'morrison-2021' } : { deltaTSeconds: -20 + 40000 * rnd() };
    const options: SunPositionOptions | undefined = k === 0 && topocentric ? undefined : { ...deltaT, topocentric };
    const a = rnd();
    const air = a < 1 / 3 ? 'none' : a < 2 / 3 ? undefined : { pressureHPa: 700 + 350 * rnd(), temperatureC: -30 + 70 * rnd() };
    cases.push([jdUT, site, air, options]);
    if (rnd() < 0.15) cases.push([jdUT + 1e-6 * rnd(), site, air, options]);
  }
  return cases;
}

/** Run the cases in order from the same start (a far instant first, so the library's caches start alike). */
function runAll(f: typeof sunPosition, cases: readonly Case[]): SunPosition[] {
  f(...FAR);
  return cases.map((c) => f(...c));
}

/** The fields that differ (not the same double), with the largest absolute difference of each. */
function differences(a: readonly SunPosition[], b: readonly SunPosition[]): Record<string, number> {
  const out: Record<string, number> = {};
  a.forEach((p, i) => {
    for (const key of Object.keys(p) as (keyof SunPosition)[]) {
      if (!Object.is(p[key], b[i]![key])) out[key] = Math.max(out[key] ?? 0, Math.abs(p[key] - b[i]![key]));
    }
  });
  return out;
}

describe('sunPosition gives exactly the doubles of astronomy-engine 2.1.19 (its own calls as reference)', () => {
  it('on every field at 6,000 random instants from -3000 to +3000 (sites, Delta T models and stated values, topocentric on and off, air none, standard and other)', () => {
    const cases = randomCases(6000, 20261202);
    const reference = runAll(sunPositionByEngine, cases);
    const fast = runAll(sunPosition, cases);
    expect(differences(reference, fast)).toEqual({});
  });

  it('inside an outer withDeltaT (the model in force reaches the new path as it reaches the library)', () => {
    const cases = randomCases(300, 7).map(([jd, site, air]) => [jd, site, air, undefined] as Case);
    const reference = withDeltaT('espenak-meeus-2006', () => runAll(sunPositionByEngine, cases));
    const fast = withDeltaT('espenak-meeus-2006', () => runAll(sunPosition, cases));
    const fixed = withDeltaT(1234.5, () => runAll(sunPosition, cases));
    expect(differences(reference, fast)).toEqual({});
    expect(differences(withDeltaT(1234.5, () => runAll(sunPositionByEngine, cases)), fixed)).toEqual({});
  });

  it('when the moon is computed between suns at nearly the same instants (the library keeps one nutation for both)', () => {
    const site = { latitudeDeg: 41.9, longitudeDeg: 12.5, elevationM: 20 };
    const instants = [2299160.3, 2299160.3 + 4e-7, 2299160.3 + 9e-7, 1721424.1, 1721424.1 + 5e-7, 2460000.9];
    const sequence = (f: typeof sunPosition): number[] => {
      f(...FAR);
      return instants.flatMap((jd) => {
        const moon = moonPosition(jd - 3e-7, site, 'none');
        const sun = f(jd, site, 'none');
        return [moon.altitudeDeg, sun.azimuthDeg, sun.geometricAltitudeDeg, sun.declinationDeg, sun.equationOfTimeMinutes];
      });
    };
    const reference = sequence(sunPositionByEngine);
    const fast = sequence(sunPosition);
    fast.forEach((x, i) => expect(Object.is(x, reference[i]), `value ${i}`).toBe(true));
  });

  describe('edge cases', () => {
    it('at the poles, on the date line and at the limits of the range', () => {
      const cases: Case[] = [
        [J2000, { latitudeDeg: 90, longitudeDeg: 0, elevationM: 0 }, 'none', undefined],
        [J2000 + 0.25, { latitudeDeg: -90, longitudeDeg: 180, elevationM: 8000 }, undefined, undefined],
        [J2000 - 5000 * 365.25, { latitudeDeg: 0, longitudeDeg: -180, elevationM: 0 }, 'none', { topocentric: false }],
        [J2000 + 1000 * 365.25, { latitudeDeg: 10, longitudeDeg: 0, elevationM: 0 }, 'none', { deltaTSeconds: 0 }],
        [2451544.5, { latitudeDeg: 51.48, longitudeDeg: 0, elevationM: 0 }, 'none', undefined], // an instant on a UT day boundary
      ];
      expect(differences(runAll(sunPositionByEngine, cases), runAll(sunPosition, cases))).toEqual({});
    });
    it('throws the library error for what the library refuses (a latitude beyond the poles, a time that is not a number)', () => {
      const site = { latitudeDeg: 91, longitudeDeg: 0, elevationM: 0 };
      expect(() => sunPosition(J2000, site)).toThrow(/Latitude 91 is out of range/);
      expect(() => sunPosition(Number.NaN, { ...site, latitudeDeg: 0 })).toThrow(/Argument must be/);
    });
  });
});
