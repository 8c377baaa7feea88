import { describe, expect, it } from 'vitest';
// @ts-expect-error astronomia ships no type declarations
import { sunrise, julian } from 'astronomia';
import { expectClose } from '../helpers/expectClose.js';
import { SUNRISE_ALTITUDE_DEG, sunEvents } from '../../src/ephemeris/riseSet.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';

const velmar = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 0 };

describe('sunEvents', () => {
  it('puts the sun at h0 = -0.8333 deg at rise and set and on the meridian at transit (Meeus 1998 ch. 15)', () => {
    const e = sunEvents(2460482.5 - 9.35 / 360, velmar); // 2024-06-21, local mean day
    if (e.sunriseJdUT === null || e.sunsetJdUT === null) throw new Error('no rise or set');
    expectClose(sunPosition(e.sunriseJdUT, velmar, 'none').geometricAltitudeDeg, SUNRISE_ALTITUDE_DEG, 1e-4, 'rise');
    expectClose(sunPosition(e.sunsetJdUT, velmar, 'none').geometricAltitudeDeg, SUNRISE_ALTITUDE_DEG, 1e-4, 'set');
    expectClose(sunPosition(e.transitJdUT, velmar, 'none').hourAngleDeg, 0, 1e-5, 'transit');
    expect(e.polar).toBe(null);
    expect(e.converged).toBe(true);
  });
  it('agrees with astronomia sunrise (Meeus 1998 ch. 15 method) within 2 minutes at several dates and sites', () => {
    const cases = [
      { y: 2024, m: 6, d: 21, lat: 47.62, lon: 9.35 },
      { y: 2024, m: 12, d: 21, lat: 47.62, lon: 9.35 },
      { y: 1990, m: 3, d: 20, lat: 0, lon: -60 },
      { y: 2010, m: 9, d: 1, lat: -33.9, lon: 151.2 },
    ];
    for (const c of cases) {
      const ref = new sunrise.Sunrise(new julian.CalendarGregorian(c.y, c.m, c.d), c.lat, -c.lon); // astronomia: west positive
      const refRise = ref.rise().toJD();
      const refSet = ref.set().toJD();
      const jd0 = new julian.CalendarGregorian(c.y, c.m, c.d).toJD() - c.lon / 360;
      const e = sunEvents(jd0, { latitudeDeg: c.lat, longitudeDeg: c.lon, elevationM: 0 });
      expectClose(((e.sunriseJdUT ?? NaN) - refRise) * 1440, 0, 2, `rise ${JSON.stringify(c)}`);
      expectClose(((e.sunsetJdUT ?? NaN) - refSet) * 1440, 0, 2, `set ${JSON.stringify(c)}`);
    }
  });
  it('gives a day of about 12 h 7 min at the equator at the equinox (refraction and semidiameter; common practice)', () => {
    const e = sunEvents(2460389.5, { latitudeDeg: 0, longitudeDeg: 0, elevationM: 0 }); // 2024-03-20
    expectClose(((e.sunsetJdUT ?? NaN) - (e.sunriseJdUT ?? NaN)) * 24, 12 + 7 / 60, 3 / 60, 'day length');
  });
});

describe('sunEvents edge cases: polar day and night', () => {
  const arctic = { latitudeDeg: 78.2, longitudeDeg: 15.6, elevationM: 0 };
  it('reports polar day in June at 78 N: no rise, no set, a transit', () => {
    const e = sunEvents(2460482.5, arctic);
    expect(e.polar).toBe('day');
    expect(e.sunriseJdUT).toBe(null);
    expect(e.sunsetJdUT).toBe(null);
    expectClose(sunPosition(e.transitJdUT, arctic).hourAngleDeg, 0, 1e-4, 'transit');
  });
  it('reports polar night in December at 78 N and polar day in December at 78 S', () => {
    expect(sunEvents(2460665.5, arctic).polar).toBe('night');
    expect(sunEvents(2460665.5, { ...arctic, latitudeDeg: -78.2 }).polar).toBe('day');
  });
});

describe('sunEvents precision: rise and set found to better than 0.01 s of time, so times printed to the second cannot round differently', () => {
  // Residual of a root in seconds: (altitude - h0) over the altitude's rate, the rate by a central difference of the model itself.
  const residualSeconds = (jdUT: number, site: typeof velmar): number => {
    const f = (t: number): number => sunPosition(t, site, 'none').geometricAltitudeDeg - SUNRISE_ALTITUDE_DEG;
    const h = 1e-5; // days
    return Math.abs(f(jdUT) / ((f(jdUT + h) - f(jdUT - h)) / (2 * h))) * 86400;
  };
  it('holds at latitudes from the equator to beyond the polar circles, on days through the year and across centuries', () => {
    let checked = 0;
    for (const latitudeDeg of [-66.4, -50, -20, 0, 23.4, 47.62, 60, 65.5, 66.4, 66.8, 68])
      for (const jd0 of [2323000.5, 2323080.5, 2323171.5, 2323265.5, 2451545.5, 2451720.5]) {
        const site = { latitudeDeg, longitudeDeg: 9.35, elevationM: 0 };
        const e = sunEvents(jd0 - site.longitudeDeg / 360, site);
        for (const jd of [e.sunriseJdUT, e.sunsetJdUT]) {
          if (jd === null) continue;
          expect(residualSeconds(jd, site), `latitude ${latitudeDeg}, JD ${jd0}`).toBeLessThan(0.01);
          checked += 1;
        }
        expect(Math.abs(sunPosition(e.transitJdUT, site, 'none').hourAngleDeg / 360) * 86400, 'transit').toBeLessThan(0.01);
      }
    expect(checked).toBeGreaterThan(100); // most of the 132 rises and sets exist; polar days and nights at 66.8 and 68 deg have none
  });
});
