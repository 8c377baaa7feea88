/**
 * The sun's direction as a unit vector in the site's east-north-up frame, and back.
 *
 * Azimuth clockwise from true north, altitude above the horizon, degrees
 * (docs/conventions.md). The vector points from the observer towards the sun.
 * Exact (no approximation); valid for every azimuth and for altitudes in [-90, 90].
 */
import { InvalidInputError } from '../errors.js';
import { atan2Deg, cosDeg, normalizeDeg360, sinDeg } from '../math/angles.js';

/** A sun direction, degrees: azimuth clockwise from true north, apparent altitude. */
export interface SunDirection {
  readonly azimuthDeg: number;
  readonly altitudeDeg: number;
}

/** A 3-vector in site coordinates: east, north, up. */
export type EnuVector = readonly [east: number, north: number, up: number];

/**
 * Unit vector towards the sun, east-north-up.
 * Spherical to Cartesian with azimuth measured from north towards east
 * (Meeus, Astronomical Algorithms, 2nd ed. 1998, ch. 13, azimuth reckoned from north here).
 * @example sunUnitVector(90, 0) // [1, 0, 0] (due east on the horizon, to rounding)
 */
export function sunUnitVector(azimuthDeg: number, altitudeDeg: number): EnuVector {
  const horizontal = cosDeg(altitudeDeg);
  return [horizontal * sinDeg(azimuthDeg), horizontal * cosDeg(azimuthDeg), sinDeg(altitudeDeg)];
}

/**
 * Direction of a vector (any non-zero length) as azimuth [0, 360) and altitude [-90, 90].
 * A vertical vector gets azimuth 0 (its azimuth is not defined).
 * @example vectorToSunDirection([0, -1, 1]) // { azimuthDeg: 180, altitudeDeg: 45 }
 */
export function vectorToSunDirection(vector: EnuVector): SunDirection {
  const [east, north, up] = vector;
  const horizontal = Math.hypot(east, north);
  if (!(horizontal > 0) && !(Math.abs(up) > 0)) {
    throw new InvalidInputError('vector', vector, 'a direction vector of non-zero, finite length');
  }
  const azimuthDeg = horizontal > 0 ? normalizeDeg360(atan2Deg(east, north)) : 0;
  return { azimuthDeg, altitudeDeg: atan2Deg(up, horizontal) };
}

/** Dot product of two 3-vectors. */
export function dot(a: EnuVector, b: EnuVector): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}
