/**
 * The file and history bar of the page: undo and redo, save and open, and the files written from the
 * page (the overlay SVG, the HTML report and the Web Annotations, each what the command line writes:
 * exports.ts); leaving with unsaved changes asks first.
 */
import type { PictureFile } from '../cli/pictureFile.js';
import { byId } from './dom.js';
import { isUnsaved, redo, undo } from './history.js';
import type { DeskApp } from './deskApp.js';
import { sceneFileName, setHistory } from './documentChanges.js';
import { openScene, save } from './sceneDocument.js';
import { exportAnnotations, exportHtmlReport, exportOverlaySvg } from './exports.js';

/**
 * Wire the bar's buttons.
 * @param overlayPicture the picture to embed in the overlay file: null without one, 'refused' (said why) for a TIFF
 */
export function installFileMenu(app: DeskApp, overlayPicture: () => PictureFile | null | 'refused'): void {
  const { state, notice } = app;
  byId('undo').addEventListener('click', () => setHistory(app, undo(state.history)));
  byId('redo').addEventListener('click', () => setHistory(app, redo(state.history)));
  byId('save').addEventListener('click', () => void save(app));
  byId('open').addEventListener('click', () => {
    const name = window.prompt('Open which scene file of this folder? (its name, e.g. hall.yaml)', sceneFileName());
    if (name && (!isUnsaved(state.history) || window.confirm('Your changes are not saved. Open another file all the same?'))) {
      openScene(app, name.trim(), false).catch((error: unknown) => notice(error instanceof Error ? error.message : String(error), 'error'));
    }
  });
  byId('export-overlay').addEventListener('click', () => {
    const file = overlayPicture();
    if (file !== 'refused') void exportOverlaySvg(state.derived, file, sceneFileName(), notice);
  });
  byId('export-report').addEventListener('click', () => void exportHtmlReport(state.history.draft, sceneFileName(), state.history.savedJson === JSON.stringify(state.history.draft), notice));
  byId('export-annotations').addEventListener('click', () => void exportAnnotations(state.derived, sceneFileName(), notice));
  window.addEventListener('beforeunload', (e) => {
    if (isUnsaved(state.history)) {
      e.preventDefault();
      e.returnValue = '';
    }
  });
}
