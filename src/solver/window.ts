/**
 * The date window of a scene as local days (JD of local 0h, numbers ending in .5) and the
 * documentary restrictions on a day: bounds, allowed months, weekday. Civil dates come from
 * the site's calendar rule (src/calendar/regions.ts), never from JavaScript dates.
 */
import { InvalidInputError } from '../errors.js';
import type { CivilDay, Scene } from '../scene/types.js';
import { civilDateToJd, jdToCivilDay, resolveCalendarRule, type ResolvedCalendar } from '../calendar/regions.js';
import { weekdayOfJd } from '../calendar/julianDay.js';

export interface DayWindow {
  readonly calendar: ResolvedCalendar;
  /** First and last allowed local day (JD of 0h), inclusive. */
  readonly firstDayJd0: number;
  readonly lastDayJd0: number;
  readonly months: ReadonlySet<number> | null;
  readonly weekday: number | null;
  readonly fromYear: number;
  readonly toYear: number;
}

function firstDayOfYear(calendar: ResolvedCalendar, year: number, field: string): number {
  // 1 January; if a reform skipped it (no known case), the next existing day.
  for (let day = 1; day <= 15; day += 1) {
    try {
      return civilDateToJd(calendar, { year, month: 1, day }, field);
    } catch {
      /* try the next day */
    }
  }
  throw new InvalidInputError(field, year, 'a year whose January exists in the stated calendar');
}

/** The scene's window as local days, with the restrictions; optional narrower bounds (civil days). */
export function dayWindowOf(scene: Scene, bounds?: { from?: CivilDay; to?: CivilDay; months?: readonly number[]; fromYear?: number; toYear?: number }): DayWindow {
  const w = scene.window;
  const calendar = resolveCalendarRule(scene.calendar, 'calendar');
  const fromYear = bounds?.fromYear ?? w.fromYear;
  const toYear = bounds?.toYear ?? w.toYear;
  if (!(Number.isInteger(fromYear) && Number.isInteger(toYear) && fromYear <= toYear)) {
    throw new InvalidInputError('window', `${fromYear}..${toYear}`, 'whole years with fromYear <= toYear');
  }
  let first = firstDayOfYear(calendar, fromYear, 'window.fromYear');
  let last = firstDayOfYear(calendar, toYear + 1, 'window.toYear') - 1;
  if (w.notBefore) first = Math.max(first, civilDateToJd(calendar, w.notBefore, 'window.notBefore'));
  if (w.notAfter) last = Math.min(last, civilDateToJd(calendar, w.notAfter, 'window.notAfter'));
  if (bounds?.from) first = Math.max(first, civilDateToJd(calendar, bounds.from, 'proposal.from'));
  if (bounds?.to) last = Math.min(last, civilDateToJd(calendar, bounds.to, 'proposal.to'));
  const monthList = bounds?.months ?? w.months;
  const months = monthList && monthList.length > 0 ? new Set(monthList) : null;
  return { calendar, firstDayJd0: first, lastDayJd0: last, months, weekday: w.weekday ?? null, fromYear, toYear };
}

/** True when the local day (JD of 0h) is allowed by the window and its restrictions. */
export function isDayAllowed(win: DayWindow, dayJd0: number): boolean {
  if (dayJd0 < win.firstDayJd0 - 1e-9 || dayJd0 > win.lastDayJd0 + 1e-9) return false;
  if (win.weekday !== null && weekdayOfJd(dayJd0 + 0.5) !== win.weekday) return false;
  if (win.months !== null && !win.months.has(jdToCivilDay(win.calendar, dayJd0 + 0.5).month)) return false;
  return true;
}

/** The whole local day (JD of 0h) nearest a continuous day value. */
export function nearestDayJd0(d: number): number {
  return Math.round(d - 0.5) + 0.5;
}

/**
 * True when at least one day of the window passes its restrictions (bounds, months, weekday).
 * Only a short window can fail: any 400 consecutive days hold every month, each with every weekday.
 */
export function windowHasAllowedDay(win: DayWindow): boolean {
  if (win.lastDayJd0 - win.firstDayJd0 > 400) return true;
  for (let day = win.firstDayJd0; day <= win.lastDayJd0 + 1e-9; day += 1) if (isDayAllowed(win, day)) return true;
  return false;
}
