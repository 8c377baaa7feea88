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
import { derivePerspective } from '../../src/desk/derivePerspective.js';
import { resolveSceneSun } from '../../src/image/sceneSun.js';
import { newMoonObservation } from '../../src/desk/forms.js';

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

  it('every shadow tool offers the light, the sun by default, and writes light: moon for moonlight, as the reader reads it', () => {
    const shadowTools = TOOLS.filter((t) => t.fields.some((f) => f.name === 'light'));
    expect(shadowTools.map((t) => t.id).sort()).toEqual(['eave-shadow', 'fin-shadow', 'object-shadow', 'overhang-shadow', 'pole-shadow', 'rod-shadow', 'shadow-points', 'shadow-wedge']);
    for (const t of shadowTools) expect(t.fields.find((f) => f.name === 'light')?.initial, t.id).toBe('sun');
    const draft = emptyDraft('hall.png', 1600, 1200);
    draft.walls = [{ id: 'west', azimuthDeg: 268.5 }];
    const rod = TOOLS.find((t) => t.id === 'rod-shadow')!;
    const result = rod.finish(draft, [[800, 515], [764, 569]], { id: 'bracket', wall: 'west', note: '', light: 'moon' });
    if (typeof result === 'string') throw new Error(result);
    const after = structuredClone(draft);
    result.change(after);
    expect(after.observations).toEqual([{ id: 'bracket', kind: 'rod-shadow', wall: 'west', light: 'moon', pixels: { fromPx: [800, 515], toPx: [764, 569] } }]);
    expect(sceneYamlText(after)).toMatch(/light: moon/);
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
    const twoWalls: Draft = { ...draft, walls: [{ id: 'west', azimuthDeg: 268.5 }, { id: 'south', azimuthDeg: 178.5 }] };
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

describe("the picture's own perspective on the desk", () => {
  const KORN = fileURLToPath(new URL('../../examples/kornplatz-figures/kornplatz-figures.yaml', import.meta.url));
  const korn = parse(readFileSync(KORN, 'utf8')) as Draft;

  it('finds the camera and the groups\' suns of the example as `heliochron measure` does (resolveSceneSun on the file itself)', () => {
    const p = derivePerspective(korn)!;
    const direct = resolveSceneSun(readSceneText(readFileSync(KORN, 'utf8'), KORN));
    expect(p.cameraRefusal).toBeNull();
    expect(p.sceneSun!.camera.focalLengthPx).toEqual(direct.camera.focalLengthPx);
    expect(p.sceneSun!.groups.map((g) => [g.group, g.sun.azimuthDeg, g.sun.altitudeDeg, g.azimuthSigmaDeg, g.altitudeSigmaDeg]))
      .toEqual(direct.groups.map((g) => [g.group, g.sun.azimuthDeg, g.sun.altitudeDeg, g.azimuthSigmaDeg, g.altitudeSigmaDeg]));
    // the camera's lines and the pairs are points of the document, labelled and owned by their line or pair
    const points = draftPoints(korn);
    expect(points.filter((q) => q.path[0] === 'camera').length).toBe(2 * (6 + 4 + 4));
    expect(points.find((q) => q.label === 'figure-2 shadow')!.owner).toEqual(['observations', 4]);
  });

  it('keeps a group of one pair as a great circle (no sun of its own, nothing refused); a camera of one direction is refused beside the camera', () => {
    const oneFigure = structuredClone(korn);
    (oneFigure.observations as Draft[]).splice(4); // front-lit, post-1, post-2, figure-1
    const p = derivePerspective(oneFigure)!;
    expect([...p.pairRefusals.keys()]).toEqual([]);
    expect(p.sceneSun!.singlePairs).toEqual([{ group: 'figures', id: 'figure-1', field: 'observations[3]' }]);
    expect(p.drawing!.groups.map((g) => g.group)).toEqual(['lamp-posts']);

    const vertical = structuredClone(korn);
    delete (vertical.camera as Draft).wallLines;
    const q = derivePerspective(vertical)!;
    expect(q.camera).toBeNull();
    expect(q.cameraRefusal!.field).toBe('camera.wallLines');
  });

  it('adds lines and pairs through the tools as transactions that undo', () => {
    const start = { ...structuredClone(korn), observations: [{ id: 'front-lit', kind: 'wall-lit', wall: 'kornhaus-front' }] } as Draft;
    delete start.camera;
    let h = startHistory(start, null);
    const tool = (id: string) => TOOLS.find((t) => t.id === id)!;
    const apply = (id: string, clicks: [number, number][], values: Record<string, string>) => {
      const r = tool(id).finish(h.draft, clicks, values);
      if (typeof r === 'string') throw new Error(r);
      h = commit(h, r.label, r.change);
    };
    apply('vertical-edges', [[794, 1174], [762, 343]], { points: '2' });
    apply('wall-courses', [[809, 1120], [1776, 959]], { wall: 'kornhaus-front', points: '2' });
    apply('wall-courses', [[797, 791], [1788, 717]], { wall: 'kornhaus-front', points: '2' });
    apply('object-shadow', [[2042, 796], [2142, 959]], { id: 'post-1', group: 'lamp-posts', note: '' });
    expect(h.draft.camera).toEqual({ verticalLines: [[[794, 1174], [762, 343]]], wallLines: [{ wall: 'kornhaus-front', lines: [[[809, 1120], [1776, 959]], [[797, 791], [1788, 717]]] }] });
    expect((h.draft.observations as Draft[])[1]).toEqual({ id: 'post-1', kind: 'object-shadow', group: 'lamp-posts', objectPx: [2042, 796], shadowPx: [2142, 959] });
    expect(tool('wall-courses').finish(h.draft, [[1, 1], [9, 9]], { wall: 'no-such-wall' })).toContain('Choose the wall');
    expect(tool('vertical-edges').clicks({ points: '3' }, h.draft).length).toBe(3);
    h = undo(undo(h));
    expect(getAt(h.draft, ['camera', 'wallLines', 0, 'lines'])).toEqual([[[809, 1120], [1776, 959]]]);
  });
});

describe('the shadow wedge, the tip through the camera and the moon on the desk', () => {
  const KORN = fileURLToPath(new URL('../../examples/kornplatz-figures/kornplatz-figures.yaml', import.meta.url));
  const korn = parse(readFileSync(KORN, 'utf8')) as Draft;
  const tool = (id: string) => TOOLS.find((t) => t.id === id)!;
  const applied = (draft: Draft, id: string, clicks: [number, number][], values: Record<string, string>): Draft => {
    const r = tool(id).finish(draft, clicks, values);
    if (typeof r === 'string') throw new Error(r);
    const after = structuredClone(draft);
    r.change(after);
    return after;
  };
  const last = (d: Draft) => (d.observations as Draft[])[(d.observations as Draft[]).length - 1];

  it('places a shadow wedge by three clicks (shadow, then the two edges) that the scene reader reads as the file states it', () => {
    const wedge = tool('shadow-wedge');
    expect(wedge.clicks({}, korn).map((s) => s.slice(0, 30))).toEqual([
      'Click the shadow point: the ti', 'Click a point on one side of t', 'Click a point on the other sid',
    ]);
    const after = applied(korn, 'shadow-wedge', [[1616, 1110], [1480, 1010], [1500, 1060]], { id: 'brim', group: 'figures', sigmaPx: '1.5', note: '' });
    expect(last(after)).toEqual({ id: 'brim', kind: 'shadow-wedge', group: 'figures', shadowPx: [1616, 1110], edgesPx: [[1480, 1010], [1500, 1060]], sigmaPx: 1.5 });
    const scene = readSceneText(sceneYamlText(after), 'desk.yaml');
    expect(scene.observations[scene.observations.length - 1]).toEqual({ id: 'brim', kind: 'shadow-wedge', group: 'figures', shadowPx: [1616, 1110], edgesPx: [[1480, 1010], [1500, 1060]], sigmaPx: 1.5 });
    // its three points are points of the document, owned by the wedge
    const k = (after.observations as Draft[]).length - 1;
    expect(draftPoints(after).filter((p) => p.owner[1] === k).map((p) => p.label)).toEqual(['brim shadow', 'brim edge 1', 'brim edge 2']);
    // the wedge enters the camera's sun as `heliochron measure` takes it (same scene, same constraint)
    const p = derivePerspective(after)!;
    expect([...p.pairRefusals.keys()]).toEqual([]);
    expect(p.sceneSun!.observations.some((o) => o.kind === 'shadow-wedge' && o.id === 'brim')).toBe(true);
  });

  it('places the moon\'s centre by one click, written in its pixel form, measured by the library through the camera as the command line measures it', () => {
    const moon = tool('moon-centre');
    expect(moon.clicks({}, korn)).toEqual(["Click the middle of the moon's disc (its centre, not the middle of its lit part)."]);
    const after = applied(korn, 'moon-centre', [[1900, 240]], { id: 'moon', through: '', wall: '', sigmaPx: '2', note: '' });
    expect(last(after)).toEqual({ id: 'moon', kind: 'moon-direction', pixels: { centrePx: [1900, 240], sigmaPx: 2 } });
    const k = (after.observations as Draft[]).length - 1;
    expect(draftPoints(after).filter((p) => p.owner[1] === k).map((p) => p.label)).toEqual(['moon moon centre']);
    const scene = readSceneText(sceneYamlText(after), 'desk.yaml');
    expect(scene.observations[k]).toEqual({ id: 'moon', kind: 'moon-direction', pixels: { centrePx: [1900, 240], sigmaPx: 2 } });
    const resolved = resolvePixelObservations(scene);
    expect(resolved.moonDirections?.map((m) => m.measured.through)).toEqual(['camera']);
    const o = resolved.scene.observations[k];
    expect(o.kind === 'moon-direction' ? o.altitudeDeg : undefined).toBeGreaterThan(0);
    expect(moon.finish(korn, [[1900, 240]], { id: 'moon', through: 'wall', wall: 'no-such-wall', sigmaPx: '', note: '' })).toContain('Choose the wall');
    expect(applied(korn, 'moon-centre', [[1900, 240]], { id: 'm2', through: 'wall', wall: 'kornhaus-front', sigmaPx: '', note: '' }).observations).toContainEqual({ id: 'm2', kind: 'moon-direction', pixels: { centrePx: [1900, 240], wall: 'kornhaus-front' } });
  });

  it('a wedge of two edges in one direction is refused beside the wedge in the scene reader\'s or the camera\'s words', () => {
    const after = applied(korn, 'shadow-wedge', [[1616, 1110], [1480, 1010], [1344, 910]], { id: 'flat', group: '', sigmaPx: '', note: '' });
    const k = (after.observations as Draft[]).length - 1;
    const refusal = derivePerspective(after)!.pairRefusals.get(`observations[${k}]`);
    expect(refusal).toMatch(/edgesPx/);
  });

  it('asks for the overhang\'s tip as a third click on a wall from the camera, and writes tipPx in place of projectionM', () => {
    const overhang = tool('overhang-shadow');
    const values = { id: 'cornice', wall: 'kornhaus-front', projectionM: '0.6', projectionSigmaM: '0.02', note: '' };
    const steps = overhang.clicks(values, korn);
    expect(steps.length).toBe(3);
    expect(steps[2]).toMatch(/^Click the point of the overhang's front edge straight out from the first point/);
    const after = applied(korn, 'overhang-shadow', [[1000, 760], [1000, 800], [990, 775]], values);
    expect(last(after)).toEqual({ id: 'cornice', kind: 'overhang-shadow', wall: 'kornhaus-front', pixels: { fromPx: [1000, 760], toPx: [1000, 800], tipPx: [990, 775] } });
    const read = readSceneText(sceneYamlText(after), 'desk.yaml').observations.find((o) => o.id === 'cornice');
    expect(read).toMatchObject({ kind: 'overhang-shadow', wallId: 'kornhaus-front', pixels: { fromPx: [1000, 760], toPx: [1000, 800], tipPx: [990, 775] } });
    expect(tool('fin-shadow').clicks({ ...values, id: 'pier' }, korn)[2]).toMatch(/^Click the point of the fin's front edge/);
  });

  it('measures the overhang through its tip as `heliochron measure` does; with no camera found yet it is refused beside it, saying why', () => {
    const after = applied(korn, 'overhang-shadow', [[1300, 428], [1300, 470], [1330, 445]], { id: 'cornice', wall: 'kornhaus-front', projectionM: '', projectionSigmaM: '0.02', note: '' });
    const k = (after.observations as Draft[]).length - 1;
    const d = derive(after);
    expect(d.itemRefusals.get(`observations[${k}]`)).toBeUndefined();
    const direct = resolvePixelObservations(readSceneText(sceneYamlText(after), 'desk.yaml'));
    expect(direct.measurements.map((m) => m.field)).toEqual([`observations[${k}]`]);
    expect(d.measurements.map((m) => [m.field, m.values.map((v) => [v.name, v.value, v.sigma])]))
      .toEqual(direct.measurements.map((m) => [m.field, m.values.map((v) => [v.name, v.value, v.sigma])]));
    const noCamera = structuredClone(after);
    delete (noCamera.camera as Draft).wallLines;
    const e = derive(noCamera);
    expect(e.measurements).toEqual([]);
    expect(e.itemRefusals.get(`observations[${k}]`)).toMatch(/only the camera puts into the picture, and the camera is not found yet/);
  });

  it('keeps two clicks and the depth in metres where the wall has its figure or the scene has no camera', () => {
    const noCamera = structuredClone(korn);
    delete noCamera.camera;
    const values = { id: 'cornice', wall: 'kornhaus-front', projectionM: '0.6', projectionSigmaM: '0.02', note: '' };
    expect(tool('overhang-shadow').clicks(values, noCamera).length).toBe(2);
    const after = applied(noCamera, 'overhang-shadow', [[1000, 760], [1000, 800]], values);
    expect(getAt(last(after), ['pixels'])).toEqual({ fromPx: [1000, 760], toPx: [1000, 800], projectionM: 0.6, projectionSigmaM: 0.02 });
    const withFigure = structuredClone(korn);
    setAt(withFigure, ['walls', 0, 'imagePlane'], { pointsPx: [[1, 1], [2, 1], [2, 2], [1, 2]], widthM: 1, heightM: 1 });
    expect(tool('fin-shadow').clicks(values, withFigure).length).toBe(2);
  });

  it('the moon\'s forms make observations the scene reader reads, and the reader\'s message names the field to fill in', () => {
    const list = (d: Draft) => d.observations as Draft[];
    const draft = structuredClone(korn);
    for (const choice of ['moon-direction', 'moon-phase', 'moon-phase-named', 'moon-lit-side', 'moon-up', 'moon-not-up']) {
      list(draft).push(newMoonObservation(choice, list(draft).length + 1));
    }
    const n = list(korn).length;
    // as added, the empty fields are refused in the reader's words, naming the field
    const first = derive(draft).refusal!;
    expect(first.field).toBe(`observations[${n}].azimuthDeg`);
    // filled in as the forms write them (each field one path)
    setAt(draft, ['observations', n, 'azimuthDeg'], 250);
    setAt(draft, ['observations', n, 'altitudeDeg'], 12.5);
    expect(derive(draft).refusal!.field).toBe(`observations[${n + 1}].illuminatedFraction`);
    setAt(draft, ['observations', n + 1, 'illuminatedFraction'], 0.2);
    expect(derive(draft).refusal!.field).toBe(`observations[${n + 2}].phase`);
    setAt(draft, ['observations', n + 2, 'phase'], 'waning crescent');
    setAt(draft, ['observations', n + 3, 'litSideDeg'], -100);
    expect(derive(draft).refusal).toBeNull();
    const scene = readSceneText(sceneYamlText(draft), 'desk.yaml');
    expect(scene.observations.slice(n)).toEqual([
      { id: `moon-direction-${n + 1}`, kind: 'moon-direction', azimuthDeg: 250, azimuthSigmaDeg: 2, altitudeDeg: 12.5, altitudeSigmaDeg: 2 },
      { id: `moon-phase-${n + 2}`, kind: 'moon-phase', illuminatedFraction: 0.2, sigma: 0.05 },
      { id: `moon-phase-${n + 3}`, kind: 'moon-phase', phase: 'waning crescent', sigmaDeg: 22.5 },
      { id: `moon-lit-side-${n + 4}`, kind: 'moon-lit-side', litSideDeg: -100, sigmaDeg: 10 },
      { id: `moon-up-${n + 5}`, kind: 'moon-up' },
      { id: `moon-not-up-${n + 6}`, kind: 'moon-not-up' },
    ]);
    // both forms of a phase at once: the reader refuses it and says why
    setAt(draft, ['observations', n + 1, 'phase'], 'full');
    expect(derive(draft).refusal!.field).toMatch(new RegExp(`^observations\\[${n + 1}\\]`));
  });
});
