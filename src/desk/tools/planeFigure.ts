/**
 * The common part of the two figure tools (wall figure, ground figure): a figure whose true
 * shape is known, clicked in the picture, in one of three forms of docs/scene-file.md
 * (a rectangle of known size, a rectangle of known proportion only, points with their
 * coordinates in the plane). The result is the `imagePlane` / `groundPlane` block.
 */
import type { PixelPoint } from '../../scene/types.js';
import type { DraftValue } from '../draft.js';
import { pointValue, typedNumber, typedPairs, type ToolField, type ToolValues } from './tool.js';

export const FIGURE_FORMS = [
  ['rectangle', 'a rectangle of known size'],
  ['proportion', 'a rectangle of known proportion only'],
  ['points', 'points with their coordinates'],
] as const;

export function figureFields(coordinateWords: string): ToolField[] {
  const is = (form: string) => (v: ToolValues) => v.form === form;
  return [
    { name: 'form', label: 'figure', kind: 'choice', choices: FIGURE_FORMS, initial: 'rectangle' },
    { name: 'widthM', label: 'width, m', kind: 'number', initial: '', when: is('rectangle') },
    { name: 'heightM', label: 'height, m', kind: 'number', initial: '', when: is('rectangle') },
    { name: 'aspect', label: 'width / height', kind: 'number', initial: '', when: is('proportion') },
    { name: 'coordinates', label: `${coordinateWords}, metres, one point a line`, kind: 'lines', initial: '', when: is('points') },
  ];
}

/** How many clicks the figure needs: 4 corners, or one per line of coordinates (at least 4). */
export function figureClickCount(values: ToolValues): number {
  return values.form === 'points' ? Math.max(4, typedPairs(values.coordinates ?? '').length) : 4;
}

/** The plane block from the clicks and the typed values. */
export function figureBlock(clicks: readonly PixelPoint[], values: ToolValues): Record<string, DraftValue> {
  const block: Record<string, DraftValue> = { pointsPx: clicks.map(pointValue) };
  if (values.form === 'points') block.planePointsM = typedPairs(values.coordinates ?? '');
  else if (values.form === 'proportion') block.aspect = typedNumber(values.aspect ?? '');
  else {
    block.widthM = typedNumber(values.widthM ?? '');
    block.heightM = typedNumber(values.heightM ?? '');
  }
  return block;
}
