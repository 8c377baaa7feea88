/**
 * Vanishing points by least squares from clicked lines, and how closely the
 * lines of one family meet.
 *
 * Each line is two or more clicked points; it is fitted by orthogonal
 * (total) least squares: through the centroid, along the principal axis of
 * the points' scatter (Pearson 1901; Hartley and Zisserman, *Multiple View
 * Geometry*, 2nd ed. (2003), sec. 8.6.1 and A5.3). The vanishing point v is
 * the homogeneous point that minimises sum_i (l_i . v)^2 / var_i, with
 * |v| = 1 so that a point at infinity (parallel lines in the picture) is an
 * ordinary answer; l_i = (n_i, -n_i . c_i) with unit normal n_i and centroid
 * c_i. var_i is the first-order variance of l_i . v from the clicking sigma:
 * the line turns about its centroid with variance sigma^2 / S_tt and shifts
 * along its normal with variance sigma^2 / n (S_tt = sum of squared spreads
 * along the line), so
 *     var_i = sigma^2 [ (t_i . (v_xy - w c_i))^2 / S_tt + w^2 / n ],
 * t_i the unit direction. The weights depend on v, so the fit is repeated a
 * fixed number of times (iteratively reweighted least squares, common
 * practice; a fixed count keeps the result a smooth function of the clicks,
 * needed by the propagation of src/image/propagation.ts). This is the
 * weighted algebraic estimate; it approaches the maximum-likelihood estimate
 * of H&Z sec. 8.6.1 as the lines get long compared with the clicking sigma.
 *
 * Work is done in normalised coordinates (picture centre at 0, half the
 * larger side = 1; H&Z sec. 4.4.4 on normalisation) for conditioning.
 *
 * Meeting test: at the fitted v, chi2 = sum_i (l_i . v)^2 / var_i follows a
 * chi-square law with (lines - 2) degrees of freedom when the lines truly
 * meet and the clicks have the stated sigma (two lines always meet: no
 * check). Each line's miss is also given as the angle it would have to turn
 * about its centroid to pass through v.
 */
import { symmetricEigen } from '../math/symmetricEigen.js';
import type { Point2 } from './homography.js';

/** Homogeneous point or line, 3 numbers. */
export type Homogeneous3 = readonly [number, number, number];

/** The normalising frame of a picture: centre and scale (half the larger side), pixels. */
export interface PictureFrame {
  readonly centreX: number;
  readonly centreY: number;
  readonly scale: number;
}

/** The frame for a picture of the given size. */
export function pictureFrame(widthPx: number, heightPx: number): PictureFrame {
  return { centreX: widthPx / 2, centreY: heightPx / 2, scale: Math.max(widthPx, heightPx) / 2 };
}

/** A pixel point into normalised coordinates. */
export function toNormalised(p: Point2, frame: PictureFrame): [number, number] {
  return [(p[0] - frame.centreX) / frame.scale, (p[1] - frame.centreY) / frame.scale];
}

/** A homogeneous point in normalised coordinates to pixels; null when at infinity (w = 0). */
export function homogeneousToPixels(v: Homogeneous3, frame: PictureFrame): [number, number] | null {
  if (v[2] === 0) return null;
  return [frame.centreX + (frame.scale * v[0]) / v[2], frame.centreY + (frame.scale * v[1]) / v[2]];
}

/** A line fitted to clicked points by orthogonal least squares, normalised coordinates. */
export interface FittedLine {
  readonly centroid: readonly [number, number];
  /** Unit direction along the line. */
  readonly direction: readonly [number, number];
  /** Unit normal, the direction turned +90 deg. */
  readonly normal: readonly [number, number];
  readonly count: number;
  /** Sum of squared offsets of the points along the line from the centroid. */
  readonly spreadAlong: number;
  /** Sum of squared distances of the points from the line. */
  readonly sumSquaredDistance: number;
  /** Clicking sigma in normalised units. */
  readonly sigma: number;
}

/**
 * Orthogonal least-squares line through points (normalised coordinates).
 * Principal axis of the scatter matrix (Pearson 1901; H&Z sec. A5.3).
 */
export function fitLine(points: readonly (readonly [number, number])[], sigma: number): FittedLine {
  const n = points.length;
  let cx = 0;
  let cy = 0;
  for (const p of points) {
    cx += p[0];
    cy += p[1];
  }
  cx /= n;
  cy /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (const p of points) {
    const dx = p[0] - cx;
    const dy = p[1] - cy;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  // principal axis of [[sxx, sxy], [sxy, syy]] in closed form: angle 0.5 atan2(2 sxy, sxx - syy)
  const theta = 0.5 * Math.atan2(2 * sxy, sxx - syy);
  const direction: [number, number] = [Math.cos(theta), Math.sin(theta)];
  const normal: [number, number] = [-direction[1], direction[0]];
  let along = 0;
  let across = 0;
  for (const p of points) {
    const dx = p[0] - cx;
    const dy = p[1] - cy;
    const a = dx * direction[0] + dy * direction[1];
    const b = dx * normal[0] + dy * normal[1];
    along += a * a;
    across += b * b;
  }
  return { centroid: [cx, cy], direction, normal, count: n, spreadAlong: along, sumSquaredDistance: across, sigma };
}

/** The homogeneous line (n, -n . c) of a fitted line. */
export function lineVector(line: FittedLine): Homogeneous3 {
  const [nx, ny] = line.normal;
  return [nx, ny, -(nx * line.centroid[0] + ny * line.centroid[1])];
}

/** First-order variance of l . v for a unit homogeneous v (see the header). */
function residualVariance(line: FittedLine, v: Homogeneous3): number {
  const ox = v[0] - v[2] * line.centroid[0];
  const oy = v[1] - v[2] * line.centroid[1];
  const t = ox * line.direction[0] + oy * line.direction[1];
  return line.sigma * line.sigma * ((t * t) / line.spreadAlong + (v[2] * v[2]) / line.count);
}

/** Angle, degrees in [0, 90], by which a line must turn about its centroid to pass through v. */
export function missAngleDeg(line: FittedLine, v: Homogeneous3): number {
  const ox = v[0] - v[2] * line.centroid[0];
  const oy = v[1] - v[2] * line.centroid[1];
  const along = Math.abs(ox * line.direction[0] + oy * line.direction[1]);
  const across = Math.abs(ox * line.normal[0] + oy * line.normal[1]);
  return (Math.atan2(across, along) * 180) / Math.PI;
}

/** Reweighting passes of the vanishing-point fit (fixed, see the header; 3 change v by far less than its sigma). */
const REWEIGHTING_PASSES = 4;

export interface VanishingPointFit {
  /** Unit homogeneous point, normalised coordinates; sign as the eigen-solver gives it. */
  readonly point: Homogeneous3;
  /** sum (l_i . v)^2 / var_i at the fit. */
  readonly chiSquare: number;
  /** lines - 2. */
  readonly dof: number;
  /** Per line: the angle it must turn to pass through v, degrees. */
  readonly missAnglesDeg: readonly number[];
  /** Second-smallest over largest eigenvalue of the weighted normal matrix: near 0 when the lines are (nearly) one line. */
  readonly separation: number;
}

/**
 * The least-squares vanishing point of two or more fitted lines (normalised coordinates).
 * @example fitVanishingPoint([fitLine([[0, 0], [1, 1]], 1e-3), fitLine([[0, 1], [1, 1.5]], 1e-3)], undefined).point // ~ +-[-2, -2, 1] / 3
 */
export function fitVanishingPoint(lines: readonly FittedLine[], orientLike?: Homogeneous3): VanishingPointFit {
  const ls = lines.map(lineVector);
  let weights = lines.map((l) => 1 / (l.sigma * l.sigma * (1 / l.count + 1 / l.spreadAlong)));
  let v: Homogeneous3 = [0, 0, 1];
  let separation = 0;
  for (let pass = 0; pass <= REWEIGHTING_PASSES; pass++) {
    const m = [
      [0, 0, 0],
      [0, 0, 0],
      [0, 0, 0],
    ];
    ls.forEach((l, i) => {
      for (let a = 0; a < 3; a++) for (let b = 0; b < 3; b++) m[a][b] += weights[i] * l[a] * l[b];
    });
    const eig = symmetricEigen(m);
    const e = eig.vectors[0];
    v = [e[0], e[1], e[2]];
    separation = eig.values[1] / eig.values[2];
    weights = lines.map((l) => 1 / residualVariance(l, v));
  }
  const ref = orientLike ?? v;
  if (v[0] * ref[0] + v[1] * ref[1] + v[2] * ref[2] < 0) v = [-v[0], -v[1], -v[2]];
  let chiSquare = 0;
  ls.forEach((l, i) => {
    const r = l[0] * v[0] + l[1] * v[1] + l[2] * v[2];
    chiSquare += r * r * weights[i];
  });
  return { point: v, chiSquare, dof: lines.length - 2, missAnglesDeg: lines.map((l) => missAngleDeg(l, v)), separation };
}
