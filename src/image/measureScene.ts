/**
 * Every pixel-form observation of a scene measured on its plane: each wall's
 * imagePlane and the scene's groundPlane rectified once, each observation's
 * pixels turned into its numeric values (pixelObservations.ts). Errors name
 * the path in the scene file (`walls[1].imagePlane.pointsPx[2]`,
 * `observations[3].wallId`).
 */
import { InvalidInputError } from '../errors.js';
import type { Scene } from '../scene/types.js';
import { measurePixelObservation, type PixelMeasurement, type PixelObservation } from './pixelObservations.js';
import { rectifyPlane, type RectifiedPlane } from './planeInImage.js';

export interface SceneMeasurements {
  /** Rectified planes by scene path (`walls[0].imagePlane`, `groundPlane`), only those used. */
  readonly planes: ReadonlyMap<string, RectifiedPlane>;
  /** One per pixel-form observation, in scene order, with its path. */
  readonly measurements: readonly { readonly field: string; readonly measurement: PixelMeasurement }[];
}

function isPixelObservation(obs: Scene['observations'][number]): obs is PixelObservation {
  return (
    (obs.kind === 'rod-shadow' || obs.kind === 'overhang-shadow' || obs.kind === 'fin-shadow' || obs.kind === 'pole-shadow') &&
    obs.pixels !== undefined
  );
}

/**
 * Measure every observation given in pixels.
 * @example measureScenePixels(scene).measurements[0].measurement.note // "slope 23.41 deg below horizontal, ..."
 */
export function measureScenePixels(scene: Scene): SceneMeasurements {
  const planes = new Map<string, RectifiedPlane>();
  const measurements: { field: string; measurement: PixelMeasurement }[] = [];
  scene.observations.forEach((obs, k) => {
    if (!isPixelObservation(obs)) return;
    const field = `observations[${k}]`;
    const image = scene.image;
    if (!image) {
      throw new InvalidInputError('image', image, 'a picture description (widthPx, heightPx, mirrored, pixelSigmaPx) when observations are given in pixels', `${field} is given in pixels`);
    }
    let planeField: string;
    let plane: RectifiedPlane | undefined;
    if (obs.kind === 'pole-shadow') {
      planeField = 'groundPlane';
      if (!scene.groundPlane) throw new InvalidInputError(planeField, undefined, 'the ground plane clicked in the picture (a rectangle or points on level ground)', `${field} is a pole shadow in pixels`);
      plane = planes.get(planeField) ?? rectifyPlane(scene.groundPlane, image, 'ground', planeField);
    } else {
      const index = scene.walls.findIndex((w) => w.id === obs.wallId);
      if (index < 0) {
        throw new InvalidInputError(`${field}.wallId`, obs.wallId, `the id of a wall of this scene (${scene.walls.map((w) => JSON.stringify(w.id)).join(', ') || 'none given'})`);
      }
      planeField = `walls[${index}].imagePlane`;
      const wallPlane = scene.walls[index].imagePlane;
      if (!wallPlane) throw new InvalidInputError(planeField, undefined, 'the wall clicked in the picture (a rectangle or points on the wall)', `${field} is given in pixels on this wall`);
      plane = planes.get(planeField) ?? rectifyPlane(wallPlane, image, 'wall', planeField);
    }
    planes.set(planeField, plane);
    measurements.push({ field, measurement: measurePixelObservation(obs, plane, field) });
  });
  return { planes, measurements };
}
