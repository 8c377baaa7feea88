/**
 * Angle helpers shared by every module: unit conversion, normalisation and
 * inverse trigonometric functions clamped so that rounding never yields NaN.
 *
 * Degrees are used at every interface; radians only inside formulas.
 */

/** Radians per degree (exact by definition: pi / 180). */
export const RAD_PER_DEG = Math.PI / 180;
/** Degrees per radian (exact by definition: 180 / pi). */
export const DEG_PER_RAD = 180 / Math.PI;
/** A small number for comparisons of unit-scale quantities (common practice). */
export const EPSILON = 1e-12;

/** Degrees to radians. */
export function degToRad(deg: number): number {
  return deg * RAD_PER_DEG;
}

/** Radians to degrees. */
export function radToDeg(rad: number): number {
  return rad * DEG_PER_RAD;
}

/**
 * An angle in degrees brought into [0, 360).
 * @example normalizeDeg360(-10) // 350
 */
export function normalizeDeg360(deg: number): number {
  const r = deg % 360;
  const v = r < 0 ? r + 360 : r;
  return v === 360 ? 0 : v;
}

/**
 * An angle in degrees brought into (-180, 180].
 * @example normalizeDeg180(190) // -170
 */
export function normalizeDeg180(deg: number): number {
  const v = normalizeDeg360(deg);
  return v > 180 ? v - 360 : v;
}

/** Difference a - b of two angles in degrees, in (-180, 180]. */
export function angleDiffDeg(a: number, b: number): number {
  return normalizeDeg180(a - b);
}

/** asin with its argument clamped to [-1, 1]; result in radians. */
export function asinClamped(x: number): number {
  return Math.asin(x > 1 ? 1 : x < -1 ? -1 : x);
}

/** acos with its argument clamped to [-1, 1]; result in radians. */
export function acosClamped(x: number): number {
  return Math.acos(x > 1 ? 1 : x < -1 ? -1 : x);
}

/** sin of an angle in degrees. */
export function sinDeg(deg: number): number {
  return Math.sin(deg * RAD_PER_DEG);
}

/** cos of an angle in degrees. */
export function cosDeg(deg: number): number {
  return Math.cos(deg * RAD_PER_DEG);
}

/** tan of an angle in degrees. */
export function tanDeg(deg: number): number {
  return Math.tan(deg * RAD_PER_DEG);
}

/** atan2 with the result in degrees, in (-180, 180]. */
export function atan2Deg(y: number, x: number): number {
  return Math.atan2(y, x) * DEG_PER_RAD;
}
