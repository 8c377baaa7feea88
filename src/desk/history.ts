/**
 * Every change of the desk's document is a transaction: a label and the document before and
 * after. The log gives undo and redo, and "unsaved changes" compares the document with the one
 * last saved. Plain immutable values: each function returns a new History.
 */
import type { Draft } from './draft.js';

export interface Transaction {
  readonly label: string;
  readonly before: Draft;
  readonly after: Draft;
}

export interface History {
  readonly draft: Draft;
  readonly done: readonly Transaction[];
  readonly undone: readonly Transaction[];
  /** The document as last saved or opened (JSON text), null when never saved. */
  readonly savedJson: string | null;
}

/** Most transactions kept for undo (common practice: enough for a long session, bounded memory). */
export const MAX_UNDO = 500;

export function startHistory(draft: Draft, savedJson: string | null): History {
  return { draft, done: [], undone: [], savedJson };
}

/**
 * Apply a change: `change` edits a deep copy of the document in place.
 * @example commit(h, 'move G 2', (d) => setAt(d, ['groundPlane', 'pointsPx', 1], [420, 860]))
 */
export function commit(history: History, label: string, change: (draft: Draft) => void): History {
  const after = structuredClone(history.draft) as Draft;
  change(after);
  if (JSON.stringify(after) === JSON.stringify(history.draft)) return history;
  const done = [...history.done, { label, before: history.draft, after }].slice(-MAX_UNDO);
  return { ...history, draft: after, done, undone: [] };
}

export function undo(history: History): History {
  const last = history.done[history.done.length - 1];
  if (!last) return history;
  return { ...history, draft: last.before, done: history.done.slice(0, -1), undone: [...history.undone, last] };
}

export function redo(history: History): History {
  const next = history.undone[history.undone.length - 1];
  if (!next) return history;
  return { ...history, draft: next.after, done: [...history.done, next], undone: history.undone.slice(0, -1) };
}

export function isUnsaved(history: History): boolean {
  return history.savedJson === null ? history.done.length > 0 : JSON.stringify(history.draft) !== history.savedJson;
}

export function markSaved(history: History): History {
  return { ...history, savedJson: JSON.stringify(history.draft) };
}
