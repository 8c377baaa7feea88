/**
 * The moon's phase and bright limb against Meeus, Astronomical Algorithms, 2nd ed. (1998),
 * ch. 48, Example 48.a: 1992 April 12, 0h TD (geocentric, Delta T 59 s from memory of the
 * book's ch. 10 table for 1992 -- it moves the moon by under 0.01 deg here).
 */
import { describe, expect, it } from 'vitest';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';

const SITE = { latitudeDeg: 50, longitudeDeg: 10, elevationM: 0 };
const DELTA_T = 59;
const JD_UT = 2448724.5 - DELTA_T / 86400;

describe('moonPosition (Meeus Example 48.a)', () => {
  const moon = moonPosition(JD_UT, SITE, 'none', { deltaTSeconds: DELTA_T, topocentric: false });
  it('gives the illuminated fraction 0.6786 (Meeus Example 48.a)', () => {
    expect(moon.illuminatedFraction).toBeCloseTo(0.6786, 3);
  });
  it('gives the phase angle 69.0756 deg within 0.01 deg (Meeus Example 48.a)', () => {
    expect(Math.abs(moon.phaseAngleDeg - 69.0756)).toBeLessThan(0.01);
  });
  it('gives the bright limb position angle 285.0 deg within 0.1 deg (Meeus Example 48.a)', () => {
    expect(Math.abs(moon.brightLimbPositionAngleDeg - 285.0)).toBeLessThan(0.1);
  });
  it('gives the moon apparent RA 134.6885 and declination 13.7684 deg within 0.005 deg (Meeus Example 48.a)', () => {
    expect(Math.abs(moon.rightAscensionDeg - 134.6885)).toBeLessThan(0.005);
    expect(Math.abs(moon.declinationDeg - 13.7684)).toBeLessThan(0.005);
  });
  it('is waxing between new and full moon (the example is 3 days before full)', () => {
    expect(moon.waxing).toBe(true);
  });
});
