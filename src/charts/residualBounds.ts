/**
 * How small a shadow's residual rows can become while the sun moves at most delta degrees of arc
 * from a sun c at which they are known: lower bounds of |row| over that cap of the sky, for leaving
 * whole blocks of a chart unevaluated (mapGrid.ts, skyBandValues.ts).
 *
 * Each bounded row is a wrapped angle difference over a sigma (src/geometry/wallShadows.ts,
 * groundShadows.ts, pointShadows.ts): the angle of the sun around an axis, or its distance from a
 * plane, less a constant. A wrapped difference changes by at most the change of the angle.
 * - The distance from a plane (altitude: from the horizon; the elevation above a wall's plane; an
 *   object-shadow pair's great circle, src/geometry/skyPlanes.ts) changes by at most delta.
 * - The angle around an axis (azimuth: around the vertical, a fin's HSA likewise; a rod's shadow
 *   direction atan2(-sin a, cos a sin H): around the wall's normal; an overhang's vertical shadow
 *   angle atan2(sin a, cos a cos H): around the wall's horizontal axis) of a sun at angle phi from
 *   the plane normal to the axis changes by at most 2 asin(sin(delta / 2) / cos(phi_max)),
 *   phi_max = |phi_c| + delta: by the haversine formula, hav d = hav(d phi) + cos phi1 cos phi2 hav(dA)
 *   >= cos^2 phi_max hav(dA) (R. W. Sinnott, "Virtues of the Haversine", Sky and Telescope 68, 1984,
 *   p. 159); 180 deg when the cap may reach the axis. A rod's slope without a side folds the
 *   direction to one half circle, which brings no two directions further apart.
 * - An object-shadow pair's row is its distance from the great circle over a sigma that depends on the
 *   direction but is at most sqrt(trace C) of its click covariance C (the largest eigenvalue of a
 *   covariance is at most its trace), and at least MIN_PLANE_SIGMA_DEG.
 * Other kinds (eave, shadow points) are not bounded here.
 */
import type { ShadowEvidence } from '../geometry/observationModels.js';
import { ratioSigmaToAngleSigmaDeg } from '../geometry/residuals.js';
import { sunElevationAboveWallDeg, horizontalShadowAngleDeg } from '../geometry/shadowAngles.js';
import { MIN_PLANE_SIGMA_DEG, planeDistanceDeg, planeNormalAt } from '../geometry/skyPlanes.js';
import { sunUnitVector, type SunDirection } from '../geometry/sunVector.js';
import { DEG_PER_RAD, RAD_PER_DEG, cosDeg, sinDeg } from '../math/angles.js';

/**
 * Largest change, degrees, of a sun's angle around an axis when the sun moves at most deltaDeg of arc
 * from a place phiDeg from the plane normal to the axis (see header); 180 when it may reach the axis.
 * @example aroundAxisChangeDeg(0, 2) // 2 (on the equator an arc of 2 deg turns the angle by 2 deg at most)
 */
export function aroundAxisChangeDeg(phiDeg: number, deltaDeg: number): number {
  const phiMax = Math.abs(phiDeg) + deltaDeg;
  if (!(phiMax < 90)) return 180;
  const x = Math.sin((deltaDeg / 2) * RAD_PER_DEG) / Math.cos(phiMax * RAD_PER_DEG);
  return x < 1 ? 2 * Math.asin(x) * DEG_PER_RAD : 180;
}

/** Kinds of shadow evidence whose rows rowLowerBounds bounds. */
export function isBoundedKind(kind: ShadowEvidence['kind']): boolean {
  return kind === 'rod-shadow' || kind === 'overhang-shadow' || kind === 'fin-shadow' || kind === 'pole-shadow' || kind === 'sun-direction' || kind === 'sun-circle';
}

/**
 * Lower bounds of |row| anywhere within deltaDeg of arc of the sun c (apparent altitude within
 * deltaDeg too), written into `lower` from 0, given the rows at c (`rows`, as evidenceResidualValues
 * writes them); returns false for a kind not bounded here (then nothing is written).
 * @example rowLowerBounds({ kind: 'sun-direction', azimuthDeg: 180, azimuthSigmaDeg: 1, altitudeDeg: 40, altitudeSigmaDeg: 1 }, { azimuthDeg: 180, altitudeDeg: 30 }, 0, 2, rows, lower)
 *   // lower = [0, 8] for rows = [0, -10]
 */
export function rowLowerBounds(evidence: ShadowEvidence, sun: SunDirection, wallAzimuthDeg: number, deltaDeg: number, rows: Float64Array, lower: Float64Array): boolean {
  const cut = (k: number, change: number): void => {
    const v = Math.abs(rows[k]) - change;
    lower[k] = v > 0 ? v : 0;
  };
  switch (evidence.kind) {
    case 'rod-shadow':
      // around the wall's normal; phi: the elevation above the wall's plane
      cut(0, aroundAxisChangeDeg(sunElevationAboveWallDeg(sun, wallAzimuthDeg), deltaDeg) / evidence.sigmaDeg);
      return true;
    case 'overhang-shadow': {
      // around the wall's horizontal axis; phi: asin of the sun's component along it, cos a sin HSA (shadowAngles.ts sunInWallFrame)
      const along = cosDeg(sun.altitudeDeg) * sinDeg(horizontalShadowAngleDeg(sun.azimuthDeg, wallAzimuthDeg));
      const phi = Math.asin(Math.min(1, Math.abs(along))) * DEG_PER_RAD;
      cut(0, aroundAxisChangeDeg(phi, deltaDeg) / ratioSigmaToAngleSigmaDeg(evidence.depthRatio, evidence.sigma));
      return true;
    }
    case 'fin-shadow':
      cut(0, aroundAxisChangeDeg(sun.altitudeDeg, deltaDeg) / ratioSigmaToAngleSigmaDeg(evidence.widthRatio, evidence.sigma));
      return true;
    case 'pole-shadow': {
      let k = 0;
      if (evidence.shadowAzimuthDeg !== undefined && evidence.shadowAzimuthSigmaDeg !== undefined) cut(k++, aroundAxisChangeDeg(sun.altitudeDeg, deltaDeg) / evidence.shadowAzimuthSigmaDeg);
      if (evidence.lengthRatio !== undefined && evidence.lengthRatioSigma !== undefined) cut(k++, deltaDeg / ratioSigmaToAngleSigmaDeg(evidence.lengthRatio, evidence.lengthRatioSigma));
      return true;
    }
    case 'sun-direction':
      cut(0, aroundAxisChangeDeg(sun.altitudeDeg, deltaDeg) / evidence.azimuthSigmaDeg);
      cut(1, deltaDeg / evidence.altitudeSigmaDeg);
      return true;
    case 'sun-circle': {
      const c = evidence.circle.clickCovariance;
      const sigmaMax = Math.max(Math.sqrt(c[0][0] + c[1][1] + c[2][2]) * DEG_PER_RAD, MIN_PLANE_SIGMA_DEG);
      if (!Number.isFinite(sigmaMax)) return false;
      const distance = Math.abs(planeDistanceDeg(planeNormalAt(evidence.circle, evidence.cameraError ?? []), sunUnitVector(sun.azimuthDeg, sun.altitudeDeg)));
      const v = (distance - deltaDeg) / sigmaMax;
      lower[0] = v > 0 ? v : 0;
      return true;
    }
    default:
      return false;
  }
}
