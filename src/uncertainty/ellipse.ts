/**
 * Confidence ellipses from a 2x2 covariance matrix, and the linearity check that decides
 * whether such an ellipse may be trusted.
 *
 * The region Delta chi2 <= q around a least-squares minimum is, to first order, the ellipse
 * dx^T C^-1 dx <= q with C the 2x2 covariance of the two parameters of interest, the others
 * marginalised by taking that block of the full covariance (Press et al., *Numerical Recipes*,
 * 3rd ed. 2007, section 15.6.4-15.6.5, "Confidence limits on estimated model parameters").
 * q for 2 parameters: 2.30 (68.3%), 5.991 (95%) (chi-square with 2 dof, closed form
 * q = -2 ln(1 - p); NIST/SEMATECH e-Handbook, chi-square table).
 * Axes from the eigen-decomposition of the symmetric 2x2 matrix (closed form: common practice).
 * The linearity check compares the true Delta chi2 at points on the 95% ellipse with the
 * quadratic prediction q; where they differ by more than a stated fraction, the ellipse is
 * declared invalid and a profile-likelihood scan takes its place (profileScan.ts).
 */
import { DELTA_CHI2_2DOF_68, DELTA_CHI2_2DOF_95, ONE_SIGMA_PROBABILITY } from '../math/chiSquare.js';
import { DEG_PER_RAD } from '../math/angles.js';

export interface Covariance2 {
  readonly xx: number;
  readonly xy: number;
  readonly yy: number;
}

export interface EllipseAxes {
  /** Variances along the principal axes, major first. */
  readonly majorVariance: number;
  readonly minorVariance: number;
  /** Angle of the major axis from the x axis toward the y axis, degrees (-90, 90]. */
  readonly orientationDeg: number;
}

/** Principal axes of a 2x2 covariance (eigenvalues and the major eigenvector's angle). */
export function principalAxes(c: Covariance2): EllipseAxes {
  const mean = 0.5 * (c.xx + c.yy);
  const half = Math.hypot(0.5 * (c.xx - c.yy), c.xy);
  const theta = 0.5 * Math.atan2(2 * c.xy, c.xx - c.yy); // angle of the major axis
  let orientationDeg = theta * DEG_PER_RAD;
  if (orientationDeg <= -90) orientationDeg += 180;
  return { majorVariance: mean + half, minorVariance: Math.max(0, mean - half), orientationDeg };
}

/** The two confidence levels reported: 1 sigma (68.27%) and 95%, with their Delta chi2 for 2 parameters. */
export const ELLIPSE_LEVELS: readonly { probability: number; deltaChiSquare: number }[] = [
  { probability: ONE_SIGMA_PROBABILITY, deltaChiSquare: DELTA_CHI2_2DOF_68 },
  { probability: 0.95, deltaChiSquare: DELTA_CHI2_2DOF_95 },
];

/** Semi-axis vectors, bounding half-widths and orientation of the ellipse dx^T C^-1 dx = q. */
export function ellipseAt(c: Covariance2, deltaChiSquare: number): {
  halfWidthX: number;
  halfWidthY: number;
  semiAxes: [{ x: number; y: number }, { x: number; y: number }];
  orientationDeg: number;
  semiMajor: number;
  semiMinor: number;
} {
  const ax = principalAxes(c);
  const a = Math.sqrt(deltaChiSquare * ax.majorVariance);
  const b = Math.sqrt(deltaChiSquare * ax.minorVariance);
  const t = ax.orientationDeg / DEG_PER_RAD;
  return {
    halfWidthX: Math.sqrt(deltaChiSquare * c.xx),
    halfWidthY: Math.sqrt(deltaChiSquare * c.yy),
    semiAxes: [
      { x: a * Math.cos(t), y: a * Math.sin(t) },
      { x: -b * Math.sin(t), y: b * Math.cos(t) },
    ],
    orientationDeg: ax.orientationDeg,
    semiMajor: a,
    semiMinor: b,
  };
}

/** `count` points evenly spaced in angle on the ellipse dx^T C^-1 dx = q (offsets from the centre). */
export function ellipseBoundaryPoints(c: Covariance2, deltaChiSquare: number, count: number): { x: number; y: number }[] {
  // dx = L u with C = L L^T (Cholesky of the 2x2), |u| = sqrt(q).
  const l11 = Math.sqrt(c.xx);
  const l21 = c.xy / l11;
  const l22 = Math.sqrt(Math.max(0, c.yy - l21 * l21));
  const r = Math.sqrt(deltaChiSquare);
  const out: { x: number; y: number }[] = [];
  for (let i = 0; i < count; i += 1) {
    const a = (2 * Math.PI * i) / count;
    const u1 = r * Math.cos(a);
    const u2 = r * Math.sin(a);
    out.push({ x: l11 * u1, y: l21 * u1 + l22 * u2 });
  }
  return out;
}

/** Largest relative error allowed between the true and the predicted Delta chi2 on the 95% ellipse. */
export const LINEARITY_TOLERANCE = 0.25;

/**
 * Linearity check: max over points on the 95% ellipse of |Delta chi2_true / q - 1|.
 * @param deltaAt true Delta chi2 (objective minus the minimum) at an offset from the centre
 */
export function linearityError(c: Covariance2, deltaAt: (dx: number, dy: number) => number, count = 8): number {
  const q = DELTA_CHI2_2DOF_95;
  let worst = 0;
  for (const p of ellipseBoundaryPoints(c, q, count)) {
    const d = deltaAt(p.x, p.y);
    const e = Number.isFinite(d) ? Math.abs(d / q - 1) : Infinity;
    if (e > worst) worst = e;
  }
  return worst;
}

/** True when a 2x2 covariance is positive definite and finite. */
export function isPositiveDefinite(c: Covariance2): boolean {
  return Number.isFinite(c.xx) && Number.isFinite(c.yy) && Number.isFinite(c.xy) && c.xx > 0 && c.yy > 0 && c.xx * c.yy - c.xy * c.xy > 0;
}
