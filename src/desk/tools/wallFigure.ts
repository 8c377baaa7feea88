/** Wall figure: a figure of known shape on a wall (window, door, panel), which straightens the wall's plane. */
import type { PixelPoint } from '../../scene/types.js';
import type { Draft, DraftValue } from '../draft.js';
import { figureBlock, figureClickCount, figureFields } from './planeFigure.js';
import { WALL_FIELD, typedPairs, wallIndex, type DeskTool, type ToolValues } from './tool.js';

const CORNERS = ['top-left', 'top-right', 'bottom-right', 'bottom-left'];

export const wallFigureTool: DeskTool = {
  id: 'wall-figure',
  name: 'Wall figure',
  key: 'w',
  fields: [WALL_FIELD, ...figureFields('wall coordinates u (right) v (up)')],
  clicks(values: ToolValues) {
    if (values.form === 'points') {
      const pairs = typedPairs(values.coordinates ?? '');
      return Array.from({ length: figureClickCount(values) }, (_, k) =>
        `Click point ${k + 1} of the figure${pairs[k] ? ` (u ${String((pairs[k] as DraftValue[])[0])} m, v ${String((pairs[k] as DraftValue[])[1])} m on the wall)` : ''}.`);
    }
    return CORNERS.map((c) => `Click the ${c} corner of the figure on the wall, as seen from outside.`);
  },
  finish(draft: Draft, clicks: readonly PixelPoint[], values: ToolValues) {
    const index = wallIndex(draft, values.wall ?? '');
    if (index < 0) return 'Choose the wall the figure is on (add the wall under Walls first).';
    const block = figureBlock(clicks, values);
    return {
      label: `wall figure on ${values.wall}`,
      change: (d: Draft) => {
        ((d.walls as DraftValue[])[index] as Record<string, DraftValue>).imagePlane = block;
      },
    };
  },
};
