/**
 * Small 3-vector helpers for the scripts that render the invented pictures of Velmar, in site
 * coordinates (east, north, up, metres).
 */
export const add = (a, b) => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
export const sub = (a, b) => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
export const mul = (a, k) => [a[0] * k, a[1] * k, a[2] * k];
export const dot = (a, b) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
export const cross = (a, b) => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
export const unit = (a) => mul(a, 1 / Math.hypot(...a));
/** Horizontal unit vector of an azimuth clockwise from north: east = sin, north = cos (docs/conventions.md). */
export const horizontal = (azDeg) => [Math.sin((azDeg * Math.PI) / 180), Math.cos((azDeg * Math.PI) / 180), 0];
