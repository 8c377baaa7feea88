/**
 * Vertical edges: lines clicked along edges known to be vertical in the scene (a building's
 * corners, door jambs, pilasters), two or more points each, written to `camera.verticalLines`
 * (docs/scene-file.md). Their vanishing point gives the camera's up direction.
 */
import type { PixelPoint } from '../../scene/types.js';
import type { Draft, DraftValue } from '../draft.js';
import { type DeskTool, type ToolValues } from './tool.js';
import { lineClicks, LINE_POINTS_FIELD, lineValue } from './cameraLine.js';

export const verticalEdgesTool: DeskTool = {
  id: 'vertical-edges',
  name: 'Vertical edges',
  key: 'v',
  fields: [LINE_POINTS_FIELD],
  clicks: (values: ToolValues) => lineClicks(values, 'an edge that is vertical in the scene (a corner, a door jamb, a pilaster)'),
  finish(_draft: Draft, clicks: readonly PixelPoint[]) {
    return {
      label: 'add a vertical edge',
      change: (d: Draft) => {
        if (d.camera === undefined || d.camera === null || typeof d.camera !== 'object' || Array.isArray(d.camera)) d.camera = {};
        const camera = d.camera as Record<string, DraftValue>;
        if (!Array.isArray(camera.verticalLines)) camera.verticalLines = [];
        (camera.verticalLines as DraftValue[]).push(lineValue(clicks));
      },
    };
  },
};
