/**
 * Every change of the desk's document is a transaction (history.ts): here the document is replaced by
 * the next one, everything derived from it is derived again, and the work in progress is kept in the
 * browser's storage (a reload or a crash loses nothing); the undo and redo buttons say what they undo.
 */
import { byId } from './dom.js';
import { getAt, pathText, setAt, type Draft, type DraftPath, type DraftPoint } from './draft.js';
import { commit, isUnsaved, type History } from './history.js';
import { derive } from './derive.js';
import type { DeskApp } from './deskApp.js';

/** The scene file name typed beside Save. */
export function sceneFileName(): string {
  return byId<HTMLInputElement>('save-name').value.trim();
}

/** Keep the work in the browser's storage, and show whether it is saved and what undo and redo would do. */
export function autosave(app: DeskApp): void {
  const { state } = app;
  try {
    localStorage.setItem(state.storageKey, JSON.stringify({ draft: state.history.draft, savedJson: state.history.savedJson, saveName: sceneFileName(), at: new Date().toISOString() }));
  } catch {
    // storage full or refused: the work stays in the page
  }
  byId('unsaved').textContent = isUnsaved(state.history) ? '(unsaved changes)' : '';
  byId<HTMLButtonElement>('undo').disabled = state.history.done.length === 0;
  byId<HTMLButtonElement>('redo').disabled = state.history.undone.length === 0;
  byId('undo').title = state.history.done.length ? `Undo: ${state.history.done[state.history.done.length - 1].label} (Ctrl+Z)` : 'Nothing to undo';
  byId('redo').title = state.history.undone.length ? `Redo: ${state.history.undone[state.history.undone.length - 1].label} (Ctrl+Shift+Z)` : 'Nothing to redo';
}

/** Replace the document's history (a transaction, an undo, a redo) and show what follows from it. */
export function setHistory(app: DeskApp, next: History, label?: string): void {
  const { state } = app;
  if (next === state.history) return;
  state.history = next;
  state.derived = derive(next.draft);
  if (state.selection && getAt(next.draft, state.selection) === undefined) state.selection = null;
  autosave(app);
  app.renderDocument();
  if (label) byId('instruction').dataset.last = label;
  app.answers.documentChanged(next.draft);
}

/** One transaction on the document, named for the undo button. */
export function change(app: DeskApp, label: string, edit: (d: Draft) => void): void {
  setHistory(app, commit(app.state.history, label, edit), label);
}

/** Delete an item. */
export function removeAt(app: DeskApp, label: string, path: DraftPath): void {
  change(app, label, (d) => setAt(d, path, undefined));
}

/** Delete a point: one point of a figure (with its plane coordinates), or the shadow or line it belongs to. */
export function deletePoint(app: DeskApp, p: DraftPoint): void {
  const [head] = p.owner;
  // a shadow, a walls' corner or a clicked camera line goes as a whole (a line of one point is no line)
  if (head === 'observations' || head === 'camera' || p.path[p.path.length - 1] === 'cornerPx') {
    removeAt(app, `delete ${pathText(p.owner)}`, p.owner);
    return;
  }
  const index = p.path[p.path.length - 1] as number;
  change(app, `delete point ${p.label}`, (d) => {
    setAt(d, p.path, undefined);
    const coords = getAt(d, [...p.owner, 'planePointsM']);
    if (Array.isArray(coords)) setAt(d, [...p.owner, 'planePointsM', index], undefined);
  });
}
