/**
 * Which reading of a disputed calendar switch a chart's days are named under, in words for the
 * chart's notes (src/calendar/disputedSwitch.ts). Charts are drawn under one reading, the scene's
 * calendar as written: the table's main reading unless the scene states another (`region@reading`).
 */
import { disputedSwitchIn } from '../calendar/disputedSwitch.js';
import { switchWords } from '../solver/calendarReadings.js';
import type { Scene } from '../scene/types.js';
import { dayWindowOf } from '../solver/window.js';

interface ReadingInUse {
  readonly used: { readonly rule: string; readonly label: string; readonly main: boolean };
  readonly others: readonly { readonly rule: string; readonly label: string }[];
}

/** The reading the scene's days are named under and the others, or null when no disputed switch is near its window. */
function readingInUse(scene: Scene): ReadingInUse | null {
  const rule = scene.calendar;
  if (rule.kind !== 'region') return null;
  const win = dayWindowOf(scene);
  // Near the switch: the dispute of the region's readings (whichever is stated) within a year of the window.
  const dispute = disputedSwitchIn({ kind: 'region', regionId: rule.regionId }, win.firstDayJd0 - 366, win.lastDayJd0 + 366);
  if (dispute === null) return null;
  const readings = dispute.readings.map((r) => ({ rule: r.main ? dispute.region.id : `${dispute.region.id}@${r.reading.id}`, label: switchWords(r), id: r.reading.id, main: r.main }));
  const used = readings.find((r) => (rule.reading === undefined ? r.main : r.id === rule.reading)) ?? readings[0];
  return { used, others: readings.filter((r) => r !== used) };
}

/**
 * The note for a chart in two lines (each short enough for a chart's width), or null when the
 * scene's calendar has no disputed switch near its window.
 * @example calendarReadingNote(hollandScene) // ['days named under "holland", the main reading of its calendar switch (21 December 1582 (Julian) followed by 1 January 1583 (Gregorian))', 'the sources disagree: also "holland@placaet" (1 January 1583 (Julian) followed by 12 January 1583 (Gregorian))']
 */
export function calendarReadingNote(scene: Scene): readonly string[] | null {
  const r = readingInUse(scene);
  if (r === null) return null;
  const which = r.used.main ? 'the main reading' : 'a reading stated in the scene';
  return [
    `days named under "${r.used.rule}", ${which} of its calendar switch (${r.used.label})`,
    `the sources disagree: also ${r.others.map((o) => `"${o.rule}" (${o.label})`).join(', ')}`,
  ];
}

/**
 * A short form for a label beside a date, or null.
 * @example calendarReadingShort(hollandScene) // 'calendar "holland", main reading; sources disagree'
 */
export function calendarReadingShort(scene: Scene): string | null {
  const r = readingInUse(scene);
  return r === null ? null : `calendar "${r.used.rule}", ${r.used.main ? 'main' : 'stated'} reading; sources disagree`;
}
