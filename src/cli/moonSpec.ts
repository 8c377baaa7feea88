/**
 * Options of `heliochron moon`: light, loaded with the program; the work is in moonCommand.ts.
 * The same site, day, time and air options as `sun` (siteMomentSpec.ts).
 */
import type { Command } from 'commander';
import type { CliIo } from './io.js';
import { addDeltaTOption, addSiteMomentOptions, siteMomentHelp, siteMomentOptionsFrom, type SiteMomentOptions } from './siteMomentSpec.js';

/** The options as the command receives them (strings, validated in siteMoment.ts). */
export type MoonOptions = SiteMomentOptions;

export function registerMoon(program: Command, io: CliIo): void {
  const command = program
    .command('moon')
    .summary('the moon at a site and moment: azimuth, altitude, phase, age, the tilt of its lit side, moonrise and moonset')
    .description(
      'The moon as seen from a site at one moment - azimuth (clockwise from true north), altitude refracted and geometric, ' +
        'the lit fraction of the disc and the phase in words, phase angle, elongation from the sun, age since the new moon, ' +
        'the position angle of the lit side and how far it is tilted from straight up as the observer sees it - with ' +
        'moonrise, transit and moonset of that day on the same clock, and every time scale of the moment as for `sun`.',
    );
  addSiteMomentOptions(command, 'time of day on the clock given by --clock');
  addDeltaTOption(command)
    .addHelpText(
      'after',
      siteMomentHelp([
        'heliochron moon --lat 47.62 --lon 9.35 --elevation 410 --date 1783-04-04 --time 20:30',
        'heliochron moon --lat 47.62 --lon 9.35 --date 1783-04-04 --time 21:00 --clock mean --json',
        'heliochron moon --lat 47.62 --lon 9.35 --date 1700-02-18 --calendar julian --time 02:00 --clock italian',
      ]),
    )
    .action(async (options: Record<string, unknown>, actionCommand: Command) => {
      const { run } = await import('./moonCommand.js');
      run([], siteMomentOptionsFrom(options, actionCommand, ['elevation', 'calendar', 'clock', 'pressure', 'temperature']), io);
    });
}
