/**
 * The moon's place and look for an instant (UT Julian Day) and a site: topocentric azimuth and
 * altitude (refracted and geometric), the geocentric illuminated fraction and phase angle, the
 * elongation from the sun, the position angle of the bright limb and its tilt from the vertical
 * as the observer sees it.
 *
 * Model: astronomy-engine (its lunar theory after Chapront-Touze and Chapront's ELP 2000-82 as
 * abridged in Montenbruck and Pfleger, "Astronomy on the Personal Computer"; topocentric parallax
 * with the WGS-84 ellipsoid; IAU 2006 precession, IAU 2000B nutation). Refraction as for the sun
 * (src/ephemeris/refraction.ts). The phase and the bright limb follow Meeus, Astronomical
 * Algorithms, 2nd ed. (1998), ch. 48, from geocentric apparent places; the tilt seen by the
 * observer subtracts the parallactic angle (Meeus eq. 14.1) at the topocentric place.
 * The moon is evaluated at a time shifted by lunarAccelerationShiftDays, which puts astronomy-engine's
 * lunar series on the secular acceleration of ELP-2000/82 that the Delta T models assume (below).
 * Accuracy: astronomy-engine states about 1 arcminute for the moon over the modern era; measured
 * against astronomia (Meeus ch. 47) and the NASA Five Millennium Canon of eclipses in
 * tests/ephemeris/moonAccuracy.test.ts (see docs/moon.md).
 * Leaves out: the moon's semi-diameter (altitudes are of the centre), libration, the horizon dip.
 */
import { AstroTime, Body, EquatorFromVector, GeoVector, Horizon, Observer, RotateVector, Rotation_EQD_ECT, Rotation_EQJ_EQD, SiderealTime, SphereFromVector, Vector } from 'astronomy-engine';
import type { Air } from '../scene/types.js';
import { atan2Deg, cosDeg, normalizeDeg180, normalizeDeg360, sinDeg, tanDeg, acosClamped, radToDeg } from '../math/angles.js';
import { astroTimeFromJdUT, withDeltaT } from './engine.js';
import { refractionDeg } from './refraction.js';
import { geocentricSunOfDate, topocentricOfDate, type SunPositionOptions, type SunSite } from './sunPosition.js';

/** The moon as seen from a site at one instant. Degrees throughout; see docs/conventions.md. */
export interface MoonPosition {
  readonly jdUT: number;
  readonly jdTT: number;
  /** Clockwise from true north, [0, 360). */
  readonly azimuthDeg: number;
  /** Apparent altitude of the centre: refracted unless air === 'none'. */
  readonly altitudeDeg: number;
  /** Geometric (unrefracted) topocentric altitude of the centre. */
  readonly geometricAltitudeDeg: number;
  /** Topocentric apparent right ascension, [0, 360), true equator and equinox of date. */
  readonly rightAscensionDeg: number;
  /** Topocentric apparent declination. */
  readonly declinationDeg: number;
  /** Local hour angle of the topocentric moon, (-180, 180], negative before transit. */
  readonly hourAngleDeg: number;
  /** Distance from the observer, km. */
  readonly distanceKm: number;
  /** Geocentric phase angle i (sun-moon-earth), [0, 180] (Meeus eq. 48.3). */
  readonly phaseAngleDeg: number;
  /** Geocentric illuminated fraction k = (1 + cos i) / 2 (Meeus eq. 48.1), [0, 1]. */
  readonly illuminatedFraction: number;
  /** Geocentric elongation of the moon from the sun, [0, 180] (Meeus eq. 48.2). */
  readonly elongationDeg: number;
  /** Moon's ecliptic longitude minus the sun's, [0, 360): 0 new, 90 first quarter, 180 full, 270 last quarter. */
  readonly phaseLongitudeDeg: number;
  /** true between new and full moon (the lit side towards the west, evening sky). */
  readonly waxing: boolean;
  /** Position angle of the midpoint of the bright limb, from north through east, [0, 360) (Meeus eq. 48.5). */
  readonly brightLimbPositionAngleDeg: number;
  /** Parallactic angle at the topocentric moon, (-180, 180] (Meeus eq. 14.1). */
  readonly parallacticAngleDeg: number;
  /**
   * The bright limb's direction as the observer sees it, from straight up (towards the zenith),
   * positive counterclockwise as seen (towards the observer's left), (-180, 180]:
   * 0 = lit side on top, +90 = lit on the left, -90 = lit on the right, 180 = lit at the bottom.
   * Bright-limb position angle minus the parallactic angle, both at the topocentric place.
   */
  readonly brightLimbTiltFromVerticalDeg: number;
}

const KM_PER_AU = 149_597_870.7;

/** T^2 coefficient of the moon's mean longitude, deg per Julian century^2: Meeus (1998) eq. 47.1, after Chapront-Touze and Chapront's ELP-2000/82 (1991 constants). */
const ELP_MEAN_LONGITUDE_T2_DEG = -0.0015786;
/** The same coefficient in astronomy-engine 2.1's lunar series (CalcMoon, L0: -0.00000313 revolutions per century^2). */
const ENGINE_MEAN_LONGITUDE_T2_DEG = -0.00000313 * 360;
/** The moon's mean motion in longitude, deg per day (Meeus 1998, eq. 47.1: 481267.88123421 deg per century). */
const MOON_MEAN_MOTION_DEG_PER_DAY = 481267.88123421 / 36525;

/**
 * The time shift, days, that brings astronomy-engine's moon onto the secular acceleration of ELP-2000/82
 * (the one the Delta T models assume, Morrison and Stephenson 2004; Espenak and Meeus 2006 use
 * n-dot = -25.858 arcsec per century^2). astronomy-engine's lunar mean elements carry T^2 terms about
 * 1.63 arcsec per century^2 smaller in magnitude than Meeus eq. 47.1 (in L', D, M' and F alike: an older
 * tidal acceleration), which puts its moon up to 0.06 deg ahead in AD 1000 and its conjunctions 4.6 min
 * early against the NASA Five Millennium Canon (measured, tests/ephemeris/moonAccuracy.test.ts).
 * Evaluating the moon at TT + shift removes it: shift = ((c_ELP - c_engine) T^2 + T^3 / 538841 - T^4 / 65194000) / n,
 * the last two the terms of eq. 47.1 that astronomy-engine's mean longitude lacks.
 * @param ttDaysSinceJ2000 TT, days since J2000.0.
 */
export function lunarAccelerationShiftDays(ttDaysSinceJ2000: number): number {
  const t = ttDaysSinceJ2000 / 36525;
  // astronomy-engine's mean longitude has no T^3 and T^4 terms; Meeus eq. 47.1 has T^3 / 538841 - T^4 / 65194000.
  const missingDeg = (ELP_MEAN_LONGITUDE_T2_DEG - ENGINE_MEAN_LONGITUDE_T2_DEG) * t * t + (t * t * t) / 538841 - (t * t * t * t) / 65194000;
  return missingDeg / MOON_MEAN_MOTION_DEG_PER_DAY;
}

/** The moon's geocentric apparent vector, true equator and equinox of date, AU, with the secular-acceleration shift above. */
export function geocentricMoonOfDate(time: AstroTime): Vector {
  const shifted = GeoVector(Body.Moon, time.AddDays(lunarAccelerationShiftDays(time.tt)), true);
  return RotateVector(Rotation_EQJ_EQD(time), new Vector(shifted.x, shifted.y, shifted.z, time));
}

/** Position angle of the bright limb, Meeus (1998) eq. 48.5; sun (raSun, decSun), moon (raMoon, decMoon), degrees. */
export function brightLimbPositionAngleDeg(raSunDeg: number, decSunDeg: number, raMoonDeg: number, decMoonDeg: number): number {
  const y = cosDeg(decSunDeg) * sinDeg(raSunDeg - raMoonDeg);
  const x = sinDeg(decSunDeg) * cosDeg(decMoonDeg) - cosDeg(decSunDeg) * sinDeg(decMoonDeg) * cosDeg(raSunDeg - raMoonDeg);
  return normalizeDeg360(atan2Deg(y, x));
}

/** Parallactic angle q, Meeus (1998) eq. 14.1: tan q = sin H / (tan phi cos dec - sin dec cos H), degrees. */
export function parallacticAngleDeg(latitudeDeg: number, hourAngleDeg: number, declinationDeg: number): number {
  return atan2Deg(sinDeg(hourAngleDeg), tanDeg(latitudeDeg) * cosDeg(declinationDeg) - sinDeg(declinationDeg) * cosDeg(hourAngleDeg));
}

/**
 * The moon's geocentric apparent ecliptic longitude minus the sun's, true ecliptic and equinox of date,
 * [0, 360) (0 new, 90 first quarter, 180 full, 270 last quarter; Meeus 1998 ch. 49 defines the phases by
 * apparent longitudes). From geocentricMoonOfDate and geocentricSunOfDate (with aberration); not
 * astronomy-engine's MoonPhase, which leaves out the sun's aberration (20.5", so its phases come about
 * 40 s late: measured on Meeus Example 49.a).
 */
export function moonPhaseLongitudeDeg(time: AstroTime): number {
  return phaseLongitudeOfVectors(time, geocentricMoonOfDate(time), geocentricSunOfDate(time));
}

/** moonPhaseLongitudeDeg from the moon's and the sun's geocentric vectors of date at `time`, already at hand (the same numbers). */
function phaseLongitudeOfVectors(time: AstroTime, moonGeo: Vector, sunGeo: Vector): number {
  const toEcliptic = Rotation_EQD_ECT(time);
  const moon = SphereFromVector(RotateVector(toEcliptic, moonGeo));
  const sun = SphereFromVector(RotateVector(toEcliptic, sunGeo));
  return normalizeDeg360(moon.lon - sun.lon);
}

/**
 * The moon at instant jdUT seen from `site`.
 * @param air refraction air; absent = standard air; 'none' = geometric altitude.
 * @example moonPosition(2448724.5 - 59 / 86400, site, 'none', { deltaTSeconds: 59 }).illuminatedFraction // 0.6786 (Meeus Example 48.a)
 */
export function moonPosition(jdUT: number, site: SunSite, air?: Air | 'none', options?: SunPositionOptions): MoonPosition {
  return withDeltaT(options?.deltaTSeconds ?? options?.deltaTModel, () => moonPositionInForce(jdUT, site, air, options));
}

function moonPositionInForce(jdUT: number, site: SunSite, air: Air | 'none' | undefined, options: SunPositionOptions | undefined): MoonPosition {
  const time = astroTimeFromJdUT(jdUT, options?.deltaTSeconds);
  const observer = new Observer(site.latitudeDeg, site.longitudeDeg, site.elevationM);
  // Geocentric apparent places of date (astronomy-engine GeoVector with light time, rotated J2000 -> of date).
  const moonGeo = geocentricMoonOfDate(time);
  const sunGeo = geocentricSunOfDate(time);
  const seen = options?.topocentric !== false ? topocentricOfDate(moonGeo, time, observer) : moonGeo;
  const eqTopo = EquatorFromVector(seen);
  const eqMoonGeo = EquatorFromVector(moonGeo);
  const eqSun = EquatorFromVector(sunGeo);
  const hor = Horizon(time, observer, eqTopo.ra, eqTopo.dec, undefined);
  const geometricAltitudeDeg = hor.altitude;

  // Elongation psi (Meeus eq. 48.2, as the angle between the geocentric vectors) and phase angle i
  // (Meeus eq. 48.3: tan i = R sin psi / (Delta - R cos psi)), k = (1 + cos i) / 2 (eq. 48.1).
  const dotGeo = moonGeo.x * sunGeo.x + moonGeo.y * sunGeo.y + moonGeo.z * sunGeo.z;
  const elongationDeg = radToDeg(acosClamped(dotGeo / (moonGeo.Length() * sunGeo.Length())));
  const sunDist = sunGeo.Length();
  const moonDist = moonGeo.Length();
  const phaseAngleDeg = atan2Deg(sunDist * sinDeg(elongationDeg), moonDist - sunDist * cosDeg(elongationDeg));
  const illuminatedFraction = (1 + cosDeg(phaseAngleDeg)) / 2;
  // The same vectors as above: moonPhaseLongitudeDeg(time) would compute both again (the costliest part of a call).
  const phaseLongitudeDeg = phaseLongitudeOfVectors(time, moonGeo, sunGeo);

  // Bright limb from geocentric places (Meeus ch. 48) ...
  const limbGeoDeg = brightLimbPositionAngleDeg(eqSun.ra * 15, eqSun.dec, eqMoonGeo.ra * 15, eqMoonGeo.dec);
  // ... and as seen: at the topocentric place, minus the parallactic angle (Meeus eq. 14.1).
  const limbTopoDeg = brightLimbPositionAngleDeg(eqSun.ra * 15, eqSun.dec, eqTopo.ra * 15, eqTopo.dec);
  // Local hour angle = GAST + east longitude - RA (Meeus 1998, ch. 13).
  const hourAngleDeg = normalizeDeg180(15 * SiderealTime(time) + site.longitudeDeg - 15 * eqTopo.ra);
  const q = parallacticAngleDeg(site.latitudeDeg, hourAngleDeg, eqTopo.dec);
  return {
    jdUT,
    jdTT: time.tt + 2451545.0,
    azimuthDeg: hor.azimuth,
    altitudeDeg: geometricAltitudeDeg + refractionDeg(geometricAltitudeDeg, air),
    geometricAltitudeDeg,
    rightAscensionDeg: eqTopo.ra * 15,
    declinationDeg: eqTopo.dec,
    hourAngleDeg,
    distanceKm: seen.Length() * KM_PER_AU,
    phaseAngleDeg,
    illuminatedFraction,
    elongationDeg,
    phaseLongitudeDeg,
    waxing: phaseLongitudeDeg < 180,
    brightLimbPositionAngleDeg: limbGeoDeg,
    parallacticAngleDeg: q,
    brightLimbTiltFromVerticalDeg: normalizeDeg180(limbTopoDeg - q),
  };
}
