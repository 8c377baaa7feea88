/**
 * The `camera` block of a scene file: lines clicked along edges vertical in
 * the scene, lines along the horizontal edges of walls of the scene (each
 * wall's azimuth is its stated one), an optional focal length in pixels and
 * clicking sigma. Shapes and ranges only; whether the lines give a camera is
 * for src/image/camera.ts to judge.
 */
import { InvalidInputError } from '../errors.js';
import { closestWord } from './didYouMean.js';
import { checkList, has, itemPath, keyPath, missing, openFields, optNum, raw, checkString } from './fields.js';
import { needImage, PIXEL_SIGMA, readPixelPoint } from './readImage.js';
import type { CameraBlock, ImageInfo, PixelLine, Wall } from './types.js';

/** Most lines in one family, and points on one line. */
export const MAX_CAMERA_LINES = 100;
export const MAX_LINE_POINTS = 50;

const CAMERA_KEYS = ['verticalLines', 'wallLines', 'focalLengthPx', 'sigmaPx'] as const;

function readLines(value: unknown, path: string, image: ImageInfo): PixelLine[] {
  const list = checkList(value, path, 'a list of two or more lines, each a list of two or more image points [xPx, yPx] along one straight edge', 2, MAX_CAMERA_LINES);
  return list.map((line, i) => {
    const lp = itemPath(path, i);
    const points = checkList(line, lp, 'two or more image points [xPx, yPx] along one straight edge', 2, MAX_LINE_POINTS);
    return points.map((p, k) => readPixelPoint(p, itemPath(lp, k), image));
  });
}

/**
 * Read `camera`.
 * @example readCamera({ verticalLines: [[[10, 5], [12, 400]], [[300, 8], [298, 410]]], wallLines: [...] }, 'camera', image, walls)
 */
export function readCamera(value: unknown, path: string, image: ImageInfo | undefined, walls: readonly Wall[]): CameraBlock {
  const img = needImage(image, path, value);
  const f = openFields(value, path, 'the camera block', CAMERA_KEYS);
  if (!has(f, 'verticalLines')) throw missing(f, 'verticalLines', 'two or more lines clicked along edges that are vertical in the scene (corners, door jambs, pilasters)');
  if (!has(f, 'wallLines')) throw missing(f, 'wallLines', 'lines along the horizontal edges of one or more walls: [{ wall: <wall id>, lines: [...] }]');
  const verticalLines = readLines(raw(f, 'verticalLines'), keyPath(path, 'verticalLines'), img);
  const wp = keyPath(path, 'wallLines');
  const known = walls.map((w) => w.id);
  const wallLines = checkList(raw(f, 'wallLines'), wp, 'one entry per wall: { wall: <wall id>, lines: [...] }', 1, 20).map((entry, i) => {
    const ep = itemPath(wp, i);
    const e = openFields(entry, ep, 'the lines of one wall', ['wall', 'lines']);
    if (!has(e, 'wall')) throw missing(e, 'wall', `the id of a wall of this scene: ${known.map((k) => `"${k}"`).join(', ') || '(none given)'}`);
    const id = checkString(raw(e, 'wall'), keyPath(ep, 'wall'), 'the id of a wall of this scene', 64);
    if (!known.includes(id)) {
      const near = closestWord(id, known);
      throw new InvalidInputError(keyPath(ep, 'wall'), id, `the id of a wall of this scene: ${known.map((k) => `"${k}"`).join(', ') || '(none given)'}`, near ? `Did you mean "${near}"?` : undefined);
    }
    if (!has(e, 'lines')) throw missing(e, 'lines', 'two or more lines along horizontal edges of this wall (courses, sills, eaves)');
    return { wallId: id, lines: readLines(raw(e, 'lines'), keyPath(ep, 'lines'), img) };
  });
  wallLines.forEach((w, i) => {
    const j = wallLines.findIndex((x) => x.wallId === w.wallId);
    if (j !== i) throw new InvalidInputError(keyPath(itemPath(wp, i), 'wall'), w.wallId, `a wall not listed before (it is already ${itemPath(wp, j)})`, 'Give all lines of one wall in one entry.');
  });
  const focalLengthPx = optNum(f, 'focalLengthPx', { words: 'a focal length in pixels', min: 1, max: 1_000_000 });
  const sigmaPx = optNum(f, 'sigmaPx', PIXEL_SIGMA);
  return {
    verticalLines, wallLines,
    ...(focalLengthPx !== undefined ? { focalLengthPx } : {}),
    ...(sigmaPx !== undefined ? { sigmaPx } : {}),
  };
}
