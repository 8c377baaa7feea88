/**
 * Object and shadow: a point that casts a shadow (a head, a post's top, a bracket's end) and
 * that point's shadow, wherever it falls (ground, steps, a wall), written as an `object-shadow`
 * observation with an optional `group` label (docs/scene-file.md). Through the camera each pair
 * confines the sun to a great circle of the sky; two or more pairs of a group fix it.
 */
import type { PixelPoint } from '../../scene/types.js';
import { freshObservationId, type Draft, type DraftValue } from '../draft.js';
import { addObservation, LIGHT_FIELD, withLight, pointValue, type DeskTool, type ToolValues } from './tool.js';

export const objectShadowTool: DeskTool = {
  id: 'object-shadow',
  name: 'Object and shadow',
  key: 's',
  fields: [
    { name: 'id', label: 'name (id)', kind: 'text', initial: 'pair' },
    { name: 'group', label: 'group (optional: figures, buildings, ...)', kind: 'text', initial: '' },
    LIGHT_FIELD,
    { name: 'note', label: 'note', kind: 'text', initial: '' },
  ],
  clicks: () => [
    'Click the object point: the point that casts the shadow (the top of a head, a post, a bracket).',
    'Click the shadow of that same point, wherever it falls (ground, steps, a wall).',
  ],
  finish(draft: Draft, clicks: readonly PixelPoint[], values: ToolValues) {
    const id = freshObservationId(draft, values.id?.trim() || 'pair');
    const observation: Record<string, DraftValue> = { id, kind: 'object-shadow' };
    const group = (values.group ?? '').trim();
    if (group !== '') observation.group = group;
    withLight(observation, values);
    observation.objectPx = pointValue(clicks[0]);
    observation.shadowPx = pointValue(clicks[1]);
    if ((values.note ?? '').trim() !== '') observation.note = values.note.trim();
    return addObservation(`add object and shadow ${id}`, observation);
  },
};
