/**
 * Points on an error ellipse, from its semi-axis vectors or from its semi-axes and
 * orientation: x = c + cos t a + sin t b (the parametric ellipse, common practice).
 */

/** Points of the ellipse with centre c and semi-axis vectors a, b, closed (first point repeated). */
export function ellipsePoints(
  centre: readonly [number, number],
  a: readonly [number, number],
  b: readonly [number, number],
  count = 48,
): [number, number][] {
  const out: [number, number][] = [];
  for (let k = 0; k <= count; k += 1) {
    const t = k === count ? 0 : (2 * Math.PI * k) / count; // the last point closes the outline exactly
    const c = Math.cos(t);
    const s = Math.sin(t);
    out.push([centre[0] + c * a[0] + s * b[0], centre[1] + c * a[1] + s * b[1]]);
  }
  return out;
}

/**
 * Semi-axis vectors of an ellipse given by semi-axes and the angle of the major axis from
 * the x axis toward the y axis, degrees.
 * @example semiAxisVectors(2, 1, 90) // [[0, 2], [-1, 0]] (up to rounding)
 */
export function semiAxisVectors(semiMajor: number, semiMinor: number, orientationDeg: number): [[number, number], [number, number]] {
  const t = (orientationDeg * Math.PI) / 180;
  return [
    [semiMajor * Math.cos(t), semiMajor * Math.sin(t)],
    [-semiMinor * Math.sin(t), semiMinor * Math.cos(t)],
  ];
}
