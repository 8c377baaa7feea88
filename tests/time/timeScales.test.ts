import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/expectClose.js';
import { jdToDecimalYear, jdTTToJdUT, jdTTToJdUTSolution, jdUTToJdTT, deltaTAtJdUT } from '../../src/time/timeScales.js';
import { deltaTSeconds } from '../../src/time/deltaT.js';

describe('jdToDecimalYear', () => {
  it('gives 2000.0 at 2000-01-01 0h and about 2000.5 in mid-year (JD from Meeus 1998 ch. 7)', () => {
    expectClose(jdToDecimalYear(2451544.5), 2000, 1e-12, '2000-01-01');
    expectClose(jdToDecimalYear(2451544.5 + 183), 2000.5, 1e-12, '2000-07-02'); // 366-day year
  });
  it('uses the Julian calendar before 1582-10-15: 1582-10-04 (Julian) ends near 1582.77', () => {
    // JD 2299160.5 is 1582 Oct 5.0 Julian = Oct 15.0 Gregorian (Meeus 1998 ch. 7).
    expectClose(jdToDecimalYear(2299160.5 - 1e-6), 1582 + 277 / 365, 1e-6, 'Julian side');
    expectClose(jdToDecimalYear(2299160.5), 1582 + 287 / 365, 1e-9, 'Gregorian side');
  });
  it('matches y = year + (month - 0.5)/12 of Espenak and Meeus at mid-month within 0.005 year', () => {
    // 1900-07-16 12h (Gregorian) is JD 2415217.0 (Meeus 1998 ch. 7 algorithm)
    expect(Math.abs(jdToDecimalYear(2415217.0) - (1900 + 6.5 / 12))).toBeLessThan(0.005);
  });
});

describe('UT and TT', () => {
  it('TT - UT is the Delta T of the epoch', () => {
    const jdUT = 2415020.5; // 1900-01-01 0h (Meeus 1998 ch. 7)
    expectClose((jdUTToJdTT(jdUT) - jdUT) * 86400, deltaTSeconds(1900), 1e-4, 'Delta T 1900 (JD resolution 4e-5 s)');
    expectClose(deltaTAtJdUT(jdUT).sigmaSeconds, 0.05, 1e-9, 'sigma 1900'); // Morrison et al. (2021), HMNAO table
    expectClose(deltaTAtJdUT(jdUT, 'espenak-meeus-2006').sigmaSeconds, 0.1, 1e-9, 'sigma 1900'); // Espenak and Meeus (2006)
    expectClose((jdUTToJdTT(jdUT, 'espenak-meeus-2006') - jdUT) * 86400, -2.79, 0.01, 'Delta T 1900 by Espenak and Meeus');
  });
  it.each([-1000000, 1000000, 2086302.5, 2299160.5, 2451545, 2816787.5])('round-trips UT -> TT -> UT at JD %d within 1e-8 day', (jdUT) => {
    const back = jdTTToJdUTSolution(jdUTToJdTT(jdUT));
    expect(back.converged).toBe(true);
    expect(back.iterations).toBeLessThanOrEqual(20);
    expectClose(back.jdUT, jdUT, 1e-8, 'UT round trip');
    expectClose(jdTTToJdUT(jdUTToJdTT(jdUT)), jdUT, 1e-8, 'UT round trip (plain)');
  });
});
