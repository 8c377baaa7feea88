/**
 * The options `sun` and `moon` share (site, day in its calendar, time on a clock, air, Delta T, --json):
 * declared once here, light, loaded with the program; read and checked in siteMoment.ts.
 */
import type { Command } from 'commander';
import { CLOCK_DEFAULT, CLOCK_DEFAULT_WHY, CLOCK_FLAGS, CLOCK_KINDS_HELP } from './clockOption.js';
import { DELTA_T_FLAGS, DELTA_T_HELP } from './deltaTOption.js';

export const SITE_MOMENT_DEFAULTS = {
  elevation: '0',
  calendar: 'gregorian',
  clock: CLOCK_DEFAULT,
  pressure: '1010',
  temperature: '10',
} as const;

/** The shared options as a command receives them (strings, validated in siteMoment.ts). */
export interface SiteMomentOptions {
  readonly lat?: string;
  readonly lon?: string;
  readonly elevation: string;
  readonly date?: string;
  readonly calendar: string;
  readonly time?: string;
  readonly clock: string;
  readonly pressure: string;
  readonly temperature: string;
  readonly json: boolean;
  /** --delta-t as written (validated in siteMoment.ts). */
  readonly deltaT?: string;
  /** Names of the options left at their defaults, to say so in the answer. */
  readonly defaulted: readonly string[];
}

/** Add the site, day, time and air options to a command; `timeHelp` says when --time is needed. */
export function addSiteMomentOptions(command: Command, timeHelp: string): Command {
  return command
    .option('--lat <deg>', `latitude in degrees, north positive (-90 to 90); also 48°12'30"N, "48 12 N", 48.2N`)
    .option('--lon <deg>', `longitude in degrees, east positive (-180 to 180); also 16°24'E, "16 24 E", 16.4W (west negative)`)
    .option('--elevation <m>', 'height above sea level in metres', SITE_MOMENT_DEFAULTS.elevation)
    .option('--date <date>', 'the civil day: 1650-03-10, -0043-03-15 (astronomical years), 44-03-15 BC, "10 March 1650"')
    .option(
      '--calendar <rule>',
      "calendar the date is written in: 'gregorian' (proleptic before 1582), 'julian', a region id " +
        "(see heliochron calendar --list-regions) or 'switch:YYYY-MM-DD/YYYY-MM-DD'",
      SITE_MOMENT_DEFAULTS.calendar,
    )
    .option('--time <hh:mm[:ss]>', timeHelp)
    .option(CLOCK_FLAGS, `what the time was kept in: ${CLOCK_KINDS_HELP}`, SITE_MOMENT_DEFAULTS.clock)
    .option('--pressure <hPa>', 'air pressure for refraction, hPa', SITE_MOMENT_DEFAULTS.pressure)
    .option('--temperature <C>', 'air temperature for refraction, degrees Celsius', SITE_MOMENT_DEFAULTS.temperature)
    .option('--json', 'print one JSON object instead of text');
}

/** The help text after the options: what is assumed when an option is left out, then the examples given. */
export function siteMomentHelp(examples: readonly string[]): string {
  return (
    '\nNothing is guessed silently: without --calendar the date is read in the proleptic Gregorian calendar, without\n' +
    `--clock the time is ${CLOCK_DEFAULT_WHY},\n` +
    'without --pressure/--temperature refraction uses 1010 hPa and 10 C, and every answer lists the defaults it used.\n' +
    'Examples (Velmar, 47.62 N 9.35 E):\n' +
    examples.map((line) => `  ${line}\n`).join('')
  );
}

/** Add --delta-t (kept last in --help). */
export function addDeltaTOption(command: Command): Command {
  return command.option(DELTA_T_FLAGS, DELTA_T_HELP);
}

/**
 * The shared options as received, with the names of those left at their defaults (among `defaultable`).
 * @example siteMomentOptionsFrom(options, command, ['elevation', 'calendar', 'clock', 'pressure', 'temperature'])
 */
export function siteMomentOptionsFrom(options: Record<string, unknown>, command: Command, defaultable: readonly string[]): SiteMomentOptions {
  const text = (name: string): string | undefined => (options[name] === undefined ? undefined : String(options[name]));
  return {
    lat: text('lat'),
    lon: text('lon'),
    elevation: String(options.elevation),
    date: text('date'),
    calendar: String(options.calendar),
    time: text('time'),
    clock: String(options.clock),
    pressure: String(options.pressure),
    temperature: String(options.temperature),
    json: options.json === true,
    deltaT: text('deltaT'),
    defaulted: defaultable.filter((name) => command.getOptionValueSource(name) === 'default'),
  };
}
