/**
 * Disputed calendar switches: where published tables give a region's change from the Julian
 * to the Gregorian calendar on different days, each reading is kept with its source
 * (data/calendar-reforms.json `readings`, docs/calendars.md). This module says when a span of
 * days touches such a dispute and names a day under every reading, so that an answer can show
 * both names and say that the sources disagree. It never picks a reading by itself.
 * All JDs are of local civil days (no time scale), as in regions.ts.
 */
import type { CalendarRule, CivilDay } from '../scene/types.js';
import { findRegion, jdToCivilDate, regionReadings, resolveCalendarRule, type Region, type RegionReading, type ResolvedCalendar } from './regions.js';
import type { Reckoning } from './reckoning.js';

/** One reading of a disputed switch made ready for use, with the rule that selects it. */
export interface DisputedReading {
  readonly reading: RegionReading;
  /** The calendar rule that selects this reading (`region@reading`; the main reading has no `reading`). */
  readonly rule: CalendarRule;
  readonly calendar: ResolvedCalendar;
  /** True for the table's main reading (the row's own periods). */
  readonly main: boolean;
}

/** A region's disputed switch as it touches a span of days. */
export interface DisputedSwitch {
  readonly region: Region;
  /** Every reading, the main one first. */
  readonly readings: readonly DisputedReading[];
  /** First and last civil day (JD of 0h) whose name differs between the readings. */
  readonly firstDisputedJd: number;
  readonly lastDisputedJd: number;
}

/** JDs (of 0h) at which a reading's periods begin (its switches). */
function switchJds(periods: ResolvedCalendar['periods']): number[] {
  return periods.slice(1).map((p) => p.firstJd);
}

/**
 * The region's disputed switch if the rule names a region with more than one reading and the
 * days named differently by the readings overlap [fromJd, toJd] (JDs of civil days; inclusive);
 * otherwise null. A rule that already selects one reading, or a plain Julian/Gregorian/switch
 * rule, is not disputed.
 * @example disputedSwitchIn({ kind: 'region', regionId: 'holland' }, 2299160.5, 2299600.5)?.readings.length // 2
 */
export function disputedSwitchIn(rule: CalendarRule, fromJd: number, toJd: number): DisputedSwitch | null {
  if (rule.kind !== 'region' || rule.reading !== undefined) return null;
  const region = findRegion(rule.regionId);
  if (region.readings === undefined || region.readings.length === 0) return null;
  const readings = regionReadings(region).map((reading, i): DisputedReading => {
    const selected: CalendarRule = i === 0 ? { kind: 'region', regionId: region.id } : { kind: 'region', regionId: region.id, reading: reading.id };
    return { reading, rule: selected, calendar: resolveCalendarRule(selected), main: i === 0 };
  });
  // Days are named differently between the earliest and the latest switch of any reading.
  const all = readings.flatMap((r) => switchJds(r.calendar.periods));
  const firstDisputedJd = Math.min(...all) - 11; // the old names of the skipped days (at most 13) precede the first switch
  const lastDisputedJd = Math.max(...all) + 13;
  if (lastDisputedJd < fromJd || firstDisputedJd > toJd) return null;
  return { region, readings, firstDisputedJd, lastDisputedJd };
}

/** A day's civil name under one reading. */
export interface NameUnderReading {
  readonly reading: RegionReading;
  readonly main: boolean;
  readonly civil: CivilDay;
  readonly reckoning: Reckoning;
}

/**
 * The civil name of the day containing `jd` under every reading of a disputed switch.
 * @example namesUnderReadings(disputedSwitchIn(holland, ...)!, 2299608.5) // 4 January 1583 (Gregorian) and 25 December 1582 (Julian)
 */
export function namesUnderReadings(dispute: DisputedSwitch, jd: number): readonly NameUnderReading[] {
  return dispute.readings.map((r) => {
    const answer = jdToCivilDate(r.calendar, jd);
    return { reading: r.reading, main: r.main, civil: answer.civil, reckoning: answer.reckoning };
  });
}

/** True when the readings give the day containing `jd` more than one name. */
export function isNameDisputed(dispute: DisputedSwitch, jd: number): boolean {
  const names = namesUnderReadings(dispute, jd);
  return names.some((n) => n.civil.year !== names[0].civil.year || n.civil.month !== names[0].civil.month || n.civil.day !== names[0].civil.day);
}
