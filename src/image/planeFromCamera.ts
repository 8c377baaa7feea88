/**
 * A wall of stated azimuth, or the level ground, put into the picture by the
 * camera (camera.ts) instead of a clicked figure of known size.
 *
 * Geometry (Hartley and Zisserman, *Multiple View Geometry*, 2nd ed. (2003),
 * sec. 8.1.1, eq. (8.1): the plane X = X0 + a A + b B is imaged by the
 * homography H = K R [A | B | X0], camera centre at the origin of the site
 * frame): for a wall, A = its u axis (azimuth normal - 90 deg), B = up and
 * X0 = -n, the foot of the perpendicular from the camera onto the wall, with
 * n the outward normal (the camera stands outside the wall); for the ground,
 * A = east, B = north and X0 = -up (the camera above the ground). The
 * distance from the camera to the plane is taken as 1: the plane is known up
 * to scale, like a rectangle of known proportion only, so angles in the plane
 * (a rod's slope on a wall, a pole shadow's azimuth on the ground) are exact
 * and ratios to a length in metres (overhang depth, fin width, pole length)
 * are refused (`metric` false).
 *
 * Error propagation: the plane's inputs are every clicked point of the
 * camera's lines; the measurement function refits the camera (cameraModel.ts,
 * cameraFromParameters, by the method chosen for the nominal clicks) and
 * rebuilds H from it, so the first-order sigma and the Monte Carlo spread
 * carry the camera's uncertainty (src/image/propagation.ts). The stated wall
 * azimuth is held fixed, as in the camera itself.
 *
 * Leaves out: a wall leaning out of plumb, ground not level, every error of
 * the painter's perspective that the camera's own meeting test does not show.
 */
import { InvalidInputError } from '../errors.js';
import type { ImageInfo } from '../scene/types.js';
import type { CameraSolution } from './camera.js';
import { cameraFromParameters, cameraParameters, siteDirectionOf, dot3, type CameraCore, type Vector3 } from './cameraModel.js';
import { applyHomography, invertHomography, type Homography, type Point2 } from './homography.js';
import type { PlaneKind, RectifiedPlane } from './planeInImage.js';
import type { Homogeneous3 } from './vanishingPoint.js';

/** Everything a plane from the camera is built from. */
export interface CameraPlaneSource {
  readonly camera: CameraSolution;
  /** The camera's vanishing points at the nominal clicks, to orient refitted ones alike. */
  readonly orientLike: readonly Homogeneous3[];
  /** In-plane axes and origin in the site frame (east, north, up), camera at the origin. */
  readonly axisA: Vector3;
  readonly axisB: Vector3;
  readonly origin: Vector3;
  /** The wall's id, for a wall. */
  readonly wallId?: string;
}

/** K R d: the image (working pixels, homogeneous) of a site direction d for one camera. */
function imageOfDirection(core: CameraCore, d: Vector3): [number, number, number] {
  const f = core.focalLengthPx;
  const [px, py] = core.principalPointPx;
  const c = [dot3(core.rotation[0], d), dot3(core.rotation[1], d), dot3(core.rotation[2], d)];
  return [f * c[0] + px * c[2], f * c[1] + py * c[2], c[2]];
}

/** H = K R [A | B | X0] for one camera (H&Z sec. 8.1.1, eq. (8.1)), plane -> working pixels. */
function homographyOfCore(core: CameraCore, source: CameraPlaneSource): Homography {
  const cols = [source.axisA, source.axisB, source.origin].map((d) => imageOfDirection(core, d));
  // row-major, like homography.ts
  return [cols[0][0], cols[1][0], cols[2][0], cols[0][1], cols[1][1], cols[2][1], cols[0][2], cols[1][2], cols[2][2]];
}

/** Number of parameters of the source: x and y of every clicked camera line point. */
export function cameraPlaneParameterCount(source: CameraPlaneSource): number {
  return cameraParameters(source.camera.input).p0.length;
}

/** The parameter vector (camera clicks) and their sigmas, in the order cameraPlaneHomographyOf reads them. */
export function cameraPlaneParameters(source: CameraPlaneSource): { p0: number[]; sigmas: number[] } {
  return cameraParameters(source.camera.input);
}

/** Plane -> working pixels, with the camera refitted from a parameter vector. */
export function cameraPlaneHomographyOf(source: CameraPlaneSource, params: readonly number[]): Homography {
  const core = cameraFromParameters(source.camera.input, source.camera.method, params, source.orientLike);
  return homographyOfCore(core, source);
}

/** The plane's unit normal N = A x B in the site frame (ground: up; wall: its outward normal). */
export function cameraPlaneNormal(source: CameraPlaneSource): Vector3 {
  const [a, b] = [source.axisA, source.axisB];
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}

/**
 * The plane map and the image of its normal, K R N, with the camera refitted from a parameter vector: the point
 * X0 + a A + b B + c N images at H (a, b, 1) + c K R N (H&Z sec. 8.1.1, eq. (8.1), extended by the normal column).
 */
export function cameraPlaneProjectionOf(source: CameraPlaneSource, params: readonly number[]): { homography: Homography; normalImage: readonly [number, number, number] } {
  const core = cameraFromParameters(source.camera.input, source.camera.method, params, source.orientLike);
  return { homography: homographyOfCore(core, source), normalImage: imageOfDirection(core, cameraPlaneNormal(source)) };
}

/**
 * How far a point straight out from a wall stands from its root, in the plane's unit (the camera's distance to the
 * wall), from the clicked pixel of that point: the root R = X0 + a A + b B in the site frame (camera at the origin,
 * as for the homography above), the point on the line R + p n (n the outward normal, n = -X0), and p from the
 * closest approach of that line to the viewing ray d = R^T K^-1 x of the click (the least-squares meeting of two
 * lines, common practice; exact when the click lies on the image of the line, which runs towards the vanishing
 * point of n). The ratio of a length in the wall to p is then free of the unknown scale: all points of one rigid
 * overhang or fin are known in one frame up to a single scale (H&Z 2nd ed. sec. 8.1.1 and Result 8.20).
 * @example projectionFromTip(source, p0, [2.1, 0.4], [812, 431]) // 0.062 (6.2% of the camera's distance to the wall)
 */
export function projectionFromTip(source: CameraPlaneSource, params: readonly number[], root: Point2, tipPx: Point2): number {
  const core = cameraFromParameters(source.camera.input, source.camera.method, params, source.orientLike);
  const { axisA: a, axisB: b, origin: x0 } = source;
  const r: Vector3 = [x0[0] + root[0] * a[0] + root[1] * b[0], x0[1] + root[0] * a[1] + root[1] * b[1], x0[2] + root[0] * a[2] + root[1] * b[2]];
  const n: Vector3 = [-x0[0], -x0[1], -x0[2]];
  const c: Vector3 = [(tipPx[0] - core.principalPointPx[0]) / core.focalLengthPx, (tipPx[1] - core.principalPointPx[1]) / core.focalLengthPx, 1];
  const rot = core.rotation;
  const d: Vector3 = [rot[0][0] * c[0] + rot[1][0] * c[1] + rot[2][0] * c[2], rot[0][1] * c[0] + rot[1][1] * c[1] + rot[2][1] * c[2], rot[0][2] * c[0] + rot[1][2] * c[1] + rot[2][2] * c[2]];
  // p (n.n) - lambda (n.d) = -n.R ; p (n.d) - lambda (d.d) = -d.R
  const [nn, nd, dd, nr, dr] = [dot3(n, n), dot3(n, d), dot3(d, d), dot3(n, r), dot3(d, r)];
  const det = -nn * dd + nd * nd;
  return (-nr * -dd - -nd * -dr) / det;
}

/**
 * A wall (of stated outward azimuth) or the level ground as a RectifiedPlane from the camera.
 * Throws InvalidInputError naming `field` when the plane cannot be seen by this camera.
 * @example planeFromCamera(camera, 'wall', image, 'walls[1]', { id: 'hall-east', azimuthDeg: 95 }).definition // 'camera'
 */
export function planeFromCamera(
  camera: CameraSolution,
  kind: PlaneKind,
  image: ImageInfo,
  field: string,
  wall?: { readonly id: string; readonly azimuthDeg: number },
): RectifiedPlane {
  const up: Vector3 = [0, 0, 1];
  let axisA: Vector3;
  let axisB: Vector3;
  let origin: Vector3;
  if (kind === 'wall') {
    if (!wall) throw new InvalidInputError(field, undefined, 'a wall with an azimuth');
    axisA = siteDirectionOf({ kind: 'wall', wallId: wall.id, wallAzimuthDeg: wall.azimuthDeg });
    axisB = up;
    origin = [-Math.sin((wall.azimuthDeg * Math.PI) / 180), -Math.cos((wall.azimuthDeg * Math.PI) / 180), 0]; // -n: east = sin, north = cos
  } else {
    axisA = [1, 0, 0];
    axisB = [0, 1, 0];
    origin = [0, 0, -1];
  }
  const source: CameraPlaneSource = {
    camera, orientLike: camera.core.vanishingPoints.map((v) => v.point), axisA, axisB, origin, ...(wall ? { wallId: wall.id } : {}),
  };
  const matrix = homographyOfCore(camera.core, source);
  // a reference point of the plane in front of the camera: the origin, or far along the view's trace on the plane
  const forward = camera.rotation[2];
  const fa = dot3(forward, axisA);
  const fb = dot3(forward, axisB);
  const inPlane = Math.hypot(fa, fb);
  const depth0 = dot3(forward, origin);
  let reference: Point2 = [0, 0];
  if (depth0 <= 0.1) {
    if (inPlane < 1e-6) {
      throw new InvalidInputError(field, kind === 'wall' ? wall!.azimuthDeg : 'ground', `a ${kind === 'wall' ? 'wall' : 'ground'} this camera can see`, 'The plane lies behind the camera as found from the camera lines; check the wall azimuth and the camera lines');
    }
    const length = (1.1 - depth0) / inPlane;
    reference = [(length * fa) / inPlane, (length * fb) / inPlane];
  }
  return {
    kind,
    field,
    definition: 'camera',
    metric: false,
    pixelPoints: [applyHomography(matrix, reference)],
    planePoints: [reference],
    pointSigmasPx: [0],
    // no clicks to fit: the map is fixed by the camera, and its residuals tell nothing (the camera's meeting test does)
    fit: { matrix, residuals: [], rms: 0, conditionNumber: 1, exactlyDetermined: true },
    imageToPlane: invertHomography(matrix),
    image,
    fromCamera: source,
  };
}
