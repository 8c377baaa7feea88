/**
 * `heliochron chart`: read a scene, solve it, draw one chart (src/charts) and write it as an
 * SVG file (or print it). A thin layer; the validation of the options is here. Progress of the
 * date-and-hour map is shown on stderr only when stderr is a terminal.
 */
import { InvalidInputError } from '../errors.js';
import type { Scene } from '../scene/types.js';
import type { DateAnswer } from '../solver/types.js';
import { solveDates } from '../solver/solveDates.js';
import { dateHourMapData } from '../charts/dateHourMapData.js';
import { renderDateHourMap } from '../charts/dateHourMap.js';
import { skyChartData } from '../charts/skyChartData.js';
import { renderSkyChart } from '../charts/skyChart.js';
import { residualChartData, renderResidualChart } from '../charts/residualChart.js';
import { checkOutputPath, deliver, readSceneForCommand } from './dateCommand.js';
import type { CliIo } from './io.js';
import { progressLine, withProgressLine } from './progress.js';
import { CHART_KINDS, type ChartKind, type ChartOptions } from './chartSpec.js';

/** The kind option, validated. */
export function parseChartKind(text: string | undefined): ChartKind {
  const allowed = `one of ${CHART_KINDS.join(', ')}`;
  if (text === undefined) throw new InvalidInputError('--kind', text, `${allowed} (this option is required)`);
  const kind = text.trim().toLowerCase();
  if (!(CHART_KINDS as readonly string[]).includes(kind)) throw new InvalidInputError('--kind', text, allowed);
  return kind as ChartKind;
}

/** One chart of a solved scene as SVG markup; `onProgress` follows the date-and-hour map's grid. */
export function drawChart(kind: ChartKind, scene: Scene, answer: DateAnswer, onProgress?: (done: number, total: number) => void, idPrefix?: string): string {
  switch (kind) {
    case 'map':
      return renderDateHourMap(dateHourMapData(scene, answer, { onProgress }), idPrefix);
    case 'sky':
      return renderSkyChart(skyChartData(scene, answer), idPrefix);
    case 'residuals':
      return renderResidualChart(residualChartData(answer), idPrefix);
  }
}

/** Run `heliochron chart`. Bad input throws (the CLI exits with 2, nothing written). */
export async function run(args: readonly string[], options: ChartOptions, io: CliIo): Promise<void> {
  const [scenePath] = args;
  if (scenePath === undefined) throw new InvalidInputError('<scene>', undefined, 'the path of a scene file');
  const kind = parseChartKind(options.kind);
  const { scene, fullPath } = readSceneForCommand(scenePath, io, options.seed);
  const target = checkOutputPath(options.output, options.force, fullPath, io);
  const answer = withProgressLine(io, 'searching the window', (onProgress) => solveDates(scene, { onProgress }));
  const progress = progressLine(io, 'drawing the date and hour map');
  let svg: string;
  try {
    svg = drawChart(kind, scene, answer, progress.onProgress);
  } finally {
    progress.finish();
  }
  deliver(svg, target, options.output, options.force, fullPath, io);
}
