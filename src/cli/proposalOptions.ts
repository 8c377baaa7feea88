/**
 * The proposal of `heliochron check` from its options (--on, --time, --clock, --within,
 * --between, --season), read in the scene's calendar and year start; used by the command and
 * by the desk's page (no file access here).
 */
import { InvalidInputError } from '../errors.js';
import type { Scene } from '../scene/types.js';
import type { Proposal } from '../solver/types.js';
import { readCivilDate } from '../scene/calendarFields.js';
import { MAX_YEAR, MIN_YEAR } from '../scene/readScene.js';
import { MONTH_NAMES } from '../calendar/julianDay.js';
import { parseClockKind } from '../time/clock.js';
import { parseTimeOfDay } from './siteMoment.js';
import type { CheckOptions } from './checkSpec.js';
import { CLOCK_DEFAULT } from './clockOption.js';

const SEASON_ALLOWED =
  'months as numbers or English names (three letters or more): a range 5-9 or may-sep (nov-feb wraps the year end), a list 5,6,7, or both (5-6,9)';

function monthOf(word: string, field: string, text: string): number {
  const w = word.trim().toLowerCase();
  if (/^\d{1,2}$/.test(w)) {
    const m = Number(w);
    if (m >= 1 && m <= 12) return m;
    throw new InvalidInputError(field, text, SEASON_ALLOWED, `${word.trim()} is no month number (1-12)`);
  }
  const index = w.length >= 3 ? MONTH_NAMES.findIndex((name) => name.toLowerCase().startsWith(w)) : -1;
  if (index < 0) throw new InvalidInputError(field, text, SEASON_ALLOWED, `${JSON.stringify(word.trim())} is not a month`);
  return index + 1;
}

/**
 * Months of a season as written: "5-9", "may-sep", "5,6,7", "nov-feb" (wraps), "5-6,9".
 * @returns the months in the order of the year, each once
 * @example parseSeason('nov-feb', '--season') // [1, 2, 11, 12]
 */
export function parseSeason(text: string, field: string): number[] {
  const parts = text.split(',').map((p) => p.trim());
  if (text.trim() === '' || parts.some((p) => p === '')) throw new InvalidInputError(field, text, SEASON_ALLOWED);
  const months = new Set<number>();
  for (const part of parts) {
    const range = part.split('-');
    if (range.length === 1) {
      months.add(monthOf(range[0], field, text));
    } else if (range.length === 2) {
      const from = monthOf(range[0], field, text);
      const to = monthOf(range[1], field, text);
      for (let m = from, n = 0; n < 12; m = (m % 12) + 1, n += 1) {
        months.add(m);
        if (m === to) break;
      }
    } else {
      throw new InvalidInputError(field, text, SEASON_ALLOWED, `${JSON.stringify(part)} has more than one "-"`);
    }
  }
  return [...months].sort((a, b) => a - b);
}

/** `--within`: minutes from 0 to 720. */
function toleranceMinutes(text: string): number {
  const value = /^\s*\d+(\.\d+)?\s*$/.test(text) ? Number(text) : NaN;
  if (!(value >= 0 && value <= 720)) throw new InvalidInputError('--within', text, 'a number of minutes from 0 to 720');
  return value;
}

const PROPOSAL_ALLOWED = 'exactly one of --on <date>, --between <date> <date>, --season <months>';

/** The proposal the options describe, with its days read in the scene's calendar and year start. */
export function proposalFromOptions(options: CheckOptions, scene: Scene): Proposal {
  const given = [options.on !== undefined ? '--on' : null, options.between !== undefined ? '--between' : null, options.season !== undefined ? '--season' : null].filter(
    (x): x is string => x !== null,
  );
  if (given.length !== 1) {
    throw new InvalidInputError('--on/--between/--season', given.length === 0 ? undefined : given.join(' '), PROPOSAL_ALLOWED, given.length === 0 ? 'No proposal was given.' : 'Give only one.');
  }
  if (options.on === undefined && options.time !== undefined) throw new InvalidInputError('--time', options.time, 'a time only together with --on <date>');
  if (options.time === undefined && options.clock !== undefined) throw new InvalidInputError('--clock', options.clock, 'a clock only together with --time <hh:mm>');
  if (options.time === undefined && options.within !== undefined) throw new InvalidInputError('--within', options.within, 'a tolerance only together with --time <hh:mm>');
  const day = (text: string, field: string) => {
    const read = readCivilDate(text, field, scene.calendar, scene.yearStart);
    // The years of a scene window: where the Delta T models state an uncertainty.
    if (read.day.year < MIN_YEAR || read.day.year > MAX_YEAR) {
      throw new InvalidInputError(field, text, `a date in the years ${MIN_YEAR} to ${MAX_YEAR} (astronomical numbering), as for the window of a scene file`);
    }
    return read;
  };
  if (options.on !== undefined) {
    const on = day(options.on, '--on');
    if (options.time === undefined) return { kind: 'day', day: on.day };
    const timeMinutes = parseTimeOfDay(options.time, '--time');
    const timeClock = parseClockKind(options.clock ?? CLOCK_DEFAULT, '--clock');
    if (options.within === undefined) return { kind: 'day', day: on.day, timeMinutes, timeClock };
    return { kind: 'day', day: on.day, timeMinutes, timeClock, timeToleranceMinutes: toleranceMinutes(options.within) };
  }
  if (options.between !== undefined) {
    if (options.between.length !== 2) {
      throw new InvalidInputError('--between', options.between.join(' '), 'two civil days, the first and the last of the range (--between 1771-05-01 1771-05-31)');
    }
    const from = day(options.between[0], '--between');
    const to = day(options.between[1], '--between');
    if (to.jd0 < from.jd0) throw new InvalidInputError('--between', options.between.join(' '), 'the earlier day first');
    return { kind: 'range', from: from.day, to: to.day };
  }
  return { kind: 'season', months: parseSeason(options.season as string, '--season') };
}
