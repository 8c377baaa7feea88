/**
 * Shadow and wedge: a shadow point whose casting point is known only within a wedge (a hat brim,
 * a branch, a cornice seen end on), written as a `shadow-wedge` observation with an optional
 * `group` label (docs/scene-file.md). Through the camera it says on which side of the sky the sun
 * must lie, a one-sided bound (docs/measuring.md, section 9a); it needs the `camera` block.
 */
import type { PixelPoint } from '../../scene/types.js';
import { freshObservationId, type Draft, type DraftValue } from '../draft.js';
import { addObservation, LIGHT_FIELD, withLight, pointValue, typedNumber, type DeskTool, type ToolValues } from './tool.js';

export const shadowWedgeTool: DeskTool = {
  id: 'shadow-wedge',
  name: 'Shadow and wedge',
  key: 'x',
  fields: [
    { name: 'id', label: 'name (id)', kind: 'text', initial: 'wedge' },
    { name: 'group', label: 'group (optional: figures, buildings, ...)', kind: 'text', initial: '' },
    { name: 'sigmaPx', label: 'clicking sigma, px (optional: else the picture\'s)', kind: 'number', initial: '' },
    LIGHT_FIELD,
    { name: 'note', label: 'note', kind: 'text', initial: '' },
  ],
  clicks: () => [
    'Click the shadow point: the tip of a shadow whose casting point is not plain.',
    'Click a point on one side of the wedge, seen from the shadow point, in which the casting point lies.',
    'Click a point on the other side of that wedge (how far out does not matter).',
  ],
  finish(draft: Draft, clicks: readonly PixelPoint[], values: ToolValues) {
    const id = freshObservationId(draft, values.id?.trim() || 'wedge');
    const observation: Record<string, DraftValue> = { id, kind: 'shadow-wedge' };
    const group = (values.group ?? '').trim();
    if (group !== '') observation.group = group;
    withLight(observation, values);
    observation.shadowPx = pointValue(clicks[0]);
    observation.edgesPx = [pointValue(clicks[1]), pointValue(clicks[2])];
    if ((values.sigmaPx ?? '').trim() !== '') observation.sigmaPx = typedNumber(values.sigmaPx);
    if ((values.note ?? '').trim() !== '') observation.note = values.note.trim();
    return addObservation(`add shadow and wedge ${id}`, observation);
  },
};
