/**
 * Options of `heliochron sun`: light, loaded with the program; the work is in sunCommand.ts.
 */
import type { Command } from 'commander';
import type { CliIo } from './io.js';
import { CLOCK_DEFAULT, CLOCK_DEFAULT_WHY, CLOCK_FLAGS, CLOCK_KINDS_HELP } from './clockOption.js';
import { DELTA_T_FLAGS, DELTA_T_HELP } from './deltaTOption.js';

export const SUN_DEFAULTS = {
  elevation: '0',
  calendar: 'gregorian',
  clock: CLOCK_DEFAULT,
  pressure: '1010',
  temperature: '10',
  step: '30',
} as const;

/** The options as the command receives them (strings, validated in sunCommand.ts). */
export interface SunOptions {
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
  readonly day: boolean;
  readonly step: string;
  /** --delta-t as written (validated in sunCommand.ts). */
  readonly deltaT?: string;
  /** Names of the options left at their defaults, to say so in the answer. */
  readonly defaulted: readonly string[];
}

export function registerSun(program: Command, io: CliIo): void {
  program
    .command('sun')
    .summary('the sun at a site and moment: azimuth, altitude, declination, hour angle, equation of time, time scales')
    .description(
      'The sun as seen from a site at one moment - azimuth (clockwise from true north), altitude refracted and geometric, ' +
        'declination, hour angle, equation of time - with every time scale of that moment (UT, TT with Delta T and its ' +
        'uncertainty, local apparent and mean time, the clock given), the civil date in both calendars, weekday and Julian Day. ' +
        'With --day: the whole day as a table between sunrise and sunset.',
    )
    .option('--lat <deg>', `latitude in degrees, north positive (-90 to 90); also 48°12'30"N, "48 12 N", 48.2N`)
    .option('--lon <deg>', `longitude in degrees, east positive (-180 to 180); also 16°24'E, "16 24 E", 16.4W (west negative)`)
    .option('--elevation <m>', 'height above sea level in metres', SUN_DEFAULTS.elevation)
    .option('--date <date>', 'the civil day: 1650-03-10, -0043-03-15 (astronomical years), 44-03-15 BC, "10 March 1650"')
    .option(
      '--calendar <rule>',
      "calendar the date is written in: 'gregorian' (proleptic before 1582), 'julian', a region id " +
        "(see heliochron calendar --list-regions) or 'switch:YYYY-MM-DD/YYYY-MM-DD'",
      SUN_DEFAULTS.calendar,
    )
    .option('--time <hh:mm[:ss]>', 'time of day on the clock given by --clock (not needed with --day)')
    .option(CLOCK_FLAGS, `what the time was kept in: ${CLOCK_KINDS_HELP}`, SUN_DEFAULTS.clock)
    .option('--pressure <hPa>', 'air pressure for refraction, hPa', SUN_DEFAULTS.pressure)
    .option('--temperature <C>', 'air temperature for refraction, degrees Celsius', SUN_DEFAULTS.temperature)
    .option('--json', 'print one JSON object instead of text')
    .option('--day', 'print the whole day: sunrise, transit, sunset and a table every --step minutes')
    .option('--step <minutes>', 'table step for --day, minutes', SUN_DEFAULTS.step)
    .option(DELTA_T_FLAGS, DELTA_T_HELP)
    .addHelpText(
      'after',
      '\nNothing is guessed silently: without --calendar the date is read in the proleptic Gregorian calendar, without\n' +
        `--clock the time is ${CLOCK_DEFAULT_WHY},\n` +
        'without --pressure/--temperature refraction uses 1010 hPa and 10 C, and every answer lists the defaults it used.\n' +
        'Examples (Velmar, 47.62 N 9.35 E):\n' +
        '  heliochron sun --lat 47.62 --lon 9.35 --elevation 410 --date 1650-03-10 --time 10:30\n' +
        `  heliochron sun --lat "47°37'N" --lon "9 21 E" --date 1780-06-15 --time 16:00 --clock mean\n` +
        '  heliochron sun --lat 47.62 --lon 9.35 --date 1890-06-15 --time 16:00 --clock zone:Europe/Zurich --json\n' +
        '  heliochron sun --lat 47.62 --lon 9.35 --date 1700-02-18 --calendar julian --day --step 60\n',
    )
    .action(async (options: Record<string, unknown>, command: Command) => {
      const { run } = await import('./sunCommand.js');
      const defaulted = ['elevation', 'calendar', 'clock', 'pressure', 'temperature', 'step'].filter(
        (name) => command.getOptionValueSource(name) === 'default',
      );
      const text = (name: string): string | undefined => (options[name] === undefined ? undefined : String(options[name]));
      const sunOptions: SunOptions = {
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
        day: options.day === true,
        step: String(options.step),
        deltaT: text('deltaT'),
        defaulted,
      };
      run([], sunOptions, io);
    });
}
