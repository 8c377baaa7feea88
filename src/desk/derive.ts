/**
 * What the desk shows about its document, derived by the library on every change: the scene
 * reader's verdict on the whole file (sceneFromData), and the measurement of every clicked
 * figure and shadow (src/image: rectifyPlane, resolvePixelObservations) with its sigma,
 * residuals and warnings, each put next to the item it concerns.
 *
 * Measuring must not wait for the site or the window to be typed in, so the pixel part is
 * measured on a copy of the document in which what does not change a measurement (title,
 * site, calendar, window, the non-pixel observations) is replaced by neutral stand-ins (the
 * camera block stays: it puts walls and the ground without a figure into the picture); the
 * observations keep their places, so that paths and Monte Carlo seeds are those of the file.
 * An item that the reader or the rectification refuses gets the message and is left out of
 * the copy, and measuring goes on for the others (at most once per item: bounded).
 */
import { sceneFromData } from '../scene/readScene.js';
import type { Scene } from '../scene/types.js';
import { rectifyPlane, type RectifiedPlane } from '../image/planeInImage.js';
import { PLANE_PIXEL_KINDS, rectifySceneGround } from '../image/measureScene.js';
import { resolvePixelObservations, type ResolvedMeasurement } from '../image/resolvePixels.js';
import { getAt, pathText, type Draft, type DraftValue } from './draft.js';
import { refusalOf, type Refusal } from './refusal.js';
import { neutralCopy, standIn } from './neutralCopy.js';
import { derivePerspective, type Perspective } from './derivePerspective.js';


export type { Refusal };

export interface Derived {
  /** The validated scene, when the reader takes the whole document. */
  readonly scene: Scene | null;
  /** The reader's refusal of the whole document (the first field it stops at). */
  readonly refusal: Refusal | null;
  /** The scene the measurements were made on (stand-ins for what does not matter to them). */
  readonly measuringScene: Scene | null;
  /** Every plane that could be straightened, by field. */
  readonly planes: ReadonlyMap<string, RectifiedPlane>;
  readonly measurements: readonly ResolvedMeasurement[];
  /** Refusals of single items, by the item's path text (`observations[2]`, `walls[0].imagePlane`, `groundPlane`). */
  readonly itemRefusals: ReadonlyMap<string, string>;
  /** The picture's camera and the groups' suns, when the document has a camera block or object-shadow pairs. */
  readonly perspective: Perspective | null;
}


/** The item a field belongs to: `observations[2].pixels.toPx` -> `observations[2]`; planes by their own path. */
export function ownerOf(field: string): string {
  const obs = /^observations\[\d+\]/.exec(field);
  if (obs) return obs[0];
  const wall = /^walls\[\d+\]\.imagePlane/.exec(field);
  if (wall) return wall[0];
  const wallItem = /^walls\[\d+\]/.exec(field);
  if (wallItem) return wallItem[0];
  if (field.startsWith('groundPlane')) return 'groundPlane';
  if (field.startsWith('image')) return 'image';
  return field;
}

/** The copy of the document that measuring needs, with neutral stand-ins for the rest. */
function measuringCopy(draft: Draft): Draft {
  const walls = (Array.isArray(draft.walls) ? draft.walls : []).map((w) =>
    w && typeof w === 'object' && !Array.isArray(w) && w.azimuthDeg === undefined && w.mapAzimuthDeg === undefined && w.mapPoints === undefined
      ? { ...w, azimuthDeg: 0 }
      : w,
  );
  const pixelForm = (o: DraftValue): boolean => PLANE_PIXEL_KINDS.has(String(getAt(o, ['kind']))) && getAt(o, ['pixels']) !== undefined;
  return neutralCopy(draft, 'measuring', walls, pixelForm, ['image', 'groundPlane', 'camera', 'mapNorthCorrectionDeg', 'seed']);
}

/** True for a pixel-form observation on a plane that only the camera puts into the picture (no figure clicked on it). */
function onCameraPlane(copy: Draft, o: DraftValue): boolean {
  if (getAt(o, ['pixels']) === undefined) return false;
  if (onGround(o)) return copy.groundPlane === undefined;
  const wallId = getAt(o, ['wall']) ?? getAt(o, ['pixels', 'wall']);
  const wall = (copy.walls as DraftValue[]).find((w) => getAt(w, ['id']) === wallId);
  return wall !== undefined && getAt(wall, ['imagePlane']) === undefined;
}

/** True for a pixel-form observation measured on the ground (pole, eave line, point pair without a wall). */
function onGround(o: DraftValue): boolean {
  const kind = getAt(o, ['kind']);
  return kind === 'pole-shadow' || kind === 'eave-shadow' || (kind === 'shadow-points' && getAt(o, ['pixels', 'wall']) === undefined);
}

/** Replace the observations that stand on a left-out plane by stand-ins, saying why beside each. */
function leaveOutDependents(copy: Draft, onPlane: (o: DraftValue) => boolean, why: string, refusals: Map<string, string>): void {
  const list = copy.observations as DraftValue[];
  list.forEach((o, k) => {
    if (getAt(o, ['kind']) === 'sun-up' || !onPlane(o)) return;
    list[k] = standIn(k);
    if (!refusals.has(`observations[${k}]`)) refusals.set(`observations[${k}]`, why);
  });
}

/** Leave out the item a refusal names (and what stands on it); false when there is nothing left to leave out. */
function leaveOut(copy: Draft, owner: string, refusals: Map<string, string>): boolean {
  const obs = /^observations\[(\d+)\]$/.exec(owner);
  if (obs) {
    const k = Number(obs[1]);
    const list = copy.observations as DraftValue[];
    if (getAt(list[k], ['kind']) === 'sun-up') return false;
    list[k] = standIn(k);
    return true;
  }
  if (owner.startsWith('camera') && copy.camera !== undefined) {
    leaveOutDependents(copy, (o) => onCameraPlane(copy, o), "it is measured on a plane that only the camera puts into the picture, and the camera is not found yet (see The picture's camera)", refusals);
    delete copy.camera;
    return true;
  }
  const wall = /^walls\[(\d+)\](\.imagePlane)?$/.exec(owner);
  if (wall) {
    const w = (copy.walls as DraftValue[])[Number(wall[1])] as Record<string, DraftValue>;
    if (!w || w.imagePlane === undefined) return false;
    delete w.imagePlane;
    leaveOutDependents(copy, (o) => getAt(o, ['kind']) !== 'eave-shadow' && (getAt(o, ['wall']) ?? getAt(o, ['pixels', 'wall'])) === w.id, `it is measured on wall ${String(w.id)}, whose figure is not accepted (see that figure)`, refusals);
    return true;
  }
  if (owner === 'groundPlane' && copy.groundPlane !== undefined) {
    delete copy.groundPlane;
    leaveOutDependents(copy, onGround, 'it is measured on the ground, whose figure is not accepted (see the ground)', refusals);
    return true;
  }
  return false;
}

/**
 * Everything the desk shows about a document.
 * @example derive(draft).measurements[0].values[0] // { name: 'slopeDeg', value: 56.3, sigma: 1.1, ... }
 */
export function derive(draft: Draft): Derived {
  let scene: Scene | null = null;
  let refusal: Refusal | null = null;
  try {
    scene = sceneFromData(draft);
  } catch (error) {
    refusal = refusalOf(error);
  }

  const itemRefusals = new Map<string, string>();
  const copy = measuringCopy(draft);
  let measuringScene: Scene | null = null;
  let planes = new Map<string, RectifiedPlane>();
  let measurements: readonly ResolvedMeasurement[] = [];
  const bound = 3 + (copy.observations as DraftValue[]).length + (copy.walls as DraftValue[]).length;
  for (let attempt = 0; attempt < bound; attempt += 1) {
    try {
      measuringScene = sceneFromData(copy);
      const resolved = resolvePixelObservations(measuringScene);
      planes = new Map(resolved.planes);
      measurements = resolved.measurements;
      break;
    } catch (error) {
      const r = refusalOf(error);
      const owner = ownerOf(r.field);
      measuringScene = null;
      if (!itemRefusals.has(owner || 'image')) itemRefusals.set(owner || 'image', r.message);
      if (!leaveOut(copy, owner, itemRefusals)) break;
    }
  }

  // planes that no measurement used are straightened too, for their grid and residuals
  if (measuringScene?.image) {
    const image = measuringScene.image;
    measuringScene.walls.forEach((wall, i) => {
      const field = `walls[${i}].imagePlane`;
      if (!wall.imagePlane || planes.has(field)) return;
      try {
        planes.set(field, rectifyPlane(wall.imagePlane, image, 'wall', field));
      } catch (error) {
        itemRefusals.set(field, refusalOf(error).message);
      }
    });
    if (measuringScene.groundPlane && !planes.has('groundPlane')) {
      try {
        rectifySceneGround(measuringScene, image, planes);
      } catch (error) {
        itemRefusals.set('groundPlane', refusalOf(error).message);
      }
    }
  }
  return { scene, refusal, measuringScene, planes, measurements, itemRefusals, perspective: derivePerspective(draft) };
}

export { pathText };
