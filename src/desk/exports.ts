/**
 * The overlay drawn on the desk and written out, the HTML report and the Web Annotations written
 * out: the same functions as `heliochron measure --overlay` (measureOverlaySvg), `heliochron report`
 * (run in the worker, worker.ts) and `heliochron measure --annotations` (annotationsText), so that
 * the files are byte for byte the command line's.
 */
import { measureOverlaySvg, type MeasurementPrediction } from '../cli/measureOverlay.js';
import type { PictureFile } from '../cli/pictureFile.js';
import type { Derived } from './derive.js';
import type { Draft } from './draft.js';
import { readFolderFile, saveAskingFirst } from './files.js';
import { runInWorker } from './workerClient.js';
import { annotationsText } from '../report/annotations.js';

export interface ChosenPrediction {
  readonly caption: string;
  readonly predictions: readonly MeasurementPrediction[];
}

/**
 * The overlay SVG of the measured planes and shadows, the camera's lines and the groups' light
 * (and a candidate's predicted shadows), or null when there is nothing to draw yet. On the page
 * the camera is drawn as soon as it is found; the file written out has what `heliochron measure`
 * draws (the camera and its suns only when every pair is accepted).
 */
export function overlayFor(derived: Derived, best: ChosenPrediction | null, picture?: PictureFile | null, forFile = false): string | null {
  const scene = derived.measuringScene;
  const sceneSun = forFile ? derived.perspective?.sceneSun : derived.perspective?.drawing;
  if (!scene?.image || (derived.planes.size === 0 && !sceneSun)) return null;
  return measureOverlaySvg({
    scene,
    image: scene.image,
    planes: derived.planes,
    measurements: derived.measurements,
    ...(picture ? { picture } : {}),
    ...(best ? { best } : {}),
    ...(sceneSun ? { sceneSun } : {}),
  });
}

type Notice = (text: string, kind?: 'info' | 'error') => void;

async function writeFile(name: string, content: string, notice: Notice): Promise<void> {
  if (await saveAskingFirst(name, content)) notice(`Written: ${name}.`);
  else notice(`Not written: ${name} exists already and was kept.`);
}

function baseOf(sceneName: string): string {
  return sceneName.replace(/\.[^.]+$/, '') || 'scene';
}

/** Write `<scene>-overlay.svg`: what `heliochron measure <scene> --overlay <scene>-overlay.svg` writes. */
export async function exportOverlaySvg(derived: Derived, picture: PictureFile | null, sceneName: string, notice: Notice): Promise<void> {
  if (!derived.scene) {
    notice(`The overlay is written for a complete scene; the scene reader does not take it yet: ${derived.refusal?.message ?? ''}`, 'error');
    return;
  }
  const svg = overlayFor(derived, null, picture, true);
  if (!svg) {
    notice('Nothing to draw yet: click a wall figure, a ground figure or the camera lines first.', 'error');
    return;
  }
  try {
    await writeFile(`${baseOf(sceneName)}-overlay.svg`, svg, notice);
  } catch (error) {
    notice(error instanceof Error ? error.message : String(error), 'error');
  }
}

/**
 * Write `<scene>-annotations.jsonld`: the clicked points and lines as W3C Web Annotations, what
 * `heliochron measure <scene> --annotations <scene>-annotations.jsonld` writes (src/report/annotations.ts).
 */
export async function exportAnnotations(derived: Derived, sceneName: string, notice: Notice): Promise<void> {
  const scene = derived.scene;
  if (!scene) {
    notice(`The annotations are written for a complete scene; the scene reader does not take it yet: ${derived.refusal?.message ?? ''}`, 'error');
    return;
  }
  if (!scene.image?.file) {
    notice('The annotations point into the picture: the scene needs its picture (image.file) first.', 'error');
    return;
  }
  try {
    await writeFile(`${baseOf(sceneName)}-annotations.jsonld`, annotationsText(scene, scene.image.file), notice);
  } catch (error) {
    notice(error instanceof Error ? error.message : String(error), 'error');
  }
}

/** Write `<scene>-report.html`: what `heliochron report <scene> -o <scene>-report.html` writes. Needs the scene saved. */
export async function exportHtmlReport(draft: Draft, sceneName: string, saved: boolean, notice: Notice): Promise<void> {
  if (!saved) {
    notice('Save the scene first: the report names the saved scene file and its SHA-256 checksum.', 'error');
    return;
  }
  try {
    const bytes = await readFolderFile(sceneName);
    const digest = new Uint8Array(await crypto.subtle.digest('SHA-256', bytes as BufferSource));
    const sha256 = Array.from(digest, (b) => b.toString(16).padStart(2, '0')).join('');
    const output = `${baseOf(sceneName)}-report.html`;
    notice('Writing the report: the scene is dated and the charts drawn first...');
    const reply = await runInWorker({ kind: 'report', sceneText: new TextDecoder().decode(bytes), sceneName, sha256, output });
    if (reply.kind === 'error') throw new Error(reply.message);
    if (reply.kind !== 'report') throw new Error('the worker gave no report');
    await writeFile(output, reply.html, notice);
  } catch (error) {
    notice(error instanceof Error ? error.message : String(error), 'error');
  }
  void draft;
}
