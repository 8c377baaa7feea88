/**
 * Options of `heliochron report`: light, loaded with the program; the work is in reportCommand.ts.
 */
import type { Command } from 'commander';
import type { CliIo } from './io.js';
import { outputForm } from './outputFormat.js';
import { parseSeedOption, SEED_FLAGS, SEED_HELP } from './seedOption.js';
import type { DeltaTModel } from '../time/deltaT.js';
import { DELTA_T_FLAGS, DELTA_T_HELP, parseDeltaTOption } from './deltaTOption.js';
import { sameLightOptions } from './dateSpec.js';

export interface ReportOptions {
  readonly output?: string;
  readonly force: boolean;
  /** Overrides the scene file's seed. */
  readonly seed?: number;
  /** --delta-t: overrides the scene file's deltaT. */
  readonly deltaT?: DeltaTModel;
  /** --same-light-in: the year to find the same light in (with --zone). */
  readonly sameLightIn?: number;
  /** --zone: the site's present IANA time zone, for --same-light-in. */
  readonly zone?: string;
  /** The program's version, written into the report's reproducibility block. */
  readonly version: string;
}

export function registerReport(program: Command, io: CliIo): void {
  program
    .command('report')
    .summary('write the whole answer as one self-contained HTML file, with its charts, assumptions and cautions')
    .description(
      'Solve the scene and write one HTML file that opens in any browser without a network and prints well to PDF: ' +
        'the question, the site, the calendar and year start, the time-keeping assumed, Delta T, refraction, where each ' +
        'wall azimuth came from, the evidence, the ranked candidates, the three charts, the consistency test, the cautions, ' +
        'and what is needed to reproduce it (version, SHA-256 of the scene file, the command, the seed).',
    )
    .argument('<scene>', 'the scene file (.yaml, .yml or .json)')
    .option('-o, --output <file>', 'write the HTML to this file, ending in .html (default: print it)')
    .option('--force', 'replace the output file if it exists')
    .option(SEED_FLAGS, SEED_HELP)
    .option(DELTA_T_FLAGS, DELTA_T_HELP)
    .option('--same-light-in [year]', 'also show, per family, the days and times of that year (default: this year) when the sun stands where the best candidate put it (needs --zone)')
    .option('--zone <IANA name>', "the site's present time zone for --same-light-in, e.g. Europe/Zurich")
    .addHelpText(
      'after',
      '\nExample (the bundled example is in the fictional town of Velmar):\n' +
        '  heliochron report examples/marktgasse-print.yaml -o marktgasse-report.html\n' +
        '  heliochron report examples/marktgasse-print.yaml --same-light-in 2026 --zone Europe/Zurich -o marktgasse-report.html\n',
    )
    .action(async (scene: string, options: Record<string, unknown>, command: Command) => {
      const output = options.output === undefined ? undefined : String(options.output);
      outputForm(output, 'html', false, ['html'], 'report');
      const { run } = await import('./reportCommand.js');
      await run(
        [scene],
        {
          output,
          force: options.force === true,
          seed: parseSeedOption(options.seed),
          deltaT: parseDeltaTOption(options.deltaT),
          ...(await sameLightOptions(options.sameLightIn, options.zone)),
          version: String(command.parent?.version() ?? ''),
        },
        io,
      );
    });
}
