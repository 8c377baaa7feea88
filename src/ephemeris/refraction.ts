/**
 * Atmospheric refraction of the sun near the ground: how much the air lifts the sun's
 * image above its geometric (true) altitude.
 *
 * - `refractionDeg` (from true altitude): the form used by the NREL Solar Position
 *   Algorithm, Reda and Andreas, *Solar Position Algorithm for Solar Radiation
 *   Applications*, NREL/TP-560-34302 (rev. 2008), eq. 42, which is Saemundsson's formula
 *   (Meeus, *Astronomical Algorithms*, 2nd ed. 1998, eq. 16.4) scaled for pressure and
 *   temperature (Meeus 1998, p. 107).
 * - `bennettRefractionDeg` (from apparent altitude): Bennett's formula, Meeus 1998 eq. 16.3,
 *   with the same pressure and temperature factor.
 *
 * Validity: from the horizon to the zenith; accuracy about 0.07' for altitudes above 15 deg
 * and a few tenths of an arcminute at the horizon for standard air (Meeus 1998, ch. 16);
 * real refraction at the horizon varies by several arcminutes with the weather.
 * Below the horizon (true altitude under -0.8333 deg, the sun's upper limb at the horizon)
 * no refraction is applied, as in SPA (Reda and Andreas 2008, step 3.12.3): the formula is
 * meaningless there.
 */
import type { Air } from '../scene/types.js';
import { tanDeg } from '../math/angles.js';

/** Standard air for refraction: 1010 hPa, 10 C (Meeus 1998, p. 107; Reda and Andreas 2008). */
export const STANDARD_AIR: Air = { pressureHPa: 1010, temperatureC: 10 };

/** True altitude below which SPA applies no refraction: -(sun radius 0.26667 + 0.5667) deg (Reda and Andreas 2008). */
export const NO_REFRACTION_BELOW_DEG = -(0.26667 + 0.5667);

/** Pressure and temperature factor (P / 1010) (283 / (273 + T)), Meeus 1998 p. 107. */
function airFactor(air: Air): number {
  return (air.pressureHPa / 1010) * (283 / (273 + air.temperatureC));
}

/**
 * Refraction in degrees for a true (geometric) altitude in degrees; SPA eq. 42.
 * `air` absent: standard air; 'none': 0.
 * @example refractionDeg(39.872046, { pressureHPa: 820, temperatureC: 11 }) // 0.016332
 */
export function refractionDeg(trueAltitudeDeg: number, air?: Air | 'none'): number {
  if (air === 'none') return 0;
  if (trueAltitudeDeg < NO_REFRACTION_BELOW_DEG) return 0;
  const f = airFactor(air ?? STANDARD_AIR);
  // Reda and Andreas (2008) eq. 42: (P/1010)(283/(273+T)) 1.02 / (60 tan(e0 + 10.3/(e0 + 5.11)))
  return (f * 1.02) / (60 * tanDeg(trueAltitudeDeg + 10.3 / (trueAltitudeDeg + 5.11)));
}

/**
 * Refraction in degrees for an apparent (observed) altitude in degrees; Bennett, Meeus 1998 eq. 16.3.
 * @example bennettRefractionDeg(0.5) * 60 // 28.754 arcminutes (Meeus 1998, Example 16.a)
 */
export function bennettRefractionDeg(apparentAltitudeDeg: number, air?: Air | 'none'): number {
  if (air === 'none') return 0;
  const f = airFactor(air ?? STANDARD_AIR);
  // Meeus (1998) eq. 16.3: R = 1 / tan(h0 + 7.31 / (h0 + 4.4)), arcminutes
  return (f * (1 / tanDeg(apparentAltitudeDeg + 7.31 / (apparentAltitudeDeg + 4.4)))) / 60;
}

/** Apparent altitude in degrees of a true altitude: true + refractionDeg (SPA eq. 43). */
export function trueToApparentAltitudeDeg(trueAltitudeDeg: number, air?: Air | 'none'): number {
  return trueAltitudeDeg + refractionDeg(trueAltitudeDeg, air);
}
