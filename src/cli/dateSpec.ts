/**
 * Options of `heliochron date`: light, loaded with the program; the work is in dateCommand.ts.
 */
import type { Command } from 'commander';
import type { CliIo } from './io.js';
import { outputForm } from './outputFormat.js';
import { InvalidInputError } from '../errors.js';
import { parseSeedOption, SEED_FLAGS, SEED_HELP } from './seedOption.js';
import type { DeltaTModel } from '../time/deltaT.js';
import { DELTA_T_FLAGS, DELTA_T_HELP, parseDeltaTOption } from './deltaTOption.js';

/** The options as the command receives them. */
export interface DateOptions {
  readonly json: boolean;
  readonly csv: boolean;
  readonly allYears: boolean;
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
  /** The program's version, written into the JSON answer. */
  readonly version: string;
}

export function registerDate(program: Command, io: CliIo): void {
  program
    .command('date')
    .summary('on what dates and hours could the light of a scene have fallen? ranked candidates with their uncertainty')
    .description(
      'Read a scene file (site, calendar, walls, shadow measurements, clocks) and answer with the dates and hours whose ' +
        'sunlight fits the measurements: the verdict first, then the families of dates (the same light in several years), ' +
        'the best candidates with their 95% uncertainty, the residual of each observation, a consistency test that leaves ' +
        'each observation out in turn, and the assumptions. Dates are written in the calendar in force at the site, with ' +
        'Old Style / New Style where both were in use.',
    )
    .argument('<scene>', 'the scene file (.yaml, .yml or .json); see docs/scene-file.md')
    .option('--json', 'print one JSON object instead of text (byte-identical for the same input)')
    .option('--csv', 'print one CSV row per candidate, with a header row')
    .option('--all-years', 'list every year of each family (one line, or CSV row, per year)')
    .option('-o, --output <file>', 'write the answer to this file instead of the screen; a name ending in .json writes JSON, .csv CSV, .txt text')
    .option('--force', 'replace the output file if it exists')
    .option(SEED_FLAGS, SEED_HELP)
    .option(DELTA_T_FLAGS, DELTA_T_HELP)
    .option('--same-light-in [year]', 'also list, per family, the days and times of that year (default: this year) when the sun stands where the best candidate put it (needs --zone)')
    .option('--zone <IANA name>', "the site's present time zone for --same-light-in, e.g. Europe/Zurich")
    .addHelpText(
      'after',
      '\nExamples (the bundled examples are in the fictional town of Velmar):\n' +
        '  heliochron date examples/marktgasse-print.yaml\n' +
        '  heliochron date examples/marktgasse-print.yaml --json -o answer.json\n' +
        '  heliochron date examples/upper-gate-drawing.yaml --all-years --csv\n' +
        '  heliochron date examples/marktgasse-print.yaml --same-light-in 2026 --zone Europe/Zurich\n',
    )
    .action(async (scene: string, options: Record<string, unknown>, command: Command) => {
      const output = options.output === undefined ? undefined : String(options.output);
      const json = options.json === true;
      const csv = options.csv === true;
      // The form from the output file's name (both flags together are refused by the command).
      const form = json && csv ? 'text' : outputForm(output, json ? 'json' : csv ? 'csv' : 'text', json || csv, ['text', 'json', 'csv'], 'date');
      const { run } = await import('./dateCommand.js');
      await run([scene], {
        json: json || form === 'json',
        csv: csv || form === 'csv',
        allYears: options.allYears === true,
        output,
        force: options.force === true,
        seed: parseSeedOption(options.seed),
        deltaT: parseDeltaTOption(options.deltaT),
        ...(await sameLightOptions(options.sameLightIn, options.zone)),
        version: String(command.parent?.version() ?? ''),
      }, io);
    });
}

/**
 * --same-light-in and --zone, checked: a whole year 1970-3000 (default this year) and a valid IANA zone.
 * The clock module (and the zone data behind it) is loaded only when a zone is given.
 */
export async function sameLightOptions(year: unknown, zone: unknown): Promise<{ sameLightIn?: number; zone?: string }> {
  if (year === undefined) {
    if (zone !== undefined) throw new InvalidInputError('--zone', zone, 'a zone only together with --same-light-in');
    return {};
  }
  // The only place that reads the machine's clock: "this year" for --same-light-in without a year.
  const y = year === true ? new Date().getUTCFullYear() : /^\d{4}$/.test(String(year)) ? Number(year) : NaN;
  if (!Number.isInteger(y) || y < 1970 || y > 3000) throw new InvalidInputError('--same-light-in', year, 'a year from 1970 to 3000 (default: this year)');
  if (zone === undefined) throw new InvalidInputError('--zone', undefined, "the site's present IANA time zone, e.g. --zone Europe/Zurich (needed by --same-light-in)");
  const { parseClockKind } = await import('../time/clock.js');
  const clock = parseClockKind(`zone:${String(zone)}`, '--zone');
  return { sameLightIn: y, zone: clock.kind === 'zone' ? clock.zone : String(zone) };
}
