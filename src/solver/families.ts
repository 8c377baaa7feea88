/**
 * Families: candidates that differ only by year, and by the clock keeping tried, grouped under one
 * line such as "any year 1640-1690: 10-16 September (Gregorian), 07:35-07:50 local apparent time".
 *
 * A family is the same light: the same stage-A minimum and side of the solstice, in one civil
 * calendar (split where the calendar changes within the window). Keepings of a clock of unknown
 * keeping (local apparent, local mean time, ...) that put the same light on the same days (best
 * members within SAME_DAYS days and SAME_MINUTES minutes) are one family that lists the keepings,
 * not several families (the reader sees one set of days).
 *
 * Years: the sun's light returns every year on almost the same day, so the years of a family
 * usually fit alike. Years within YEARS_ALIKE_DELTA_CHI2 of the family's best are called alike
 * (3.841: Delta chi-square of one parameter at 95%, Press et al., Numerical Recipes, 3rd ed.
 * (2007), section 15.6.5); a single year is named only when no other is alike, with what singled
 * it out.
 */
import type { Candidate, CandidateFamily, ClockAssumption, FamilyKeeping, YearsTold } from './types.js';
import type { ClockKind } from '../scene/types.js';
import { MONTH_NAMES } from '../calendar/julianDay.js';
import { formatYearBcAd } from '../calendar/format.js';
import { DELTA_CHI2_1DOF_95 } from '../math/chiSquare.js';
import { describeClockKind } from '../time/clock.js';
import { clockAssumptionLabel, hhmm } from './candidates.js';

const CUMULATIVE_DAYS = [0, 31, 59, 90, 120, 151, 181, 212, 243, 273, 304, 334];

/** Years whose chi-square lies within this of the family's best are alike (one parameter, 95%). */
export const YEARS_ALIKE_DELTA_CHI2 = DELTA_CHI2_1DOF_95;
/** Keepings whose best members lie within this many days of the year ... */
export const SAME_DAYS = 7;
/** ... and this many minutes of local apparent time are one family. */
export const SAME_MINUTES = 30;

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
  readonly penalty: number;
  readonly pValue: number | null;
  readonly assumptionIndex: number;
  readonly assumption: ClockAssumption;
}

/** What a family needs to know of the answer around it. */
export interface FamilyContext {
  /** The years searched. */
  readonly fromYear: number;
  readonly toYear: number;
  /** The window's restrictions on days in words ("the weekday (Mondays only)"), or null when there are none. */
  readonly restrictions: string | null;
  /** How a keeping's best fits: as the answer judges it. */
  readonly judge: (chiSquare: number, penalty: number) => FamilyKeeping['fit'];
  /** True when the scene holds evidence of the moon, which is fitted in every year (src/solver/moonYears.ts). */
  readonly moonEvidence?: boolean;
}

function ordinal(month: number, day: number): number {
  return CUMULATIVE_DAYS[month - 1] + day;
}

/** Distance between two month-days in days, across the year end. */
export function monthDayDistance(a: { month: number; day: number }, b: { month: number; day: number }): number {
  const d = Math.abs(ordinal(a.month, a.day) - ordinal(b.month, b.day));
  return Math.min(d, 365 - d);
}

function monthDayText(a: { month: number; day: number }, b: { month: number; day: number }): string {
  if (a.month === b.month && a.day === b.day) return `${a.day} ${MONTH_NAMES[a.month - 1]}`;
  if (a.month === b.month) return `${a.day}-${b.day} ${MONTH_NAMES[a.month - 1]}`;
  return `${a.day} ${MONTH_NAMES[a.month - 1]} - ${b.day} ${MONTH_NAMES[b.month - 1]}`;
}

function calendarName(c: 'julian' | 'gregorian'): string {
  return c === 'julian' ? 'Julian' : 'Gregorian';
}

/**
 * Years in words: "1775", "any year 1760-1790" (every year of the span), "12 of the years 1760-1790".
 * @example yearsText([1760, 1761, 1762]) // "any year 1760-1762"
 */
export function yearsText(years: readonly number[]): string {
  const sorted = [...new Set(years)].sort((a, b) => a - b);
  const from = sorted[0];
  const to = sorted[sorted.length - 1];
  if (from === to) return formatYearBcAd(from);
  const span = `${formatYearBcAd(from)}-${formatYearBcAd(to)}`;
  return sorted.length === to - from + 1 ? `any year ${span}` : `${sorted.length} of the years ${span}`;
}

/**
 * Years in words, each named when there are few: "1790 and 1809", "1512, 1525 and 1531"; more than
 * `most` as yearsText.
 * @example yearListText([1790, 1809]) // "1790 and 1809"
 */
export function yearListText(years: readonly number[], most = 8): string {
  const sorted = [...new Set(years)].sort((a, b) => a - b);
  if (sorted.length > most || sorted.length <= 1) return yearsText(sorted);
  const named = sorted.map((y) => formatYearBcAd(y));
  return `${named.slice(0, -1).join(', ')} and ${named[named.length - 1]}`;
}

/** The lowest objective of each year. */
function bestByYear(members: readonly FamilyMember[]): Map<number, number> {
  const byYear = new Map<number, number>();
  for (const m of members) byYear.set(m.year, Math.min(byYear.get(m.year) ?? Infinity, m.objective));
  return byYear;
}

/** Whether the family's years are told apart (by the members of the best keeping). */
export function yearsToldOf(members: readonly FamilyMember[], ctx: FamilyContext): YearsTold {
  const byYear = bestByYear(members);
  // Loops, not spreads of the map: a family holds a member for every year of the window.
  let best = Infinity;
  for (const o of byYear.values()) best = Math.min(best, o);
  const alikeYears: number[] = [];
  let spreadChiSquare = -Infinity;
  let alikeSpreadChiSquare = 0;
  for (const [y, o] of byYear) {
    if (o <= best + YEARS_ALIKE_DELTA_CHI2) {
      alikeYears.push(y);
      alikeSpreadChiSquare = Math.max(alikeSpreadChiSquare, o - best);
    }
    spreadChiSquare = Math.max(spreadChiSquare, o - best);
  }
  alikeYears.sort((a, b) => a - b);
  if (alikeYears.length > 1) {
    const words = ctx.moonEvidence
      ? `${yearListText(alikeYears)} (the light and the moon together cannot tell these years apart)`
      : `${yearsText(alikeYears)} (the light alone cannot tell these years apart)`;
    return { singledOut: false, alikeYears, spreadChiSquare, alikeSpreadChiSquare, words };
  }
  const year = alikeYears[0];
  let by: string;
  if (byYear.size > 1) {
    const next = Math.min(...[...byYear].filter(([y]) => y !== year).map(([, o]) => o - best));
    by = ctx.moonEvidence
      ? `the moon: every other year of the family fits worse, by ${next.toFixed(1)} or more in chi-square`
      : `the light itself: every other year of the family fits worse, by ${next.toFixed(1)} or more in chi-square`;
  } else if (ctx.fromYear === ctx.toYear) {
    by = 'the window, which holds this year only';
  } else if (ctx.restrictions) {
    by = `the window's restrictions (${ctx.restrictions}), which leave this year only`;
  } else {
    by = 'the window: no other year of it has this light on an allowed day';
  }
  return { singledOut: true, alikeYears, spreadChiSquare, alikeSpreadChiSquare, singledOutBy: by, words: `${formatYearBcAd(year)} (singled out by ${by})` };
}

/** The keepings of a family in words: "clock kept local mean time (best chi2 3.31) or local apparent (sundial) time (best chi2 4.11); tried: ...". */
function keepingsLabel(keepings: readonly FamilyKeeping[]): string {
  if (keepings.length === 1) return keepings[0].clockAssumptionLabel;
  const kinds = keepings.map((k) => {
    const { stated: _stated, ...kind } = k.clockAssumption as ClockKind & { stated: boolean };
    return `${describeClockKind(kind as ClockKind)} (best chi2 ${k.bestChiSquare.toFixed(2)}${k.fit === 'does-not-fit' ? ', does not fit' : ''})`;
  });
  const stated = keepings.every((k) => k.clockAssumption.kind !== 'none' && k.clockAssumption.stated);
  return `clock kept ${kinds.join(' or ')}; ${stated ? 'as stated' : 'tried: the scene does not say'}`;
}

/** Build one family from its members (at least one; several keepings allowed). */
export function buildFamily(id: string, rank: number, members: readonly FamilyMember[], ctx: FamilyContext, perYear: boolean): CandidateFamily {
  const sorted = [...members].sort((a, b) => a.year - b.year || a.objective - b.objective);
  // The first member of lowest objective (what a stable sort by objective puts first), by one pass.
  const best = members.reduce((x, y) => (y.objective < x.objective ? y : x));
  // With the moon the years differ in fit (src/solver/moonYears.ts): the days and hours shown are
  // those of the years that fit alike, never of years the moon rules out.
  const byKeeping = new Map<number, FamilyMember[]>();
  for (const m of members) {
    const list = byKeeping.get(m.assumptionIndex);
    if (list) list.push(m);
    else byKeeping.set(m.assumptionIndex, [m]);
  }
  const yearsTold = yearsToldOf(byKeeping.get(best.assumptionIndex) ?? [best], ctx);
  const alikeOfBest = ctx.moonEvidence ? new Set(yearsTold.alikeYears) : null;
  const spanned = alikeOfBest ? sorted.filter((m) => alikeOfBest.has(m.year) && m.objective <= best.objective + YEARS_ALIKE_DELTA_CHI2) : sorted;
  // Loops, not spreads or mapped copies: a family holds a member for every year of the window.
  // The first and last day of the year: when the days spread over more than half a year, those before
  // day 183 are counted in the next year (a span across the year end). The first member of lowest
  // (highest) day is taken, as a reduce keeping the earlier on ties would.
  let lo0 = Infinity;
  let hi0 = -Infinity;
  for (const m of spanned) {
    const o = ordinal(m.month, m.day);
    lo0 = Math.min(lo0, o);
    hi0 = Math.max(hi0, o);
  }
  const acrossYearEnd = hi0 - lo0 > 183;
  let first = spanned[0];
  let last = spanned[0];
  let firstO = Infinity;
  let lastO = -Infinity;
  for (const m of spanned) {
    const plainO = ordinal(m.month, m.day);
    const o = acrossYearEnd && plainO < 183 ? plainO + 365 : plainO;
    if (o < firstO) {
      first = m;
      firstO = o;
    }
    if (o > lastO) {
      last = m;
      lastO = o;
    }
  }
  // A night's hours pass midnight (moonlit views): when the hours are spread over more than half a
  // day, those of the morning are read as after midnight if that makes the span shorter ("21:08-00:06").
  let plainMin = Infinity;
  let plainMax = -Infinity;
  let wrappedMin = Infinity;
  let wrappedMax = -Infinity;
  for (const m of spanned) {
    const v = m.apparentMinutes;
    const w = v < 720 ? v + 1440 : v;
    plainMin = Math.min(plainMin, v);
    plainMax = Math.max(plainMax, v);
    wrappedMin = Math.min(wrappedMin, w);
    wrappedMax = Math.max(wrappedMax, w);
  }
  const useWrapped = plainMax - plainMin > 720 && wrappedMax - wrappedMin < plainMax - plainMin;
  const fromMin = useWrapped ? wrappedMin : plainMin;
  const toMin = useWrapped ? wrappedMax : plainMax;
  const yearSet = new Set<number>();
  for (const m of sorted) yearSet.add(m.year);
  const years = [...yearSet];
  const fromYear = sorted[0].year;
  const toYear = sorted[sorted.length - 1].year;

  const keepings: FamilyKeeping[] = [...byKeeping.values()]
    .map((list) => {
      const b = list.reduce((x, y) => (y.objective < x.objective ? y : x));
      return {
        clockAssumption: b.assumption,
        clockAssumptionLabel: clockAssumptionLabel(b.assumption),
        bestChiSquare: b.chiSquare,
        bestPValue: b.pValue,
        fit: ctx.judge(b.chiSquare, b.penalty),
        yearCount: new Set(list.map((m) => m.year)).size,
      };
    })
    .sort((a, b) => a.bestChiSquare - b.bestChiSquare);
  const label = keepingsLabel(keepings);

  const time = hhmm(fromMin) === hhmm(toMin) ? hhmm(fromMin) : `${hhmm(fromMin)}-${hhmm(toMin)}${toMin >= 1440 ? ' (across midnight)' : ''}`;
  const days = monthDayText(first, last);
  const only = yearsTold.singledOut && years.length > 1 ? `; only ${formatYearBcAd(best.year)} fits as well (${yearsTold.singledOutBy})` : '';
  const ruledOut = years.length - new Set(spanned.map((m) => m.year)).size;
  const yearsPart = alikeOfBest && ruledOut > 0
    ? `${yearListText(spanned.map((m) => m.year))} (the years that fit alike; ${ruledOut} other year${ruledOut === 1 ? '' : 's'} of this light fit${ruledOut === 1 ? 's' : ''} worse by more than ${YEARS_ALIKE_DELTA_CHI2.toFixed(2)} in chi-square)`
    : yearsText(years);
  const summary = `${yearsPart}: ${days} (${calendarName(spanned[0].calendar)}), ${time} local apparent time; ${label}${only}`;
  const bestCandidate = best.candidate();
  const headline = yearsTold.singledOut
    ? `${best.day} ${MONTH_NAMES[best.month - 1]} ${formatYearBcAd(best.year)} (${calendarName(best.calendar)}), ${hhmm(best.apparentMinutes)} local apparent time (the year singled out by ${yearsTold.singledOutBy})`
    : `${days} (${calendarName(sorted[0].calendar)}), ${yearsTold.words}, ${time} local apparent time`;
  return {
    id,
    rank,
    clockAssumption: best.assumption,
    clockAssumptionLabel: label,
    keepings,
    yearsTold,
    headline,
    calendar: sorted[0].calendar,
    fromYear,
    toYear,
    yearCount: years.length,
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

/**
 * Groups of members (one per track and calendar, best first) joined where they differ only in the
 * clock keeping: the same calendar, no keeping in common, best members within SAME_DAYS days of the
 * year and SAME_MINUTES minutes. Returns the joined groups, best first.
 */
export function joinKeepings(groups: readonly (readonly FamilyMember[])[]): FamilyMember[][] {
  const bestOf = (g: readonly FamilyMember[]): FamilyMember => g.reduce((x, y) => (y.objective < x.objective ? y : x));
  const joined: { members: FamilyMember[]; heads: FamilyMember[]; keepings: Set<number> }[] = [];
  for (const g of [...groups].sort((a, b) => bestOf(a).objective - bestOf(b).objective)) {
    const head = bestOf(g);
    const into = joined.find(
      (j) =>
        !j.keepings.has(head.assumptionIndex) &&
        j.heads.some(
          (h) =>
            h.calendar === head.calendar &&
            monthDayDistance(h, head) <= SAME_DAYS &&
            Math.abs(h.apparentMinutes - head.apparentMinutes) <= SAME_MINUTES,
        ),
    );
    if (into) {
      into.members.push(...g);
      into.heads.push(head);
      into.keepings.add(head.assumptionIndex);
    } else {
      joined.push({ members: [...g], heads: [head], keepings: new Set([head.assumptionIndex]) });
    }
  }
  return joined.map((j) => j.members);
}
