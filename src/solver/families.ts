/**
 * Families: candidates that differ only by year (same clock assumption, same stage-A
 * minimum and side of the solstice, same civil calendar) grouped under one line such as
 * "any year 1640-1690: 10-16 September (Gregorian), 07:35-07:50 local apparent time".
 * A family is split where the civil calendar changes within the window.
 */
import type { Candidate, CandidateFamily } from './types.js';
import { MONTH_NAMES } from '../calendar/julianDay.js';
import { hhmm } from './candidates.js';

const CUMULATIVE_DAYS = [0, 31, 59, 90, 120, 151, 181, 212, 243, 273, 304, 334];

/** A member as the family needs it. */
export interface FamilyMember {
  readonly candidate: () => Candidate;
  readonly objective: number;
  readonly year: number;
  readonly month: number;
  readonly day: number;
  readonly calendar: 'julian' | 'gregorian';
  readonly apparentMinutes: number;
  readonly weight: number;
  readonly chiSquare: number;
  readonly pValue: number | null;
}

function ordinal(month: number, day: number): number {
  return CUMULATIVE_DAYS[month - 1] + day;
}

function monthDayText(a: { month: number; day: number }, b: { month: number; day: number }): string {
  if (a.month === b.month && a.day === b.day) return `${a.day} ${MONTH_NAMES[a.month - 1]}`;
  if (a.month === b.month) return `${a.day}-${b.day} ${MONTH_NAMES[a.month - 1]}`;
  return `${a.day} ${MONTH_NAMES[a.month - 1]} - ${b.day} ${MONTH_NAMES[b.month - 1]}`;
}

function calendarName(c: 'julian' | 'gregorian'): string {
  return c === 'julian' ? 'Julian' : 'Gregorian';
}

/** Build one family from its members (at least one). */
export function buildFamily(
  id: string,
  rank: number,
  members: readonly FamilyMember[],
  label: string,
  assumption: Candidate['clockAssumption'],
  perYear: boolean,
): CandidateFamily {
  const sorted = [...members].sort((a, b) => a.year - b.year);
  const best = [...members].sort((a, b) => a.objective - b.objective)[0];
  let ords = sorted.map((m) => ({ m, o: ordinal(m.month, m.day) }));
  const lo0 = Math.min(...ords.map((x) => x.o));
  const hi0 = Math.max(...ords.map((x) => x.o));
  if (hi0 - lo0 > 183) ords = ords.map((x) => ({ m: x.m, o: x.o < 183 ? x.o + 365 : x.o }));
  const first = ords.reduce((a, b) => (b.o < a.o ? b : a)).m;
  const last = ords.reduce((a, b) => (b.o > a.o ? b : a)).m;
  const minutes = sorted.map((m) => m.apparentMinutes);
  const fromMin = Math.min(...minutes);
  const toMin = Math.max(...minutes);
  const fromYear = sorted[0].year;
  const toYear = sorted[sorted.length - 1].year;
  const span = toYear - fromYear + 1;
  const years =
    fromYear === toYear ? `${fromYear}` : sorted.length === span ? `any year ${fromYear}-${toYear}` : `${sorted.length} of the years ${fromYear}-${toYear}`;
  const time = hhmm(fromMin) === hhmm(toMin) ? hhmm(fromMin) : `${hhmm(fromMin)}-${hhmm(toMin)}`;
  const summary = `${years}: ${monthDayText(first, last)} (${calendarName(sorted[0].calendar)}), ${time} local apparent time; ${label}`;
  const bestCandidate = best.candidate();
  return {
    id,
    rank,
    clockAssumption: assumption,
    clockAssumptionLabel: label,
    calendar: sorted[0].calendar,
    fromYear,
    toYear,
    yearCount: sorted.length,
    fromMonthDay: { month: first.month, day: first.day },
    toMonthDay: { month: last.month, day: last.day },
    fromLocalApparentMinutes: fromMin,
    toLocalApparentMinutes: toMin,
    best: bestCandidate,
    bestChiSquare: best.chiSquare,
    bestPValue: best.pValue,
    relativeWeight: members.reduce((s, m) => s + m.weight, 0),
    summary,
    members: perYear ? sorted.map((m) => m.candidate()) : undefined,
  };
}
