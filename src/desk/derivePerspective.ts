/**
 * The picture's own perspective on the desk, derived by the library on every change: the camera
 * from the clicked vertical edges and wall courses (src/image/camera.ts, solveCamera through
 * sceneSun.ts's cameraInputOf) and the sun of each group of object-shadow pairs
 * (resolveSceneSun), exactly as `heliochron measure` finds them.
 *
 * As for the figures (derive.ts), this does not wait for the site or the window: it reads a copy
 * of the document in which what does not change the camera or the suns is replaced by neutral
 * stand-ins, the observations keeping their places (so that fields and Monte Carlo seeds are
 * those of the file). A pair the reader or the sun refuses gets the message beside it and is left
 * out, and the others go on (at most once per pair: bounded). A refusal of the camera (too few
 * lines, parallel lines, one direction only) stops the suns and is shown beside the camera.
 */
import { sceneFromData } from '../scene/readScene.js';
import type { Scene } from '../scene/types.js';
import { solveCamera, type CameraSolution } from '../image/camera.js';
import { cameraInputOf, hasObjectShadows, resolveSceneSun, type SceneSun } from '../image/sceneSun.js';
import { getAt, type Draft, type DraftValue } from './draft.js';
import { refusalOf, type Refusal } from './refusal.js';
import { neutralCopy, standIn } from './neutralCopy.js';

export interface Perspective {
  /** The camera, when its lines give one. */
  readonly camera: CameraSolution | null;
  /** Why there is no camera, in the library's words, naming its field (`camera.wallLines`). */
  readonly cameraRefusal: Refusal | null;
  /** The camera and every group's sun as `heliochron measure` finds them, when every pair is accepted. */
  readonly sceneSun: SceneSun | null;
  /** What is drawn over the picture: the camera and the groups that could be found. */
  readonly drawing: SceneSun | null;
  /** Refusals of single pairs, by the pair's field (`observations[4]`). */
  readonly pairRefusals: ReadonlyMap<string, string>;
}

/** An object-shadow pair or a shadow wedge: both stand on the camera alone. */
const isPair = (o: DraftValue | undefined): boolean => getAt(o, ['kind']) === 'object-shadow' || getAt(o, ['kind']) === 'shadow-wedge';

/** The copy of the document the camera and the suns need, with neutral stand-ins for the rest. */
function perspectiveCopy(draft: Draft): Draft {
  return neutralCopy(draft, 'perspective', Array.isArray(draft.walls) ? draft.walls : [], isPair, ['image', 'camera', 'mapNorthCorrectionDeg', 'seed']);
}

/** Leave out the pair a refusal names; false when it names no pair still in the copy. */
function leaveOutPair(copy: Draft, refusal: Refusal, refusals: Map<string, string>): boolean {
  const m = /^observations\[(\d+)\]/.exec(refusal.field);
  const list = copy.observations as DraftValue[];
  if (!m || !isPair(list[Number(m[1])])) return false;
  if (!refusals.has(m[0])) refusals.set(m[0], refusal.message);
  list[Number(m[1])] = standIn(Number(m[1]));
  return true;
}

/**
 * The camera and the groups' suns of a document, or null when it has neither camera lines nor pairs.
 * @example derivePerspective(draft)?.camera?.focalLengthPx.value // 2210.4
 */
export function derivePerspective(draft: Draft): Perspective | null {
  // the camera and suns take a good part of a second: found again only when what they stand on changed
  const copy = perspectiveCopy(draft);
  const key = JSON.stringify(copy);
  if (key !== last.key) last = { key, value: perspectiveOf(draft, copy) };
  return last.value;
}

let last: { key: string; value: Perspective | null } = { key: '', value: null };

function perspectiveOf(draft: Draft, copy: Draft): Perspective | null {
  const pairs = (Array.isArray(draft.observations) ? draft.observations : []).filter(isPair).length;
  if (draft.camera === undefined && pairs === 0) return null;
  const pairRefusals = new Map<string, string>();
  const bound = 2 + (copy.observations as DraftValue[]).length;
  const none = (cameraRefusal: Refusal | null, camera: CameraSolution | null = null): Perspective => ({
    camera, cameraRefusal, sceneSun: null, drawing: camera ? { camera, groups: [], singlePairs: [], cameraErrors: { nominal: [camera.core.focalLengthPx, camera.core.principalPointPx[0], camera.core.principalPointPx[1], 0, 0, 0], components: [] }, observations: [], pairsByField: new Map() } : null, pairRefusals,
  });

  let scene: Scene | null = null;
  for (let attempt = 0; attempt < bound && !scene; attempt += 1) {
    try {
      scene = sceneFromData(copy);
    } catch (error) {
      const r = refusalOf(error);
      if (!leaveOutPair(copy, r, pairRefusals)) return none(r);
    }
  }
  if (!scene?.camera) return none(null);

  let camera: CameraSolution;
  try {
    camera = solveCamera(cameraInputOf(scene));
  } catch (error) {
    return none(refusalOf(error));
  }
  for (let attempt = 0; attempt < bound && hasObjectShadows(scene); attempt += 1) {
    try {
      const sun = resolveSceneSun(scene);
      return { camera: sun.camera, cameraRefusal: null, sceneSun: pairRefusals.size === 0 ? sun : null, drawing: sun, pairRefusals };
    } catch (error) {
      const r = refusalOf(error);
      if (!leaveOutPair(copy, r, pairRefusals)) return none(r, camera);
      try {
        scene = sceneFromData(copy);
      } catch (again) {
        return none(refusalOf(again), camera);
      }
    }
  }
  return none(null, camera);
}
