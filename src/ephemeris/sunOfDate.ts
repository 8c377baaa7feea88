/**
 * The sun's apparent place for an instant and a site exactly as astronomy-engine 2.1.19 computes
 * it for sunPosition.ts, evaluated without the library's objects: the same floating-point
 * operations in the same order on the same constants, so that every number is the same double as
 * the library's (checked with Object.is at thousands of random instants from -3000 to +3000,
 * tests/ephemeris/sunOfDate.test.ts), in a little over half the CPU time and with about a sixth
 * of the allocation (2.5 instead of 14 kB per call; bench/sun-position.mjs). What remains is
 * mostly the trigonometry of the VSOP87 series, evaluated three times for the light time.
 *
 * The pipeline, with the library's function names (its esm/astronomy.js) in brackets:
 * 1. UT days since J2000.0 and TT from the Delta T in force (src/ephemeris/engine.ts) [AstroTime,
 *    TerrestrialTime].
 * 2. The Earth's heliocentric place from VSOP87 (Bretagnon and Francou 1988, as truncated by the
 *    library: src/ephemeris/vsopEarth.generated.ts) [CalcVsop, VsopFormula, VsopSphereToRect,
 *    VsopRotate]; the sun's geocentric place with the Earth backdated by the light time, which
 *    gives the light time and the annual aberration together [GeoVector(Body.Sun, time, true),
 *    BackdatePosition, CorrectLightTravel].
 * 3. J2000 mean equator to true equator and equinox of date: IAU 2006 precession (Capitaine,
 *    Wallace and Chapront 2003, eqs. 37-39, the four-rotation form) and IAU 2000B nutation
 *    (McCarthy and Luzum 2003) [Rotation_EQJ_EQD, precession_rot, nutation_rot, CombineRotation,
 *    RotateVector].
 * 4. Greenwich apparent sidereal time from the Earth rotation angle (IERS Conventions 2003,
 *    ch. 5) and the equation of the equinoxes [sidereal_time, era].
 * 5. The site's geocentric place of date on the library's ellipsoid, subtracted (topocentric)
 *    [ObserverVector(time, observer, true), terra, after NOVAS, Kaplan et al. 2011].
 * 6. Right ascension and declination [EquatorFromVector, SphereFromVector]; azimuth and altitude
 *    without refraction [Horizon(..., undefined), spin, after NOVAS equ2hor].
 *
 * Nutation comes from the library's own exported e_tilt, called once at the time's TT as the
 * library does: e_tilt keeps the last value it computed and reuses it within 1e-6 day of TT, one
 * cache shared with every other library call (the moon's), so calling it keeps that behaviour
 * exactly. The library also caches sidereal time by TT alone; here it is computed afresh, which
 * gives the same value except when two successive calls share a TT but not a UT (two Delta T
 * choices), where the library would return the first call's value.
 * Leaves out: refraction (sunPosition.ts adds it), validation (sunPosition.ts leaves invalid input
 * to the library, which throws its own errors).
 */
import { C_AUDAY, DEG2RAD, HOUR2RAD, KM_PER_AU, RAD2DEG, RAD2HOUR, e_tilt, type AstroTime } from 'astronomy-engine';
import { deltaTSecondsAtUt, J2000_JD, type DeltaTChoice } from './engine.js';
import { VSOP_EARTH_LATITUDE, VSOP_EARTH_LONGITUDE, VSOP_EARTH_RADIUS, type VsopSeries } from './vsopEarth.generated.js';

/** Constants of astronomy-engine 2.1.19 that it does not export (esm/astronomy.js, lines 98-115). */
const PI2 = 2 * Math.PI;
const ASEC2RAD = 4.848136811095359935899141e-6;
const EARTH_FLATTENING = 0.996647180302104;
const EARTH_FLATTENING_SQUARED = EARTH_FLATTENING * EARTH_FLATTENING;
const EARTH_EQUATORIAL_RADIUS_KM = 6378.1366;
/** Days per Julian millennium, the time unit of VSOP87. */
const DAYS_PER_MILLENNIUM = 365250;

/** A site in the library's terms: degrees north and east, metres above sea level. */
export interface SiteOfDate {
  readonly latitudeDeg: number;
  readonly longitudeDeg: number;
  readonly elevationM: number;
}

/** The sun's place of date as the library gives it; the same doubles as the library's fields named. */
export interface SunOfDate {
  /** TT of the instant, Julian Day (AstroTime.tt + 2451545). */
  readonly jdTT: number;
  /** Clockwise from north, [0, 360) (Horizon().azimuth). */
  readonly azimuthDeg: number;
  /** Topocentric (or geocentric) geometric altitude (Horizon().altitude). */
  readonly geometricAltitudeDeg: number;
  /** Right ascension in hours [0, 24), true equator and equinox of date (EquatorFromVector().ra). */
  readonly raHours: number;
  /** Declination, true equator of date (EquatorFromVector().dec). */
  readonly decDeg: number;
  /** Geocentric right ascension in hours (equals raHours when not topocentric). */
  readonly geocentricRaHours: number;
  /** Greenwich apparent sidereal time in hours [0, 24) (SiderealTime()). */
  readonly gastHours: number;
}

/**
 * A VSOP87 coordinate at t Julian millennia of TT: sum over s of t^s sum A cos(B + C t), each
 * power's sum taken modulo 2 pi for a longitude (astronomy-engine VsopFormula; Bretagnon and
 * Francou 1988, eq. 1).
 */
function vsopFormula(series: VsopSeries, t: number, clampAngle: boolean): number {
  const { termCounts, terms } = series;
  let tpower = 1;
  let coord = 0;
  let k = 0;
  for (let s = 0; s < termCounts.length; s += 1) {
    let sum = 0;
    const end = k + 3 * termCounts[s]!;
    for (; k < end; k += 3) sum += terms[k]! * Math.cos(terms[k + 1]! + t * terms[k + 2]!);
    let incr = tpower * sum;
    if (clampAngle) incr %= PI2;
    coord += incr;
    tpower *= t;
  }
  return coord;
}

/** Greenwich apparent sidereal time, hours [0, 24), at UT and TT days since J2000 (astronomy-engine sidereal_time). */
function gastHoursAt(ut: number, tt: number, equationOfEquinoxesHours: number): number {
  const t = tt / 36525;
  const eqeq = 15 * equationOfEquinoxesHours;
  // Earth rotation angle, IERS Conventions 2003, ch. 5, eq. 14 (astronomy-engine era).
  const thet1 = 0.779057273264 + 0.00273781191135448 * ut;
  const thet3 = ut % 1;
  let theta = 360 * ((thet1 + thet3) % 1);
  if (theta < 0) theta += 360;
  // GMST - ERA in arcseconds, Capitaine, Wallace and Chapront (2003), eq. 42, plus the equation of the equinoxes.
  const st = eqeq + 0.014506 + ((((-0.0000000368 * t - 0.000029956) * t - 0.00000044) * t + 1.3915817) * t + 4612.156534) * t;
  let gst = ((st / 3600 + theta) % 360) / 15;
  if (gst < 0) gst += 24;
  return gst;
}

/**
 * The sun at `jdUT` seen from `site` (topocentric) or from the Earth's centre, with Delta T by
 * `deltaTChoice` (undefined: the choice in force) and, when `deltaTSeconds` is given, the outer
 * TT set from it as astroTimeFromJdUT does.
 * @example sunOfDate(2452930.312847, { latitudeDeg: 39.742476, longitudeDeg: -105.1786, elevationM: 1830.14 }, 67, 67, true).azimuthDeg // 194.34
 */
export function sunOfDate(jdUT: number, site: SiteOfDate, deltaTChoice: DeltaTChoice | undefined, deltaTSeconds: number | undefined, topocentric: boolean): SunOfDate {
  // 1. new AstroTime(jdUT - J2000): tt = ut + DeltaT(ut) / 86400; astroTimeFromJdUT may set tt from a stated Delta T.
  const ut = jdUT - J2000_JD;
  let tt = ut + deltaTSecondsAtUt(ut, deltaTChoice) / 86400;
  if (deltaTSeconds !== undefined) tt = ut + deltaTSeconds / 86400;

  // 3a. Precession J2000 -> date (astronomy-engine precession_rot, From2000), Capitaine et al. (2003) eqs. 37-39, arcseconds.
  const T = tt / 36525;
  let eps0 = 84381.406;
  let psia = ((((-0.0000000951 * T + 0.000132851) * T - 0.00114045) * T - 1.0790069) * T + 5038.481507) * T;
  let omegaa = ((((+0.0000003337 * T - 0.000000467) * T - 0.00772503) * T + 0.0512623) * T - 0.025754) * T + eps0;
  let chia = ((((-0.000000056 * T + 0.000170663) * T - 0.00121197) * T - 2.3814292) * T + 10.556403) * T;
  eps0 *= ASEC2RAD;
  psia *= ASEC2RAD;
  omegaa *= ASEC2RAD;
  chia *= ASEC2RAD;
  const sa = Math.sin(eps0);
  const ca = Math.cos(eps0);
  const sb = Math.sin(-psia);
  const cb = Math.cos(-psia);
  const sc = Math.sin(-omegaa);
  const cc = Math.cos(-omegaa);
  const sd = Math.sin(chia);
  const cd = Math.cos(chia);
  // The library's matrix rot[i][j] for From2000 is [[xx, xy, xz], [yx, yy, yz], [zx, zy, zz]].
  const p00 = cd * cb - sb * sd * cc;
  const p10 = cd * sb * ca + sd * cc * cb * ca - sa * sd * sc;
  const p20 = cd * sb * sa + sd * cc * cb * sa + ca * sd * sc;
  const p01 = -sd * cb - sb * cd * cc;
  const p11 = -sd * sb * ca + cd * cc * cb * ca - sa * cd * sc;
  const p21 = -sd * sb * sa + cd * cc * cb * sa + ca * cd * sc;
  const p02 = sb * sc;
  const p12 = -sc * cb * ca - sa * cc;
  const p22 = -sc * cb * sa + cc * ca;

  // 3b. Nutation J2000 -> date (astronomy-engine nutation_rot, From2000), IAU 2000B through the library's e_tilt.
  const tilt = e_tilt({ tt } as AstroTime);
  const oblm = tilt.mobl * DEG2RAD;
  const oblt = tilt.tobl * DEG2RAD;
  const psi = tilt.dpsi * ASEC2RAD;
  const cobm = Math.cos(oblm);
  const sobm = Math.sin(oblm);
  const cobt = Math.cos(oblt);
  const sobt = Math.sin(oblt);
  const cpsi = Math.cos(psi);
  const spsi = Math.sin(psi);
  const n00 = cpsi;
  const n10 = -spsi * cobm;
  const n20 = -spsi * sobm;
  const n01 = spsi * cobt;
  const n11 = cpsi * cobm * cobt + sobm * sobt;
  const n21 = cpsi * sobm * cobt - cobm * sobt;
  const n02 = spsi * sobt;
  const n12 = cpsi * cobm * sobt - sobm * cobt;
  const n22 = cpsi * sobm * sobt + cobm * cobt;
  // Rows [0], [1], [2] of n are [n00, n01, n02], [n10, n11, n12], [n20, n21, n22]; of p likewise.
  // CombineRotation(a = precession, b = nutation): c[i][j] = b[0][j] a[i][0] + b[1][j] a[i][1] + b[2][j] a[i][2].
  const c00 = n00 * p00 + n10 * p01 + n20 * p02;
  const c01 = n01 * p00 + n11 * p01 + n21 * p02;
  const c02 = n02 * p00 + n12 * p01 + n22 * p02;
  const c10 = n00 * p10 + n10 * p11 + n20 * p12;
  const c11 = n01 * p10 + n11 * p11 + n21 * p12;
  const c12 = n02 * p10 + n12 * p11 + n22 * p12;
  const c20 = n00 * p20 + n10 * p21 + n20 * p22;
  const c21 = n01 * p20 + n11 * p21 + n21 * p22;
  const c22 = n02 * p20 + n12 * p21 + n22 * p22;

  // 2. GeoVector(Sun, time, true): the sun (at the heliocentric origin) minus the Earth, both at
  // the backdated time, iterated on the light time (CorrectLightTravel; AddDays makes each time from UT).
  let ltimeTT = tt;
  let vx = 0;
  let vy = 0;
  let vz = 0;
  let converged = false;
  for (let iter = 0; iter < 10; iter += 1) {
    // The Earth's heliocentric place at ltimeTT (CalcVsop): VSOP87 spherical, ecliptic J2000.
    const t = ltimeTT / DAYS_PER_MILLENNIUM;
    const lon = vsopFormula(VSOP_EARTH_LONGITUDE, t, true);
    const lat = vsopFormula(VSOP_EARTH_LATITUDE, t, false);
    const rad = vsopFormula(VSOP_EARTH_RADIUS, t, false);
    const rCosLat = rad * Math.cos(lat);
    const cosLon = Math.cos(lon);
    const sinLon = Math.sin(lon);
    const e0 = rCosLat * cosLon;
    const e1 = rCosLat * sinLon;
    const e2 = rad * Math.sin(lat);
    // VSOP87 ecliptic J2000 to the J2000 mean equator (VsopRotate: the library's frame-tie matrix).
    const ex = e0 + 0.00000044036 * e1 - 0.000000190919 * e2;
    const ey = -0.000000479966 * e0 + 0.917482137087 * e1 - 0.397776982902 * e2;
    const ez = 0.397776982902 * e1 + 0.917482137087 * e2;
    vx = 0 - ex;
    vy = 0 - ey;
    vz = 0 - ez;
    const lt = Math.hypot(vx, vy, vz) / C_AUDAY;
    if (lt > 1.0) throw new Error('Object is too distant for light-travel solver.');
    const ut2 = ut + -lt;
    const tt2 = ut2 + deltaTSecondsAtUt(ut2, deltaTChoice) / 86400;
    if (Math.abs(tt2 - ltimeTT) < 1.0e-9) {
      converged = true;
      break;
    }
    ltimeTT = tt2;
  }
  if (!converged) throw new Error('Light-travel time solver did not converge');

  // 3c. RotateVector(c, v): out[j] = c[0][j] x + c[1][j] y + c[2][j] z.
  const gx = c00 * vx + c10 * vy + c20 * vz;
  const gy = c01 * vx + c11 * vy + c21 * vz;
  const gz = c02 * vx + c12 * vy + c22 * vz;

  // 4. GAST.
  const gastHours = gastHoursAt(ut, tt, tilt.ee);

  // 5. ObserverVector(time, observer, true) = terra(observer, gast).pos, subtracted.
  let sx = gx;
  let sy = gy;
  let sz = gz;
  if (topocentric) {
    const phi = site.latitudeDeg * DEG2RAD;
    const sinphi = Math.sin(phi);
    const cosphi = Math.cos(phi);
    const c = 1 / Math.hypot(cosphi, EARTH_FLATTENING * sinphi);
    const s = EARTH_FLATTENING_SQUARED * c;
    const htKm = site.elevationM / 1000;
    const ach = EARTH_EQUATORIAL_RADIUS_KM * c + htKm;
    const ash = EARTH_EQUATORIAL_RADIUS_KM * s + htKm;
    const stlocl = (15 * gastHours + site.longitudeDeg) * DEG2RAD;
    const sinst = Math.sin(stlocl);
    const cosst = Math.cos(stlocl);
    sx = gx - (ach * cosphi * cosst) / KM_PER_AU;
    sy = gy - (ach * cosphi * sinst) / KM_PER_AU;
    sz = gz - (ash * sinphi) / KM_PER_AU;
  }

  // 6a. EquatorFromVector (SphereFromVector): ra in hours, dec in degrees.
  const raHours = sphereLonDeg(sx, sy, sz) / 15;
  const decDeg = sphereLatDeg(sx, sy, sz);
  const geocentricRaHours = topocentric ? sphereLonDeg(gx, gy, gz) / 15 : raHours;

  // 6b. Horizon(time, observer, ra, dec, undefined).
  const latRad = site.latitudeDeg * DEG2RAD;
  const lonRad = site.longitudeDeg * DEG2RAD;
  const sinlat = Math.sin(latRad);
  const coslat = Math.cos(latRad);
  const sinlon = Math.sin(lonRad);
  const coslon = Math.cos(lonRad);
  const sindc = Math.sin(decDeg * DEG2RAD);
  const cosdc = Math.cos(decDeg * DEG2RAD);
  const sinra = Math.sin(raHours * HOUR2RAD);
  const cosra = Math.cos(raHours * HOUR2RAD);
  // Zenith, north and west unit vectors of the site, turned by the sidereal time (spin).
  const uze0 = coslat * coslon;
  const uze1 = coslat * sinlon;
  const uze2 = sinlat;
  const une0 = -sinlat * coslon;
  const une1 = -sinlat * sinlon;
  const une2 = coslat;
  const uwe0 = sinlon;
  const uwe1 = -coslon;
  const uwe2 = 0;
  const angr = -15 * gastHours * DEG2RAD;
  const cs = Math.cos(angr);
  const sn = Math.sin(angr);
  const uz0 = cs * uze0 + sn * uze1;
  const uz1 = cs * uze1 - sn * uze0;
  const un0 = cs * une0 + sn * une1;
  const un1 = cs * une1 - sn * une0;
  const uw0 = cs * uwe0 + sn * uwe1;
  const uw1 = cs * uwe1 - sn * uwe0;
  const q0 = cosdc * cosra;
  const q1 = cosdc * sinra;
  const q2 = sindc;
  const pz = q0 * uz0 + q1 * uz1 + q2 * uze2;
  const pn = q0 * un0 + q1 * un1 + q2 * une2;
  const pw = q0 * uw0 + q1 * uw1 + q2 * uwe2;
  const proj = Math.hypot(pn, pw);
  let azimuthDeg = 0;
  if (proj > 0) {
    azimuthDeg = -RAD2DEG * Math.atan2(pw, pn);
    if (azimuthDeg < 0) azimuthDeg += 360;
  }
  const zd = RAD2DEG * Math.atan2(proj, pz);

  return {
    jdTT: tt + 2451545.0,
    azimuthDeg,
    geometricAltitudeDeg: 90 - zd,
    raHours,
    decDeg,
    geocentricRaHours,
    gastHours,
  };
}

/** SphereFromVector's longitude in degrees [0, 360); 0 on the axis (the library throws only for a zero vector). */
function sphereLonDeg(x: number, y: number, z: number): number {
  const xyproj = x * x + y * y;
  if (xyproj === 0.0) return z === 0.0 ? Number.NaN : 0.0;
  let lon = RAD2DEG * Math.atan2(y, x);
  if (lon < 0.0) lon += 360.0;
  return lon;
}

/** SphereFromVector's latitude in degrees. */
function sphereLatDeg(x: number, y: number, z: number): number {
  const xyproj = x * x + y * y;
  if (xyproj === 0.0) return z === 0.0 ? Number.NaN : z < 0.0 ? -90.0 : +90.0;
  return RAD2DEG * Math.atan2(z, Math.sqrt(xyproj));
}
