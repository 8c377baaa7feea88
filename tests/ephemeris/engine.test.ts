import { describe, expect, it } from 'vitest';
import { DeltaT_EspenakMeeus } from 'astronomy-engine';
import { expectClose } from '../helpers/expectClose.js';
import { astroTimeFromJdUT } from '../../src/ephemeris/engine.js';
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
      maxDiff = Math.max(maxDiff, Math.abs(builtIn - deltaTAtJdUT(jdUT).seconds));
    }
    console.log(`built-in vs our Delta T, -1000..3000: max difference ${maxDiff.toFixed(2)} s`);
    expect(maxDiff).toBeGreaterThan(0.1);
  });
});
