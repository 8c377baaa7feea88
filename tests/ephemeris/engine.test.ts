import { describe, expect, it } from 'vitest';
import { DeltaT_EspenakMeeus } from 'astronomy-engine';
import { expectClose } from '../helpers/expectClose.js';
import { astroTimeFromJdUT, withDeltaT } from '../../src/ephemeris/engine.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { deltaTAtJdUT, jdUTToJdTT } from '../../src/time/timeScales.js';

describe('astronomy-engine runs on our Delta T (the one global setting, src/ephemeris/engine.ts)', () => {
  it('gives the TT of our time scales at every epoch from -1000 to 3000', () => {
    for (let jdUT = 1355807.5; jdUT < 2816787.5; jdUT += 3652.4) {
      const time = astroTimeFromJdUT(jdUT);
      expectClose((time.tt - time.ut) * 86400, (jdUTToJdTT(jdUT) - jdUT) * 86400, 1e-3, `Delta T at JD ${jdUT}`);
    }
  });
  it('honours a stated Delta T for one call only', () => {
    const time = astroTimeFromJdUT(2452930.312847, 67);
    expectClose((time.tt - time.ut) * 86400, 67, 1e-4, 'stated Delta T'); // Reda and Andreas (2008), Table A5.1
    const again = astroTimeFromJdUT(2452930.312847);
    expect(Math.abs((again.tt - again.ut) * 86400 - 67)).toBeGreaterThan(1);
  });
  it('would differ by more than 0.1 s with the built-in Espenak-Meeus (its own decimal year), which is why it is replaced', () => {
    let maxDiff = 0;
    for (let jdUT = 1355807.5; jdUT < 2816787.5; jdUT += 365.25) {
      const builtIn = DeltaT_EspenakMeeus(jdUT - 2451545);
      maxDiff = Math.max(maxDiff, Math.abs(builtIn - deltaTAtJdUT(jdUT, 'espenak-meeus-2006').seconds));
    }
    console.log(`built-in vs our Delta T, -1000..3000: max difference ${maxDiff.toFixed(2)} s`);
    expect(maxDiff).toBeGreaterThan(0.1);
  });
  it('a model stated for one computation reaches the inner steps of the library, and is restored afterwards', () => {
    // At 500 BC (JD 1538431.5, -499-01-01 Julian, Meeus 1998 ch. 7 algorithm) the models differ by about 260 s;
    // the sun moves 0.041" per second along its path (360 deg per 365.25 days), so about 0.003 deg.
    const jdUT = 1538431.5 + 100;
    const site = { latitudeDeg: 40, longitudeDeg: 20, elevationM: 0 };
    const a = sunPosition(jdUT, site, 'none');
    const b = sunPosition(jdUT, site, 'none', { deltaTModel: 'espenak-meeus-2006' });
    const dT = deltaTAtJdUT(jdUT, 'espenak-meeus-2006').seconds - deltaTAtJdUT(jdUT).seconds;
    const expectedDeg = (Math.abs(dT) / 86400) * (360 / 365.25);
    const movedDeg = Math.hypot(a.declinationDeg - b.declinationDeg, (a.rightAscensionDeg - b.rightAscensionDeg) * Math.cos((a.declinationDeg * Math.PI) / 180));
    expectClose(movedDeg, expectedDeg, 0.2 * expectedDeg, 'sun moved by the Delta T difference');
    expect(sunPosition(jdUT, site, 'none').declinationDeg).toBe(a.declinationDeg); // restored
    expect(() => withDeltaT(100, () => { throw new Error('inner'); })).toThrow('inner');
    expect(sunPosition(jdUT, site, 'none').declinationDeg).toBe(a.declinationDeg); // restored after an error
  });
});
