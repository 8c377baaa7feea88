/**
 * The level ground rectified from the foot lines of two walls of known
 * azimuth that meet at a building corner, each wall already rectified from a
 * figure of known size (its `imagePlane`).
 *
 * Geometry (Hartley, R. and Zisserman, A., Multiple View Geometry in Computer
 * Vision, 2nd ed. (2003), ch. 2, sec. 2.3 (a plane projective transformation
 * maps lines to lines, and the 1-D projectivity it induces on a line is fixed
 * by three points, sec. 2.5) and ch. 4, sec. 4.1 and Algorithm 4.2 (four
 * correspondences in general position fix a homography; the normalised DLT
 * fits it); axes as in docs/conventions.md: wall u to
 * the viewer's right = azimuth (normal - 90 deg), v up; ground east, north):
 * - the user clicks the corner c where both walls meet the ground;
 * - each wall's homography H_w (wall plane -> image) maps c back to wall
 *   coordinates (u_c, v_c); the corner is on the ground, so the wall's foot
 *   line is v = v_c;
 * - along that foot line, at offsets t from the corner (every FOOT_STEP_M
 *   across the extent of the wall's clicked points and the corner, at least
 *   MIN_FOOT_POINTS), the image point H_w(u_c + t, v_c) is the ground point
 *   t * e_u(wall), with e_u = (sin(normal - 90), cos(normal - 90)) in
 *   (east, north) metres and the corner as the ground origin;
 * - the two walls give correspondences on two lines through c; the ground
 *   homography is fitted to them by the normalised DLT (homography.ts).
 * Two image lines through c with a projective scale along each carry exactly
 * 8 numbers (c: 2, two directions: 2, two 1-D scales with c fixed: 2 x 2),
 * the homography's 8 degrees of freedom: the fit is exact for any clicks
 * (its residuals are zero and tell nothing), and the walls must not be
 * parallel (MIN_WALL_ANGLE_DEG).
 *
 * What it leaves out: the ground is taken level and the corner's foot on it;
 * a wall leaning out of plumb, or a corner foot hidden behind steps, is not
 * modelled. Error propagation (src/image/propagation.ts) treats the whole
 * chain (both walls refitted from their clicks, the corner, the walls'
 * azimuths, the ground refitted) as one measurement function, see
 * groundHomographyOf.
 */
import { InvalidInputError } from '../errors.js';
import { angleDiffDeg, cosDeg, sinDeg } from '../math/angles.js';
import type { GroundFromWalls, ImageInfo, PixelPoint, Wall } from '../scene/types.js';
import { applyHomography, fitHomography, fitHomographyDlt, homogeneousW, invertHomography, type Homography, type Point2 } from './homography.js';
import { checkPixelPoint, signedArea2, toWorkingFrame, type RectifiedPlane } from './planeInImage.js';

/** Smallest angle between the two walls' normals, degrees (and 180 minus it the largest): below it the foot lines are too nearly parallel. */
export const MIN_WALL_ANGLE_DEG = 20;
/** Spacing of the ground points taken along each foot line, metres. */
export const FOOT_STEP_M = 0.5;
/** Fewest points taken along each foot line. */
export const MIN_FOOT_POINTS = 4;
/** Most points taken along each foot line (a very long wall is sampled more coarsely). */
export const MAX_FOOT_POINTS = 100;

/** One wall whose foot line fixes the ground. */
export interface FootWall {
  readonly id: string;
  /** Path of its plane in the scene file: `walls[i].imagePlane`. */
  readonly field: string;
  /** Outward normal, degrees clockwise from true north. */
  readonly azimuthDeg: number;
  readonly azimuthSigmaDeg: number;
  readonly plane: RectifiedPlane;
  /** Offsets t along the foot line from the corner, metres, positive towards u. */
  readonly offsetsM: readonly number[];
}

/** Everything the ground-from-walls map is built from. */
export interface GroundFromWallsSource {
  readonly walls: readonly [FootWall, FootWall];
  /** The clicked corner in the working frame (after the mirror flip). */
  readonly cornerPx: Point2;
  readonly cornerSigmaPx: number;
}

/** Horizontal unit vector (east, north) of a wall's u axis: azimuth normal - 90 deg (docs/conventions.md). */
export function wallUAxis(normalAzimuthDeg: number): Point2 {
  return [sinDeg(normalAzimuthDeg - 90), cosDeg(normalAzimuthDeg - 90)];
}

/** Number of parameters of the source: every click of both walls, the corner, the two azimuths. */
export function groundFromWallsParameterCount(source: GroundFromWallsSource): number {
  return 2 * source.walls[0].plane.pixelPoints.length + 2 * source.walls[1].plane.pixelPoints.length + 4;
}

/**
 * The parameter vector of the source and the sigma of each entry, in the order
 * groundHomographyOf reads them: wall 0 clicks (x, y each), wall 1 clicks, corner x, y, azimuth 0, azimuth 1.
 */
export function groundFromWallsParameters(source: GroundFromWallsSource): { p0: number[]; sigmas: number[] } {
  const p0: number[] = [];
  const sigmas: number[] = [];
  for (const w of source.walls) {
    w.plane.pixelPoints.forEach((p, i) => {
      p0.push(p[0], p[1]);
      sigmas.push(w.plane.pointSigmasPx[i], w.plane.pointSigmasPx[i]);
    });
  }
  p0.push(source.cornerPx[0], source.cornerPx[1], source.walls[0].azimuthDeg, source.walls[1].azimuthDeg);
  sigmas.push(source.cornerSigmaPx, source.cornerSigmaPx, source.walls[0].azimuthSigmaDeg, source.walls[1].azimuthSigmaDeg);
  return { p0, sigmas };
}

/** The correspondences (ground metres, working pixels) along both foot lines for a parameter vector. */
export function footCorrespondences(
  source: GroundFromWallsSource,
  params: readonly number[],
): { ground: Point2[]; image: Point2[] } {
  const n0 = source.walls[0].plane.pixelPoints.length;
  const n1 = source.walls[1].plane.pixelPoints.length;
  const k = 2 * (n0 + n1);
  const corner: Point2 = [params[k], params[k + 1]];
  const ground: Point2[] = [];
  const image: Point2[] = [];
  source.walls.forEach((w, wi) => {
    const start = wi === 0 ? 0 : 2 * n0;
    const n = wi === 0 ? n0 : n1;
    const px: Point2[] = [];
    for (let i = 0; i < n; i++) px.push([params[start + 2 * i], params[start + 2 * i + 1]]);
    const h = fitHomographyDlt(w.plane.planePoints, px).matrix; // wall -> image, H&Z Algorithm 4.2
    const [uc, vc] = applyHomography(invertHomography(h), corner); // the corner on the wall; its foot line is v = vc
    const eu = wallUAxis(params[k + 2 + wi]);
    for (const t of w.offsetsM) {
      if (wi === 1 && t === 0) continue; // the corner once
      image.push(applyHomography(h, [uc + t, vc]));
      ground.push([t * eu[0], t * eu[1]]);
    }
  });
  return { ground, image };
}

/** Ground (east, north, corner at the origin) -> working pixels, refitted from a parameter vector. */
export function groundHomographyOf(source: GroundFromWallsSource, params: readonly number[]): Homography {
  const { ground, image } = footCorrespondences(source, params);
  return fitHomographyDlt(ground, image).matrix;
}

/** Offsets along a foot line: across the wall's clicked u extent and the corner, FOOT_STEP_M apart, the corner (0) among them. */
function footOffsets(plane: RectifiedPlane, uc: number): number[] {
  const us = plane.planePoints.map((p) => p[0]);
  const lo = Math.min(...us, uc) - uc;
  const hi = Math.max(...us, uc) - uc;
  const count = Math.min(MAX_FOOT_POINTS, Math.max(MIN_FOOT_POINTS, Math.floor((hi - lo) / FOOT_STEP_M) + 1));
  const out = [0];
  for (let i = 0; i < count; i++) {
    const t = lo + ((hi - lo) * i) / (count - 1);
    if (Math.abs(t) > 1e-9 * Math.max(1, hi - lo)) out.push(t);
  }
  return out.sort((a, b) => a - b);
}

/**
 * The ground plane of a scene from two rectified walls meeting at a corner.
 * @param def the scene's `groundPlane.fromWalls`
 * @param wallPlane the rectified imagePlane of walls[index] (the caller caches them)
 * @param field path of the ground plane in the scene, `groundPlane`
 * @example rectifyGroundFromWalls({ walls: ['hall-south', 'hall-east'], cornerPx: [812, 940] }, scene.walls, image, planeOf, 'groundPlane').definition // 'walls'
 */
export function rectifyGroundFromWalls(
  def: GroundFromWalls,
  walls: readonly Wall[],
  image: ImageInfo,
  wallPlane: (index: number) => RectifiedPlane,
  field = 'groundPlane',
): RectifiedPlane {
  const base = `${field}.fromWalls`;
  const ids = def.walls;
  if (!Array.isArray(ids) || ids.length !== 2) {
    throw new InvalidInputError(`${base}.walls`, ids, 'the ids of exactly two walls that meet at the clicked corner');
  }
  if (ids[0] === ids[1]) {
    throw new InvalidInputError(`${base}.walls[1]`, ids[1], 'a wall other than walls[0]: two different walls meeting at the corner');
  }
  const indices = ids.map((id, k) => {
    const index = walls.findIndex((w) => w.id === id);
    if (index < 0) {
      throw new InvalidInputError(`${base}.walls[${k}]`, id, `the id of a wall of this scene (${walls.map((w) => JSON.stringify(w.id)).join(', ') || 'none given'})`);
    }
    if (!walls[index].imagePlane) {
      throw new InvalidInputError(
        `walls[${index}].imagePlane`,
        undefined,
        'the wall clicked in the picture (a figure of known size on it)',
        `${base}.walls[${k}] names wall ${JSON.stringify(id)}, whose foot line fixes the ground`,
      );
    }
    return index;
  });
  const [a, b] = indices.map((i) => walls[i]);
  const between = Math.abs(angleDiffDeg(a.azimuthDeg, b.azimuthDeg));
  if (between < MIN_WALL_ANGLE_DEG || between > 180 - MIN_WALL_ANGLE_DEG) {
    throw new InvalidInputError(
      `${base}.walls`,
      ids,
      `two walls whose azimuths differ by ${MIN_WALL_ANGLE_DEG} to ${180 - MIN_WALL_ANGLE_DEG} deg (walls meeting at a corner)`,
      `Walls ${JSON.stringify(a.id)} (${a.azimuthDeg} deg) and ${JSON.stringify(b.id)} (${b.azimuthDeg} deg) differ by ${between.toFixed(1)} deg: ` +
        'their foot lines are nearly parallel and cannot fix the ground',
    );
  }
  checkPixelPoint(def.cornerPx, image, `${base}.cornerPx`);
  const cornerSigmaPx = def.cornerSigmaPx ?? image.pixelSigmaPx;
  if (!(Number.isFinite(cornerSigmaPx) && cornerSigmaPx >= 0)) {
    throw new InvalidInputError(`${base}.cornerSigmaPx`, def.cornerSigmaPx, 'a sigma in pixels, 0 or more');
  }
  const corner = toWorkingFrame(def.cornerPx, image);
  const footWalls = indices.map((index, k): FootWall => {
    const plane = wallPlane(index);
    const planeField = `walls[${index}].imagePlane`;
    if (!plane.metric) {
      throw new InvalidInputError(
        `${planeField}.aspect`,
        plane.definition,
        `a wall plane known in metres (widthM with heightM, or planePointsM) for ${base}.walls[${k}]`,
        'The ground from the walls needs lengths along each foot line in metres; an aspect-only rectangle gives them only up to scale',
      );
    }
    const g = plane.imageToPlane;
    if (Math.sign(homogeneousW(g, corner)) !== Math.sign(homogeneousW(g, plane.pixelPoints[0]))) {
      throw new InvalidInputError(`${base}.cornerPx`, def.cornerPx, `a point on wall ${JSON.stringify(walls[index].id)} (below its horizon line in the picture)`);
    }
    const [uc] = applyHomography(g, corner);
    return {
      id: walls[index].id,
      field: planeField,
      azimuthDeg: walls[index].azimuthDeg,
      azimuthSigmaDeg: walls[index].azimuthSigmaDeg,
      plane,
      offsetsM: footOffsets(plane, uc),
    };
  });
  const source: GroundFromWallsSource = { walls: [footWalls[0], footWalls[1]], cornerPx: corner, cornerSigmaPx };
  const { p0 } = groundFromWallsParameters(source);
  const { ground, image: px } = footCorrespondences(source, p0);
  footWalls.forEach((w, k) => {
    const first = w.plane.pixelPoints[0];
    const side = Math.sign(homogeneousW(w.plane.imageToPlane, first));
    const start = k === 0 ? 0 : footWalls[0].offsetsM.length;
    const count = k === 0 ? w.offsetsM.length : w.offsetsM.length - 1;
    for (let i = start; i < start + count; i++) {
      if (Math.sign(homogeneousW(w.plane.imageToPlane, px[i])) !== side) {
        throw new InvalidInputError(
          `${w.field}.pointsPx`,
          w.plane.pixelPoints.map((p) => [Math.round(p[0] * 10) / 10, Math.round(p[1] * 10) / 10] as PixelPoint),
          'a wall figure whose foot line, from the corner across the figure, is in front of the camera',
          `Along the foot line of wall ${JSON.stringify(w.id)} the straightened wall runs past its horizon line: the clicks or the corner are misplaced`,
        );
      }
    }
  });
  // Orientation (as in planeInImage.ts, H&Z 2nd ed. sec. 2.3): a camera above the ground sees the triangle
  // corner - foot of wall 0 - foot of wall 1 turn the other way in the picture than on the ground (pixel y runs down).
  const far0 = footWalls[0].offsetsM.reduce((m, t) => (Math.abs(t) > Math.abs(m) ? t : m), 0);
  const far1 = footWalls[1].offsetsM.reduce((m, t) => (Math.abs(t) > Math.abs(m) ? t : m), 0);
  const i0 = footWalls[0].offsetsM.indexOf(far0);
  const i1 = footWalls[0].offsetsM.length + footWalls[1].offsetsM.filter((t) => t !== 0).indexOf(far1);
  const iC = footWalls[0].offsetsM.indexOf(0);
  if (signedArea2(ground[iC], ground[i0], ground[i1]) * signedArea2(px[iC], px[i0], px[i1]) > 0) {
    throw new InvalidInputError(
      `${base}.walls`,
      ids,
      'two walls whose azimuths and clicked figures agree with a camera above the ground',
      `With the stated azimuths (${a.azimuthDeg} and ${b.azimuthDeg} deg) the two foot lines would show the ground seen from below: ` +
        'check each azimuth is the outward normal of its wall and that cornerPx is where both walls meet the ground',
    );
  }
  const fitted = fitHomography(ground, px, `${base}.cornerPx`);
  // the two foot lines fix the map exactly (header): the residuals are zero by construction
  const fit = { ...fitted, exactlyDetermined: true };
  return {
    kind: 'ground',
    field,
    definition: 'walls',
    metric: true,
    pixelPoints: px,
    planePoints: ground,
    pointSigmasPx: px.map(() => cornerSigmaPx),
    fit,
    imageToPlane: invertHomography(fit.matrix),
    image,
    fromWalls: source,
  };
}
