/**
 * The measuring desk's page: one document (the scene file's data, draft.ts), changed only by
 * transactions (history.ts); everything shown is derived from it by the library (derive.ts,
 * the worker). This file wires the parts to the page's elements and events.
 */
import { sniffPicture, type PictureFile } from '../cli/pictureFile.js';
import type { PixelPoint } from '../scene/types.js';
import { fill } from './dom.js';
import { draftPoints, emptyDraft, getAt, pathText, roundPx, setAt, type Draft, type DraftPoint, type DraftValue } from './draft.js';
import { startHistory } from './history.js';
import { derive, ownerOf } from './derive.js';
import { drawMagnifier, drawView, fitView, pictureToScreen, screenToPicture, zoomAround, type Mark } from './viewer.js';
import { renderForms } from './forms.js';
import { renderMeasurements } from './measurements.js';
import { fetchSession, readFolderFile, type Session } from './files.js';
import { overlayFor } from './exports.js';
import { AnswerPanel } from './answerPanel.js';
import { loadTiledPicture } from './pictureSource.js';
import type { TiledPicture } from './tiles.js';
import type { DeskApp, DeskState } from './deskApp.js';
import { autosave, change, removeAt } from './documentChanges.js';
import { instructionText, placeClick, renderToolPanel } from './toolPanel.js';
import { installKeys } from './keys.js';
import { openPicture, openScene, save } from './sceneDocument.js';
import { installFileMenu } from './fileMenu.js';

const $ = <T extends HTMLElement>(id: string): T => document.getElementById(id) as T;

let session: Session = { opened: null, kind: null };
let picture: TiledPicture | null = null;
/** The picture file's bytes and name as read (JPEG, PNG or TIFF), for its size and for the overlay export. */
let pictureBytes: Uint8Array | null = null;
let pictureName = '';
let state: DeskState;
let answers: AnswerPanel;
let app: DeskApp;

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
  fill($('measurements'), renderMeasurements({ draft: state.preview, derived, commit: (label, edit) => change(app, label, edit), remove: (label, path) => removeAt(app, label, path) }));
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
  fill($('measurements'), renderMeasurements({ draft, derived: state.derived, commit: (label, edit) => change(app, label, edit), remove: (label, path) => removeAt(app, label, path) }));
  fill($('forms'), renderForms({ draft, refusal: state.derived.refusal, itemRefusals: state.derived.itemRefusals, commit: (label, edit) => change(app, label, edit), sectionsOpen: state.sectionsOpen }));
  if (focusKey) (document.querySelector(`[data-field="${CSS.escape(focusKey)}"]`) as HTMLElement | null)?.focus();
  renderToolPanel(app);
  renderOverlay();
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
      placeClick(app, screenToPicture(state.view, sx, sy));
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
    $('instruction').textContent = instructionText(app);
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
      change(app, `move ${drag.point.label}`, (d) => setAt(d, path, moved));
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

// ---------------------------------------------------------------- files

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
    storageKey: 'heliochron-desk:empty',
  };
  answers = new AnswerPanel({
    draft: () => state.history.draft,
    derived: () => state.derived,
    redraw: () => renderOverlay(),
    notice,
  });
  app = {
    state, answers, notice, renderDocument, drawSoon, pictureSize, setZoom, zoomBy, loadPicture,
    pictureDimensions: () => (picture ? { width: picture.width, height: picture.height } : null),
  };
  installPointer();
  installKeys(app, () => save(app));
  installFileMenu(app, overlayPicture);
  $('mirror').addEventListener('change', () => {
    const on = ($('mirror') as HTMLInputElement).checked;
    change(app, on ? 'mark as a reversed print' : 'mark as not reversed', (d) => setAt(d, ['image', 'mirrored'], on ? true : undefined));
  });
  $('show-overlay').addEventListener('change', () => renderOverlay());
  ($('zoom-select') as HTMLSelectElement).addEventListener('change', (e) => setZoom((e.target as HTMLSelectElement).value));

  session = await fetchSession();
  if (session.kind === 'scene' && session.opened) await openScene(app, session.opened, true);
  else if (session.kind === 'picture' && session.opened) await openPicture(app, session.opened);
  else {
    ($('save-name') as HTMLInputElement).value = 'scene.yaml';
    state.storageKey = 'heliochron-desk:(empty)';
    setZoom('fit');
    autosave(app);
    renderDocument();
  }
  document.body.dataset.ready = 'true';
}

start().catch((error: unknown) => notice(`The desk could not start: ${error instanceof Error ? error.message : String(error)}`, 'error'));

export { ownerOf };
