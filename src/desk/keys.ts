/**
 * The desk's keyboard: undo and redo, save, a tool by its key, Esc back to select and move, zoom,
 * the arrow keys (the keyboard cross while a tool is in use, the chosen point otherwise, else the
 * picture), Enter to place a click at the cross, Delete for the chosen point.
 */
import { byId } from './dom.js';
import { draftPoints, getAt, pathText, roundPx, setAt } from './draft.js';
import { redo, undo } from './history.js';
import { TOOLS } from './tools/registry.js';
import type { DeskApp } from './deskApp.js';
import { change, deletePoint, setHistory } from './documentChanges.js';
import { pickTool, placeClick, showInstruction } from './toolPanel.js';

/** True while the user types into a field (the keys then belong to the field). */
export function isTyping(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  return !!el && (el.tagName === 'INPUT' || el.tagName === 'TEXTAREA' || el.tagName === 'SELECT' || el.isContentEditable);
}

const ARROWS: Readonly<Record<string, readonly [number, number]>> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, -1], ArrowDown: [0, 1] };

/** An arrow key: the cross by 1 px (Shift: 0.1 px) with a tool, else the chosen point, else the picture by 50 px. */
function arrow(app: DeskApp, dir: readonly [number, number], fine: boolean): void {
  const { state } = app;
  const step = fine ? 0.1 : 1;
  if (state.toolId) {
    const { w, h: ph } = app.pictureSize();
    const from = state.cross ?? [w / 2, ph / 2];
    state.cross = [roundPx(from[0] + dir[0] * step), roundPx(from[1] + dir[1] * step)];
    app.drawSoon();
    return;
  }
  if (state.selection) {
    const sel = state.selection;
    const p = getAt(state.history.draft, sel) as number[];
    change(app, `nudge ${pathText(sel)}`, (d) => setAt(d, sel, [roundPx(p[0] + dir[0] * step), roundPx(p[1] + dir[1] * step)]));
    return;
  }
  state.view = { ...state.view, panX: state.view.panX - dir[0] * 50, panY: state.view.panY - dir[1] * 50 };
  app.drawSoon();
}

export function installKeys(app: DeskApp, save: () => Promise<void>): void {
  const { state } = app;
  window.addEventListener('keydown', (e) => {
    const mod = e.ctrlKey || e.metaKey;
    if (mod && e.key.toLowerCase() === 'z') {
      if (isTyping(e.target)) return;
      e.preventDefault();
      setHistory(app, e.shiftKey ? redo(state.history) : undo(state.history));
      return;
    }
    if (mod && e.key.toLowerCase() === 'y') {
      if (isTyping(e.target)) return;
      e.preventDefault();
      setHistory(app, redo(state.history));
      return;
    }
    if (mod && e.key.toLowerCase() === 's') {
      e.preventDefault();
      void save();
      return;
    }
    if (mod || e.altKey || isTyping(e.target)) return;
    if (e.key === 'Escape') {
      pickTool(app, null);
      return;
    }
    const tool = TOOLS.find((t) => t.key === e.key.toLowerCase());
    if (tool && e.key.length === 1) {
      pickTool(app, tool.id);
      return;
    }
    if (e.key === '+' || e.key === '=') return app.zoomBy(1.25);
    if (e.key === '-') return app.zoomBy(0.8);
    if (e.key === '0') return app.setZoom('fit');
    if (e.key === 'Backspace' && state.clicks.length) {
      e.preventDefault();
      state.clicks = state.clicks.slice(0, -1);
      showInstruction(app);
      app.drawSoon();
      return;
    }
    const dir = ARROWS[e.key];
    if (dir) {
      e.preventDefault();
      arrow(app, dir, e.shiftKey);
      return;
    }
    if (e.key === 'Enter' && state.toolId && state.cross && document.activeElement === byId('viewer')) {
      placeClick(app, state.cross);
      return;
    }
    if ((e.key === 'Delete' || e.key === 'Backspace') && state.selection) {
      e.preventDefault();
      const p = draftPoints(state.history.draft).find((x) => pathText(x.path) === pathText(state.selection!));
      if (p) deletePoint(app, p);
    }
  });
}
