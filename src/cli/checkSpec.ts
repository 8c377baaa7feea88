/**
 * Options of `heliochron check`: light, loaded with the program; the work is in checkCommand.ts.
 */
import type { Command } from 'commander';
import type { CliIo } from './io.js';
import { outputForm } from './outputFormat.js';
import { CLOCK_DEFAULT, CLOCK_DEFAULT_WHY, CLOCK_FLAGS, CLOCK_KINDS_HELP } from './clockOption.js';
import { parseSeedOption, SEED_FLAGS, SEED_HELP } from './seedOption.js';
import type { DeltaTModel } from '../time/deltaT.js';
import { DELTA_T_FLAGS, DELTA_T_HELP, parseDeltaTOption } from './deltaTOption.js';

/** The options as the command receives them (strings, validated in checkCommand.ts). */
export interface CheckOptions {
  readonly on?: string;
  readonly time?: string;
  readonly clock?: string;
  readonly within?: string;
  readonly between?: readonly string[];
  readonly season?: string;
  readonly json: boolean;
  readonly output?: string;
  readonly force: boolean;
  /** Overrides the scene file's seed. */
  readonly seed?: number;
  /** --delta-t: overrides the scene file's deltaT. */
  readonly deltaT?: DeltaTModel;
  readonly version: string;
}

export function registerCheck(program: Command, io: CliIo): void {
  program
    .command('check')
    .summary('could the light of a scene have fallen on this date, in this range of days, or in this season?')
    .description(
      'Test a proposed date (optionally with an hour), a range of days or a season against the shadow evidence of a ' +
        'scene: the best fit inside the proposal, its chi-square and p-value, the residual of each observation, the best ' +
        'fit anywhere in the window for comparison, and a one-line verdict. Dates are civil days in the calendar of the ' +
        "scene's site, written with the scene's year start. Give exactly one of --on, --between, --season.",
    )
    .argument('<scene>', 'the scene file (.yaml, .yml or .json); put it before --between')
    .option('--on <date>', 'one civil day: 1771-07-30, "30 July 1771", 1650/1-02-10 (dual year)')
    .option('--time <hh:mm>', 'with --on: the hour, on the clock given by --clock')
    .option(CLOCK_FLAGS, `with --time: what the hour was kept in: ${CLOCK_KINDS_HELP} (default: ${CLOCK_DEFAULT}, ${CLOCK_DEFAULT_WHY})`)
    .option('--within <minutes>', 'with --time: how far the true hour may lie from it, minutes (default 0: the hour is taken as exact)')
    .option('--between <dates...>', 'two civil days, the first and the last of a range (both included)')
    .option('--season <months>', 'months of any year of the window: 5-9, may-sep, 5,6,7, nov-feb (wraps the year end)')
    .option('--json', 'print one JSON object instead of text')
    .option('-o, --output <file>', 'write the answer to this file instead of the screen; a name ending in .json writes JSON, .txt text')
    .option('--force', 'replace the output file if it exists')
    .option(SEED_FLAGS, SEED_HELP)
    .option(DELTA_T_FLAGS, DELTA_T_HELP)
    .addHelpText(
      'after',
      '\nExamples:\n' +
        '  heliochron check examples/marktgasse-print.yaml --on 1771-07-30 --time 08:06 --clock mean\n' +
        '  heliochron check examples/marktgasse-print.yaml --between 1771-05-01 1771-05-31\n' +
        '  heliochron check examples/marktgasse-print.yaml --season may-jun --json\n',
    )
    .action(async (scene: string, options: Record<string, unknown>, command: Command) => {
      const text = (name: string): string | undefined => (options[name] === undefined ? undefined : String(options[name]));
      const json = options.json === true;
      const form = outputForm(text('output'), json ? 'json' : 'text', json, ['text', 'json'], 'check');
      const { run } = await import('./checkCommand.js');
      await run([scene], {
        on: text('on'),
        time: text('time'),
        clock: text('clock'),
        within: text('within'),
        between: Array.isArray(options.between) ? options.between.map(String) : undefined,
        season: text('season'),
        json: form === 'json',
        output: text('output'),
        force: options.force === true,
        seed: parseSeedOption(options.seed),
        deltaT: parseDeltaTOption(options.deltaT),
        version: String(command.parent?.version() ?? ''),
      }, io);
    });
}
