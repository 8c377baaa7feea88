/**
 * The moon's direction in the sky from its centre clicked in the picture: through the scene's camera
 * (camera.ts), or through a wall or the ground clicked as a figure of known shape, whose plane
 * homography gives the camera's focal length and rotation.
 *
 * Through the camera: the site direction of a pixel p is R^T K^-1 (p, 1) (Hartley and Zisserman,
 * *Multiple View Geometry*, 2nd ed. 2003, sec. 8.6.1, Result 8.20), R and K those of cameraModel.ts.
 *
 * Through a plane: the plane -> picture homography is H ~ K [r1 r2 t] (H&Z sec. 8.1.1 and sec. 8.8.1,
 * "calibration from a metric plane"; Zhang, "A flexible new technique for camera calibration", IEEE
 * Trans. PAMI 22(11), 2000, sec. 2.3 and 3.1), r1 and r2 the camera-frame directions of the plane's two
 * axes (wall: u along the wall and v up; ground: east and north; docs/conventions.md). With square
 * pixels, no skew and the principal point at the picture's centre (the only unknown is f), the image of
 * the absolute conic omega = diag(1/f^2, 1/f^2, 1) gives Zhang's two constraints on the columns h1, h2 of
 * the centred homography:
 *     h1^T omega h2 = 0             (h11 h12 + h21 h22) w + h31 h32 = 0
 *     h1^T omega h1 = h2^T omega h2 (h11^2 + h21^2 - h12^2 - h22^2) w + h31^2 - h32^2 = 0
 * with w = 1/f^2, solved together by least squares in w. Then r1 ~ K^-1 h1 and r2 ~ K^-1 h2 (sign: the
 * plane's clicked points in front of the camera), and the rotation R (site -> camera) is the
 * least-squares rotation taking the plane's site axes to r1, r2 (Horn 1987, cameraModel.ts
 * rotationFromPairs), which also makes them exactly square. The direction of the clicked moon follows
 * as through the camera.
 *
 * When the plane cannot give the camera: a plane seen face-on or as an affine view (h31 = h32 = 0:
 * its lines do not converge) leaves f free (w = 0 solves both constraints), and near it f is
 * unstable; refused with a message when w is not positive, or when the first-order sigma of f from
 * the clicks exceeds MAX_FOCAL_RELATIVE_SIGMA of f.
 *
 * Uncertainty: the azimuth and altitude as one function of every click (the plane's or camera's clicks,
 * the moon's centre) and of the wall's azimuth sigma, propagated to first order (propagation.ts); the
 * caller checks it against a Monte Carlo of the same function when its linearity check fails.
 *
 * Not modelled: lens distortion, a principal point off the centre (for a plane), the 0.25 deg
 * semi-diameter of the moon (the centre of the disc is to be clicked), the ground rectangle's own
 * azimuth sigma.
 */
import { InvalidInputError } from '../errors.js';
import { cosDeg, sinDeg } from '../math/angles.js';
import type { ImageInfo, PixelPoint } from '../scene/types.js';
import type { CameraSolution } from './camera.js';
import { applyMatrix, cameraFromParameters, cameraParameters, cross, pixelRay, rotationFromPairs, transpose, unit, type Matrix3, type Vector3 } from './cameraModel.js';
import type { Homography, Point2 } from './homography.js';
import { checkPixelPoint, toWorkingFrame, type RectifiedPlane } from './planeInImage.js';
import { planeHomographyAt, planeParameters, LINEARITY_TOLERANCE } from './pixelSetup.js';
import { propagateFirstOrder, type FirstOrderResult } from './propagation.js';

/** A plane whose focal length has a first-order sigma above this share of itself does not fix the camera (common practice). */
export const MAX_FOCAL_RELATIVE_SIGMA = 0.25;

const DEG = 180 / Math.PI;

/** A camera as the plane gives it: focal length (px), principal point (the picture's centre) and rotation site -> camera. */
export interface PlaneCamera {
  readonly focalLengthPx: number;
  readonly principalPointPx: Point2;
  readonly rotation: Matrix3;
}

/** The moon's direction from its clicked centre, with its first-order covariance. */
export interface MoonFromPixels {
  readonly azimuthDeg: number;
  readonly altitudeDeg: number;
  readonly azimuthSigmaDeg: number;
  readonly altitudeSigmaDeg: number;
  /** Covariance of (azimuth, altitude), deg^2. */
  readonly covarianceDeg2: readonly (readonly number[])[];
  /** Focal length used, px, and how the direction was found, in words. */
  readonly focalLengthPx: number;
  readonly through: 'camera' | 'plane';
  readonly note: string;
  readonly nonlinearity: number;
  readonly firstOrderReliable: boolean;
  /** The same measurement as a function of every input, for a Monte Carlo check: [azimuth, altitude]. */
  readonly f: (q: readonly number[]) => number[];
  readonly p0: readonly number[];
  readonly sigmas: readonly number[];
}

/** Azimuth (clockwise from north, [0, 360)) and altitude of a site vector (east, north, up), degrees. */
export function vectorToAzimuthAltitude(s: Vector3): [number, number] {
  const az = Math.atan2(s[0], s[1]) * DEG;
  return [az < 0 ? az + 360 : az, Math.atan2(s[2], Math.hypot(s[0], s[1])) * DEG];
}

/** The site directions of a plane's two axes: wall (u along it, azimuth of the normal - 90 deg; up), ground (east; north). */
export function planeSiteAxes(kind: RectifiedPlane['kind'], wallAzimuthDeg: number | undefined): [Vector3, Vector3] {
  if (kind === 'ground') return [[1, 0, 0], [0, 1, 0]];
  const az = (wallAzimuthDeg ?? 0) - 90;
  return [[sinDeg(az), cosDeg(az), 0], [0, 0, 1]];
}

/**
 * The camera from a plane's homography (plane -> working pixels): Zhang's two constraints for w = 1/f^2 with
 * the principal point at the picture's centre, then the rotation. Null when no positive f solves them.
 * @example cameraFromPlaneHomography(h, 1600, 1200, [[1, 0, 0], [0, 1, 0]], [3, 2])?.focalLengthPx // 1400
 */
export function cameraFromPlaneHomography(h: Homography, widthPx: number, heightPx: number, axes: readonly [Vector3, Vector3], planePoint: Point2): PlaneCamera | null {
  const cx = widthPx / 2;
  const cy = heightPx / 2;
  // Centre the picture and scale it (conditioning): G = S T H, with pixels measured from the centre in units of s.
  const s = Math.max(widthPx, heightPx) / 2;
  const g = (r: number, c: number): number => (r === 2 ? h[6 + c] : (h[3 * r + c] - (r === 0 ? cx : cy) * h[6 + c]) / s);
  const [g11, g21, g31] = [g(0, 0), g(1, 0), g(2, 0)];
  const [g12, g22, g32] = [g(0, 1), g(1, 1), g(2, 1)];
  // Zhang (2000) eqs. (3)-(4) with omega = diag(w, w, 1) in the scaled frame: a_k w + b_k = 0.
  const a1 = g11 * g12 + g21 * g22;
  const b1 = g31 * g32;
  const a2 = g11 * g11 + g21 * g21 - g12 * g12 - g22 * g22;
  const b2 = g31 * g31 - g32 * g32;
  const w = -(a1 * b1 + a2 * b2) / (a1 * a1 + a2 * a2);
  if (!(w > 0) || !Number.isFinite(w)) return null;
  const fScaled = 1 / Math.sqrt(w);
  const k1: Vector3 = [g11 / fScaled, g21 / fScaled, g31];
  const k2: Vector3 = [g12 / fScaled, g22 / fScaled, g32];
  // Sign: a clicked plane point in front of the camera (its third homogeneous coordinate positive after K^-1).
  const depth = h[6] * planePoint[0] + h[7] * planePoint[1] + h[8];
  const sign = depth >= 0 ? 1 : -1;
  const r1 = unit([sign * k1[0], sign * k1[1], sign * k1[2]]);
  const r2 = unit([sign * k2[0], sign * k2[1], sign * k2[2]]);
  const rotation = rotationFromPairs([axes[0], axes[1], cross(axes[0], axes[1])], [r1, r2, unit(cross(r1, r2))]);
  return { focalLengthPx: fScaled * s, principalPointPx: [cx, cy], rotation };
}

/** Site unit vector of a working-frame pixel through a camera (R^T K^-1 p). */
function siteRay(p: Point2, focalLengthPx: number, principal: Point2, rotation: Matrix3): Vector3 {
  return unit(applyMatrix(transpose(rotation), pixelRay(p, focalLengthPx, principal)));
}

function result(fo: FirstOrderResult, through: 'camera' | 'plane', focalLengthPx: number, note: string, f: (q: readonly number[]) => number[], p0: number[], sigmas: number[], extraNonlinearity = 0): MoonFromPixels {
  const nonlinearity = Math.max(fo.nonlinearity[0], fo.nonlinearity[1], extraNonlinearity);
  return {
    azimuthDeg: fo.values[0], altitudeDeg: fo.values[1], azimuthSigmaDeg: fo.sigmas[0], altitudeSigmaDeg: fo.sigmas[1],
    covarianceDeg2: [[fo.covariance[0][0], fo.covariance[0][1]], [fo.covariance[1][0], fo.covariance[1][1]]],
    focalLengthPx, through, note, nonlinearity, firstOrderReliable: nonlinearity <= LINEARITY_TOLERANCE, f, p0, sigmas,
  };
}

/** The clicked centre in the working frame, checked inside the picture. */
export function moonCentreInWorkingFrame(centrePx: PixelPoint, image: ImageInfo, field: string): Point2 {
  checkPixelPoint(centrePx, image, field);
  return toWorkingFrame(centrePx, image);
}

/**
 * The moon's direction through the scene's camera, from its centre (working frame) clicked with sigmaPx.
 * @example moonThroughCamera(camera, [812, 140], 1.5).altitudeDeg // 24.3
 */
export function moonThroughCamera(camera: CameraSolution, centre: Point2, sigmaPx: number): MoonFromPixels {
  const { p0: camP0, sigmas: camSigmas } = cameraParameters(camera.input);
  const nc = camP0.length;
  const vpOrient = camera.vanishingPoints.map((r) => r.homogeneous);
  const f = (q: readonly number[]): number[] => {
    const c = cameraFromParameters(camera.input, camera.method, q.slice(0, nc), vpOrient);
    return vectorToAzimuthAltitude(siteRay([q[nc], q[nc + 1]], c.focalLengthPx, c.principalPointPx, c.rotation));
  };
  const p0 = [...camP0, centre[0], centre[1]];
  const sigmas = [...camSigmas, sigmaPx, sigmaPx];
  const fo = propagateFirstOrder(f, p0, sigmas, [true, false], [...camP0.map(() => 'camera'), 'point', 'point']);
  const note = `through the camera (focal length ${camera.focalLengthPx.value.toFixed(0)} px, from its lines)`;
  return result(fo, 'camera', camera.focalLengthPx.value, note, f, p0, sigmas, camera.nonlinearity);
}

/**
 * The moon's direction through a wall or the ground clicked as a figure of known shape: the plane's homography gives
 * the focal length and the rotation (header). Throws InvalidInputError naming `field` when the plane cannot.
 * @example moonThroughPlane(plane, 200, 0.5, [812, 140], 1.5, 'observations[4].pixels').azimuthDeg // 251.7
 */
export function moonThroughPlane(plane: RectifiedPlane, wallAzimuthDeg: number | undefined, wallAzimuthSigmaDeg: number, centre: Point2, sigmaPx: number, field: string): MoonFromPixels {
  const { p0: planeP0, sigmas: planeSigmas } = planeParameters(plane);
  const np = planeP0.length;
  const { widthPx, heightPx } = plane.image;
  const anchor = plane.planePoints[0];
  const cameraAt = (q: readonly number[]): PlaneCamera | null =>
    cameraFromPlaneHomography(planeHomographyAt(plane, q.slice(0, np)), widthPx, heightPx, planeSiteAxes(plane.kind, q[np + 2]), anchor);
  const p0 = [...planeP0, centre[0], centre[1], wallAzimuthDeg ?? 0];
  const sigmas = [...planeSigmas, sigmaPx, sigmaPx, plane.kind === 'wall' ? wallAzimuthSigmaDeg : 0];
  const where = plane.kind === 'wall' ? `the wall's figure (${plane.field})` : `the ground's figure (${plane.field})`;
  const Where = `T${where.slice(1)}`;
  const nominal = cameraAt(p0);
  if (nominal === null) {
    throw new InvalidInputError(
      `${field}.wall`, plane.field, 'a wall or ground figure seen at a slant, whose lines converge in the picture',
      `${Where} gives no focal length: it is seen face-on or as a parallel (affine) view, where every focal length fits it alike, so it cannot turn the moon's pixel into a direction. Give the scene a camera block (vertical edges and wall courses), another figure, or the moon's azimuth and altitude as numbers`,
    );
  }
  // The focal length's own sigma from the plane's clicks: a plane near face-on fixes it poorly.
  const focal = propagateFirstOrder((q) => [cameraAt(q)?.focalLengthPx ?? NaN], p0, sigmas, [false], p0.map(() => 'clicks'));
  const relative = focal.sigmas[0] / nominal.focalLengthPx;
  if (!(relative <= MAX_FOCAL_RELATIVE_SIGMA)) {
    throw new InvalidInputError(
      `${field}.wall`, plane.field, `a figure that fixes the focal length to within ${Math.round(100 * MAX_FOCAL_RELATIVE_SIGMA)}% (this one: ${Number.isFinite(relative) ? `${(100 * relative).toFixed(0)}%` : 'not at all'})`,
      `${Where} is seen too nearly face-on: its lines converge too little for the focal length (${nominal.focalLengthPx.toFixed(0)} px) to be known, so the moon's direction through it would be unreliable. Give the scene a camera block, a figure seen more at a slant, or the moon's azimuth and altitude as numbers`,
    );
  }
  const f = (q: readonly number[]): number[] => {
    const c = cameraAt(q);
    return c === null ? [NaN, NaN] : vectorToAzimuthAltitude(siteRay([q[np], q[np + 1]], c.focalLengthPx, c.principalPointPx, c.rotation));
  };
  const groups = [...planeP0.map(() => 'plane'), 'point', 'point', 'azimuth'];
  const fo = propagateFirstOrder(f, p0, sigmas, [true, false], groups);
  const note = `through ${where}: focal length ${nominal.focalLengthPx.toFixed(0)} +/- ${focal.sigmas[0].toFixed(0)} px from its perspective, principal point taken at the picture's centre`;
  return result(fo, 'plane', nominal.focalLengthPx, note, f, p0, sigmas);
}

/** A moon's direction written into the scene from its pixel form, with where its sigmas came from. */
export interface ResolvedMoonDirection {
  /** Path of the observation in the scene file, e.g. `observations[3]`. */
  readonly field: string;
  readonly observationId: string;
  readonly measured: MoonFromPixels;
  /** The sigmas written into the scene (azimuth, altitude), degrees. */
  readonly sigmasDeg: readonly [number, number];
  /** Monte Carlo spread (azimuth, altitude), present when the first-order sigmas are not reliable. */
  readonly monteCarloSigmasDeg?: readonly [number, number];
  readonly sigmaSource: 'first-order' | 'monte-carlo';
}

/**
 * A measured moon in words, for `heliochron measure`.
 * @example describeMoonDirection(r) // "moon (observations[5]): azimuth 251.70 +/- 0.16 deg, altitude 24.31 +/- 0.37 deg, through the camera ..."
 */
export function describeMoonDirection(r: ResolvedMoonDirection): string {
  const m = r.measured;
  const how = r.sigmaSource === 'monte-carlo' ? 'sigmas from a Monte Carlo of the clicks (the first-order ones bend within the clicking error)' : 'sigmas by first-order propagation of the clicks';
  return `${r.observationId} (${r.field}), the moon's centre: azimuth ${m.azimuthDeg.toFixed(2)} +/- ${r.sigmasDeg[0].toFixed(2)} deg, apparent altitude ${m.altitudeDeg.toFixed(2)} +/- ${r.sigmasDeg[1].toFixed(2)} deg, ${m.note}; ${how}`;
}

/** A measured moon as plain data, for `heliochron measure --json`. */
export function moonDirectionRecord(r: ResolvedMoonDirection): unknown {
  const m = r.measured;
  return {
    id: r.observationId, field: r.field, through: m.through, azimuthDeg: m.azimuthDeg, altitudeDeg: m.altitudeDeg,
    azimuthSigmaDeg: r.sigmasDeg[0], altitudeSigmaDeg: r.sigmasDeg[1], firstOrderSigmasDeg: [m.azimuthSigmaDeg, m.altitudeSigmaDeg],
    ...(r.monteCarloSigmasDeg ? { monteCarloSigmasDeg: r.monteCarloSigmasDeg } : {}), sigmaSource: r.sigmaSource,
    focalLengthPx: m.focalLengthPx, note: m.note,
  };
}
