import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parse } from 'yaml';
import { readSceneText, sceneFromData } from '../../src/scene/readScene.js';
import { resolvePixelObservations } from '../../src/image/resolvePixels.js';
import { draftPoints, emptyDraft, getAt, pathText, setAt, type Draft } from '../../src/desk/draft.js';
import { commit, isUnsaved, markSaved, redo, startHistory, undo } from '../../src/desk/history.js';
import { derive } from '../../src/desk/derive.js';
import { sceneYamlText } from '../../src/desk/sceneYaml.js';
import { TOOLS } from '../../src/desk/tools/registry.js';

// The desk's document is the scene file's own data (src/desk/draft.ts): what it saves is read by the
// scene reader into the same Scene as the file it came from; its measurements are the library's.
const EXAMPLE = fileURLToPath(new URL('../../examples/tanners-hall-photo/tanners-hall-photo.yaml', import.meta.url));
const exampleText = readFileSync(EXAMPLE, 'utf8');
const exampleDraft = parse(exampleText) as Draft;

describe('the document and its YAML', () => {
  it('writes a scene file that the scene reader reads into the same scene as the example it came from', () => {
    const text = sceneYamlText(exampleDraft);
    expect(readSceneText(text, 'desk.yaml')).toEqual(readSceneText(exampleText, EXAMPLE));
    expect(text).toContain('    - [ 588, 558 ]\n'); // a pixel point on one line
    expect(text.startsWith('# Written by the heliochron measuring desk')).toBe(true);
  });

  it('names paths as the scene reader does', () => {
    expect(pathText(['walls', 0, 'imagePlane', 'pointsPx', 2])).toBe('walls[0].imagePlane.pointsPx[2]');
    expect(pathText(['observations', 3, 'pixels', 'toPx'])).toBe('observations[3].pixels.toPx');
  });

  it('lists every clicked point of the example with its path and label', () => {
    const points = draftPoints(exampleDraft);
    expect(points.length).toBe(4 + 8 + 2 * 3);
    expect(points.map((p) => p.label)).toContain('lamp-post tip');
    const tip = points.find((p) => p.label === 'lamp-post tip')!;
    expect(getAt(exampleDraft, tip.path)).toEqual([905, 867]);
  });
});

describe('transactions', () => {
  it('undo returns the document before a change and redo the one after; saving clears "unsaved"', () => {
    const start = startHistory(emptyDraft('hall.png', 1600, 1200), null);
    const a = commit(start, 'set title', (d) => setAt(d, ['title'], 'Hall'));
    const b = commit(a, 'set latitude', (d) => setAt(d, ['site', 'latitudeDeg'], 47.62));
    expect(isUnsaved(b)).toBe(true);
    expect(undo(b).draft).toEqual(a.draft);
    expect(undo(undo(b)).draft).toEqual(start.draft);
    expect(redo(undo(b)).draft).toEqual(b.draft);
    expect(commit(b, 'no change', () => undefined)).toBe(b);
    const saved = markSaved(b);
    expect(isUnsaved(saved)).toBe(false);
    expect(isUnsaved(commit(saved, 'set title', (d) => setAt(d, ['title'], 'Other')))).toBe(true);
    // the earlier document is not changed by later transactions (immutable values)
    expect(getAt(a.draft, ['site'])).toBeUndefined();
  });
});

describe('edge cases', () => {
  it('measures each item on its own: a figure with three corners on one line is refused beside it, the others are still measured', () => {
    const bad = structuredClone(exampleDraft) as Draft;
    // ground corners on one line: the reader's own message is put beside groundPlane, the wall's shadows are still measured
    setAt(bad, ['groundPlane', 'pointsPx'], [[100, 900], [200, 900], [300, 900], [400, 900]]);
    const d = derive(bad);
    expect(d.itemRefusals.get('groundPlane')).toMatch(/^groundPlane/);
    expect(d.itemRefusals.get('observations[3]')).toMatch(/on the ground, whose figure is not accepted/);
    expect(d.measurements.map((m) => m.field)).toEqual(['observations[1]', 'observations[2]']);
    expect(d.planes.has('walls[0].imagePlane')).toBe(true);
    // the reader alone takes the file (it checks shapes; the straightening finds the line)
    expect(d.refusal).toBeNull();
  });

  it('measures a document with no site or window yet (stand-ins for what does not change a measurement)', () => {
    const partial = structuredClone(exampleDraft) as Draft;
    for (const key of ['site', 'window', 'calendar', 'title']) delete partial[key];
    const d = derive(partial);
    expect(d.scene).toBeNull();
    expect(d.refusal?.field).toBe('title');
    const cli = resolvePixelObservations(sceneFromData(exampleDraft));
    expect(d.measurements.map((m) => m.values.map((v) => v.value))).toEqual(cli.measurements.map((m) => m.values.map((v) => v.value)));
  });
});

describe('the tools', () => {
  it('every tool has a name, its own key and an instruction for each click', () => {
    const keys = TOOLS.map((t) => t.key);
    expect(new Set(keys).size).toBe(keys.length);
    for (const tool of TOOLS) {
      const values = Object.fromEntries(tool.fields.map((f) => [f.name, f.initial]));
      const steps = tool.clicks(values, exampleDraft);
      expect(steps.length, tool.id).toBeGreaterThan(0);
      for (const s of steps) expect(s, tool.id).toMatch(/^Click /);
    }
  });

  it('the clicks of the shadow and figure tools make the structure of the scene file', () => {
    const draft = emptyDraft('hall.png', 1600, 1200);
    draft.walls = [{ id: 'west', azimuthDeg: 268.5 }];
    const rod = TOOLS.find((t) => t.id === 'rod-shadow')!;
    const result = rod.finish(draft, [[800, 515], [764, 569]], { id: 'bracket', wall: 'west', note: '' });
    if (typeof result === 'string') throw new Error(result);
    const after = structuredClone(draft);
    result.change(after);
    expect(after.observations).toEqual([{ id: 'bracket', kind: 'rod-shadow', wall: 'west', pixels: { fromPx: [800, 515], toPx: [764, 569] } }]);
    const corner = TOOLS.find((t) => t.id === 'walls-corner')!;
    const twoWalls = { ...draft, walls: [{ id: 'west', azimuthDeg: 268.5 }, { id: 'south', azimuthDeg: 178.5 }] };
    const ground = corner.finish(twoWalls, [[1231.5, 954]], { wallA: 'west', wallB: 'south' });
    if (typeof ground === 'string') throw new Error(ground);
    const withGround = structuredClone(twoWalls);
    ground.change(withGround);
    expect(withGround.groundPlane).toEqual({ fromWalls: { walls: ['west', 'south'], cornerPx: [1231.5, 954] } });
    expect(corner.finish(twoWalls, [[1, 1]], { wallA: 'west', wallB: 'west' })).toMatch(/two different walls/);
    const wallFigure = TOOLS.find((t) => t.id === 'wall-figure')!;
    expect(wallFigure.finish(emptyDraft(null, null, null), [[0, 0], [1, 0], [1, 1], [0, 1]], { wall: 'none', form: 'rectangle' })).toMatch(/Choose the wall/);
  });
});
