/** Ground figure: a figure of known shape on level ground (paving, a kerbed square), which straightens the ground. */
import type { PixelPoint } from '../../scene/types.js';
import type { Draft, DraftValue } from '../draft.js';
import { figureBlock, figureClickCount, figureFields } from './planeFigure.js';
import { typedNumber, typedPairs, type DeskTool, type ToolValues } from './tool.js';

export const groundFigureTool: DeskTool = {
  id: 'ground-figure',
  name: 'Ground figure',
  key: 'g',
  fields: [
    ...figureFields('ground coordinates east north'),
    { name: 'firstEdgeAzimuthDeg', label: 'azimuth of the edge from corner 1 to corner 2, deg', kind: 'number', initial: '', when: (v) => v.form !== 'points' },
  ],
  clicks(values: ToolValues) {
    if (values.form === 'points') {
      const n = figureClickCount(values);
      const pairs = typedPairs(values.coordinates ?? '');
      return Array.from({ length: n }, (_, k) =>
        `Click point ${k + 1} on the ground${pairs[k] ? ` (east ${String((pairs[k] as DraftValue[])[0])} m, north ${String((pairs[k] as DraftValue[])[1])} m)` : ''}.`);
    }
    return [
      'Click corner 1 of the figure on the ground (its edge to corner 2 has the azimuth given).',
      'Click corner 2, going round the figure.',
      'Click corner 3, going on round.',
      'Click corner 4.',
    ];
  },
  finish(_draft: Draft, clicks: readonly PixelPoint[], values: ToolValues) {
    const block = figureBlock(clicks, values);
    if (values.form !== 'points' && (values.firstEdgeAzimuthDeg ?? '').trim() !== '') block.firstEdgeAzimuthDeg = typedNumber(values.firstEdgeAzimuthDeg);
    return {
      label: 'ground figure',
      change: (d: Draft) => {
        d.groundPlane = block;
      },
    };
  },
};
