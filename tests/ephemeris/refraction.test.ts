import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/expectClose.js';
import { bennettRefractionDeg, refractionDeg, trueToApparentAltitudeDeg } from '../../src/ephemeris/refraction.js';

describe('refraction', () => {
  it("Bennett's formula gives 28.754' at apparent altitude 0.5 deg (Meeus 1998, Example 16.a)", () => {
    // Example 16.a uses the formula without the pressure factor, i.e. 1010 hPa and 10 C.
    expectClose(bennettRefractionDeg(0.5) * 60, 28.754, 0.001, 'Bennett 0.5 deg');
  });
  it('SPA eq. 42 gives 0.016332 deg at true altitude 39.872046 deg, 820 mbar, 11 C (Reda and Andreas 2008, Table A5.1)', () => {
    expectClose(refractionDeg(39.872046, { pressureHPa: 820, temperatureC: 11 }), 0.016332, 0.000001, 'SPA refraction');
  });
  it('is about 34 arcminutes at the horizon in standard air (Meeus 1998 ch. 16; common practice)', () => {
    expectClose(refractionDeg(-0.5) * 60, 34, 2, 'horizon refraction');
  });
  it("SPA form and Bennett's formula agree within 0.2' above 1 deg (Meeus 1998 ch. 16: both ~0.1' accurate)", () => {
    for (let h = 1; h <= 89; h += 2) {
      const apparent = trueToApparentAltitudeDeg(h);
      expectClose(bennettRefractionDeg(apparent) * 60, refractionDeg(h) * 60, 0.2, `altitude ${h}`);
    }
  });
  it('is zero below the SPA cut-off, with air none, and smaller in thin warm air', () => {
    expect(refractionDeg(-1)).toBe(0); // Reda and Andreas (2008) step 3.12.3
    expect(refractionDeg(10, 'none')).toBe(0);
    expect(refractionDeg(10, { pressureHPa: 700, temperatureC: 30 })).toBeLessThan(refractionDeg(10));
  });
});
