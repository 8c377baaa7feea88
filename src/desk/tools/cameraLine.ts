/**
 * The common part of the two line tools of the camera (vertical edges, wall courses): one
 * straight edge clicked as two or more points, in the order the user chooses along it.
 */
import type { PixelPoint } from '../../scene/types.js';
import type { DraftValue } from '../draft.js';
import { pointValue, type ToolField, type ToolValues } from './tool.js';

/** Most points on one line a tool asks for (the scene reader takes up to 50; more adds little). */
export const MAX_TOOL_LINE_POINTS = 20;

export const LINE_POINTS_FIELD: ToolField = { name: 'points', label: 'points on each line (2 or more)', kind: 'number', initial: '2' };

/** How many points the line takes: the typed number, 2 when not a whole number from 2 up. */
export function linePointCount(values: ToolValues): number {
  const n = Number((values.points ?? '').trim());
  return Number.isInteger(n) && n >= 2 ? Math.min(n, MAX_TOOL_LINE_POINTS) : 2;
}

/** One instruction per click along the edge. */
export function lineClicks(values: ToolValues, edgeWords: string): string[] {
  const n = linePointCount(values);
  return Array.from({ length: n }, (_, k) =>
    k === 0
      ? `Click one end of ${edgeWords}, where it is sharp.`
      : k === n - 1
      ? `Click the other end of the same edge, as far along it as it stays straight.`
      : `Click point ${k + 1} along the same edge.`);
}

export function lineValue(clicks: readonly PixelPoint[]): DraftValue {
  return clicks.map(pointValue);
}
