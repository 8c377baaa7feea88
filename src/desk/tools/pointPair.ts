/**
 * Caster and shadow point on a plane: the foot of a point that casts a shadow (straight below it on
 * the ground, straight behind it on a wall) and its shadow on the same plane, written as a
 * `shadow-points` observation in pixels (docs/scene-file.md). On a figure of known size the
 * caster's distance from the plane is typed in metres; on a plane that only the camera puts into
 * the picture (no ground figure, or a wall without its figure, and a camera block) the caster
 * itself is clicked third.
 */
import type { PixelPoint } from '../../scene/types.js';
import { freshObservationId, type Draft, type DraftValue } from '../draft.js';
import { addObservation, LIGHT_FIELD, withLight, pointValue, typedNumber, wallFromCamera, wallIndex, type DeskTool, type ToolValues } from './tool.js';

/** True when the plane the pair is on comes from the camera alone (no clicked figure, a camera block). */
function fromCamera(draft: Draft, values: ToolValues): boolean {
  if (draft.camera === undefined) return false;
  if (values.on !== 'wall') return draft.groundPlane === undefined;
  return wallFromCamera(draft, values.wall ?? '');
}

export const pointPairTool: DeskTool = {
  id: 'shadow-points',
  name: 'Caster and shadow point',
  key: 'k',
  fields: [
    { name: 'id', label: 'name (id)', kind: 'text', initial: 'caster' },
    { name: 'on', label: 'the shadow falls on', kind: 'choice', choices: [['ground', 'the ground'], ['wall', 'a wall']], initial: 'ground' },
    { name: 'wall', label: 'on wall', kind: 'wall', initial: '', when: (v) => v.on === 'wall' },
    { name: 'heightM', label: "caster's distance from the plane, m", kind: 'number', initial: '' },
    { name: 'heightSigmaM', label: 'its sigma, m', kind: 'number', initial: '0.02' },
    LIGHT_FIELD,
    { name: 'note', label: 'note', kind: 'text', initial: '' },
  ],
  clicks(values: ToolValues, draft: Draft) {
    const plane = values.on === 'wall' ? 'wall' : 'ground';
    const steps = [
      `Click the caster's foot: the point of the ${plane} straight ${plane === 'wall' ? 'behind' : 'below'} the point that casts the shadow.`,
      `Click that point's shadow on the ${plane}.`,
    ];
    if (fromCamera(draft, values)) steps.push(`Click the caster itself (the ${plane} comes from the camera, so its distance in metres is not used).`);
    return steps;
  },
  finish(draft: Draft, clicks: readonly PixelPoint[], values: ToolValues) {
    const onWall = values.on === 'wall';
    if (onWall && wallIndex(draft, values.wall ?? '') < 0) return 'Choose the wall the shadow falls on (add the wall under Walls first).';
    const id = freshObservationId(draft, values.id?.trim() || 'caster');
    const pixels: Record<string, DraftValue> = {};
    if (onWall) pixels.wall = values.wall;
    pixels.fromPx = pointValue(clicks[0]);
    pixels.toPx = pointValue(clicks[1]);
    if (fromCamera(draft, values)) pixels.objectPx = pointValue(clicks[2]);
    else {
      pixels.heightM = typedNumber(values.heightM ?? '');
      pixels.heightSigmaM = typedNumber(values.heightSigmaM ?? '');
    }
    const observation: Record<string, DraftValue> = { id, kind: 'shadow-points' };
    if ((values.note ?? '').trim() !== '') observation.note = values.note.trim();
    withLight(observation, values);
    observation.pixels = pixels;
    return addObservation(`add caster and shadow point ${id}`, observation);
  },
};
