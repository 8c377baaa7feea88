/**
 * Wall courses: lines clicked along edges known to be horizontal in a wall of stated azimuth
 * (string courses, sills, eaves, rows of window heads), two or more points each, written to
 * `camera.wallLines` under that wall's id (docs/scene-file.md). The wall is one of the scene's
 * walls, whose azimuth turns the lines' vanishing point into a direction on the site.
 */
import type { PixelPoint } from '../../scene/types.js';
import { getAt, type Draft, type DraftValue } from '../draft.js';
import { WALL_FIELD, wallIndex, type DeskTool, type ToolValues } from './tool.js';
import { lineClicks, LINE_POINTS_FIELD, lineValue } from './cameraLine.js';

export const wallCoursesTool: DeskTool = {
  id: 'wall-courses',
  name: 'Wall courses',
  key: 'h',
  fields: [{ ...WALL_FIELD, label: 'along wall' }, LINE_POINTS_FIELD],
  clicks: (values: ToolValues) => lineClicks(values, `an edge that is horizontal on wall ${values.wall || '(choose the wall)'} (a string course, a sill, the eaves)`),
  finish(draft: Draft, clicks: readonly PixelPoint[], values: ToolValues) {
    const wall = values.wall ?? '';
    if (wallIndex(draft, wall) < 0) return 'Choose the wall the edge runs along (add the wall, with the azimuth it faces, under Walls first).';
    return {
      label: `add a course line on wall ${wall}`,
      change: (d: Draft) => {
        if (d.camera === undefined || d.camera === null || typeof d.camera !== 'object' || Array.isArray(d.camera)) d.camera = {};
        const camera = d.camera as Record<string, DraftValue>;
        if (!Array.isArray(camera.wallLines)) camera.wallLines = [];
        const entries = camera.wallLines as DraftValue[];
        let entry = entries.find((e) => getAt(e, ['wall']) === wall) as Record<string, DraftValue> | undefined;
        if (!entry) {
          entry = { wall, lines: [] };
          entries.push(entry);
        }
        if (!Array.isArray(entry.lines)) entry.lines = [];
        (entry.lines as DraftValue[]).push(lineValue(clicks));
      },
    };
  },
};
