/**
 * The sun's place in the sky for an instant (UT Julian Day) and a site: topocentric apparent
 * azimuth and altitude (with and without refraction), right ascension, declination, local
 * hour angle, and the equation of time.
 *
 * Model: astronomy-engine (VSOP87 for the Earth, IAU 2006 precession, IAU 2000B nutation,
 * annual aberration, light time, topocentric parallax with the WGS-84 ellipsoid); its
 * `Horizon(..., undefined)` gives the geometric altitude, and our refraction
 * (src/ephemeris/refraction.ts, Reda and Andreas 2008 eq. 42) is added.
 * Accuracy: agrees with the NREL SPA worked example (Reda and Andreas 2008, Table A5.1)
 * to better than 0.001 deg in azimuth and zenith when the same Delta T is used
 * (tests/ephemeris/sunPosition.test.ts). Against astronomia's Meeus/VSOP87D (10,000 random
 * instants 1000-2100, tests/ephemeris/crossCheckAstronomia.test.ts) the largest difference is
 * 0.008 deg, growing with distance from 2000 (0.0006 deg over 1900-2100, 0.002 deg around
 * 1600, 0.008 deg around 1000-1200); which side errs there is not settled. astronomy-engine's own accuracy is about 1 arcminute
 * or better for the sun over several millennia. By era, the sun's direction in the Earth-fixed
 * frame departs from VSOP87D (astronomia) by at most 0.042 deg at -500, 0.016 deg at 500,
 * 0.008 deg at 1000, 0.004 deg at 1400 and 0.0004 deg at 2000, mostly in declination
 * (tests/ephemeris/sunAccuracyByEra.test.ts). Given the instant in UT (as every clock
 * reading is), Delta T only moves the sun along its orbit, 0.041" per second of Delta T:
 * even a 720 s sigma at -1000 is 0.008 deg. (Were the instant known in TT, each second of
 * Delta T would turn the Earth by 15".)
 * Evaluation: the same numbers are computed by src/ephemeris/sunOfDate.ts, which performs the
 * library's floating-point operations in its order without making its objects (about 1.8 times
 * faster, a sixth of the garbage); `sunPositionByEngine` keeps the library's own calls as the reference
 * (tests/ephemeris/sunOfDate.test.ts checks that every field is the same double).
 * Leaves out: refraction below the horizon (see refraction.ts), the horizon dip of a raised observer.
 */
import { Body, EquatorFromVector, Horizon, Observer, ObserverVector, RotateVector, Rotation_EQJ_EQD, SiderealTime, Vector, GeoVector, type AstroTime } from 'astronomy-engine';
import type { Air } from '../scene/types.js';
import { normalizeDeg180 } from '../math/angles.js';
import type { DeltaTModel } from '../time/deltaT.js';
import { astroTimeFromJdUT, withDeltaT } from './engine.js';
import { refractionDeg } from './refraction.js';
import { sunOfDate } from './sunOfDate.js';

/** A site on the Earth: degrees (latitude north positive, longitude east positive), metres above sea level. */
export interface SunSite {
  readonly latitudeDeg: number;
  readonly longitudeDeg: number;
  readonly elevationM: number;
}

/** The sun as seen from a site at one instant. Degrees throughout; see docs/conventions.md. */
export interface SunPosition {
  readonly jdUT: number;
  readonly jdTT: number;
  /** Clockwise from true north, [0, 360). */
  readonly azimuthDeg: number;
  /** Apparent altitude: refracted unless air === 'none'. */
  readonly altitudeDeg: number;
  /** Geometric (unrefracted) topocentric altitude of the sun's centre. */
  readonly geometricAltitudeDeg: number;
  /** Topocentric apparent declination, true equator and equinox of date. */
  readonly declinationDeg: number;
  /** Topocentric apparent right ascension, degrees [0, 360). */
  readonly rightAscensionDeg: number;
  /** Local hour angle, (-180, 180], negative before transit. */
  readonly hourAngleDeg: number;
  /** Apparent minus mean solar time, minutes (geocentric). */
  readonly equationOfTimeMinutes: number;
}

/** Options: the Delta T model, a fixed Delta T for checks against published examples, the frame. */
export interface SunPositionOptions {
  /** Use this Delta T (TT - UT, seconds) instead of a model (checks against published examples). */
  readonly deltaTSeconds?: number;
  /** The Delta T model (src/time/deltaT.ts); absent: the default, Morrison et al. (2021). */
  readonly deltaTModel?: DeltaTModel;
  /** false: geocentric (no parallax) instead of topocentric. Default true. */
  readonly topocentric?: boolean;
}

/** Geocentric apparent position vector of the sun, true equator and equinox of date (AU). */
export function geocentricSunOfDate(time: AstroTime): Vector {
  // astronomy-engine GeoVector with aberration, then precession-nutation J2000 -> of date.
  return RotateVector(Rotation_EQJ_EQD(time), GeoVector(Body.Sun, time, true));
}

/** A geocentric vector of date as seen from the observer: the observer's geocentric position of date subtracted (astronomy-engine ObserverVector). */
export function topocentricOfDate(geo: Vector, time: AstroTime, observer: Observer): Vector {
  const obs = ObserverVector(time, observer, true);
  return new Vector(geo.x - obs.x, geo.y - obs.y, geo.z - obs.z, time);
}

/**
 * Equation of time in minutes from the sun's geocentric apparent right ascension:
 * E = (Greenwich hour angle of the true sun) - (Greenwich hour angle of the mean sun),
 * GHA_true = GAST - RA (Meeus 1998, ch. 12 and 13), GHA_mean = 15 deg x UT hours - 180 deg,
 * because mean solar time at Greenwich is UT by definition (Explanatory Supplement to the
 * Astronomical Almanac, 1992, sec. 2.24). Positive: the sundial is ahead of the mean clock.
 */
export function equationOfTimeFromRaMinutes(jdUT: number, gastHours: number, raHours: number): number {
  const utFraction = jdUT - 0.5 - Math.floor(jdUT - 0.5);
  const trueGhaDeg = 15 * (gastHours - raHours);
  const meanGhaDeg = 360 * utFraction - 180;
  return 4 * normalizeDeg180(trueGhaDeg - meanGhaDeg);
}

/**
 * The sun at instant jdUT seen from `site`.
 * @param air refraction air; absent = standard air (1010 hPa, 10 C); 'none' = geometric altitude.
 * @example sunPosition(2452930.312847, { latitudeDeg: 39.742476, longitudeDeg: -105.1786, elevationM: 1830.14 },
 *   { pressureHPa: 820, temperatureC: 11 }, { deltaTSeconds: 67 }).azimuthDeg // 194.340
 */
export function sunPosition(jdUT: number, site: SunSite, air?: Air | 'none', options?: SunPositionOptions): SunPosition {
  const { latitudeDeg, longitudeDeg, elevationM } = site;
  // What the library would refuse (a non-finite number, a latitude beyond the poles) goes to it, to throw its own error.
  if (!(Number.isFinite(jdUT) && Number.isFinite(longitudeDeg) && Number.isFinite(elevationM) && latitudeDeg >= -90 && latitudeDeg <= 90)) {
    return sunPositionByEngine(jdUT, site, air, options);
  }
  const deltaTSeconds = options?.deltaTSeconds;
  const sun = sunOfDate(jdUT, site, deltaTSeconds ?? options?.deltaTModel, deltaTSeconds, options?.topocentric !== false);
  const geometricAltitudeDeg = sun.geometricAltitudeDeg;
  if (!(Number.isFinite(geometricAltitudeDeg) && Number.isFinite(sun.azimuthDeg) && Number.isFinite(sun.raHours) && Number.isFinite(sun.geocentricRaHours))) {
    return sunPositionByEngine(jdUT, site, air, options);
  }
  return sunPositionOf(jdUT, sun.jdTT, sun.azimuthDeg, geometricAltitudeDeg, sun.decDeg, sun.raHours, sun.gastHours, sun.geocentricRaHours, longitudeDeg, air);
}

/**
 * The SunPosition of the sun's topocentric place (RA in hours, dec and horizon in degrees), the
 * apparent sidereal time and the geocentric RA: refraction added, the local hour angle
 * H = GAST + longitude - RA (Meeus 1998, eq. 13.1 with east longitude positive), and the equation of time.
 */
function sunPositionOf(jdUT: number, jdTT: number, azimuthDeg: number, geometricAltitudeDeg: number, decDeg: number, raHours: number, gastHours: number, geocentricRaHours: number, longitudeDeg: number, air: Air | 'none' | undefined): SunPosition {
  return {
    jdUT,
    jdTT,
    azimuthDeg,
    altitudeDeg: geometricAltitudeDeg + refractionDeg(geometricAltitudeDeg, air),
    geometricAltitudeDeg,
    declinationDeg: decDeg,
    rightAscensionDeg: raHours * 15,
    hourAngleDeg: normalizeDeg180(15 * gastHours + longitudeDeg - 15 * raHours),
    equationOfTimeMinutes: equationOfTimeFromRaMinutes(jdUT, gastHours, geocentricRaHours),
  };
}

/**
 * sunPosition by astronomy-engine's own calls (GeoVector, Rotation_EQJ_EQD, ObserverVector,
 * EquatorFromVector, Horizon, SiderealTime): the reference that sunPosition reproduces
 * (tests/ephemeris/sunOfDate.test.ts), and the path that throws the library's errors for invalid input.
 */
export function sunPositionByEngine(jdUT: number, site: SunSite, air?: Air | 'none', options?: SunPositionOptions): SunPosition {
  return withDeltaT(options?.deltaTSeconds ?? options?.deltaTModel, () => sunPositionInForce(jdUT, site, air, options));
}

/** sunPosition with the Delta T in force (src/ephemeris/engine.ts). */
function sunPositionInForce(jdUT: number, site: SunSite, air: Air | 'none' | undefined, options: SunPositionOptions | undefined): SunPosition {
  const time = astroTimeFromJdUT(jdUT, options?.deltaTSeconds);
  const observer = new Observer(site.latitudeDeg, site.longitudeDeg, site.elevationM);
  const geo = geocentricSunOfDate(time);
  const seen = options?.topocentric !== false ? topocentricOfDate(geo, time, observer) : geo;
  const eq = EquatorFromVector(seen);
  const hor = Horizon(time, observer, eq.ra, eq.dec, undefined);
  const geoRaHours = seen === geo ? eq.ra : EquatorFromVector(geo).ra;
  return sunPositionOf(jdUT, time.tt + 2451545.0, hor.azimuth, hor.altitude, eq.dec, eq.ra, SiderealTime(time), geoRaHours, site.longitudeDeg, air);
}
