/**
 * Options of `heliochron chart`: light, loaded with the program; the work is in chartCommand.ts.
 */
import type { Command } from 'commander';
import type { CliIo } from './io.js';
import { outputForm } from './outputFormat.js';
import { parseSeedOption, SEED_FLAGS, SEED_HELP } from './seedOption.js';
import type { DeltaTModel } from '../time/deltaT.js';
import { DELTA_T_FLAGS, DELTA_T_HELP, parseDeltaTOption } from './deltaTOption.js';

export const CHART_KINDS = ['map', 'sky', 'residuals'] as const;
export type ChartKind = (typeof CHART_KINDS)[number];
/** The value of --kind that writes every chart, each into its own file. */
export const ALL_CHARTS = 'all';

/** The options as the command receives them (the kind is validated in chartCommand.ts). */
export interface ChartOptions {
  readonly kind?: string;
  readonly output?: string;
  readonly force: boolean;
  /** Overrides the scene file's seed. */
  readonly seed?: number;
  /** --delta-t: overrides the scene file's deltaT. */
  readonly deltaT?: DeltaTModel;
}

export function registerChart(program: Command, io: CliIo): void {
  program
    .command('chart')
    .summary('draw one picture of the answer as an SVG file: the date-and-hour map, the sky chart or the residuals')
    .description(
      'Solve the scene as `heliochron date` does and draw one chart as a standalone SVG file: ' +
        "'map' - the year against the hour of local apparent time, shaded by how well each day and hour fits, the candidates " +
        "with their error ellipses; 'sky' - azimuth against altitude, each measured shadow as its band of possible sun " +
        "directions, the sun's paths on the candidate days; 'residuals' - how far each measurement is from the best " +
        'candidate, in units of its sigma. docs/pictures.md explains how to read them.',
    )
    .argument('<scene>', 'the scene file (.yaml, .yml or .json)')
    .option(
      '--kind <kind>',
      `which chart (required): ${CHART_KINDS.join(', ')}, or ${ALL_CHARTS} for the three, each in its own file ` +
        'NAME-map.svg, NAME-sky.svg, NAME-residuals.svg (NAME from -o, else the scene file\'s name, in the current folder)',
    )
    .option('-o, --output <file>', 'write the SVG to this file, ending in .svg (default: print it; with --kind all, the NAME of the three files)')
    .option('--force', 'replace the output file if it exists')
    .option(SEED_FLAGS, SEED_HELP)
    .option(DELTA_T_FLAGS, DELTA_T_HELP)
    .addHelpText(
      'after',
      '\nExamples (the bundled example is in the fictional town of Velmar):\n' +
        '  heliochron chart examples/marktgasse-print.yaml --kind map -o map.svg\n' +
        '  heliochron chart examples/marktgasse-print.yaml --kind sky -o sky.svg --force\n' +
        '  heliochron chart examples/marktgasse-print.yaml --kind all -o marktgasse.svg   (marktgasse-map.svg, -sky.svg, -residuals.svg)\n',
    )
    .action(async (scene: string, options: Record<string, unknown>) => {
      const output = options.output === undefined ? undefined : String(options.output);
      outputForm(output, 'svg', false, ['svg'], 'chart');
      const { run } = await import('./chartCommand.js');
      await run(
        [scene],
        {
          kind: options.kind === undefined ? undefined : String(options.kind),
          output,
          force: options.force === true,
          seed: parseSeedOption(options.seed),
          deltaT: parseDeltaTOption(options.deltaT),
        },
        io,
      );
    });
}
