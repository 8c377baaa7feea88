/**
 * Options of `heliochron sun`: light, loaded with the program; the work is in sunCommand.ts.
 */
import type { Command } from 'commander';
import type { CliIo } from './io.js';
import { addDeltaTOption, addSiteMomentOptions, SITE_MOMENT_DEFAULTS, siteMomentHelp, siteMomentOptionsFrom, type SiteMomentOptions } from './siteMomentSpec.js';

export const SUN_DEFAULTS = { ...SITE_MOMENT_DEFAULTS, step: '30' } as const;

/** The options as the command receives them (strings, validated in sunCommand.ts and siteMoment.ts). */
export interface SunOptions extends SiteMomentOptions {
  readonly day: boolean;
  readonly step: string;
}

export function registerSun(program: Command, io: CliIo): void {
  const command = program
    .command('sun')
    .summary('the sun at a site and moment: azimuth, altitude, declination, hour angle, equation of time, time scales')
    .description(
      'The sun as seen from a site at one moment - azimuth (clockwise from true north), altitude refracted and geometric, ' +
        'declination, hour angle, equation of time - with every time scale of that moment (UT, TT with Delta T and its ' +
        'uncertainty, local apparent and mean time, the clock given), the civil date in both calendars, weekday and Julian Day. ' +
        'With --day: the whole day as a table between sunrise and sunset.',
    );
  addSiteMomentOptions(command, 'time of day on the clock given by --clock (not needed with --day)')
    .option('--day', 'print the whole day: sunrise, transit, sunset and a table every --step minutes')
    .option('--step <minutes>', 'table step for --day, minutes', SUN_DEFAULTS.step);
  addDeltaTOption(command)
    .addHelpText(
      'after',
      siteMomentHelp([
        'heliochron sun --lat 47.62 --lon 9.35 --elevation 410 --date 1650-03-10 --time 10:30',
        `heliochron sun --lat "47°37'N" --lon "9 21 E" --date 1780-06-15 --time 16:00 --clock mean`,
        'heliochron sun --lat 47.62 --lon 9.35 --date 1890-06-15 --time 16:00 --clock zone:Europe/Zurich --json',
        'heliochron sun --lat 47.62 --lon 9.35 --date 1700-02-18 --calendar julian --day --step 60',
      ]),
    )
    .action(async (options: Record<string, unknown>, actionCommand: Command) => {
      const { run } = await import('./sunCommand.js');
      const sunOptions: SunOptions = {
        ...siteMomentOptionsFrom(options, actionCommand, ['elevation', 'calendar', 'clock', 'pressure', 'temperature', 'step']),
        day: options.day === true,
        step: String(options.step),
      };
      run([], sunOptions, io);
    });
}
