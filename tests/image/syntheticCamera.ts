/**
 * Test helper: synthetic pinhole cameras looking at a known 3-D scene, in
 * site coordinates (east, north, up), metres. The pinhole model x = K [R | t] X
 * follows Hartley and Zisserman, Multiple View Geometry, 2nd ed. (2003),
 * sec. 6.1, eq. (6.8); pixel y runs down (docs/conventions.md).
 */
import type { RandomSource } from '../../src/math/random.js';

export type Vec3 = readonly [number, number, number];

export const add = (a: Vec3, b: Vec3): Vec3 => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
export const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
export const scale = (a: Vec3, s: number): Vec3 => [a[0] * s, a[1] * s, a[2] * s];
export const dot = (a: Vec3, b: Vec3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
export const cross = (a: Vec3, b: Vec3): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
export const normalise = (a: Vec3): Vec3 => scale(a, 1 / Math.hypot(...a));

/** Horizontal unit vector of an azimuth (clockwise from north): east = sin, north = cos (docs/conventions.md). */
export function horizontal(azDeg: number): Vec3 {
  const a = (azDeg * Math.PI) / 180;
  return [Math.sin(a), Math.cos(a), 0];
}

/** Unit vector towards the sun from azimuth and altitude (common practice: spherical to east-north-up). */
export function sunVector(azDeg: number, altDeg: number): Vec3 {
  const a = (azDeg * Math.PI) / 180;
  const h = (altDeg * Math.PI) / 180;
  return [Math.sin(a) * Math.cos(h), Math.cos(a) * Math.cos(h), Math.sin(h)];
}

/** Where the shadow of point p falls on the plane through o with normal n, for sunlight from direction s (ray p - t s). */
export function shadowOnPlane(p: Vec3, s: Vec3, o: Vec3, n: Vec3): Vec3 {
  const t = dot(sub(p, o), n) / dot(s, n);
  return sub(p, scale(s, t));
}

export interface Camera {
  readonly centre: Vec3;
  readonly right: Vec3;
  readonly down: Vec3;
  readonly forward: Vec3;
  readonly focalPx: number;
  readonly principal: readonly [number, number];
}

/** Project a site point to pixels; null when behind the camera. */
export function project(cam: Camera, p: Vec3): [number, number] | null {
  const d = sub(p, cam.centre);
  const z = dot(d, cam.forward);
  if (z <= 0.1) return null;
  return [cam.principal[0] + (cam.focalPx * dot(d, cam.right)) / z, cam.principal[1] + (cam.focalPx * dot(d, cam.down)) / z];
}

/**
 * A user's click on a projected point: the projection plus Gaussian noise (x drawn first, then y),
 * mirrored (x' = widthPx - x) for a reversed print, as docs/conventions.md defines it.
 */
export function clicker(cam: Camera, rng: RandomSource, noisePx: number, mirrored: boolean, widthPx: number): (p: Vec3) => [number, number] {
  return (p) => {
    const q = project(cam, p)!;
    const x = q[0] + noisePx * rng.normal();
    return [mirrored ? widthPx - x : x, q[1] + noisePx * rng.normal()];
  };
}

const uniform = (rng: RandomSource, a: number, b: number): number => a + (b - a) * rng.uniform();

/**
 * A random camera at `centre` looking at `target` (with a random roll), its focal length chosen so that
 * every point of `mustSee` falls inside a widthPx x heightPx picture with a margin; null if impossible.
 */
export function randomCamera(
  rng: RandomSource,
  centre: Vec3,
  target: Vec3,
  mustSee: readonly Vec3[],
  widthPx: number,
  heightPx: number,
): Camera | null {
  const forward = normalise(sub(target, centre));
  const right0 = normalise(cross(forward, [0, 0, 1]));
  const down0 = cross(forward, right0);
  const roll = (uniform(rng, -12, 12) * Math.PI) / 180;
  const right = add(scale(right0, Math.cos(roll)), scale(down0, Math.sin(roll)));
  const down = cross(forward, right);
  const principal: [number, number] = [widthPx / 2 + uniform(rng, -0.03, 0.03) * widthPx, heightPx / 2 + uniform(rng, -0.03, 0.03) * heightPx];
  let maxX = 0;
  let maxY = 0;
  for (const p of mustSee) {
    const d = sub(p, centre);
    const z = dot(d, forward);
    if (z <= 0.5) return null;
    maxX = Math.max(maxX, Math.abs(dot(d, right) / z));
    maxY = Math.max(maxY, Math.abs(dot(d, down) / z));
  }
  const fit = Math.min((0.42 * widthPx) / maxX, (0.42 * heightPx) / maxY);
  const cam: Camera = { centre, right, down, forward, focalPx: fit * uniform(rng, 0.6, 1), principal };
  for (const p of mustSee) {
    const q = project(cam, p);
    if (!q || q[0] < 0 || q[0] > widthPx || q[1] < 0 || q[1] > heightPx) return null;
  }
  return cam;
}
