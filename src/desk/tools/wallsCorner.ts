/**
 * Walls' corner: the ground from the foot lines of two straightened walls of known azimuth and
 * the one point where both meet the ground (src/image/groundFromWalls.ts), for pictures with no
 * figure of known size on the ground.
 */
import type { PixelPoint } from '../../scene/types.js';
import type { Draft } from '../draft.js';
import { pointValue, wallIndex, type DeskTool, type ToolValues } from './tool.js';

export const wallsCornerTool: DeskTool = {
  id: 'walls-corner',
  name: "Walls' corner",
  key: 'c',
  fields: [
    { name: 'wallA', label: 'first wall', kind: 'wall', initial: '' },
    { name: 'wallB', label: 'second wall', kind: 'wall', initial: '' },
  ],
  clicks: () => ['Click the point where the two walls meet the ground (the foot of their corner).'],
  finish(draft: Draft, clicks: readonly PixelPoint[], values: ToolValues) {
    if (wallIndex(draft, values.wallA ?? '') < 0 || wallIndex(draft, values.wallB ?? '') < 0 || values.wallA === values.wallB) {
      return 'Choose two different walls, each with its wall figure clicked.';
    }
    return {
      label: `ground from the corner of ${values.wallA} and ${values.wallB}`,
      change: (d: Draft) => {
        d.groundPlane = { fromWalls: { walls: [values.wallA, values.wallB], cornerPx: pointValue(clicks[0]) } };
      },
    };
  },
};
