/**
 * `heliochron report`: read a scene, solve it, draw the three charts and write the
 * self-contained HTML report (src/report/html.ts). The scene file's bytes are hashed
 * (SHA-256, FIPS 180-4, through node:crypto) for the reproducibility block.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import { InvalidInputError } from '../errors.js';
import { solveDates } from '../solver/solveDates.js';
import { REPORT_SOLVE_OPTIONS, renderHtmlReport } from '../report/html.js';
import { drawReportCharts } from './drawChart.js';
import { resolvePixelObservations } from '../image/resolvePixels.js';
import { checkOutputPath, deliver, inScene, readSceneForCommand, sameLightOfFamilies } from './dateCommand.js';
import { calendarReadings } from '../solver/calendarReadings.js';
import type { CliIo } from './io.js';
import { progressLine, withProgressLine } from './progress.js';
import type { ReportOptions } from './reportSpec.js';
import { reportCommandLine } from './reportCommandLine.js';

/** SHA-256 of bytes, hexadecimal. */
export function sha256Hex(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/** Run `heliochron report`. Bad input throws (the CLI exits with 2, nothing written). */
export async function run(args: readonly string[], options: ReportOptions, io: CliIo): Promise<void> {
  const [scenePath] = args;
  if (scenePath === undefined) throw new InvalidInputError('<scene>', undefined, 'the path of a scene file');
  const read = readSceneForCommand(scenePath, io, options.seed, options.deltaT);
  const fullPath = read.fullPath;
  const target = checkOutputPath(options.output, options.force, fullPath, io);
  // Pixel observations turned into numbers once, as date and check do (src/image/resolvePixels.ts).
  const scene = inScene(scenePath, () => resolvePixelObservations(read.scene).scene);
  const bytes = readFileSync(fullPath);
  const answer = withProgressLine(io, 'searching the window', (onProgress) => inScene(scenePath, () => solveDates(scene, { ...REPORT_SOLVE_OPTIONS, onProgress })));
  // A disputed calendar switch in the window: solve under every published reading (src/solver/calendarReadings.ts).
  const readings = inScene(scenePath, () => calendarReadings(scene, answer, (s) => solveDates(s, REPORT_SOLVE_OPTIONS)));
  const sameLight = options.sameLightIn === undefined || options.zone === undefined ? null : sameLightOfFamilies(answer, scene, options.sameLightIn, options.zone);
  const progress = progressLine(io, 'drawing the date and hour map');
  let charts;
  try {
    charts = drawReportCharts(scene, answer, progress.onProgress);
  } finally {
    progress.finish();
  }
  const html = renderHtmlReport({
    scene,
    answer,
    charts,
    calendarReadings: readings,
    sameLight,
    reproducibility: {
      version: options.version,
      sceneSha256: sha256Hex(bytes),
      commandLine: reportCommandLine(scenePath, options),
      seed: scene.seed,
      sceneFileName: basename(scenePath),
    },
  });
  deliver(html, target, options.output, options.force, fullPath, io);
}
