/**
 * Every pixel-form observation of a scene measured on its plane: each wall's
 * imagePlane and the scene's groundPlane rectified once (the ground from its
 * clicked points, or from the foot lines of two walls: groundFromWalls.ts), each observation's
 * pixels turned into its numeric values (pixelObservations.ts). Errors name
 * the path in the scene file (`walls[1].imagePlane.pointsPx[2]`,
 * `observations[3].wallId`). With a `camera` block, a wall without an
 * imagePlane, and the ground without a groundPlane, are put into the picture
 * by the camera (planeFromCamera.ts), known up to scale.
 */
import { InvalidInputError } from '../errors.js';
import type { ImageInfo, Scene } from '../scene/types.js';
import { measurePixelObservation, type MeasureContext, type PixelMeasurement, type PixelObservation } from './pixelObservations.js';
import { rectifyPlane, type RectifiedPlane } from './planeInImage.js';
import { rectifyGroundFromWalls } from './groundFromWalls.js';
import { solveCamera, type CameraSolution } from './camera.js';
import { planeFromCamera } from './planeFromCamera.js';
import { cameraInputOf } from './sceneSun.js';

/** The scene's camera, solved once per measuring run (solveCamera is pure; this only avoids solving it twice). */
function cameraGetter(scene: Scene): () => CameraSolution | undefined {
  let solved: CameraSolution | undefined;
  return () => {
    if (!scene.camera) return undefined;
    solved ??= solveCamera(cameraInputOf(scene));
    return solved;
  };
}

/** A wall's imagePlane rectified, from the cache `planes` when it is there (and put there). */
function wallPlaneOf(scene: Scene, index: number, image: ImageInfo, planes: Map<string, RectifiedPlane>, camera: () => CameraSolution | undefined = cameraGetter(scene)): RectifiedPlane {
  const field = `walls[${index}].imagePlane`;
  const cached = planes.get(field);
  if (cached) return cached;
  const wall = scene.walls[index];
  const wallPlane = wall.imagePlane;
  const solved = wallPlane ? undefined : camera();
  if (!wallPlane && !solved) throw new InvalidInputError(field, undefined, 'the wall clicked in the picture (a rectangle or points on the wall), or a camera block');
  const plane = wallPlane ? rectifyPlane(wallPlane, image, 'wall', field) : planeFromCamera(solved!, 'wall', image, field, wall);
  planes.set(field, plane);
  return plane;
}

/**
 * The scene's groundPlane rectified: from its clicked points, or from the foot lines of two walls
 * (groundFromWalls.ts), whose planes are then rectified too and put into `planes`.
 * @example rectifySceneGround(scene, scene.image!, new Map()).definition // 'rectangle' or 'walls'
 */
export function rectifySceneGround(scene: Scene, image: ImageInfo, planes: Map<string, RectifiedPlane>, camera: () => CameraSolution | undefined = cameraGetter(scene)): RectifiedPlane {
  const ground = scene.groundPlane;
  const cached = planes.get('groundPlane');
  if (cached) return cached;
  const solved = ground ? undefined : camera();
  if (!ground && !solved) throw new InvalidInputError('groundPlane', undefined, 'the ground plane clicked in the picture (a rectangle or points on level ground, or fromWalls), or a camera block');
  const plane = !ground
    ? planeFromCamera(solved!, 'ground', image, 'groundPlane')
    : ground.fromWalls
    ? rectifyGroundFromWalls(ground.fromWalls, scene.walls, image, (index) => wallPlaneOf(scene, index, image, planes, camera), 'groundPlane')
    : rectifyPlane(ground, image, 'ground', 'groundPlane');
  planes.set('groundPlane', plane);
  return plane;
}

export interface SceneMeasurements {
  /** Rectified planes by scene path (`walls[0].imagePlane`, `groundPlane`), only those used. */
  readonly planes: ReadonlyMap<string, RectifiedPlane>;
  /** One per pixel-form observation, in scene order, with its path. */
  readonly measurements: readonly { readonly field: string; readonly measurement: PixelMeasurement }[];
}

/** The kinds that have a pixel form measured on a plane (object-shadow pairs go through the camera: sceneSun.ts). */
export const PLANE_PIXEL_KINDS: ReadonlySet<string> = new Set(['rod-shadow', 'overhang-shadow', 'fin-shadow', 'pole-shadow', 'eave-shadow', 'shadow-points']);

/** True for an observation given in pixels on a plane. */
export function isPixelObservation(obs: Scene['observations'][number]): obs is PixelObservation {
  return PLANE_PIXEL_KINDS.has(obs.kind) && (obs as { pixels?: unknown }).pixels !== undefined;
}

/** The wall a pixel observation is measured on, or undefined for the ground. */
export function pixelWallId(obs: PixelObservation): string | undefined {
  if (obs.kind === 'pole-shadow' || obs.kind === 'eave-shadow') return undefined;
  if (obs.kind === 'shadow-points') return obs.pixels?.wallId;
  return obs.wallId;
}

/** The stated azimuth of the wall a pixel observation lies on (empty for the ground or an unknown wall). */
export function measureContextOf(scene: Scene, obs: PixelObservation): MeasureContext {
  const wall = scene.walls.find((w) => w.id === pixelWallId(obs));
  return wall ? { wallAzimuthDeg: wall.azimuthDeg, wallAzimuthSigmaDeg: wall.azimuthSigmaDeg } : {};
}

/**
 * Measure every observation given in pixels.
 * @example measureScenePixels(scene).measurements[0].measurement.note // "slope 23.41 deg below horizontal, ..."
 */
export function measureScenePixels(scene: Scene): SceneMeasurements {
  const planes = new Map<string, RectifiedPlane>();
  const measurements: { field: string; measurement: PixelMeasurement }[] = [];
  const camera = cameraGetter(scene);
  scene.observations.forEach((obs, k) => {
    if (!isPixelObservation(obs)) return;
    const field = `observations[${k}]`;
    const image = scene.image;
    if (!image) {
      throw new InvalidInputError('image', image, 'a picture description (widthPx, heightPx, mirrored, pixelSigmaPx) when observations are given in pixels', `${field} is given in pixels`);
    }
    let planeField: string;
    let plane: RectifiedPlane | undefined;
    const wallId = pixelWallId(obs);
    let context: MeasureContext = {};
    if (wallId === undefined) {
      planeField = 'groundPlane';
      if (!scene.groundPlane && !scene.camera) throw new InvalidInputError(planeField, undefined, 'the ground plane clicked in the picture (a rectangle or points on level ground), or a camera block', `${field} is a ${obs.kind.replace('-', ' ')} in pixels on the ground`);
      plane = rectifySceneGround(scene, image, planes, camera);
    } else {
      const index = scene.walls.findIndex((w) => w.id === wallId);
      if (index < 0) {
        throw new InvalidInputError(`${field}.${obs.kind === 'shadow-points' ? 'pixels.wall' : 'wallId'}`, wallId, `the id of a wall of this scene (${scene.walls.map((w) => JSON.stringify(w.id)).join(', ') || 'none given'})`);
      }
      context = measureContextOf(scene, obs);
      planeField = `walls[${index}].imagePlane`;
      const wallPlane = scene.walls[index].imagePlane;
      if (!wallPlane && !scene.camera) throw new InvalidInputError(planeField, undefined, 'the wall clicked in the picture (a rectangle or points on the wall), or a camera block', `${field} is given in pixels on this wall`);
      plane = wallPlaneOf(scene, index, image, planes, camera);
    }
    planes.set(planeField, plane);
    measurements.push({ field, measurement: measurePixelObservation(obs, plane, field, context) });
  });
  return { planes, measurements };
}
