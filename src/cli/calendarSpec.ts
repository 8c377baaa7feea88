/**
 * Options of `heliochron calendar`: light, loaded with the program; the work is in calendarCommand.ts.
 */
import type { Command } from 'commander';
import type { CliIo } from './io.js';

export const CALENDAR_DEFAULT = 'gregorian';
export const YEAR_START_DEFAULT = 'jan1';

export function registerCalendar(program: Command, io: CliIo): void {
  program
    .command('calendar')
    .summary('show one day in the Julian and Gregorian calendars, its Julian Day and weekday')
    .description(
      'Show one day in the Julian and Gregorian calendars, its Julian Day (of 0h and of noon), its weekday, ' +
        'the civil date in a region (Old Style / New Style near a switch) and its dual year under a year-start style.',
    )
    .argument('[date]', 'the day: 1582-10-15, -0043-03-15 (astronomical years), 44-03-15 BC, "15 March 44 BC", 1650/1-02-10 (dual year), or "JD 2299160.5"')
    .option(
      '--calendar <rule>',
      "calendar the date is written in: 'gregorian' (proleptic before 1582), 'julian', a region id (see --list-regions) " +
        "or 'switch:YYYY-MM-DD/YYYY-MM-DD' (last Julian day / first Gregorian day)",
      CALENDAR_DEFAULT,
    )
    .option('--year-start <style>', "where the written year began: jan1, mar25-forward, mar25-backward, mar1, dec25", YEAR_START_DEFAULT)
    .option('--json', 'print one JSON object instead of text')
    .option('--list-regions', 'list the regions of the reform table with their switch days and sources')
    .addHelpText(
      'after',
      '\nThe calendar is never guessed: without --calendar the date is read in the proleptic Gregorian calendar,\n' +
        'and every answer says which calendar and year start were used. Examples:\n' +
        '  heliochron calendar 1752-09-14 --calendar great-britain\n' +
        '  heliochron calendar 1650/1-02-10 --calendar great-britain\n' +
        '  heliochron calendar "15 March 44 BC" --calendar julian --json\n',
    )
    .action(async (date: string | undefined, options: Record<string, unknown>, command: Command) => {
      const { run } = await import('./calendarCommand.js');
      run(date === undefined ? [] : [date], {
        calendar: String(options.calendar),
        calendarGiven: command.getOptionValueSource('calendar') !== 'default',
        yearStart: String(options.yearStart),
        yearStartGiven: command.getOptionValueSource('yearStart') !== 'default',
        json: options.json === true,
        listRegions: options.listRegions === true,
      }, io);
    });
}
