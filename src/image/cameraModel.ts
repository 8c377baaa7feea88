/**
 * The picture's camera from vanishing points: focal length, principal point
 * and the rotation into the site's east-north-up frame, as one smooth
 * function of every clicked coordinate (so that src/image/propagation.ts can
 * carry the clicking error through it).
 *
 * Pinhole camera x = K R (X - C), K = [[f, 0, px], [0, f, py], [0, 0, 1]],
 * square pixels, no skew (Hartley and Zisserman, *Multiple View Geometry*,
 * 2nd ed. (2003), sec. 6.1, eq. (6.8)); camera frame x right, y down (the
 * picture's pixel axes, docs/conventions.md), z forward. R maps site vectors
 * (east, north, up) to the camera frame. The vanishing point of direction d
 * is v = K R d (H&Z sec. 8.6.1, Result 8.20), so d = R^T K^-1 v up to sign.
 *
 * Calibration (H&Z sec. 8.8.1, Example 8.27 and Table 8.1; Caprile and
 * Torre, "Using vanishing points for camera calibration", IJCV 4, 1990):
 * the vanishing points v_i, v_j of two perpendicular directions satisfy
 * v_i^T omega v_j = 0 with omega = K^-T K^-1, that is
 *     (x_i - px)(x_j - px) + (y_i - py)(y_j - py) + f^2 = 0
 * for finite points (pixels). Three mutually perpendicular directions put
 * the principal point at the orthocentre of the triangle of their vanishing
 * points, and f^2 = -(v_1 - p) . (v_2 - p) (Caprile and Torre 1990, sec. 3;
 * H&Z sec. 8.8.1). With fewer, the principal point is taken at the picture's
 * centre and f^2 is the mean over the perpendicular pairs whose vanishing
 * points are both finite; or f is the user's.
 *
 * Rotation: the camera-frame directions b_k = +-K^-1 v_k (unit) of the
 * vertical and of each wall's horizontal lines (along u, azimuth normal - 90
 * deg, docs/conventions.md) are matched to their site directions a_k by the
 * closed-form least-squares rotation of Horn, "Closed-form solution of
 * absolute orientation using unit quaternions", JOSA A 4(4), 1987, sec. 4
 * (the quaternion is the eigenvector of the largest eigenvalue of his 4x4
 * matrix N). Signs: up is the direction that points up in the picture
 * (negative camera y, true for any camera not upside down); a wall's u
 * direction is the one that makes the wall face the camera, the outward
 * normal u x up pointing against the mean viewing ray of the wall's clicked
 * points (the camera stands outside the wall).
 *
 * Not modelled: lens distortion, non-square pixels, skew, a principal point
 * off the centre when fewer than three perpendicular vanishing points are
 * finite (its error then goes into f and the rotation, unreported).
 */
import { symmetricEigen } from '../math/symmetricEigen.js';
import { cosDeg, normalizeDeg180, sinDeg } from '../math/angles.js';
import type { Point2 } from './homography.js';
import { fitLine, fitVanishingPoint, pictureFrame, toNormalised, type Homogeneous3, type PictureFrame, type VanishingPointFit } from './vanishingPoint.js';

export type Vector3 = readonly [number, number, number];
/** Row-major 3x3 matrix. */
export type Matrix3 = readonly [Vector3, Vector3, Vector3];

/** What the lines of a family run along: the vertical, or the horizontal edges of a wall of known azimuth. */
export type FamilyDirection =
  | { readonly kind: 'vertical' }
  | { readonly kind: 'wall'; readonly wallId: string; readonly wallAzimuthDeg: number };

/** One clicked line: two or more points along a straight edge, working-frame pixels, with their clicking sigma. */
export interface ClickedLine {
  readonly pointsPx: readonly Point2[];
  readonly sigmaPx: number;
}

/** Lines known to be parallel in the scene. */
export interface LineFamily {
  /** Path in the scene file, for messages, e.g. `camera.verticalLines`. */
  readonly field: string;
  readonly direction: FamilyDirection;
  readonly lines: readonly ClickedLine[];
}

/** Everything the camera is found from. Points in the working frame (after the mirror flip). */
export interface CameraInput {
  /** Path in the scene file, e.g. `camera`. */
  readonly field: string;
  readonly widthPx: number;
  readonly heightPx: number;
  readonly families: readonly LineFamily[];
  /** Focal length in pixels, when the user knows it; the principal point is then the picture's centre. */
  readonly focalLengthPx?: number;
}

/** How focal length and principal point were obtained. */
export type CalibrationMethod =
  | { readonly kind: 'orthocentre'; readonly families: readonly [number, number, number] }
  | { readonly kind: 'centre-and-pairs'; readonly pairs: readonly (readonly [number, number])[] }
  | { readonly kind: 'given-focal-length' };

/** The camera's numbers for one set of clicks. */
export interface CameraCore {
  readonly focalLengthPx: number;
  readonly principalPointPx: Point2;
  /** Site (east, north, up) to camera (right, down, forward). */
  readonly rotation: Matrix3;
  /** Per family: its vanishing point fit (normalised coordinates of `frame`). */
  readonly vanishingPoints: readonly VanishingPointFit[];
  /** Per family: the camera-frame unit direction the vanishing point gives, sign chosen as in the header. */
  readonly directions: readonly Vector3[];
  /** Per family: the site direction it is matched to. */
  readonly siteDirections: readonly Vector3[];
  readonly frame: PictureFrame;
}

export const cross = (a: Vector3, b: Vector3): Vector3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
export const dot3 = (a: Vector3, b: Vector3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
export const unit = (a: Vector3): Vector3 => {
  const n = Math.hypot(a[0], a[1], a[2]);
  return [a[0] / n, a[1] / n, a[2] / n];
};
export const applyMatrix = (m: Matrix3, a: Vector3): Vector3 => [dot3(m[0], a), dot3(m[1], a), dot3(m[2], a)];
export const transpose = (m: Matrix3): Matrix3 => [
  [m[0][0], m[1][0], m[2][0]],
  [m[0][1], m[1][1], m[2][1]],
  [m[0][2], m[1][2], m[2][2]],
];

/** Site direction of a family: up, or the wall's u axis (azimuth normal - 90 deg, docs/conventions.md). */
export function siteDirectionOf(direction: FamilyDirection): Vector3 {
  if (direction.kind === 'vertical') return [0, 0, 1];
  const az = direction.wallAzimuthDeg - 90;
  return [sinDeg(az), cosDeg(az), 0]; // east = sin, north = cos
}

/** True when two families' site directions are perpendicular within `toleranceDeg`. */
export function arePerpendicular(a: FamilyDirection, b: FamilyDirection, toleranceDeg: number): boolean {
  if (a.kind === 'vertical' || b.kind === 'vertical') return a.kind !== b.kind;
  const d = Math.abs(normalizeDeg180(a.wallAzimuthDeg - b.wallAzimuthDeg));
  return Math.abs(d - 90) <= toleranceDeg;
}

/** Number of parameters (x and y of every clicked point) the input has. */
export function cameraParameterCount(input: CameraInput): number {
  let n = 0;
  for (const fam of input.families) for (const line of fam.lines) n += 2 * line.pointsPx.length;
  return n;
}

/** The clicked coordinates as one parameter vector, with the sigma of each. */
export function cameraParameters(input: CameraInput): { p0: number[]; sigmas: number[] } {
  const p0: number[] = [];
  const sigmas: number[] = [];
  for (const fam of input.families) {
    for (const line of fam.lines) {
      for (const p of line.pointsPx) {
        p0.push(p[0], p[1]);
        sigmas.push(line.sigmaPx, line.sigmaPx);
      }
    }
  }
  return { p0, sigmas };
}

/** Vanishing point of each family from the parameter vector (normalised coordinates). */
export function vanishingPointsOf(
  input: CameraInput,
  params: readonly number[],
  orientLike?: readonly Homogeneous3[],
): VanishingPointFit[] {
  const frame = pictureFrame(input.widthPx, input.heightPx);
  let k = 0;
  return input.families.map((fam, f) => {
    const lines = fam.lines.map((line) => {
      const pts = line.pointsPx.map(() => {
        const q = toNormalised([params[k], params[k + 1]], frame);
        k += 2;
        return q;
      });
      return fitLine(pts, line.sigmaPx / frame.scale);
    });
    return fitVanishingPoint(lines, orientLike?.[f]);
  });
}

/** A finite homogeneous point (normalised) as [x, y]. */
const finite = (v: Homogeneous3): [number, number] => [v[0] / v[2], v[1] / v[2]];

/** f^2 (normalised units) of a perpendicular pair with both points finite, given the principal point. */
function focalSquared(vi: Homogeneous3, vj: Homogeneous3, p: readonly [number, number]): number {
  const a = finite(vi);
  const b = finite(vj);
  return -((a[0] - p[0]) * (b[0] - p[0]) + (a[1] - p[1]) * (b[1] - p[1])); // H&Z sec. 8.8.1, omega with zero skew, square pixels
}

/** Orthocentre of the triangle a, b, c (Caprile and Torre 1990): (p - c) . (a - b) = 0, (p - a) . (b - c) = 0. */
export function orthocentre(a: readonly [number, number], b: readonly [number, number], c: readonly [number, number]): [number, number] {
  const [m11, m12, r1] = [a[0] - b[0], a[1] - b[1], c[0] * (a[0] - b[0]) + c[1] * (a[1] - b[1])];
  const [m21, m22, r2] = [b[0] - c[0], b[1] - c[1], a[0] * (b[0] - c[0]) + a[1] * (b[1] - c[1])];
  const det = m11 * m22 - m12 * m21;
  return [(r1 * m22 - m12 * r2) / det, (m11 * r2 - m21 * r1) / det];
}

/**
 * Rotation matrix of a unit quaternion (q0, qx, qy, qz) (Horn 1987, sec. 3.3).
 */
function quaternionToMatrix(q: readonly number[]): Matrix3 {
  const [w, x, y, z] = q;
  return [
    [w * w + x * x - y * y - z * z, 2 * (x * y - w * z), 2 * (x * z + w * y)],
    [2 * (y * x + w * z), w * w - x * x + y * y - z * z, 2 * (y * z - w * x)],
    [2 * (z * x - w * y), 2 * (z * y + w * x), w * w - x * x - y * y + z * z],
  ];
}

/**
 * Least-squares rotation R with R a_k ~ b_k (Horn 1987, sec. 4, eq. for N; equal weights).
 * @example rotationFromPairs([[1,0,0],[0,0,1]], [[0,1,0],[0,0,1]]) // 90 deg about z
 */
export function rotationFromPairs(a: readonly Vector3[], b: readonly Vector3[]): Matrix3 {
  const s = [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
  a.forEach((ak, k) => {
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) s[i][j] += ak[i] * b[k][j];
  });
  const [[sxx, sxy, sxz], [syx, syy, syz], [szx, szy, szz]] = s;
  const n = [
    [sxx + syy + szz, syz - szy, szx - sxz, sxy - syx],
    [syz - szy, sxx - syy - szz, sxy + syx, szx + sxz],
    [szx - sxz, sxy + syx, -sxx + syy - szz, syz + szy],
    [sxy - syx, szx + sxz, syz + szy, -sxx - syy + szz],
  ];
  const eig = symmetricEigen(n);
  return quaternionToMatrix(eig.vectors[3]);
}

/** Camera-frame ray through a working-frame pixel (not unit). */
export function pixelRay(p: Point2, focalLengthPx: number, principal: Point2): Vector3 {
  return [(p[0] - principal[0]) / focalLengthPx, (p[1] - principal[1]) / focalLengthPx, 1];
}

/**
 * The camera for one parameter vector, by the method chosen for the nominal clicks.
 * Numbers only: the checks with messages are in camera.ts, at the nominal clicks.
 */
export function cameraFromParameters(
  input: CameraInput,
  method: CalibrationMethod,
  params: readonly number[],
  orientLike?: readonly Homogeneous3[],
): CameraCore {
  const frame = pictureFrame(input.widthPx, input.heightPx);
  const vps = vanishingPointsOf(input, params, orientLike);
  const v = vps.map((fit) => fit.point);
  let principal: [number, number] = [0, 0]; // normalised: the picture's centre
  let f2: number;
  if (method.kind === 'orthocentre') {
    const [i, j, k] = method.families;
    principal = orthocentre(finite(v[i]), finite(v[j]), finite(v[k]));
    f2 = focalSquared(v[i], v[j], principal);
  } else if (method.kind === 'centre-and-pairs') {
    f2 = method.pairs.reduce((sum, [i, j]) => sum + focalSquared(v[i], v[j], principal), 0) / method.pairs.length;
  } else {
    const fn = input.focalLengthPx! / frame.scale;
    f2 = fn * fn;
  }
  const f = Math.sqrt(f2);
  const focalLengthPx = f * frame.scale;
  const principalPx: Point2 = [frame.centreX + principal[0] * frame.scale, frame.centreY + principal[1] * frame.scale];
  // camera-frame directions K^-1 v (H&Z Result 8.20), in normalised units
  const raw = v.map((p): Vector3 => unit([(p[0] - principal[0] * p[2]) / f, (p[1] - principal[1] * p[2]) / f, p[2]]));
  const verticalIndex = input.families.findIndex((fam) => fam.direction.kind === 'vertical');
  const up = raw[verticalIndex][1] < 0 ? raw[verticalIndex] : ([-raw[verticalIndex][0], -raw[verticalIndex][1], -raw[verticalIndex][2]] as Vector3);
  let k = 0;
  const directions = input.families.map((fam, index): Vector3 => {
    let meanRay: Vector3 = [0, 0, 0];
    for (const line of fam.lines) {
      for (let n = 0; n < line.pointsPx.length; n++) {
        const r = unit(pixelRay([params[k], params[k + 1]], focalLengthPx, principalPx));
        meanRay = [meanRay[0] + r[0], meanRay[1] + r[1], meanRay[2] + r[2]];
        k += 2;
      }
    }
    if (index === verticalIndex) return up;
    const d = raw[index];
    // the wall faces the camera: outward normal u x up against the viewing rays
    return dot3(cross(d, up), meanRay) < 0 ? d : [-d[0], -d[1], -d[2]];
  });
  const siteDirections = input.families.map((fam) => siteDirectionOf(fam.direction));
  const rotation = rotationFromPairs(siteDirections, directions);
  return { focalLengthPx, principalPointPx: principalPx, rotation, vanishingPoints: vps, directions, siteDirections, frame };
}

/** Small rotation vector (east, north, up components, degrees) taking `reference` to `rotation`: R = R0 exp([w]x). */
export function rotationDifferenceDeg(rotation: Matrix3, reference: Matrix3): Vector3 {
  const rt = transpose(reference);
  const d = [0, 1, 2].map((i) => [0, 1, 2].map((j) => rt[i][0] * rotation[0][j] + rt[i][1] * rotation[1][j] + rt[i][2] * rotation[2][j]));
  const c = 180 / Math.PI;
  return [((d[2][1] - d[1][2]) / 2) * c, ((d[0][2] - d[2][0]) / 2) * c, ((d[1][0] - d[0][1]) / 2) * c];
}

/** Angle of the rotation between two rotation matrices, degrees (trace formula, common practice). */
export function rotationAngleDeg(a: Matrix3, b: Matrix3): number {
  let trace = 0;
  for (let i = 0; i < 3; i++) trace += a[i][0] * b[i][0] + a[i][1] * b[i][1] + a[i][2] * b[i][2];
  const c = Math.min(1, Math.max(-1, (trace - 1) / 2));
  // acos loses precision near 0: use the sine of the skew part as well
  const s = Math.hypot(...rotationDifferenceDeg(a, b).map((x) => (x * Math.PI) / 180));
  return (Math.atan2(s, c) * 180) / Math.PI;
}

/** The camera's viewing direction (azimuth, altitude), and roll (positive when its right side is raised), degrees. */
export function cameraAttitude(rotation: Matrix3): { viewAzimuthDeg: number; viewAltitudeDeg: number; rollDeg: number } {
  const [right, down, forward] = rotation; // the rows of R are the camera's axes in site coordinates
  const c = 180 / Math.PI;
  const az = Math.atan2(forward[0], forward[1]) * c;
  return {
    viewAzimuthDeg: az < 0 ? az + 360 : az,
    viewAltitudeDeg: Math.atan2(forward[2], Math.hypot(forward[0], forward[1])) * c,
    rollDeg: Math.atan2(right[2], -down[2]) * c,
  };
}
