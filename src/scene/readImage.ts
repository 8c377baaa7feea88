/**
 * The pixel parts of a scene file: the `image` block, the planes in the image
 * (`imagePlane` of a wall, `groundPlane`, or the ground from two walls:
 * `groundPlane.fromWalls`), pixel points and segments.
 * Shapes and ranges only (points inside the image, 4 or more points, positive
 * sizes); whether a quadrilateral is degenerate is for src/image to judge.
 */
import { InvalidInputError } from '../errors.js';
import {
  checkList, checkNumber, checkPair, checkString, exactlyOne, has, itemPath, keyPath, missing, num, openFields,
  optBool, optNum, optStr, raw, refuseKeys, type NumberRule,
  SIGMA_FLOOR,
} from './fields.js';
import type { GroundFromWalls, ImageInfo, PixelPoint, PixelSegment, PlaneInImage, Wall } from './types.js';

/** Largest image side accepted, pixels. */
export const MAX_IMAGE_SIDE_PX = 100_000;
/** Most points in one plane. */
export const MAX_PLANE_POINTS = 100;

const IMAGE_KEYS = ['widthPx', 'heightPx', 'file', 'mirrored', 'pixelSigmaPx'] as const;
export const PIXEL_SIGMA: NumberRule = { words: 'a pixel sigma in pixels', min: SIGMA_FLOOR, max: 100 };
const SIDE_PX: NumberRule = { words: 'an image size in pixels', min: 1, max: MAX_IMAGE_SIDE_PX, integer: true };
const PLANE_LENGTH: NumberRule = { words: 'a length in metres', min: 0, max: 100_000, minExclusive: true };
const PLANE_COORD: NumberRule = { words: 'a coordinate in metres', min: -100_000, max: 100_000 };

/** Default clicking precision when the file gives none, pixels (common practice: about one pixel). */
export const DEFAULT_PIXEL_SIGMA_PX = 1;

export function readImage(value: unknown, path: string): ImageInfo {
  const f = openFields(value, path, 'the image block', IMAGE_KEYS);
  const widthPx = num(f, 'widthPx', SIDE_PX);
  const heightPx = num(f, 'heightPx', SIDE_PX);
  const file = optStr(f, 'file', 'a JPEG or PNG file name beside the scene file, ending .jpg, .jpeg or .png', 1000, /\.(jpe?g|png)$/i);
  // The picture sits in the scene's folder (or a folder inside it): no absolute path, no way up.
  if (file !== undefined && (/^([/\\]|[A-Za-z]:)/.test(file) || file.split(/[/\\]/).includes('..'))) {
    throw new InvalidInputError(
      keyPath(path, 'file'),
      file,
      "a file name relative to the scene file's folder, in it or in a folder inside it (no absolute path, no \"..\")",
      'Copy the picture beside the scene file, or give it to measure with --image.',
    );
  }
  const mirrored = optBool(f, 'mirrored', false);
  const pixelSigmaPx = optNum(f, 'pixelSigmaPx', PIXEL_SIGMA, DEFAULT_PIXEL_SIGMA_PX);
  return file === undefined ? { widthPx, heightPx, mirrored, pixelSigmaPx } : { widthPx, heightPx, file, mirrored, pixelSigmaPx };
}

/** A point [xPx, yPx] inside the image (edges included). */
export function readPixelPoint(value: unknown, path: string, image: ImageInfo): PixelPoint {
  return checkPair(value, path, 'an image point [xPx, yPx]', [
    { words: `an x in pixels inside the image (width ${image.widthPx} px)`, min: 0, max: image.widthPx },
    { words: `a y in pixels inside the image (height ${image.heightPx} px), measured down from the top`, min: 0, max: image.heightPx },
  ]);
}

/** The image a pixel form needs, or a message saying the image block is missing. */
export function needImage(image: ImageInfo | undefined, path: string, value: unknown): ImageInfo {
  if (image === undefined) {
    throw new InvalidInputError(path, value, 'pixel measurements only together with an "image" block (widthPx, heightPx)', 'The scene has no image block.');
  }
  return image;
}

/**
 * A plane in the image: its points in pixels and their true shape.
 * @param ground true for the ground plane (east, north) which may give firstEdgeAzimuthDeg
 */
export function readPlane(value: unknown, path: string, image: ImageInfo, ground: boolean): PlaneInImage {
  const keys = ['pointsPx', 'planePointsM', 'widthM', 'heightM', 'aspect', 'pointSigmaPx', ...(ground ? ['firstEdgeAzimuthDeg', 'fromWalls'] : [])];
  const what = ground ? 'the ground plane' : "a wall's image plane";
  const f = openFields(value, path, what, keys);
  if (ground && has(f, 'fromWalls')) return { pointsPx: [], fromWalls: readFromWalls(f, path, image) };
  if (!has(f, 'pointsPx')) {
    throw missing(f, 'pointsPx', ground ? 'a list of 4 or more image points [xPx, yPx], or fromWalls instead' : 'a list of 4 or more image points [xPx, yPx]');
  }
  const pointsPath = keyPath(path, 'pointsPx');
  const rawPoints = checkList(raw(f, 'pointsPx'), pointsPath, 'image points [xPx, yPx]', 4, MAX_PLANE_POINTS);
  const pointsPx = rawPoints.map((p, i) => readPixelPoint(p, itemPath(pointsPath, i), image));

  const shapeKeys = ['planePointsM', 'widthM', 'aspect'];
  if (has(f, 'heightM') && !has(f, 'widthM')) throw missing(f, 'widthM', 'the rectangle width in metres, given with heightM');
  const form = exactlyOne(f, shapeKeys, 'the true shape: planePointsM, or a rectangle widthM and heightM, or its aspect');
  const result: { -readonly [K in keyof PlaneInImage]: PlaneInImage[K] } = { pointsPx };
  const coordWords = ground ? 'a ground point [eastM, northM]' : 'a wall point [uM, vM] (u right, v up)';
  if (form === 'planePointsM') {
    const pp = keyPath(path, 'planePointsM');
    const list = checkList(raw(f, 'planePointsM'), pp, `${coordWords} for each image point`, pointsPx.length, pointsPx.length);
    result.planePointsM = list.map((p, i) => checkPair(p, itemPath(pp, i), coordWords, [PLANE_COORD, PLANE_COORD]));
    refuseKeys(f, ['heightM'], 'no heightM beside planePointsM');
  } else {
    if (pointsPx.length !== 4) {
      throw new InvalidInputError(pointsPath, raw(f, 'pointsPx'), 'exactly 4 corners for a rectangle (top-left, top-right, bottom-right, bottom-left)', `It has ${pointsPx.length}; give planePointsM for other figures.`);
    }
    if (form === 'widthM') {
      result.widthM = num(f, 'widthM', PLANE_LENGTH);
      result.heightM = num(f, 'heightM', PLANE_LENGTH);
    } else {
      result.aspect = num(f, 'aspect', { words: 'a width / height ratio', min: 0, max: 1000, minExclusive: true });
    }
  }
  if (ground) {
    const az = optNum(f, 'firstEdgeAzimuthDeg', { words: 'an azimuth in degrees clockwise from true north', min: 0, max: 360, maxExclusive: true });
    if (az === undefined && form !== 'planePointsM') {
      throw missing(f, 'firstEdgeAzimuthDeg', 'the true azimuth of the edge from the first corner to the second, degrees');
    }
    if (az !== undefined) result.firstEdgeAzimuthDeg = az;
  }
  if (has(f, 'pointSigmaPx')) {
    const sp = keyPath(path, 'pointSigmaPx');
    const list = checkList(raw(f, 'pointSigmaPx'), sp, 'a pixel sigma for each image point', pointsPx.length, pointsPx.length);
    result.pointSigmaPx = list.map((s, i) => checkNumber(s, itemPath(sp, i), PIXEL_SIGMA));
  }
  return result;
}

const FROM_WALLS_KEYS = ['walls', 'cornerPx', 'cornerSigmaPx'] as const;

/** `groundPlane.fromWalls`: the ground from the foot lines of two walls meeting at a corner (src/image/groundFromWalls.ts). */
function readFromWalls(plane: ReturnType<typeof openFields>, path: string, image: ImageInfo): GroundFromWalls {
  const fp = keyPath(path, 'fromWalls');
  for (const key of Object.keys(plane.data)) {
    if (key === 'fromWalls') continue;
    throw new InvalidInputError(
      fp,
      raw(plane, 'fromWalls'),
      `either fromWalls or ${key} with the other clicked-figure keys in ${path}, not both`,
      `The ground is fixed either by a figure clicked on it (pointsPx and its shape) or by two walls meeting at a corner; "${key}" is given too.`,
    );
  }
  const f = openFields(raw(plane, 'fromWalls'), fp, 'the ground from two walls', FROM_WALLS_KEYS);
  if (!has(f, 'walls')) throw missing(f, 'walls', 'the ids of the two walls that meet at the corner, [wallId, wallId]');
  if (!has(f, 'cornerPx')) throw missing(f, 'cornerPx', 'the image point [xPx, yPx] where both walls meet the ground');
  const wp = keyPath(fp, 'walls');
  const list = checkList(raw(f, 'walls'), wp, 'the ids of the two walls that meet at the corner', 2, 2);
  const ids = list.map((id, i) => checkString(id, itemPath(wp, i), 'the id of a wall of this scene', 64));
  if (ids[0] === ids[1]) throw new InvalidInputError(itemPath(wp, 1), ids[1], `a wall other than ${JSON.stringify(ids[0])}: two different walls meeting at the corner`);
  const cornerPx = readPixelPoint(raw(f, 'cornerPx'), keyPath(fp, 'cornerPx'), image);
  const cornerSigmaPx = optNum(f, 'cornerSigmaPx', PIXEL_SIGMA);
  const walls: readonly [string, string] = [ids[0], ids[1]];
  return cornerSigmaPx === undefined ? { walls, cornerPx } : { walls, cornerPx, cornerSigmaPx };
}

/**
 * Check the walls `groundPlane.fromWalls` names against the scene's walls: each must exist and have an
 * imagePlane in metres (whether their azimuths and clicks fix the ground is for src/image to judge).
 */
export function checkGroundWalls(plane: PlaneInImage | undefined, walls: readonly Wall[], path = 'groundPlane'): void {
  const def = plane?.fromWalls;
  if (def === undefined) return;
  def.walls.forEach((id, k) => {
    const index = walls.findIndex((w) => w.id === id);
    const field = `${path}.fromWalls.walls[${k}]`;
    if (index < 0) {
      throw new InvalidInputError(field, id, `the id of a wall of this scene (${walls.map((w) => JSON.stringify(w.id)).join(', ') || 'none given'})`);
    }
    const wallPlane = walls[index].imagePlane;
    if (wallPlane === undefined) {
      throw new InvalidInputError(
        `walls[${index}].imagePlane`,
        undefined,
        'the wall clicked in the picture (a figure of known size in metres: widthM with heightM, or planePointsM)',
        `${field} names this wall, whose foot line fixes the ground.`,
      );
    }
    if (wallPlane.aspect !== undefined) {
      throw new InvalidInputError(
        `walls[${index}].imagePlane.aspect`,
        wallPlane.aspect,
        'a wall figure known in metres (widthM with heightM, or planePointsM)',
        `${field} names this wall; lengths along its foot line must be known in metres, and an aspect gives them only up to scale.`,
      );
    }
  });
}

/** The key names of a pixel segment; pixel forms add their own (projectionM, heightM). */
export const SEGMENT_KEYS = ['fromPx', 'toPx', 'sigmaPx'] as const;

/** A pixel segment from -> to (distinct points inside the image). */
export function readSegmentPart(f: ReturnType<typeof openFields>, image: ImageInfo): PixelSegment {
  if (!has(f, 'fromPx')) throw missing(f, 'fromPx', 'an image point [xPx, yPx]');
  if (!has(f, 'toPx')) throw missing(f, 'toPx', 'an image point [xPx, yPx]');
  const fromPx = readPixelPoint(raw(f, 'fromPx'), keyPath(f.path, 'fromPx'), image);
  const toPx = readPixelPoint(raw(f, 'toPx'), keyPath(f.path, 'toPx'), image);
  if (fromPx[0] === toPx[0] && fromPx[1] === toPx[1]) {
    throw new InvalidInputError(keyPath(f.path, 'toPx'), toPx, 'an image point different from fromPx', 'A segment needs two distinct points.');
  }
  const sigmaPx = optNum(f, 'sigmaPx', PIXEL_SIGMA);
  return sigmaPx === undefined ? { fromPx, toPx } : { fromPx, toPx, sigmaPx };
}
