/**
 * A wall or the ground rectified from clicked points: the plane definitions of
 * a PlaneInImage (explicit plane points, a rectangle of known size, a
 * rectangle of known aspect only, ground rectangles oriented by the azimuth of
 * their first edge), the mirror flip of reversed prints, and the checks that
 * refuse clicks no camera could have produced.
 *
 * Working frame: pixels after the mirror flip x' = widthPx - x
 * (docs/conventions.md). Plane frame: wall (u right, v up) or ground (east,
 * north), metres; for an aspect-only rectangle the unit is the rectangle's
 * height (lengths known up to scale, angles and ratios of lengths in the plane
 * exact).
 *
 * Orientation rule used by the checks (common practice of projective
 * geometry; H&Z 2nd ed. sec. 2.3 and Result 2.12 on orientation): a camera in
 * front of the plane (outside the wall, above the ground) sees every triangle
 * of plane points with the same turning sense; since the plane frame turns
 * counterclockwise (v up, north up) and pixel y runs down, every triangle's
 * signed area changes sign between plane and picture. Mixed signs mean crossed
 * edges or a misplaced point; all signs unchanged means a reversed print or
 * corners clicked the other way round.
 */
import { InvalidInputError } from '../errors.js';
import type { ImageInfo, PixelPoint, PlaneInImage } from '../scene/types.js';
import { cosDeg, sinDeg } from '../math/angles.js';
import type { GroundFromWallsSource } from './groundFromWalls.js';
import type { CameraPlaneSource } from './planeFromCamera.js';
import {
  fitHomography,
  invertHomography,
  type Homography,
  type HomographyFit,
  type Point2,
} from './homography.js';

/** Which plane: a wall (u right, v up) or the level ground (east, north). */
export type PlaneKind = 'wall' | 'ground';

/** A plane of the picture, ready for measuring. */
export interface RectifiedPlane {
  readonly kind: PlaneKind;
  /** Path of the PlaneInImage in the scene file, e.g. `walls[0].imagePlane`. */
  readonly field: string;
  /**
   * How the plane is fixed: plane points, a rectangle of known size or aspect, (ground only) the foot lines of
   * two walls (groundFromWalls.ts), or the camera with the wall's azimuth or the vertical (planeFromCamera.ts).
   */
  readonly definition: 'points' | 'rectangle' | 'aspect' | 'walls' | 'camera';
  /** False for an aspect-only rectangle: plane unit = the rectangle's height, not metres. */
  readonly metric: boolean;
  /** Clicked points in the working frame (after the mirror flip). */
  readonly pixelPoints: readonly Point2[];
  /** The same points in the plane frame. */
  readonly planePoints: readonly Point2[];
  /** Sigma of each clicked point, px (per coordinate). */
  readonly pointSigmasPx: readonly number[];
  /** Plane -> working pixel frame, with residuals. */
  readonly fit: HomographyFit;
  /** Working pixel frame -> plane. */
  readonly imageToPlane: Homography;
  readonly image: ImageInfo;
  /**
   * Ground from two walls only: the walls, corner and azimuths the map is built from. pixelPoints and
   * planePoints then hold the derived foot-line correspondences, not clicks.
   */
  readonly fromWalls?: GroundFromWallsSource;
  /**
   * From the camera only (no clicked figure): the camera and the plane's axes. pixelPoints and planePoints then
   * hold one reference point of the plane in front of the camera, not clicks; the unit is the camera's distance to the plane.
   */
  readonly fromCamera?: CameraPlaneSource;
}

/** Smallest distance, px, between two clicked points (common practice: a click is good to about a pixel). */
export const MIN_POINT_SEPARATION_PX = 1;
/** A point closer than this to the line through two others counts as on that line, px (common practice). */
export const COLLINEAR_TOLERANCE_PX = 1;
/**
 * With more than 4 points, triangles flatter than this (height in px) are left out of the orientation
 * check: clicking noise may turn them either way (common practice: a few times the clicking precision).
 */
export const ORIENTATION_TOLERANCE_PX = 5;

/** Flip a clicked point into the working frame: x' = widthPx - x for a mirrored image (docs/conventions.md). */
export function toWorkingFrame(p: PixelPoint, image: ImageInfo): Point2 {
  return image.mirrored ? [image.widthPx - p[0], p[1]] : [p[0], p[1]];
}

/** Back from the working frame to the picture's own pixels (the flip is its own inverse). */
export function toPictureFrame(p: Point2, image: ImageInfo): Point2 {
  return image.mirrored ? [image.widthPx - p[0], p[1]] : [p[0], p[1]];
}

/** Twice the signed area of triangle abc (positive when a->b->c turns counterclockwise in a y-up frame). */
export function signedArea2(a: Point2, b: Point2, c: Point2): number {
  return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
}

/** Check a clicked pixel point: finite and inside the picture. */
export function checkPixelPoint(p: PixelPoint, image: ImageInfo, field: string): void {
  const ok =
    Array.isArray(p) && p.length === 2 && Number.isFinite(p[0]) && Number.isFinite(p[1]) &&
    p[0] >= 0 && p[0] <= image.widthPx && p[1] >= 0 && p[1] <= image.heightPx;
  if (!ok) {
    throw new InvalidInputError(
      field,
      p,
      `a point [x, y] inside the picture, x from 0 to ${image.widthPx} and y from 0 to ${image.heightPx} px`,
    );
  }
}

/** The plane points a PlaneInImage defines, with which definition and whether in metres. */
function planePointsOf(
  plane: PlaneInImage,
  kind: PlaneKind,
  field: string,
): { points: Point2[]; definition: RectifiedPlane['definition']; metric: boolean } {
  const n = plane.pointsPx.length;
  const hasPoints = plane.planePointsM !== undefined;
  const hasSize = plane.widthM !== undefined || plane.heightM !== undefined;
  const hasAspect = plane.aspect !== undefined;
  const count = Number(hasPoints) + Number(hasSize) + Number(hasAspect);
  if (count !== 1) {
    throw new InvalidInputError(
      field,
      { planePointsM: hasPoints, widthM: plane.widthM, heightM: plane.heightM, aspect: plane.aspect },
      'exactly one of: planePointsM; widthM with heightM; aspect',
    );
  }
  if (kind === 'wall' && plane.firstEdgeAzimuthDeg !== undefined) {
    throw new InvalidInputError(
      `${field}.firstEdgeAzimuthDeg`,
      plane.firstEdgeAzimuthDeg,
      'nothing on a wall (the wall azimuth orients a wall; firstEdgeAzimuthDeg is for ground rectangles)',
    );
  }
  if (hasPoints) {
    const pts = plane.planePointsM!;
    if (pts.length !== n) {
      throw new InvalidInputError(`${field}.planePointsM`, `${pts.length} points`, `${n} points, one for each of pointsPx`);
    }
    pts.forEach((p, i) => {
      if (!(Array.isArray(p) && p.length === 2 && Number.isFinite(p[0]) && Number.isFinite(p[1]))) {
        throw new InvalidInputError(`${field}.planePointsM[${i}]`, p, 'a point [a, b] in metres');
      }
    });
    return { points: pts.map((p) => [p[0], p[1]] as Point2), definition: 'points', metric: true };
  }
  if (n !== 4) {
    throw new InvalidInputError(`${field}.pointsPx`, `${n} points`, 'the 4 corners of the rectangle');
  }
  let width: number;
  let height: number;
  if (hasSize) {
    for (const key of ['widthM', 'heightM'] as const) {
      const v = plane[key];
      if (!(typeof v === 'number' && Number.isFinite(v) && v > 0)) {
        throw new InvalidInputError(`${field}.${key}`, v, 'a length in metres greater than 0 (give both widthM and heightM)');
      }
    }
    width = plane.widthM!;
    height = plane.heightM!;
  } else {
    const a = plane.aspect;
    if (!(typeof a === 'number' && Number.isFinite(a) && a > 0)) {
      throw new InvalidInputError(`${field}.aspect`, a, 'the ratio width / height of the rectangle, greater than 0');
    }
    width = a; // unit: the rectangle's height
    height = 1;
  }
  const definition = hasSize ? 'rectangle' : 'aspect';
  if (kind === 'wall') {
    // corners top-left, top-right, bottom-right, bottom-left as seen; origin at the bottom-left corner
    return { points: [[0, height], [width, height], [width, 0], [0, 0]], definition, metric: hasSize };
  }
  const az = plane.firstEdgeAzimuthDeg;
  if (!(typeof az === 'number' && Number.isFinite(az))) {
    throw new InvalidInputError(
      `${field}.firstEdgeAzimuthDeg`,
      az,
      'the true azimuth, degrees clockwise from north, of the edge from the first clicked corner to the second',
    );
  }
  // Ground: first corner at the origin, first edge along azimuth az, the next edge along az + 90
  // (clockwise seen from above, the same turning as top-left, top-right, bottom-right on a wall).
  const e1: Point2 = [sinDeg(az), cosDeg(az)]; // east = sin(az), north = cos(az)
  const e2: Point2 = [sinDeg(az + 90), cosDeg(az + 90)];
  const p1: Point2 = [width * e1[0], width * e1[1]];
  const p3: Point2 = [height * e2[0], height * e2[1]];
  return { points: [[0, 0], p1, [p1[0] + p3[0], p1[1] + p3[1]], p3], definition, metric: hasSize };
}

function segmentsCross(a: Point2, b: Point2, c: Point2, d: Point2): boolean {
  const s1 = signedArea2(a, b, c);
  const s2 = signedArea2(a, b, d);
  const s3 = signedArea2(c, d, a);
  const s4 = signedArea2(c, d, b);
  return s1 * s2 < 0 && s3 * s4 < 0;
}

/** Check that the clicked points can be a picture of the plane points (see the header). */
function checkConfiguration(px: readonly Point2[], plane: readonly Point2[], clicked: readonly PixelPoint[], field: string): void {
  const n = px.length;
  const planeExtent = Math.max(...plane.map((p) => Math.hypot(p[0] - plane[0][0], p[1] - plane[0][1])));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      if (Math.hypot(px[i][0] - px[j][0], px[i][1] - px[j][1]) < MIN_POINT_SEPARATION_PX) {
        throw new InvalidInputError(
          `${field}.pointsPx[${i}]`,
          clicked[i],
          `a point at least ${MIN_POINT_SEPARATION_PX} px from every other clicked point`,
          `It falls on pointsPx[${j}] ${JSON.stringify(clicked[j])}`,
        );
      }
      if (Math.hypot(plane[i][0] - plane[j][0], plane[i][1] - plane[j][1]) <= 1e-9 * planeExtent) {
        throw new InvalidInputError(`${field}.planePointsM[${i}]`, plane[i], 'a plane point different from every other', `It repeats planePointsM[${j}]`);
      }
    }
  }
  // triples: collinearity (4 points) and orientation
  let flipped = 0;
  let kept = 0;
  const badCount = new Array(n).fill(0);
  const triples: [number, number, number][] = [];
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) for (let k = j + 1; k < n; k++) triples.push([i, j, k]);
  for (const [i, j, k] of triples) {
    const aImg = signedArea2(px[i], px[j], px[k]);
    const aPlane = signedArea2(plane[i], plane[j], plane[k]);
    const longestImg = Math.max(dist(px[i], px[j]), dist(px[j], px[k]), dist(px[k], px[i]));
    const longestPlane = Math.max(dist(plane[i], plane[j]), dist(plane[j], plane[k]), dist(plane[k], plane[i]));
    const heightImg = Math.abs(aImg) / longestImg;
    const heightPlane = Math.abs(aPlane) / longestPlane;
    const collinearImg = heightImg < COLLINEAR_TOLERANCE_PX;
    const collinearPlane = heightPlane <= 1e-6 * planeExtent;
    if (n === 4 && (collinearImg || collinearPlane)) {
      const which = collinearImg ? 'pointsPx' : 'planePointsM';
      throw new InvalidInputError(
        `${field}.${which}[${j}]`,
        collinearImg ? clicked[j] : plane[j],
        'four points of which no three lie on one line',
        `Points ${i}, ${j} and ${k} are on one line${collinearImg ? ` (within ${heightImg.toFixed(2)} px)` : ''}`,
      );
    }
    if (collinearImg || collinearPlane || (n > 4 && heightImg < ORIENTATION_TOLERANCE_PX)) continue;
    kept++;
    if (aImg * aPlane > 0) {
      flipped++;
      badCount[i]++;
      badCount[j]++;
      badCount[k]++;
    }
  }
  if (n === 4 && (segmentsCross(px[0], px[1], px[2], px[3]) || segmentsCross(px[1], px[2], px[3], px[0]))) {
    throw new InvalidInputError(
      `${field}.pointsPx`,
      clicked,
      'the corners in order top-left, top-right, bottom-right, bottom-left as seen, going once round the figure',
      'Two edges of the clicked figure cross each other',
    );
  }
  if (kept > 0 && flipped === kept) {
    throw new InvalidInputError(
      `${field}.pointsPx`,
      clicked,
      'points going round in the same sense as the plane points (corners: top-left, top-right, bottom-right, bottom-left as seen)',
      'They go round the other way: either the picture is a reversed print (set image.mirrored: true) or the corners were clicked in another order',
    );
  }
  if (flipped > 0) {
    const worst = badCount.indexOf(Math.max(...badCount));
    throw new InvalidInputError(
      `${field}.pointsPx[${worst}]`,
      clicked[worst],
      'points that a camera in front of the plane could have produced',
      'Seen from this point, some triangles of the figure turn the other way in the picture than on the plane: a point is misplaced or the edges cross',
    );
  }
}

function dist(a: Point2, b: Point2): number {
  return Math.hypot(a[0] - b[0], a[1] - b[1]);
}

/** Check the image description used by every pixel measurement. */
export function checkImageInfo(image: ImageInfo, field = 'image'): void {
  for (const key of ['widthPx', 'heightPx'] as const) {
    const v = image[key];
    if (!(Number.isFinite(v) && v > 0)) throw new InvalidInputError(`${field}.${key}`, v, 'a size in pixels greater than 0');
  }
  if (!(Number.isFinite(image.pixelSigmaPx) && image.pixelSigmaPx >= 0)) {
    throw new InvalidInputError(`${field}.pixelSigmaPx`, image.pixelSigmaPx, 'a clicking precision in pixels, 0 or more');
  }
}

/**
 * Rectify a wall or the ground from its PlaneInImage.
 * @param field path of the PlaneInImage in the scene, e.g. `walls[0].imagePlane` or `groundPlane`
 * @example rectifyPlane({ pointsPx: [[100,100],[300,110],[290,300],[110,290]], widthM: 2, heightM: 2 },
 *   image, 'wall', 'walls[0].imagePlane').fit.rms // 0 (4 points: exact)
 */
export function rectifyPlane(plane: PlaneInImage, image: ImageInfo, kind: PlaneKind, field: string): RectifiedPlane {
  checkImageInfo(image);
  if (plane.fromWalls !== undefined) {
    throw new InvalidInputError(
      `${field}.fromWalls`,
      plane.fromWalls.walls,
      kind === 'ground' ? 'a ground plane rectified together with its walls (rectifySceneGround in measureScene.ts)' : 'nothing on a wall (fromWalls is for the ground plane)',
    );
  }
  const clicked = plane.pointsPx;
  if (!Array.isArray(clicked) || clicked.length < 4) {
    throw new InvalidInputError(`${field}.pointsPx`, clicked, 'at least 4 clicked points');
  }
  clicked.forEach((p, i) => checkPixelPoint(p, image, `${field}.pointsPx[${i}]`));
  const { points, definition, metric } = planePointsOf(plane, kind, field);
  const sigmas = plane.pointSigmaPx ?? clicked.map(() => image.pixelSigmaPx);
  if (sigmas.length !== clicked.length) {
    throw new InvalidInputError(`${field}.pointSigmaPx`, `${sigmas.length} values`, `${clicked.length} values, one for each of pointsPx`);
  }
  sigmas.forEach((s, i) => {
    if (!(Number.isFinite(s) && s >= 0)) throw new InvalidInputError(`${field}.pointSigmaPx[${i}]`, s, 'a sigma in pixels, 0 or more');
  });
  const px = clicked.map((p) => toWorkingFrame(p, image));
  checkConfiguration(px, points, clicked, field);
  const fit = fitHomography(points, px, `${field}.pointsPx`);
  return {
    kind,
    field,
    definition,
    metric,
    pixelPoints: px,
    planePoints: points,
    pointSigmasPx: sigmas,
    fit,
    imageToPlane: invertHomography(fit.matrix),
    image,
  };
}
