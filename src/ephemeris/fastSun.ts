/**
 * A fast, low-precision sun for scanning many instants (a solver's coarse grid).
 *
 * Model: Meeus, *Astronomical Algorithms*, 2nd ed. (1998): low-precision solar coordinates
 * (ch. 25, eqs. 25.2-25.8, apparent longitude with the nutation-aberration term of p. 164),
 * mean obliquity (eq. 22.2) corrected as on p. 165, Greenwich mean sidereal time (eq. 12.4)
 * plus the equation of the equinoxes with the low-accuracy nutation in longitude
 * (ch. 22, p. 144), horizontal coordinates (eqs. 13.5, 13.6), our refraction (refraction.ts).
 * Geocentric: no parallax (at most 0.0024 deg for the sun).
 *
 * Measured maximum error against the full model (sunPosition.ts), 20,000 random instants
 * 1000-2100 and random sites (tests/ephemeris/fastSun.test.ts): altitude 0.012 deg,
 * azimuth (as an arc, times cos altitude) 0.011 deg, equation of time 2.7 s; the test holds
 * it to 0.015 deg and 0.05 min. Validity: years 1000-2100 as measured; the error grows slowly outside.
 */
import type { Air } from '../scene/types.js';
import { DEG_PER_RAD, RAD_PER_DEG, normalizeDeg180, normalizeDeg360 } from '../math/angles.js';
import { refractionDeg } from './refraction.js';
import type { SunPosition, SunSite } from './sunPosition.js';

/** The fast sun: the fields of SunPosition that a scan needs (degrees, minutes), with the same meanings. */
export type FastSunPosition = Omit<SunPosition, 'jdUT' | 'jdTT'>;

/**
 * The sun at instant jdUT by the low-precision model; `deltaTSeconds` is TT - UT
 * (take it from src/time/timeScales.ts once per scan: it changes slowly).
 */
export function fastSunPosition(jdUT: number, site: SunSite, deltaTSeconds: number, air?: Air | 'none'): FastSunPosition {
  const jdTT = jdUT + deltaTSeconds / 86400;
  const t = (jdTT - 2451545) / 36525; // Julian centuries of TT, Meeus eq. 25.1
  const l0 = 280.46646 + t * (36000.76983 + 0.0003032 * t); // mean longitude, eq. 25.2
  const mRad = (357.52911 + t * (35999.05029 - 0.0001537 * t)) * RAD_PER_DEG; // mean anomaly, eq. 25.3
  const c = // equation of the centre, Meeus p. 164
    (1.914602 - t * (0.004817 + 0.000014 * t)) * Math.sin(mRad) +
    (0.019993 - 0.000101 * t) * Math.sin(2 * mRad) +
    0.000289 * Math.sin(3 * mRad);
  const omegaRad = (125.04 - 1934.136 * t) * RAD_PER_DEG; // Meeus p. 164
  const lambdaRad = (l0 + c - 0.00569 - 0.00478 * Math.sin(omegaRad)) * RAD_PER_DEG; // apparent longitude, p. 164
  const eps0 = 23.43929111 - t * (0.013004167 + t * (1.6389e-7 - 5.0361e-7 * t)); // eq. 22.2
  const epsRad = (eps0 + 0.00256 * Math.cos(omegaRad)) * RAD_PER_DEG; // p. 165
  const sinLambda = Math.sin(lambdaRad);
  const raDeg = normalizeDeg360(Math.atan2(Math.cos(epsRad) * sinLambda, Math.cos(lambdaRad)) * DEG_PER_RAD); // eq. 25.6
  const decRad = Math.asin(Math.sin(epsRad) * sinLambda); // eq. 25.7
  // Nutation in longitude, low accuracy (Meeus ch. 22, p. 144), arcseconds.
  const l0Rad = l0 * RAD_PER_DEG;
  const dPsiArcsec = -17.2 * Math.sin(omegaRad) - 1.32 * Math.sin(2 * l0Rad);
  const d = jdUT - 2451545;
  const tu = d / 36525;
  const gmstDeg = 280.46061837 + 360.98564736629 * d + tu * tu * (0.000387933 - tu / 38710000); // eq. 12.4
  const gastDeg = gmstDeg + (dPsiArcsec / 3600) * Math.cos(epsRad); // Meeus ch. 12, p. 88
  const hourAngleDeg = normalizeDeg180(gastDeg + site.longitudeDeg - raDeg);
  const hRad = hourAngleDeg * RAD_PER_DEG;
  const latRad = site.latitudeDeg * RAD_PER_DEG;
  const sinLat = Math.sin(latRad);
  const cosLat = Math.cos(latRad);
  const sinDec = Math.sin(decRad);
  const cosDec = Math.cos(decRad);
  const sinAlt = sinLat * sinDec + cosLat * cosDec * Math.cos(hRad); // eq. 13.6
  const geometricAltitudeDeg = Math.asin(Math.max(-1, Math.min(1, sinAlt))) * DEG_PER_RAD;
  // eq. 13.5 gives azimuth from the south; +180 turns it to clockwise from north.
  const azSouth = Math.atan2(Math.sin(hRad), Math.cos(hRad) * sinLat - (sinDec / cosDec) * cosLat) * DEG_PER_RAD;
  const utFraction = jdUT - 0.5 - Math.floor(jdUT - 0.5);
  const eotDeg = normalizeDeg180(gastDeg - raDeg - (360 * utFraction - 180)); // as in sunPosition.ts
  return {
    azimuthDeg: normalizeDeg360(azSouth + 180),
    altitudeDeg: geometricAltitudeDeg + refractionDeg(geometricAltitudeDeg, air),
    geometricAltitudeDeg,
    declinationDeg: decRad * DEG_PER_RAD,
    rightAscensionDeg: raDeg,
    hourAngleDeg,
    equationOfTimeMinutes: 4 * eotDeg,
  };
}
