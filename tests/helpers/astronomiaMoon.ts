/**
 * The moon by astronomia (npm), a port of Meeus, Astronomical Algorithms, 2nd ed. (1998), for the
 * cross-checks: moonposition.position (ch. 47, ELP-2000/82 truncated to the terms of Tables 47.A
 * and 47.B, mean equinox of date), nutation in longitude and obliquity (ch. 22, IAU 1980),
 * apparent sidereal time (ch. 12), topocentric parallax (ch. 40, eqs. 40.2 and 40.3) and the
 * horizontal frame (ch. 13, eqs. 13.5 and 13.6). Astronomia measures longitude positive west and
 * azimuth from the south; both are turned to heliochron's conventions here.
 */
// @ts-expect-error astronomia ships no type declarations
import { moonposition, nutation, sidereal, coord, globe, parallax } from 'astronomia';

const RAD = Math.PI / 180;
const KM_PER_AU = 149_597_870.7;

export interface AstronomiaMoon {
  /** Clockwise from true north, degrees. */
  readonly azimuthDeg: number;
  /** Topocentric geometric altitude of the centre, degrees. */
  readonly altitudeDeg: number;
  /** Geocentric geometric altitude of the centre, degrees (Meeus ch. 15 works with this one). */
  readonly geocentricAltitudeDeg: number;
  /** Equatorial horizontal parallax, degrees (Meeus p. 337). */
  readonly horizontalParallaxDeg: number;
}

/** The moon at jdUT (TT = UT + deltaTSeconds) from a site, by astronomia. */
export function astronomiaMoon(jdUT: number, deltaTSeconds: number, site: { latitudeDeg: number; longitudeDeg: number; elevationM: number }): AstronomiaMoon {
  const jde = jdUT + deltaTSeconds / 86400;
  const ecl = moonposition.position(jde); // lon, lat (rad), range (km)
  const [dPsi, dEps] = nutation.nutation(jde);
  const eps = nutation.meanObliquity(jde) + dEps;
  const eq = new coord.Ecliptic(ecl.lon + dPsi, ecl.lat).toEquatorial(eps); // apparent place of date (Meeus ch. 47: lambda + delta psi)
  const st = sidereal.apparent(jdUT); // seconds of time
  const g = new globe.Coord(site.latitudeDeg * RAD, -site.longitudeDeg * RAD);
  const geoHor = new coord.Equatorial(eq.ra, eq.dec).toHorizontal(g, st);
  const [rsf, rcf] = globe.Earth76.parallaxConstants(site.latitudeDeg * RAD, site.elevationM);
  // parallax.topocentric's last argument only feeds the apparent sidereal time, so it takes UT here.
  const topo = parallax.topocentric({ ra: eq.ra, dec: eq.dec, range: ecl.range / KM_PER_AU }, rsf, rcf, -site.longitudeDeg * RAD, jdUT);
  const hor = new coord.Equatorial(topo.ra, topo.dec).toHorizontal(g, st);
  return {
    azimuthDeg: (((hor.az / RAD + 180) % 360) + 360) % 360,
    altitudeDeg: hor.alt / RAD,
    geocentricAltitudeDeg: geoHor.alt / RAD,
    horizontalParallaxDeg: moonposition.parallax(ecl.range) / RAD,
  };
}
