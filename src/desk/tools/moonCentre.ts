/**
 * The moon's centre: the middle of the moon's disc clicked once, written as a `moon-direction`
 * observation in its pixel form (docs/moon-evidence.md). The library turns the pixel into azimuth
 * and altitude (src/image/moonPixels.ts) through a wall's clicked figure when one is chosen, else
 * through the scene's camera block, else through the ground's figure.
 */
import type { PixelPoint } from '../../scene/types.js';
import { freshObservationId, type Draft, type DraftValue } from '../draft.js';
import { addObservation, pointValue, typedNumber, wallIndex, type DeskTool, type ToolValues } from './tool.js';

export const moonCentreTool: DeskTool = {
  id: 'moon-centre',
  name: "Moon's centre",
  key: 'm',
  fields: [
    { name: 'id', label: 'name (id)', kind: 'text', initial: 'moon' },
    {
      name: 'through', label: 'turned into a direction through', kind: 'choice', initial: '',
      choices: [['', 'the camera block, else the ground figure'], ['wall', "a wall's clicked figure"]],
    },
    { name: 'wall', label: 'the wall', kind: 'wall', initial: '', when: (v) => v.through === 'wall' },
    { name: 'sigmaPx', label: 'clicking sigma, px (if not the picture\'s)', kind: 'number', initial: '' },
    { name: 'note', label: 'note', kind: 'text', initial: '' },
  ],
  clicks: () => ["Click the middle of the moon's disc (its centre, not the middle of its lit part)."],
  finish(draft: Draft, clicks: readonly PixelPoint[], values: ToolValues) {
    const throughWall = values.through === 'wall';
    if (throughWall && wallIndex(draft, values.wall ?? '') < 0) return 'Choose the wall whose clicked figure turns the moon into a direction (add the wall and its figure first).';
    const id = freshObservationId(draft, values.id?.trim() || 'moon');
    const pixels: Record<string, DraftValue> = { centrePx: pointValue(clicks[0]) };
    if ((values.sigmaPx ?? '').trim() !== '') pixels.sigmaPx = typedNumber(values.sigmaPx);
    if (throughWall) pixels.wall = values.wall;
    const observation: Record<string, DraftValue> = { id, kind: 'moon-direction', pixels };
    if ((values.note ?? '').trim() !== '') observation.note = values.note.trim();
    return addObservation(`add the moon's centre ${id}`, observation);
  },
};
