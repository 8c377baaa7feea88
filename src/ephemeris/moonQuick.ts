/**
 * A quick moon for scanning many instants: its topocentric apparent azimuth and altitude from
 * low-precision series, about a hundred times cheaper than src/ephemeris/moonPosition.ts.
 *
 * - Ecliptic longitude, latitude and horizontal parallax of date: the six, four and four leading
 *   periodic terms of the low-precision formulae of The Astronomical Almanac (section D, "Low
 *   precision formulae for the Moon's coordinates"; stated there: 0.3 deg in longitude, 0.2 deg in
 *   latitude; from memory, the error measured below), with the quadratic term of the mean longitude
 *   of Meeus, Astronomical Algorithms, 2nd ed. (1998), eq. 47.1.
 * - To the equator with the mean obliquity of date (Meeus eq. 22.2, first two terms; eq. 13.3, 13.4).
 * - Greenwich mean sidereal time, Meeus eq. 12.4; altitude and azimuth, Meeus eqs. 13.5 and 13.6.
 * - Parallax in altitude on a spherical earth: h' = h - pi cos h (Meeus ch. 40, the first-order form;
 *   common practice); refraction as for the sun (src/ephemeris/refraction.ts).
 * Accuracy, measured against moonPosition.ts from 1000 to 2100 in tests/ephemeris/moonQuick.test.ts:
 * within QUICK_MOON_ALLOWANCE_DEG in azimuth (times cos altitude) and altitude. Used only to screen
 * instants; every answer is refined with moonPosition.ts. Leaves out nutation, aberration and the
 * secular acceleration's shift of moonPosition.ts (within the allowance over that span).
 */
import type { Air } from '../scene/types.js';
import { atan2Deg, asinClamped, cosDeg, normalizeDeg360, radToDeg, sinDeg } from '../math/angles.js';
import { refractionDeg } from './refraction.js';

/** Largest difference from moonPosition.ts in either coordinate, degrees (measured, with margin: see the test). */
export const QUICK_MOON_ALLOWANCE_DEG = 0.6;

/** The quick moon's direction, degrees. */
export interface QuickMoon {
  /** Clockwise from true north, [0, 360). */
  readonly azimuthDeg: number;
  /** Apparent (refracted unless air is 'none') topocentric altitude of the centre. */
  readonly altitudeDeg: number;
  readonly geometricAltitudeDeg: number;
}

/** The quick moon's geocentric place of date: right ascension and declination, and its equatorial horizontal parallax, degrees. */
export interface QuickMoonEquatorial {
  readonly rightAscensionDeg: number;
  readonly declinationDeg: number;
  readonly parallaxDeg: number;
}

/**
 * The quick moon's geocentric place at jdUT (the low-precision series, see the header).
 * @param deltaTSeconds TT - UT at the instant
 */
export function quickMoonEquatorial(jdUT: number, deltaTSeconds: number): QuickMoonEquatorial {
  const t = (jdUT + deltaTSeconds / 86400 - 2451545) / 36525; // Julian centuries of TT from J2000.0
  // The Astronomical Almanac, low-precision formulae (ecliptic and equinox of date), degrees.
  const lambda = 218.32 + 481267.881 * t - 0.0015786 * t * t
    + 6.29 * sinDeg(135.0 + 477198.87 * t) - 1.27 * sinDeg(259.3 - 413335.36 * t)
    + 0.66 * sinDeg(235.7 + 890534.22 * t) + 0.21 * sinDeg(269.9 + 954397.74 * t)
    - 0.19 * sinDeg(357.5 + 35999.05 * t) - 0.11 * sinDeg(186.5 + 966404.03 * t);
  const beta = 5.13 * sinDeg(93.3 + 483202.02 * t) + 0.28 * sinDeg(228.2 + 960400.89 * t)
    - 0.28 * sinDeg(318.3 + 6003.15 * t) - 0.17 * sinDeg(217.6 - 407332.21 * t);
  const parallaxDeg = 0.9508 + 0.0518 * cosDeg(135.0 + 477198.87 * t) + 0.0095 * cosDeg(259.3 - 413335.36 * t)
    + 0.0078 * cosDeg(235.7 + 890534.22 * t) + 0.0028 * cosDeg(269.9 + 954397.74 * t);
  // Mean obliquity, Meeus eq. 22.2 (first two terms); ecliptic to equator, Meeus eqs. 13.3 and 13.4.
  const eps = 23.439291 - 0.0130042 * t;
  const rightAscensionDeg = normalizeDeg360(atan2Deg(sinDeg(lambda) * cosDeg(eps) - (sinDeg(beta) / cosDeg(beta)) * sinDeg(eps), cosDeg(lambda)));
  const declinationDeg = radToDeg(asinClamped(sinDeg(beta) * cosDeg(eps) + cosDeg(beta) * sinDeg(eps) * sinDeg(lambda))); // asinClamped gives radians
  return { rightAscensionDeg, declinationDeg, parallaxDeg };
}

/**
 * The quick moon's direction seen from a site at jdUT, from its geocentric place (quickMoonEquatorial,
 * at that instant or interpolated to it).
 */
export function quickMoonHorizontal(place: QuickMoonEquatorial, jdUT: number, latitudeDeg: number, longitudeDeg: number, air?: Air | 'none'): QuickMoon {
  // Greenwich mean sidereal time, Meeus eq. 12.4 (UT).
  const d = jdUT - 2451545;
  const tu = d / 36525;
  const gmst = 280.46061837 + 360.98564736629 * d + 0.000387933 * tu * tu;
  // Local hour angle, reduced to [0, 360) before the sines: far from 2000 the sidereal time is
  // hundreds of millions of degrees, and a reduced argument is both quicker and more exact.
  const h = normalizeDeg360(gmst + longitudeDeg - place.rightAscensionDeg);
  const dec = place.declinationDeg;
  // Meeus eqs. 13.5 (azimuth from the south, turned to from the north) and 13.6.
  const sinAlt = sinDeg(latitudeDeg) * sinDeg(dec) + cosDeg(latitudeDeg) * cosDeg(dec) * cosDeg(h);
  const geocentricAltitude = radToDeg(asinClamped(sinAlt));
  const fromSouth = atan2Deg(sinDeg(h), cosDeg(h) * sinDeg(latitudeDeg) - (sinDeg(dec) / cosDeg(dec)) * cosDeg(latitudeDeg));
  const geometricAltitudeDeg = geocentricAltitude - place.parallaxDeg * cosDeg(geocentricAltitude);
  return {
    azimuthDeg: normalizeDeg360(fromSouth + 180),
    altitudeDeg: geometricAltitudeDeg + refractionDeg(geometricAltitudeDeg, air),
    geometricAltitudeDeg,
  };
}

/**
 * The quick moon at jdUT for a site (degrees, east longitude positive).
 * @param deltaTSeconds TT - UT at the instant
 * @example quickMoon(2451545, 0, 0, 64).altitudeDeg // within 0.6 deg of moonPosition's
 */
export function quickMoon(jdUT: number, latitudeDeg: number, longitudeDeg: number, deltaTSeconds: number, air?: Air | 'none'): QuickMoon {
  return quickMoonHorizontal(quickMoonEquatorial(jdUT, deltaTSeconds), jdUT, latitudeDeg, longitudeDeg, air);
}
