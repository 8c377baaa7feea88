/**
 * The date solver in a Web Worker, so that the page stays responsive: the same calls as
 * `heliochron date`, `chart` and `check` (sceneFromData, solveDates, renderDateText,
 * drawReportCharts, checkProposal, renderCheckText), on the desk's document.
 */
import { readSceneText, sceneFromData } from '../scene/readScene.js';
import { REPORT_SOLVE_OPTIONS, renderHtmlReport } from '../report/html.js';
import { reportCommandLine } from '../cli/reportCommandLine.js';
import { solveDates } from '../solver/solveDates.js';
import { renderCheckText, renderDateText } from '../report/text.js';
import { drawReportCharts } from '../cli/drawChart.js';
import { checkProposal } from '../solver/checkDate.js';
import { proposalFromOptions } from '../cli/proposalOptions.js';
import { resolvePixelObservations } from '../image/resolvePixels.js';
import type { WorkerReply, WorkerRequest } from './workerProtocol.js';

function reply(message: WorkerReply): void {
  (self as unknown as Worker).postMessage(message);
}

/** The HTML report, as reportCommand.ts makes it for `heliochron report <sceneName> -o <output>` run in the scene's folder. */
function reportHtml(sceneText: string, sceneName: string, sha256: string, output: string): string {
  const scene = readSceneText(sceneText, sceneName);
  const answer = solveDates(scene, REPORT_SOLVE_OPTIONS);
  const charts = drawReportCharts(scene, answer);
  return renderHtmlReport({
    scene,
    answer,
    charts,
    reproducibility: {
      version: HELIOCHRON_VERSION,
      sceneSha256: sha256,
      commandLine: reportCommandLine(sceneName, { output, force: false, version: HELIOCHRON_VERSION }),
      seed: scene.seed,
      sceneFileName: sceneName,
    },
  });
}

declare const HELIOCHRON_VERSION: string;

function handle(request: WorkerRequest): void {
  const { id } = request;
  try {
    if (request.kind === 'report') {
      reply({ id, kind: 'report', html: reportHtml(request.sceneText, request.sceneName, request.sha256, request.output) });
      return;
    }
    const scene = sceneFromData(request.draft);
    if (request.kind === 'check') {
      const proposal = proposalFromOptions({ ...request.proposal, json: false, force: false, version: '' }, scene);
      const answer = checkProposal(scene, proposal);
      reply({ id, kind: 'check', answer, text: renderCheckText(answer, scene) });
      return;
    }
    reply({ id, kind: 'progress', stage: 'searching the window', fraction: 0 });
    const started = performance.now();
    // the solver's own progress, passed on at each new percent or stage (not at every grid row)
    let shown = '';
    const answer = solveDates(scene, {
      onProgress: (done, total, stage = 'searching the window') => {
        const fraction = Math.min(1, done / total);
        const key = `${stage} ${Math.floor(fraction * 100)}`;
        if (key === shown) return;
        shown = key;
        reply({ id, kind: 'progress', stage, fraction });
      },
    });
    const solveMs = performance.now() - started;
    const text = renderDateText(answer, scene);
    let charts = null;
    if (request.charts) {
      // the charts read the numeric form of each observation: pixel forms are measured first, as solveDates does
      const measured = resolvePixelObservations(scene).scene;
      reply({ id, kind: 'progress', stage: 'drawing the date and hour map', fraction: 0 });
      let last = 0;
      charts = drawReportCharts(measured, answer, (done, total) => {
        if (done - last >= total / 20 || done === total) {
          last = done;
          reply({ id, kind: 'progress', stage: 'drawing the date and hour map', fraction: done / total });
        }
      });
    }
    reply({ id, kind: 'date', answer, text, charts, solveMs });
  } catch (error) {
    reply({ id, kind: 'error', message: error instanceof Error ? error.message : String(error) });
  }
}

self.addEventListener('message', (event: MessageEvent<WorkerRequest>) => handle(event.data));
