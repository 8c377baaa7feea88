/**
 * Shadow angles of a wall: horizontal shadow angle (HSA), vertical shadow angle
 * (VSA, also called profile angle), the sun's components in the wall's own frame,
 * and the sunlit test.
 *
 * Sources: ASHRAE Handbook - Fundamentals, chapter "Fenestration", section on
 * exterior shading (profile angle); S. V. Szokolay, Solar Geometry, PLEA Note 1
 * (1996), shadow angles. Exact geometry; no approximation.
 *
 * Wall conventions (docs/conventions.md): a wall is given by the azimuth W of its
 * outward normal; HSA = sun azimuth - W wrapped to (-180, 180]; in-plane axes as
 * seen from outside facing the wall: u to the viewer's right (azimuth W - 90), v up.
 */
import { atan2Deg, cosDeg, hypot2, normalizeDeg180, sinDeg } from '../math/angles.js';
import type { SunDirection } from './sunVector.js';

/**
 * HSA = sun azimuth - wall-normal azimuth, wrapped to (-180, 180].
 * Positive: the sun is to the viewer's left (viewer outside facing the wall).
 * @example horizontalShadowAngleDeg(200, 180) // 20
 */
export function horizontalShadowAngleDeg(sunAzimuthDeg: number, wallAzimuthDeg: number): number {
  return normalizeDeg180(sunAzimuthDeg - wallAzimuthDeg);
}

/**
 * Signed vertical shadow angle (profile angle), degrees in (-180, 180]:
 * the sun's elevation seen in the vertical plane through the wall normal.
 * tan(VSA) = tan(altitude) / cos(HSA) (ASHRAE Handbook - Fundamentals, Fenestration;
 * Szokolay, Solar Geometry, PLEA Note 1). Computed as
 * atan2(sin(alt), cos(alt) cos(HSA)) so that it is finite everywhere: in (0, 90) for a
 * sunlit wall, in (90, 180) when the sun is up behind the wall. Undefined only for the
 * sun on the horizon exactly in the wall plane (returns 0 or 180 there).
 * @example verticalShadowAngleDeg(40, 30) // 44.0953...
 */
export function verticalShadowAngleDeg(altitudeDeg: number, hsaDeg: number): number {
  return atan2Deg(sinDeg(altitudeDeg), cosDeg(altitudeDeg) * cosDeg(hsaDeg));
}

/** The unit sun vector resolved on a wall's axes: outward normal, u (viewer's right), up. */
export interface WallFrameComponents {
  readonly normal: number;
  readonly u: number;
  readonly up: number;
}

/**
 * The sun's unit vector on the wall's axes: normal = cos(alt) cos(HSA),
 * u = -cos(alt) sin(HSA), up = sin(alt). Derivation: e_u has azimuth W - 90, so
 * e_u . s = cos(alt) sin(W - azimuth) (rotation of the horizontal frame by W).
 */
export function sunInWallFrame(sun: SunDirection, wallAzimuthDeg: number): WallFrameComponents {
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  const horizontal = cosDeg(sun.altitudeDeg);
  return {
    normal: horizontal * cosDeg(hsaDeg),
    u: -horizontal * sinDeg(hsaDeg),
    up: sinDeg(sun.altitudeDeg),
  };
}

/** The sun is above the horizon (apparent altitude > 0; common practice). */
export function isSunUp(sun: SunDirection): boolean {
  return sun.altitudeDeg > 0;
}

/**
 * A wall is sunlit when |HSA| < 90 deg and the sun's apparent altitude is above 0
 * (common practice). At the zenith the sun grazes every wall; this test then
 * follows |HSA| < 90.
 */
export function isWallSunlit(sun: SunDirection, wallAzimuthDeg: number): boolean {
  const hsaDeg = horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg);
  return Math.abs(hsaDeg) < 90 && sun.altitudeDeg > 0;
}

/**
 * The sun's elevation above the wall's plane, degrees in [-90, 90]: asin(cos(alt) cos(HSA)).
 * Positive exactly when the sun is in front of the wall (for altitudes below 90).
 */
export function sunElevationAboveWallDeg(sun: SunDirection, wallAzimuthDeg: number): number {
  const { normal, u, up } = sunInWallFrame(sun, wallAzimuthDeg);
  return atan2Deg(normal, hypot2(u, up)); // Math.hypot's number, without its argument array
}
