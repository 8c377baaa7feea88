/**
 * Evidence that cannot fix the day and the hour: a clock alone (it fixes the hour, not the day),
 * one measured number (it puts the sun on a line across the sky), facts without numbers, or numbers
 * that depend on the sun in the same way (the fit is singular). Such an answer gets its own status,
 * 'undetermined', and its first line says what is left free and which kind of observation would fix
 * it (common practice: two independent numbers fix the two unknowns, day and hour).
 */
import type { AnswerFreedom, Candidate } from './types.js';
import type { EvidenceModel } from './evidenceModel.js';
import { MONTH_NAMES } from '../calendar/julianDay.js';
import { hhmm } from './candidates.js';
import type { RawCandidate } from './stageB.js';
import { TROPICAL_YEAR_DAYS } from './seasons.js';
import { equationOfTimeMinutes } from '../ephemeris/equationOfTime.js';
import { describeClockKind } from '../time/clock.js';
import { describeSundialHours } from '../time/hourSystems.js';

/** Candidates within this Delta chi-square of the best fit alike (the 68.3% level of one parameter). */
const ALIKE_DELTA_CHI2 = 1;
/** Alike candidates this many days of the year apart mean the day is left free. */
const FREE_SPREAD_DAYS = 20;

/**
 * Largest distance in days of the year (across the year end, by the tropical year) between the best
 * candidate and any candidate that fits alike (within ALIKE_DELTA_CHI2 of it).
 */
export function alikeDaySpread(kept: readonly RawCandidate[]): number {
  if (kept.length === 0) return 0;
  const best = kept[0];
  let spread = 0;
  for (const c of kept) {
    if (c.objective > best.objective + ALIKE_DELTA_CHI2) continue;
    const d = Math.abs(c.dayJd0 - best.dayJd0) % TROPICAL_YEAR_DAYS;
    spread = Math.max(spread, Math.min(d, TROPICAL_YEAR_DAYS - d));
  }
  return spread;
}

/**
 * Whether the evidence fixes day and hour: two measured numbers or more with a regular fit, or else
 * a window and evidence that leave no other day of the year fitting alike (a one-day window, a
 * shadow of length 0 that only the solstice's noon gives).
 */
export function evidenceFixesDayAndHour(model: EvidenceModel, best: Candidate, kept: readonly RawCandidate[]): boolean {
  if (model.measuredCount >= 2 && best.uncertainty.fixesDayAndHour) return true;
  return model.measuredCount > 0 && alikeDaySpread(kept) <= FREE_SPREAD_DAYS;
}

/** What the evidence leaves free, and what would fix it. */
export function freedomOf(model: EvidenceModel): AnswerFreedom {
  const shadowNumbers = model.shadows.reduce((n, t) => n + t.count, 0);
  if (model.measuredCount === 0) {
    return {
      kind: 'facts-only',
      leftFree: 'facts without a measured number (a wall lit or in shade, the sun up) fix neither the day nor the hour; they only rule some hours out',
      wouldFix: 'a measured shadow (the direction and length of a pole\'s shadow, the depth of a cornice\'s shadow, the slope of a rod\'s shadow on a wall) would fix them',
    };
  }
  if (shadowNumbers === 0) {
    return {
      kind: 'clock-only',
      leftFree: model.clocks.some((c) => c.observationKind === 'sundial') ? 'a clock or sundial alone fixes the hour, not the day' : 'a clock alone fixes the hour, not the day',
      wouldFix: 'a measured shadow (the direction and length of a pole\'s shadow, the depth of a cornice\'s shadow, the slope of a rod\'s shadow on a wall) would fix the day',
    };
  }
  if (model.measuredCount === 1) {
    return {
      kind: 'one-number',
      leftFree: 'one measured number puts the sun on a line across the sky, not at one point: on many days some hour fits',
      wouldFix: 'a second measurement of the same moment (the shadow\'s length besides its direction, a shadow on a wall, or a clock) would fix the day and the hour, up to the mirror date on the other side of the solstice',
    };
  }
  return {
    kind: 'same-dependence',
    leftFree: 'the measured numbers depend on the sun in the same way, so they do not fix the day and the hour separately',
    wouldFix: 'a measurement of another kind (a shadow\'s length besides its direction, a shadow on a wall, or a clock) would fix them',
  };
}

const capitalised = (s: string): string => s.charAt(0).toUpperCase() + s.slice(1);

function dayHour(c: Candidate): string {
  return `${c.civilDate.day} ${MONTH_NAMES[c.civilDate.month - 1]} at ${hhmm(c.times.localApparentMinutes)} local apparent time`;
}

/**
 * The verdict of an undetermined answer: what is free, examples from the candidates, what would fix it.
 * @example undeterminedVerdict(freedom, candidates, '1760-1790')
 *   // "Undetermined: a clock alone fixes the hour, not the day. Any day of 1760-1790 fits ..."
 */
export function undeterminedVerdict(freedom: AnswerFreedom, candidates: readonly Candidate[], windowText: string, model: EvidenceModel, midJdUT: number): string {
  const shown = candidates.slice(0, 3);
  let free: string;
  if (freedom.kind === 'clock-only' && model.clocks.length > 0) {
    free = ` Any day of ${windowText} fits, at ${clockHourWords(model, midJdUT)}.`;
  } else if (shown.length > 0) {
    free = ` For example ${shown.map(dayHour).join(', or ')} fit alike; the candidates listed are points along that curve, not separate answers.`;
  } else {
    free = '';
  }
  return `Undetermined: ${freedom.leftFree}.${free} ${capitalised(freedom.wouldFix)}.`;
}

/**
 * The hour a lone clock gives, in local apparent time: the reading itself for a sundial-time clock;
 * for a mean-time clock the reading plus the equation of time, which runs through about -14 to +16
 * minutes in a year (sampled every 2 days over the year around midJdUT; Meeus 1998 ch. 28).
 */
function clockHourWords(model: EvidenceModel, midJdUT: number): string {
  const c = model.clocks[0];
  const reading = hhmm(c.readingMinutes);
  let eMin = Infinity;
  let eMax = -Infinity;
  for (let d = -182; d <= 182; d += 2) {
    const e = equationOfTimeMinutes(midJdUT + d);
    eMin = Math.min(eMin, e);
    eMax = Math.max(eMax, e);
  }
  const meanWords = `${hhmm(c.readingMinutes + eMin)}-${hhmm(c.readingMinutes + eMax)} local apparent time through the year (the equation of time)`;
  const kept = c.kept;
  if (c.observationKind === 'sundial') return `the sundial's ${reading} (${describeSundialHours((kept ?? { kind: 'apparent' }) as Parameters<typeof describeSundialHours>[0])})`;
  if (kept === null) return `the clock's ${reading}: that hour in local apparent time if the clock kept sundial time, ${meanWords} if it kept local mean time`;
  if (kept.kind === 'apparent') return `the clock's ${reading} local apparent time`;
  if (kept.kind === 'mean') return `the clock's ${reading} local mean time, which is ${meanWords}`;
  return `the hour the clock's ${reading} (${describeClockKind(kept)}) gives`;
}
