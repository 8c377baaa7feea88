/**
 * Plane-to-image homography by the normalised Direct Linear Transformation.
 *
 * Hartley, R. and Zisserman, A., Multiple View Geometry in Computer Vision,
 * 2nd ed. (2003), Algorithm 4.2 (normalised DLT for 2-D homographies):
 * (i) a similarity moving each point set's centroid to the origin and its
 * mean distance from the origin to sqrt(2); (ii) the 2n x 9 system of
 * eq. (4.3) solved by the singular vector of the smallest singular value
 * (least squares for n > 4, exact for n = 4); (iii) denormalisation
 * H = T'^-1 H~ T. The algebraic error is minimised, not the geometric
 * (reprojection) error; for clicked points of a few pixels the difference is
 * small (H&Z sec. 4.4.4) and the reprojection residuals are reported.
 *
 * Matrices are 3 x 3, row-major, as plain arrays of 9 numbers, normalised to
 * unit Frobenius norm by the fit. Checks of clicked points (order, collinearity,
 * duplicates, points outside the picture) are in planeInImage.ts; the numerical
 * core here only refuses a near-singular system (fitHomography).
 */
import { smallestRightVector, smallSvd } from '../math/smallSvd.js';
import { InvalidInputError } from '../errors.js';

/** A 3 x 3 projective map, row-major: [h11, h12, h13, h21, ..., h33]. */
export type Homography = readonly number[];

/** A 2-D point, any unit. */
export type Point2 = readonly [number, number];

/** The result of fitting source -> destination. */
export interface HomographyFit {
  /** Maps source points (plane) to destination points (image pixels). */
  readonly matrix: Homography;
  /** Distance between each destination point and its mapped source point, destination units (px). */
  readonly residuals: readonly number[];
  /** Root mean square of the residuals. Zero by construction for exactly 4 points. */
  readonly rms: number;
  /** sigma1 / sigma8 of the normalised 2n x 9 system: large means the fit is close to undetermined. */
  readonly conditionNumber: number;
  /** True for exactly 4 points: the map is determined exactly and the residuals are no check. */
  readonly exactlyDetermined: boolean;
}

/**
 * The similarity of H&Z Algorithm 4.2 step (i): centroid to the origin, mean distance sqrt(2).
 * Returned as a homography.
 */
export function normalisingSimilarity(points: readonly Point2[]): Homography {
  const n = points.length;
  let cx = 0;
  let cy = 0;
  for (const [x, y] of points) {
    cx += x / n;
    cy += y / n;
  }
  let meanDistance = 0;
  for (const [x, y] of points) meanDistance += Math.hypot(x - cx, y - cy) / n;
  const s = meanDistance > 0 ? Math.SQRT2 / meanDistance : 1;
  return [s, 0, -s * cx, 0, s, -s * cy, 0, 0, 1];
}

/** Apply a homography to a point; returns the dehomogenised point. */
export function applyHomography(h: Homography, p: Point2): [number, number] {
  const x = h[0] * p[0] + h[1] * p[1] + h[2];
  const y = h[3] * p[0] + h[4] * p[1] + h[5];
  const w = h[6] * p[0] + h[7] * p[1] + h[8];
  return [x / w, y / w];
}

/** The third homogeneous coordinate of a mapped point (its sign tells the side of the vanishing line). */
export function homogeneousW(h: Homography, p: Point2): number {
  return h[6] * p[0] + h[7] * p[1] + h[8];
}

/** The product a * b (first b, then a). */
export function composeHomographies(a: Homography, b: Homography): Homography {
  const out: number[] = new Array(9).fill(0);
  for (let r = 0; r < 3; r++)
    for (let c = 0; c < 3; c++)
      out[3 * r + c] = a[3 * r] * b[c] + a[3 * r + 1] * b[3 + c] + a[3 * r + 2] * b[6 + c];
  return out;
}

/** The inverse map (adjugate over determinant; a homography is defined up to scale). */
export function invertHomography(h: Homography): Homography {
  const [a, b, c, d, e, f, g, k, l] = h;
  const adj = [
    e * l - f * k, c * k - b * l, b * f - c * e,
    f * g - d * l, a * l - c * g, c * d - a * f,
    d * k - e * g, b * g - a * k, a * e - b * d,
  ];
  const det = a * adj[0] + b * adj[3] + c * adj[6];
  return adj.map((v) => v / det);
}

/** Scale to unit Frobenius norm with a non-negative h33. */
function normaliseScale(h: readonly number[]): Homography {
  const norm = Math.hypot(...h);
  const sign = h[8] < 0 ? -1 : 1;
  return h.map((v) => (sign * v) / norm);
}

/**
 * The normalised DLT itself (H&Z Algorithm 4.2), no validation: source[i] -> destination[i], n >= 4.
 * Returns the matrix and the singular values of the normalised system, largest first.
 */
export function fitHomographyDlt(
  source: readonly Point2[],
  destination: readonly Point2[],
): { matrix: Homography; singularValues: readonly number[] } {
  const n = source.length;
  const t = normalisingSimilarity(source);
  const tPrime = normalisingSimilarity(destination);
  // With n = 4 the system is 8 x 9; a zero row makes it square so that the
  // SVD returns all nine right singular vectors (the null vector included).
  const rows = Math.max(2 * n, 9);
  const a = new Float64Array(rows * 9);
  for (let i = 0; i < n; i++) {
    const [X, Y] = applyHomography(t, source[i]);
    const [x, y] = applyHomography(tPrime, destination[i]);
    // H&Z eq. (4.3) with w = w' = 1: rows [0^T, -x^T, y' x^T] and [x^T, 0^T, -x' x^T]
    a.set([0, 0, 0, -X, -Y, -1, y * X, y * Y, y], 18 * i);
    a.set([X, Y, 1, 0, 0, 0, -x * X, -x * Y, -x], 18 * i + 9);
  }
  // The null vector by inverse iteration on the QR triangle; the singular values (for the
  // condition number) only when asked, by the full small SVD (src/math/smallSvd.ts).
  const hTilde = smallestRightVector(a, rows, 9);
  // H&Z Algorithm 4.2 (iii): H = T'^-1 H~ T
  const matrix = normaliseScale(composeHomographies(invertHomography(tPrime), composeHomographies(hTilde, t)));
  let singularValues: readonly number[] | undefined;
  return {
    matrix,
    get singularValues(): readonly number[] {
      singularValues ??= smallSvd(a, rows, 9).singularValues;
      return singularValues;
    },
  };
}

/** Reprojection residuals of a fit: |H source_i - destination_i|. */
export function reprojectionResiduals(
  h: Homography,
  source: readonly Point2[],
  destination: readonly Point2[],
): number[] {
  return source.map((p, i) => {
    const [x, y] = applyHomography(h, p);
    return Math.hypot(x - destination[i][0], y - destination[i][1]);
  });
}

/** Largest ratio sigma1 / sigma8 accepted: beyond it the fit is treated as near-singular (common practice). */
export const MAX_CONDITION_NUMBER = 1e7;

/**
 * Fit source -> destination with residuals and the condition number.
 * Throws InvalidInputError (field `field`) when the system is near-singular.
 */
export function fitHomography(
  source: readonly Point2[],
  destination: readonly Point2[],
  field = 'pointsPx',
): HomographyFit {
  const { matrix, singularValues } = fitHomographyDlt(source, destination);
  const s8 = singularValues[7];
  const conditionNumber = s8 > 0 ? singularValues[0] / s8 : Infinity;
  if (!(conditionNumber < MAX_CONDITION_NUMBER)) {
    throw new InvalidInputError(
      field,
      destination.map((p) => [round1(p[0]), round1(p[1])]),
      'points that fix the plane in the picture (at least 4, no three in a line, spread over the figure)',
      `The rectification is near-singular (condition number ${conditionNumber.toExponential(2)}, limit ${MAX_CONDITION_NUMBER.toExponential(0)})`,
    );
  }
  const residuals = reprojectionResiduals(matrix, source, destination);
  const rms = Math.sqrt(residuals.reduce((sum, r) => sum + r * r, 0) / residuals.length);
  return { matrix, residuals, rms, conditionNumber, exactlyDetermined: source.length === 4 };
}

function round1(v: number): number {
  return Math.round(v * 10) / 10;
}
