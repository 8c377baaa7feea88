/**
 * Opening and saving the scene file: Save writes the document as the scene file's YAML through the
 * server (never over an existing file without asking, files.ts); Open reads one and shows the scene
 * reader's refusal by name; a picture opened alone starts an empty scene. Work kept in the browser's
 * storage (documentChanges.ts) is restored when it differs from the file.
 */
import { parseSceneText } from '../scene/parseSceneText.js';
import { byId } from './dom.js';
import { emptyDraft, getAt, type Draft } from './draft.js';
import { isUnsaved, markSaved, startHistory } from './history.js';
import { derive } from './derive.js';
import { sceneYamlText } from './sceneYaml.js';
import { readFolderFile, saveAskingFirst } from './files.js';
import type { DeskApp } from './deskApp.js';
import { autosave, sceneFileName, setHistory } from './documentChanges.js';

interface Stored {
  readonly draft: Draft;
  readonly savedJson: string | null;
  readonly saveName?: string;
  readonly at: string;
}

function readStored(app: DeskApp): Stored | null {
  try {
    const raw = localStorage.getItem(app.state.storageKey);
    return raw ? (JSON.parse(raw) as Stored) : null;
  } catch {
    return null;
  }
}

/** Save the document as the scene file named beside Save, asking before replacing a file. */
export async function save(app: DeskApp): Promise<void> {
  const name = sceneFileName();
  if (!/^[^/\\]+\.(ya?ml)$/i.test(name) || name.startsWith('.')) {
    app.notice(`scene file: ${JSON.stringify(name)} is not allowed; expected a file name ending .yaml or .yml, in the folder of the picture`, 'error');
    return;
  }
  const text = sceneYamlText(app.state.history.draft);
  try {
    if (!(await saveAskingFirst(name, text))) {
      app.notice(`Not saved: ${name} exists already and was kept.`);
      return;
    }
    setHistory(app, markSaved(app.state.history));
    autosave(app);
    const problem = app.state.derived.refusal ? ` The scene reader does not take it yet: ${app.state.derived.refusal.message}` : '';
    app.notice(`Saved ${name}.${problem}`, problem ? 'error' : 'info');
  } catch (error) {
    app.notice(error instanceof Error ? error.message : String(error), 'error');
  }
}

/** Show a new document: derived, fitted to the view, kept, drawn. */
function showDocument(app: DeskApp): void {
  app.state.derived = derive(app.state.history.draft);
  app.state.selection = null;
  app.setZoom('fit');
  autosave(app);
  app.renderDocument();
}

/** Open a scene file of the folder (and its picture); with `restore`, unsaved work kept in the browser wins. */
export async function openScene(app: DeskApp, name: string, restore: boolean): Promise<void> {
  const bytes = await readFolderFile(name);
  const text = new TextDecoder('utf-8').decode(bytes);
  let data: Draft;
  try {
    data = parseSceneText(text, name) as Draft;
    if (data === null || typeof data !== 'object' || Array.isArray(data)) throw new Error(`${name}: the file does not hold a scene (a map of fields)`);
  } catch (error) {
    app.notice(error instanceof Error ? error.message : String(error), 'error');
    return;
  }
  app.state.storageKey = `heliochron-desk:${name}`;
  byId<HTMLInputElement>('save-name').value = name;
  let history = startHistory(data, JSON.stringify(data));
  const stored = restore ? readStored(app) : null;
  if (stored && JSON.stringify(stored.draft) !== JSON.stringify(data)) {
    history = { ...startHistory(stored.draft, stored.savedJson), savedJson: stored.savedJson };
    app.notice(`Your unsaved work on ${name} from ${stored.at} was restored from this browser's storage. Undo is not kept across a reload.`);
  }
  const file = getAt(history.draft, ['image', 'file']);
  if (typeof file === 'string') await app.loadPicture(file);
  app.state.history = history;
  showDocument(app);
  app.answers.documentChanged(history.draft);
}

/** Open a picture alone: an empty scene on it, or the work on it kept in the browser. */
export async function openPicture(app: DeskApp, name: string): Promise<void> {
  await app.loadPicture(name);
  app.state.storageKey = `heliochron-desk:${name}`;
  const base = name.replace(/\.[^.]+$/, '');
  byId<HTMLInputElement>('save-name').value = `${base}.yaml`;
  const stored = readStored(app);
  if (stored) {
    app.state.history = startHistory(stored.draft, stored.savedJson);
    if (stored.saveName) byId<HTMLInputElement>('save-name').value = stored.saveName;
    if (isUnsaved(app.state.history)) app.notice(`Your work on ${name} from ${stored.at} was restored from this browser's storage. Undo is not kept across a reload.`);
  } else {
    const size = app.pictureDimensions();
    app.state.history = startHistory(emptyDraft(name, size?.width ?? null, size?.height ?? null), null);
  }
  app.state.derived = derive(app.state.history.draft);
  app.setZoom('fit');
  autosave(app);
  app.renderDocument();
}
