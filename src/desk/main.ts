/**
 * The measuring desk's page: one document (the scene file's data, draft.ts), changed only by
 * transactions (history.ts); everything shown is derived from it by the library (derive.ts,
 * the worker). This file wires the parts to the page's elements and events.
 */
import { parseSceneText } from '../scene/parseSceneText.js';
import { sniffPicture, type PictureFile } from '../cli/pictureFile.js';
import type { PixelPoint } from '../scene/types.js';
import { h, fill } from './dom.js';
import { draftPoints, emptyDraft, getAt, pathText, roundPx, setAt, wallIds, type Draft, type DraftPath, type DraftPoint, type DraftValue } from './draft.js';
import { commit, isUnsaved, markSaved, redo, startHistory, undo, type History } from './history.js';
import { derive, ownerOf, type Derived } from './derive.js';
import { drawMagnifier, drawView, fitView, pictureToScreen, screenToPicture, zoomAround, type Mark, type ViewTransform } from './viewer.js';
import { TOOLS } from './tools/registry.js';
import type { DeskTool, ToolValues } from './tools/tool.js';
import { renderForms } from './forms.js';
import { renderMeasurements } from './measurements.js';
import { sceneYamlText } from './sceneYaml.js';
import { fetchSession, readFolderFile, saveAskingFirst, type Session } from './files.js';
import { overlayFor, exportOverlaySvg, exportHtmlReport } from './exports.js';
import { AnswerPanel } from './answerPanel.js';
import { loadTiledPicture } from './pictureSource.js';
import type { TiledPicture } from './tiles.js';

const $ = <T extends HTMLElement>(id: string): T => document.getElementById(id) as T;

interface DeskState {
  history: History;
  derived: Derived;
  view: ViewTransform;
  toolId: string | null;
  toolValues: Record<string, Record<string, string>>;
  clicks: PixelPoint[];
  selection: DraftPath | null;
  /** The keyboard cross, picture pixels, for placing points without a mouse. */
  cross: PixelPoint | null;
  pointer: PixelPoint | null;
  /** While a point is dragged: the document with the point moved (not yet committed). */
  preview: Draft | null;
  sectionsOpen: Map<string, boolean>;
}

let session: Session = { opened: null, kind: null };
let picture: TiledPicture | null = null;
/** The picture file's bytes and name as read (JPEG, PNG or TIFF), for its size and for the overlay export. */
let pictureBytes: Uint8Array | null = null;
let pictureName = '';
let state: DeskState;
let answers: AnswerPanel;
let storageKey = 'heliochron-desk:empty';

function notice(text: string, kind: 'info' | 'error' = 'info'): void {
  const el = $('notice');
  el.textContent = text;
  el.className = `notice ${kind}`;
  el.hidden = false;
  window.clearTimeout((notice as unknown as { timer?: number }).timer);
  (notice as unknown as { timer?: number }).timer = window.setTimeout(() => { el.hidden = true; }, kind === 'error' ? 12000 : 5000);
}

function pictureSize(): { w: number; h: number } {
  const w = Number(getAt(state.history.draft, ['image', 'widthPx'])) || picture?.width || 1000;
  const hh = Number(getAt(state.history.draft, ['image', 'heightPx'])) || picture?.height || 750;
  return { w, h: hh };
}

function currentTool(): DeskTool | null {
  return TOOLS.find((t) => t.id === state.toolId) ?? null;
}

function toolValues(tool: DeskTool): ToolValues {
  const values = { ...Object.fromEntries(tool.fields.map((f) => [f.name, f.initial])), ...(state.toolValues[tool.id] ?? {}) };
  for (const f of tool.fields) if (f.kind === 'wall' && !wallIds(state.history.draft).includes(values[f.name])) values[f.name] = wallIds(state.history.draft)[0] ?? '';
  return values;
}

// ---------------------------------------------------------------- changes

function setHistory(next: History, label?: string): void {
  if (next === state.history) return;
  state.history = next;
  state.derived = derive(next.draft);
  if (state.selection && getAt(next.draft, state.selection) === undefined) state.selection = null;
  autosave();
  renderDocument();
  if (label) $('instruction').dataset.last = label;
  answers.documentChanged(next.draft);
}

function change(label: string, edit: (d: Draft) => void): void {
  setHistory(commit(state.history, label, edit), label);
}

/** Delete an item, or one point of a figure (with its plane coordinates). */
function removeAt(label: string, path: DraftPath): void {
  change(label, (d) => setAt(d, path, undefined));
}

function deletePoint(p: DraftPoint): void {
  const [head] = p.owner;
  // a shadow, a walls' corner or a clicked camera line goes as a whole (a line of one point is no line)
  if (head === 'observations' || head === 'camera' || p.path[p.path.length - 1] === 'cornerPx') {
    removeAt(`delete ${pathText(p.owner)}`, p.owner);
    return;
  }
  const index = p.path[p.path.length - 1] as number;
  change(`delete point ${p.label}`, (d) => {
    setAt(d, p.path, undefined);
    const coords = getAt(d, [...p.owner, 'planePointsM']);
    if (Array.isArray(coords)) setAt(d, [...p.owner, 'planePointsM', index], undefined);
  });
}

function autosave(): void {
  try {
    localStorage.setItem(storageKey, JSON.stringify({ draft: state.history.draft, savedJson: state.history.savedJson, saveName: sceneFileName(), at: new Date().toISOString() }));
  } catch {
    // storage full or refused: the work stays in the page
  }
  $('unsaved').textContent = isUnsaved(state.history) ? '(unsaved changes)' : '';
  ($('undo') as HTMLButtonElement).disabled = state.history.done.length === 0;
  ($('redo') as HTMLButtonElement).disabled = state.history.undone.length === 0;
  $('undo').title = state.history.done.length ? `Undo: ${state.history.done[state.history.done.length - 1].label} (Ctrl+Z)` : 'Nothing to undo';
  $('redo').title = state.history.undone.length ? `Redo: ${state.history.undone[state.history.undone.length - 1].label} (Ctrl+Shift+Z)` : 'Nothing to redo';
}

// ---------------------------------------------------------------- drawing

function marks(): Mark[] {
  const draft = state.preview ?? state.history.draft;
  const out: Mark[] = draftPoints(draft).map((p) => ({
    xy: p.xy,
    label: p.label,
    kind: state.selection && pathText(state.selection) === pathText(p.path)
      ? 'selected'
      : state.derived.itemRefusals.has(pathText(p.owner)) || state.derived.perspective?.pairRefusals.has(pathText(p.owner)) ? 'refused' : 'point',
  }));
  state.clicks.forEach((c, k) => out.push({ xy: c, label: String(k + 1), kind: 'pending' }));
  if (state.cross && state.toolId) out.push({ xy: state.cross, label: '+', kind: 'pending' });
  return out;
}

function pendingLines(): (readonly [PixelPoint, PixelPoint])[] {
  const lines: [PixelPoint, PixelPoint][] = [];
  for (let k = 1; k < state.clicks.length; k += 1) lines.push([state.clicks[k - 1], state.clicks[k]]);
  return lines;
}

/** The view transform on the viewer element, at once (tests and assistive tools read it). */
function publishView(): void {
  const viewer = $('viewer');
  viewer.dataset.zoom = String(state.view.zoom);
  viewer.dataset.panX = String(state.view.panX);
  viewer.dataset.panY = String(state.view.panY);
}

let frame = 0;
function drawSoon(): void {
  publishView();
  if (frame) return;
  frame = requestAnimationFrame(() => {
    frame = 0;
    drawPicture();
  });
}

/** While a point is dragged, its measurement follows it (derived once per frame from the moved document). */
let previewDerivedFor: Draft | null = null;
function derivePreview(): void {
  if (!state.preview || state.preview === previewDerivedFor) return;
  previewDerivedFor = state.preview;
  const derived = derive(state.preview);
  fill($('measurements'), renderMeasurements({ draft: state.preview, derived, commit: change, remove: removeAt }));
}

function drawPicture(): void {
  derivePreview();
  const { w, h: ph } = pictureSize();
  const canvas = $('picture') as HTMLCanvasElement;
  const all = marks();
  drawView(canvas, picture, w, ph, state.view, all, pendingLines());
  const overlay = $('overlay');
  overlay.style.transform = `matrix(${state.view.zoom}, 0, 0, ${state.view.zoom}, ${state.view.panX}, ${state.view.panY})`;
  publishView();
  $('zoom-readout').textContent = `${Math.round(state.view.zoom * 1000) / 10}%`;
  const at = state.pointer ?? state.cross;
  const magnifier = $('magnifier') as HTMLCanvasElement;
  if (at) {
    $('pointer-pos').textContent = `x ${at[0].toFixed(1)}, y ${at[1].toFixed(1)} px`;
    drawMagnifier(magnifier, picture, at, all);
    // beside the pointer (above and to the right, or wherever there is room), never on the point clicked
    const [sx, sy] = pictureToScreen(state.view, at);
    const box = $('viewer').getBoundingClientRect();
    const size = magnifier.offsetWidth || 176;
    const left = sx + 24 + size < box.width ? sx + 24 : sx - 24 - size;
    const top = sy - 24 - size > 0 ? sy - 24 - size : sy + 24;
    magnifier.style.left = `${Math.max(0, Math.round(left))}px`;
    magnifier.style.top = `${Math.max(0, Math.round(top))}px`;
    magnifier.hidden = false;
  } else magnifier.hidden = true;
}

function renderOverlay(): void {
  const overlay = $('overlay');
  const svgText = overlayFor(state.derived, answers.chosenPrediction(state.derived));
  if (!svgText || !($('show-overlay') as HTMLInputElement).checked) {
    fill(overlay, []);
    return;
  }
  // parsed as an SVG document (the library escapes every user text in it), then adopted
  const doc = new DOMParser().parseFromString(svgText, 'image/svg+xml');
  const svg = doc.documentElement;
  if (svg.nodeName !== 'svg') {
    fill(overlay, []);
    return;
  }
  fill(overlay, [document.importNode(svg, true)]);
}

function renderDocument(): void {
  const draft = state.history.draft;
  $('doc-name').textContent = String(getAt(draft, ['title']) ?? '');
  ($('mirror') as HTMLInputElement).checked = getAt(draft, ['image', 'mirrored']) === true;
  const focused = document.activeElement as HTMLElement | null;
  const focusKey = focused?.dataset?.field;
  fill($('measurements'), renderMeasurements({ draft, derived: state.derived, commit: change, remove: removeAt }));
  fill($('forms'), renderForms({ draft, refusal: state.derived.refusal, itemRefusals: state.derived.itemRefusals, commit: change, sectionsOpen: state.sectionsOpen }));
  if (focusKey) (document.querySelector(`[data-field="${CSS.escape(focusKey)}"]`) as HTMLElement | null)?.focus();
  renderToolPanel();
  renderOverlay();
  drawSoon();
}

// ---------------------------------------------------------------- tools

function instructionText(): string {
  const tool = currentTool();
  if (!tool) {
    return state.selection
      ? `Point ${draftPoints(state.history.draft).find((p) => pathText(p.path) === pathText(state.selection!))?.label ?? ''} chosen: drag it, nudge it with the arrow keys (Shift: 0.1 px), or press Delete.`
      : 'Select and move: click a point to choose it, drag it to move it; drag elsewhere to move the picture. Pick a tool to measure.';
  }
  const steps = tool.clicks(toolValues(tool), state.history.draft);
  const k = state.clicks.length;
  return `${tool.name}, click ${Math.min(k + 1, steps.length)} of ${steps.length}: ${steps[Math.min(k, steps.length - 1)]}${k > 0 ? ' (Backspace: take back the last click; Esc: drop them)' : ''}`;
}

function renderToolPanel(): void {
  const buttons = TOOLS.map((tool) => {
    const b = h('button', { type: 'button', class: `tool${state.toolId === tool.id ? ' active' : ''}`, 'aria-pressed': String(state.toolId === tool.id), 'data-tool': tool.id }, [
      h('span', { class: 'key', text: tool.key.toUpperCase() }),
      h('span', { text: tool.name }),
    ]);
    b.addEventListener('click', () => pickTool(tool.id));
    return b;
  });
  const select = h('button', { type: 'button', class: `tool${state.toolId === null ? ' active' : ''}`, 'aria-pressed': String(state.toolId === null), 'data-tool': 'select' }, [
    h('span', { class: 'key', text: 'Esc' }),
    h('span', { text: 'Select and move' }),
  ]);
  select.addEventListener('click', () => pickTool(null));
  fill($('tool-buttons'), [select, ...buttons]);

  const tool = currentTool();
  const fieldsEl = $('tool-fields');
  if (!tool) {
    fill(fieldsEl, []);
  } else {
    const values = toolValues(tool);
    const walls = wallIds(state.history.draft);
    const rows = tool.fields.filter((f) => !f.when || f.when(values)).map((f) => {
      const id = `tool-${tool.id}-${f.name}`;
      let input: HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement;
      if (f.kind === 'wall' || f.kind === 'choice') {
        const choices = f.kind === 'wall' ? walls.map((w) => [w, w] as const) : f.choices ?? [];
        input = h('select', { id, 'data-tool-field': f.name }, choices.length ? choices.map(([v, words]) => h('option', { value: v, text: words })) : [h('option', { value: '', text: '(add a wall under Walls first)' })]);
      } else if (f.kind === 'lines') {
        input = h('textarea', { id, 'data-tool-field': f.name, rows: 5, spellcheck: 'false' });
      } else {
        input = h('input', { type: 'text', id, 'data-tool-field': f.name, inputmode: f.kind === 'number' ? 'decimal' : undefined, spellcheck: 'false' });
      }
      input.value = values[f.name] ?? '';
      input.addEventListener('change', () => {
        state.toolValues[tool.id] = { ...(state.toolValues[tool.id] ?? {}), [f.name]: input.value };
        if (f.kind === 'choice' || f.kind === 'lines') renderToolPanel();
        $('instruction').textContent = instructionText();
      });
      return h('div', { class: 'field' }, [h('label', { for: id, text: f.label }), input]);
    });
    fill(fieldsEl, [h('h3', { text: tool.name }), ...rows]);
  }
  $('instruction').textContent = instructionText();
}

function pickTool(id: string | null): void {
  state.toolId = id;
  state.clicks = [];
  if (id !== null) state.selection = null;
  renderToolPanel();
  drawSoon();
}

function placeClick(p: PixelPoint): void {
  const tool = currentTool();
  if (!tool) return;
  const { w, h: ph } = pictureSize();
  if (p[0] < 0 || p[1] < 0 || p[0] > w || p[1] > ph) {
    notice(`That point (x ${p[0].toFixed(1)}, y ${p[1].toFixed(1)}) is outside the picture (${w} x ${ph} px).`, 'error');
    return;
  }
  state.clicks = [...state.clicks, [roundPx(p[0]), roundPx(p[1])]];
  const values = toolValues(tool);
  const steps = tool.clicks(values, state.history.draft);
  if (state.clicks.length >= steps.length) {
    const result = tool.finish(state.history.draft, state.clicks, values);
    state.clicks = [];
    if (typeof result === 'string') notice(result, 'error');
    else change(result.label, result.change);
  }
  $('instruction').textContent = instructionText();
  drawSoon();
}

// ---------------------------------------------------------------- pointer and keys

function viewerPoint(event: MouseEvent): [number, number] {
  const box = $('viewer').getBoundingClientRect();
  return [event.clientX - box.left, event.clientY - box.top];
}

function nearestPoint(sx: number, sy: number): DraftPoint | null {
  let best: DraftPoint | null = null;
  let bestD = 9; // screen px
  for (const p of draftPoints(state.history.draft)) {
    const [x, y] = pictureToScreen(state.view, p.xy);
    const d = Math.hypot(x - sx, y - sy);
    if (d < bestD) {
      bestD = d;
      best = p;
    }
  }
  return best;
}

function installPointer(): void {
  const viewer = $('viewer');
  let drag: { kind: 'pan'; sx: number; sy: number; panX: number; panY: number } | { kind: 'point'; point: DraftPoint; moved: boolean } | null = null;
  let spaceHeld = false;
  window.addEventListener('keydown', (e) => { if (e.code === 'Space' && e.target === viewer) { spaceHeld = true; e.preventDefault(); } });
  window.addEventListener('keyup', (e) => { if (e.code === 'Space') spaceHeld = false; });

  viewer.addEventListener('pointerdown', (e) => {
    viewer.focus({ preventScroll: true });
    const [sx, sy] = viewerPoint(e);
    if (e.button === 1 || (e.button === 0 && spaceHeld)) {
      drag = { kind: 'pan', sx, sy, panX: state.view.panX, panY: state.view.panY };
      viewer.setPointerCapture(e.pointerId);
      e.preventDefault();
      return;
    }
    if (e.button !== 0) return;
    if (state.toolId) {
      placeClick(screenToPicture(state.view, sx, sy));
      return;
    }
    const hit = nearestPoint(sx, sy);
    if (hit) {
      state.selection = hit.path;
      drag = { kind: 'point', point: hit, moved: false };
    } else {
      state.selection = null;
      drag = { kind: 'pan', sx, sy, panX: state.view.panX, panY: state.view.panY };
    }
    viewer.setPointerCapture(e.pointerId);
    $('instruction').textContent = instructionText();
    drawSoon();
  });
  viewer.addEventListener('pointermove', (e) => {
    const [sx, sy] = viewerPoint(e);
    state.pointer = screenToPicture(state.view, sx, sy);
    if (drag?.kind === 'pan') {
      state.view = { ...state.view, panX: drag.panX + sx - drag.sx, panY: drag.panY + sy - drag.sy };
    } else if (drag?.kind === 'point') {
      drag.moved = true;
      const preview = structuredClone(state.history.draft) as Draft;
      setAt(preview, drag.point.path, [roundPx(state.pointer[0]), roundPx(state.pointer[1])]);
      state.preview = preview;
    }
    drawSoon();
  });
  const end = (): void => {
    if (drag?.kind === 'point' && drag.moved && state.preview) {
      const moved = getAt(state.preview, drag.point.path) as DraftValue;
      const path = drag.point.path;
      state.preview = null;
      change(`move ${drag.point.label}`, (d) => setAt(d, path, moved));
    }
    state.preview = null;
    drag = null;
    drawSoon();
  };
  viewer.addEventListener('pointerup', end);
  viewer.addEventListener('pointercancel', end);
  viewer.addEventListener('pointerleave', () => {
    state.pointer = null;
    drawSoon();
  });
  viewer.addEventListener('wheel', (e) => {
    e.preventDefault();
    const [sx, sy] = viewerPoint(e);
    state.view = zoomAround(state.view, Math.exp(-e.deltaY * 0.0015), sx, sy);
    drawSoon();
  }, { passive: false });
  window.addEventListener('resize', drawSoon);
}

function isTyping(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  return !!el && (el.tagName === 'INPUT' || el.tagName === 'TEXTAREA' || el.tagName === 'SELECT' || el.isContentEditable);
}

function zoomBy(factor: number): void {
  const box = $('viewer').getBoundingClientRect();
  state.view = zoomAround(state.view, factor, box.width / 2, box.height / 2);
  drawSoon();
}

function setZoom(value: string): void {
  const box = $('viewer').getBoundingClientRect();
  const { w, h: ph } = pictureSize();
  if (value === 'fit') state.view = fitView(box.width, box.height, w, ph);
  else {
    const zoom = Number(value);
    // keep the picture point at the centre of the box in place, on whole screen pixels
    const [cx, cy] = screenToPicture(state.view, box.width / 2, box.height / 2);
    state.view = { zoom, panX: Math.round(box.width / 2 - zoom * cx), panY: Math.round(box.height / 2 - zoom * cy) };
  }
  drawSoon();
}

function installKeys(): void {
  window.addEventListener('keydown', (e) => {
    const mod = e.ctrlKey || e.metaKey;
    if (mod && e.key.toLowerCase() === 'z') {
      if (isTyping(e.target)) return;
      e.preventDefault();
      setHistory(e.shiftKey ? redo(state.history) : undo(state.history));
      return;
    }
    if (mod && e.key.toLowerCase() === 'y') {
      if (isTyping(e.target)) return;
      e.preventDefault();
      setHistory(redo(state.history));
      return;
    }
    if (mod && e.key.toLowerCase() === 's') {
      e.preventDefault();
      void save();
      return;
    }
    if (mod || e.altKey || isTyping(e.target)) return;
    if (e.key === 'Escape') {
      pickTool(null);
      return;
    }
    const tool = TOOLS.find((t) => t.key === e.key.toLowerCase());
    if (tool && e.key.length === 1) {
      pickTool(tool.id);
      return;
    }
    if (e.key === '+' || e.key === '=') return zoomBy(1.25);
    if (e.key === '-') return zoomBy(0.8);
    if (e.key === '0') return setZoom('fit');
    if (e.key === 'Backspace' && state.clicks.length) {
      e.preventDefault();
      state.clicks = state.clicks.slice(0, -1);
      $('instruction').textContent = instructionText();
      drawSoon();
      return;
    }
    const arrows: Record<string, [number, number]> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, -1], ArrowDown: [0, 1] };
    const dir = arrows[e.key];
    if (dir) {
      e.preventDefault();
      const step = e.shiftKey ? 0.1 : 1;
      if (state.toolId) {
        const { w, h: ph } = pictureSize();
        const from = state.cross ?? [w / 2, ph / 2];
        state.cross = [roundPx(from[0] + dir[0] * step), roundPx(from[1] + dir[1] * step)];
        drawSoon();
        return;
      }
      if (state.selection) {
        const sel = state.selection;
        const p = getAt(state.history.draft, sel) as number[];
        change(`nudge ${pathText(sel)}`, (d) => setAt(d, sel, [roundPx(p[0] + dir[0] * step), roundPx(p[1] + dir[1] * step)]));
        return;
      }
      state.view = { ...state.view, panX: state.view.panX - dir[0] * 50, panY: state.view.panY - dir[1] * 50 };
      drawSoon();
      return;
    }
    if (e.key === 'Enter' && state.toolId && state.cross && document.activeElement === $('viewer')) {
      placeClick(state.cross);
      return;
    }
    if ((e.key === 'Delete' || e.key === 'Backspace') && state.selection) {
      e.preventDefault();
      const p = draftPoints(state.history.draft).find((x) => pathText(x.path) === pathText(state.selection!));
      if (p) deletePoint(p);
    }
  });
}

// ---------------------------------------------------------------- files

function sceneFileName(): string {
  return ($('save-name') as HTMLInputElement).value.trim();
}

async function save(): Promise<void> {
  const name = sceneFileName();
  if (!/^[^/\\]+\.(ya?ml)$/i.test(name) || name.startsWith('.')) {
    notice(`scene file: ${JSON.stringify(name)} is not allowed; expected a file name ending .yaml or .yml, in the folder of the picture`, 'error');
    return;
  }
  const text = sceneYamlText(state.history.draft);
  try {
    if (!(await saveAskingFirst(name, text))) {
      notice(`Not saved: ${name} exists already and was kept.`);
      return;
    }
    setHistory(markSaved(state.history));
    autosave();
    const problem = state.derived.refusal ? ` The scene reader does not take it yet: ${state.derived.refusal.message}` : '';
    notice(`Saved ${name}.${problem}`, problem ? 'error' : 'info');
  } catch (error) {
    notice(error instanceof Error ? error.message : String(error), 'error');
  }
}

async function openScene(name: string, restore: boolean): Promise<void> {
  const bytes = await readFolderFile(name);
  const text = new TextDecoder('utf-8').decode(bytes);
  let data: Draft;
  try {
    data = parseSceneText(text, name) as Draft;
    if (data === null || typeof data !== 'object' || Array.isArray(data)) throw new Error(`${name}: the file does not hold a scene (a map of fields)`);
  } catch (error) {
    notice(error instanceof Error ? error.message : String(error), 'error');
    return;
  }
  storageKey = `heliochron-desk:${name}`;
  ($('save-name') as HTMLInputElement).value = name;
  let history = startHistory(data, JSON.stringify(data));
  const stored = restore ? readStored() : null;
  if (stored && JSON.stringify(stored.draft) !== JSON.stringify(data)) {
    history = { ...startHistory(stored.draft, stored.savedJson), savedJson: stored.savedJson };
    notice(`Your unsaved work on ${name} from ${stored.at} was restored from this browser's storage. Undo is not kept across a reload.`);
  }
  const file = getAt(history.draft, ['image', 'file']);
  if (typeof file === 'string') await loadPicture(file);
  state.history = history;
  state.derived = derive(history.draft);
  state.selection = null;
  setZoom('fit');
  autosave();
  renderDocument();
  answers.documentChanged(history.draft);
}

interface Stored {
  readonly draft: Draft;
  readonly savedJson: string | null;
  readonly saveName?: string;
  readonly at: string;
}

function readStored(): Stored | null {
  try {
    const raw = localStorage.getItem(storageKey);
    return raw ? (JSON.parse(raw) as Stored) : null;
  } catch {
    return null;
  }
}

async function loadPicture(name: string): Promise<void> {
  try {
    const bytes = await readFolderFile(name);
    pictureBytes = bytes;
    pictureName = name;
    picture?.dispose();
    picture = await loadTiledPicture(bytes, name, (done, total) => { $('instruction').textContent = `Preparing ${name} for zooming: ${Math.floor((100 * done) / total)}%`; });
    picture.onTileReady = drawSoon;
  } catch (error) {
    picture = null;
    pictureBytes = null;
    notice(error instanceof Error ? error.message : String(error), 'error');
  }
}

/** The picture to embed in an exported overlay: only JPEG and PNG, refused as the command line refuses it. */
function overlayPicture(): PictureFile | null | 'refused' {
  if (!pictureBytes) return null;
  try {
    return sniffPicture(pictureBytes, 'image.file', pictureName);
  } catch (error) {
    notice(`${error instanceof Error ? error.message : String(error)} (the overlay embeds the picture as the command line does)`, 'error');
    return 'refused';
  }
}

async function openPicture(name: string): Promise<void> {
  await loadPicture(name);
  storageKey = `heliochron-desk:${name}`;
  const base = name.replace(/\.[^.]+$/, '');
  ($('save-name') as HTMLInputElement).value = `${base}.yaml`;
  const stored = readStored();
  if (stored) {
    state.history = startHistory(stored.draft, stored.savedJson);
    if (stored.saveName) ($('save-name') as HTMLInputElement).value = stored.saveName;
    if (isUnsaved(state.history)) notice(`Your work on ${name} from ${stored.at} was restored from this browser's storage. Undo is not kept across a reload.`);
  } else {
    state.history = startHistory(emptyDraft(name, picture?.width ?? null, picture?.height ?? null), null);
  }
  state.derived = derive(state.history.draft);
  setZoom('fit');
  autosave();
  renderDocument();
}

// ---------------------------------------------------------------- start

async function start(): Promise<void> {
  state = {
    history: startHistory(emptyDraft(null, null, null), null),
    derived: derive(emptyDraft(null, null, null)),
    view: { zoom: 1, panX: 0, panY: 0 },
    toolId: null,
    toolValues: {},
    clicks: [],
    selection: null,
    cross: null,
    pointer: null,
    preview: null,
    sectionsOpen: new Map(),
  };
  answers = new AnswerPanel({
    draft: () => state.history.draft,
    derived: () => state.derived,
    redraw: () => renderOverlay(),
    notice,
  });
  installPointer();
  installKeys();
  $('undo').addEventListener('click', () => setHistory(undo(state.history)));
  $('redo').addEventListener('click', () => setHistory(redo(state.history)));
  $('save').addEventListener('click', () => void save());
  $('open').addEventListener('click', () => {
    const name = window.prompt('Open which scene file of this folder? (its name, e.g. hall.yaml)', sceneFileName());
    if (name && (!isUnsaved(state.history) || window.confirm('Your changes are not saved. Open another file all the same?'))) {
      openScene(name.trim(), false).catch((error: unknown) => notice(error instanceof Error ? error.message : String(error), 'error'));
    }
  });
  $('export-overlay').addEventListener('click', () => {
    const file = overlayPicture();
    if (file !== 'refused') void exportOverlaySvg(state.derived, file, sceneFileName(), notice);
  });
  $('export-report').addEventListener('click', () => void exportHtmlReport(state.history.draft, sceneFileName(), state.history.savedJson === JSON.stringify(state.history.draft), notice));
  $('mirror').addEventListener('change', () => {
    const on = ($('mirror') as HTMLInputElement).checked;
    change(on ? 'mark as a reversed print' : 'mark as not reversed', (d) => setAt(d, ['image', 'mirrored'], on ? true : undefined));
  });
  $('show-overlay').addEventListener('change', () => renderOverlay());
  ($('zoom-select') as HTMLSelectElement).addEventListener('change', (e) => setZoom((e.target as HTMLSelectElement).value));
  window.addEventListener('beforeunload', (e) => {
    if (isUnsaved(state.history)) {
      e.preventDefault();
      e.returnValue = '';
    }
  });

  session = await fetchSession();
  if (session.kind === 'scene' && session.opened) await openScene(session.opened, true);
  else if (session.kind === 'picture' && session.opened) await openPicture(session.opened);
  else {
    ($('save-name') as HTMLInputElement).value = 'scene.yaml';
    storageKey = 'heliochron-desk:(empty)';
    setZoom('fit');
    autosave();
    renderDocument();
  }
  document.body.dataset.ready = 'true';
}

start().catch((error: unknown) => notice(`The desk could not start: ${error instanceof Error ? error.message : String(error)}`, 'error'));

export { ownerOf };
