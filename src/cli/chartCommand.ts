/**
 * `heliochron chart`: read a scene, solve it, draw one chart (src/charts) and write it as an
 * SVG file (or print it). A thin layer; the validation of the options is here. Progress of the
 * date-and-hour map is shown on stderr only when stderr is a terminal.
 */
import { basename } from 'node:path';
import { InvalidInputError } from '../errors.js';
import { solveDates } from '../solver/solveDates.js';
import { resolvePixelObservations } from '../image/resolvePixels.js';
import { checkOutputPath, deliver, inScene, readSceneForCommand } from './dateCommand.js';
import type { CliIo } from './io.js';
import { progressLine, withProgressLine } from './progress.js';
import { chartModel, drawChart } from './drawChart.js';
import { ALL_CHARTS, CHART_KINDS, type ChartKind, type ChartOptions } from './chartSpec.js';

/** The kind option, validated: one chart, or all three. */
export function parseChartKind(text: string | undefined): ChartKind | typeof ALL_CHARTS {
  const allowed = `one of ${CHART_KINDS.join(', ')}, ${ALL_CHARTS}`;
  if (text === undefined) throw new InvalidInputError('--kind', text, `${allowed} (this option is required)`);
  const kind = text.trim().toLowerCase();
  if (kind === ALL_CHARTS) return ALL_CHARTS;
  if (!(CHART_KINDS as readonly string[]).includes(kind)) throw new InvalidInputError('--kind', text, allowed);
  return kind as ChartKind;
}

/**
 * The three file names of --kind all: NAME-map.svg, NAME-sky.svg, NAME-residuals.svg, NAME from
 * -o (without its .svg), else the scene file's name without its extension, in the current folder.
 * @example chartFileNames('velmar.svg', 'scenes/velmar.yaml') // ['velmar-map.svg', 'velmar-sky.svg', 'velmar-residuals.svg']
 */
export function chartFileNames(output: string | undefined, scenePath: string): { kind: ChartKind; file: string }[] {
  const stem = output === undefined ? basename(scenePath).replace(/\.(ya?ml|json)$/i, '') : output.replace(/\.svg$/i, '');
  return CHART_KINDS.map((kind) => ({ kind, file: `${stem}-${kind}.svg` }));
}

/** Run `heliochron chart`. Bad input throws (the CLI exits with 2, nothing written). */
export async function run(args: readonly string[], options: ChartOptions, io: CliIo): Promise<void> {
  const [scenePath] = args;
  if (scenePath === undefined) throw new InvalidInputError('<scene>', undefined, 'the path of a scene file');
  const kind = parseChartKind(options.kind);
  const read = readSceneForCommand(scenePath, io, options.seed, options.deltaT);
  const fullPath = read.fullPath;
  if (kind === ALL_CHARTS) {
    // Every file is checked before any work, so that a refusal leaves nothing written.
    const files = chartFileNames(options.output, scenePath).map((f) => ({ ...f, target: checkOutputPath(f.file, options.force, fullPath, io) }));
    const scene = inScene(scenePath, () => resolvePixelObservations(read.scene).scene);
    const answer = withProgressLine(io, 'searching the window', (onProgress) => inScene(scenePath, () => solveDates(scene, { onProgress })));
    const model = chartModel(scene); // one evidence model for every chart
    for (const f of files) {
      const progress = progressLine(io, `drawing the ${f.kind} chart`);
      let svg: string;
      try {
        svg = drawChart(f.kind, scene, answer, progress.onProgress, undefined, model);
      } finally {
        progress.finish();
      }
      deliver(svg, f.target, f.file, options.force, fullPath, io);
    }
    return;
  }
  const target = checkOutputPath(options.output, options.force, fullPath, io);
  // Pixel observations turned into numbers once, as date and check do (src/image/resolvePixels.ts).
  const scene = inScene(scenePath, () => resolvePixelObservations(read.scene).scene);
  const answer = withProgressLine(io, 'searching the window', (onProgress) => inScene(scenePath, () => solveDates(scene, { onProgress })));
  const progress = progressLine(io, 'drawing the date and hour map');
  let svg: string;
  try {
    svg = drawChart(kind, scene, answer, progress.onProgress);
  } finally {
    progress.finish();
  }
  deliver(svg, target, options.output, options.force, fullPath, io);
}
