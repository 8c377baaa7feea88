/**
 * Dressing a raw candidate for the answer: civil date in the site's calendar (and the other
 * calendar where a switch applies), weekday, times in every clock, sun position, residuals
 * in the observations' own units, facts in words, nuisances, uncertainty.
 */
import type { Candidate, CandidateMoon, ClockAssumption, FactEntry, NuisanceEntry, ResidualEntry, SolverCalendarDate } from './types.js';
import type { ClockKind } from '../scene/types.js';
import { jdToCalendarDate, weekdayOfJd, WEEKDAY_NAMES, type CalendarDate } from '../calendar/julianDay.js';
import { jdToCivilDate } from '../calendar/regions.js';
import { chiSquarePValue } from '../math/chiSquare.js';
import { deltaTAtJdUT } from '../time/timeScales.js';
import { describeClockKind, formatClockKind, jdUTToClockMinutes } from '../time/clock.js';
import { factNote, latitudeOf, lightDirectionOf, predictClock, predictedValuesOf, termEvidence, wallAzimuthOf, wrapSymmetric, type ClockTerm, type EvidenceModel } from './evidenceModel.js';
import { zoneOffsetsAt } from './fitting.js';
import { candidateUncertainty, type UncertaintyCache } from './candidateUncertainty.js';
import type { RawCandidate } from './stageB.js';
import type { MoonPosition } from '../ephemeris/moonPosition.js';
import { moonFactNote, moonLookWords, moonValuesOf } from './moonEvidence.js';
import type { DayWindow } from './window.js';

export function plainDate(d: CalendarDate): SolverCalendarDate {
  return { calendar: d.calendar, year: d.year, month: d.month, day: d.day };
}

function wrapDay(minutes: number): number {
  const m = minutes % 1440;
  return m < 0 ? m + 1440 : m;
}

/**
 * On a dial of fewer than 24 hours, which of the readings the dial cannot tell apart fits: the
 * reading plus a whole number of turns of the dial, nearest the prediction, on the 24-hour count
 * ([0, 1440)). Absent on a 24-hour dial and when the hour hand is not trusted.
 */
function dialCountOf(c: ClockTerm, predictedMinutes: number): { fullCount?: { readonly minutes: number; readonly turnsOfDial: number; readonly dialHours: 6 | 12 } } {
  if (c.dialHours === 24 || c.modulusMinutes !== c.dialHours * 60) return {};
  const turns = Math.round((predictedMinutes - c.readingMinutes) / c.modulusMinutes);
  const k = ((turns % (24 / c.dialHours)) + 24 / c.dialHours) % (24 / c.dialHours);
  return { fullCount: { minutes: c.readingMinutes + k * c.modulusMinutes, turnsOfDial: k, dialHours: c.dialHours } };
}

/** The label of a clock assumption in words. */
export function clockAssumptionLabel(a: ClockAssumption): string {
  if (a.kind === 'none') return 'no clock';
  const { stated, ...kind } = a;
  const words = describeClockKind(kind as ClockKind);
  return stated ? `clock kept ${words} (as stated)` : `clock kept ${words} (tried: the scene does not say)`;
}

/** The clock kind of an assumption, or null. */
export function assumedKind(a: ClockAssumption): ClockKind | null {
  if (a.kind === 'none') return null;
  const { stated: _stated, ...kind } = a;
  return kind as ClockKind;
}

export interface DressContext {
  readonly model: EvidenceModel;
  readonly win: DayWindow;
  readonly assumptions: readonly ClockAssumption[];
  readonly cache: UncertaintyCache;
  readonly profileScans: boolean;
}

/** A Candidate from a raw candidate (rank and weight given by the caller). */
export function dressCandidate(raw: RawCandidate, id: string, rank: number, relativeWeight: number, dc: DressContext): Candidate {
  const { model, win } = dc;
  const scene = model.scene;
  const assumption = dc.assumptions[raw.assumptionIndex];
  const kind = assumedKind(assumption);
  const p = raw.point;
  const civilAnswer = jdToCivilDate(win.calendar, raw.dayJd0 + 0.5);
  const civil = civilAnswer.date;
  const named: SolverCalendarDate = { calendar: civil.calendar, year: civilAnswer.civil.year, month: civilAnswer.civil.month, day: civilAnswer.civil.day };
  const switching = scene.calendar.kind === 'region' || scene.calendar.kind === 'switch';
  const other = switching ? plainDate(jdToCalendarDate(raw.dayJd0 + 0.5, civil.calendar === 'julian' ? 'gregorian' : 'julian').date) : undefined;
  const e = p.state.equationOfTimeMinutes;
  const site = { longitudeDeg: scene.site.longitudeDeg, latitudeDeg: scene.site.latitudeDeg, elevationM: scene.site.elevationM };
  let clock: Candidate['times']['clock'];
  const shownKind = kind ?? model.clocks.find((c) => c.kept && c.observationKind === 'clock')?.kept ?? null;
  if (shownKind && shownKind.kind !== 'apparent') {
    try {
      clock = { kind: shownKind, minutes: jdUTToClockMinutes(p.jdUT, shownKind, site, undefined).minutesOfDay, label: formatClockKind(shownKind) };
    } catch {
      clock = undefined;
    }
  }
  const measuredRows: ResidualEntry[] = [];
  let row = 0;
  for (const t of model.shadows) {
    // A shadow by moonlight is predicted from the moon's place at the candidate's instant.
    const light = lightDirectionOf(t.light, p);
    const values = light ? predictedValuesOf({ ...t, evidence: termEvidence(model, t, raw.nuisances) }, light, wallAzimuthOf(model, t.wallId, raw.nuisances)) : [];
    for (let k = 0; k < t.count; k += 1) {
      const v = values[k] ?? { component: `residual-${k + 1}`, measured: NaN, predicted: NaN, unit: '', sigma: NaN };
      // The solver's residuals are (predicted - measured) / sigma; reports use the opposite sign (docs/conventions.md).
      measuredRows.push({ observationId: t.observationId, observationKind: t.observationKind, light: t.light, ...v, normalised: -p.residuals[row] });
      row += 1;
    }
  }
  const zoneOffset = zoneOffsetsAt(model, kind, p.jdUT);
  for (const c of model.clocks) {
    const pred = predictClock(c, model, {
      sun: p.sun,
      nuisances: raw.nuisances,
      apparentMinutes: raw.apparentMinutes,
      equationOfTimeMinutes: e,
      assumedClock: kind,
      zoneOffsetMinutes: zoneOffset,
    });
    const predicted = c.readingMinutes + wrapSymmetric(pred.minutes - c.readingMinutes, c.modulusMinutes);
    measuredRows.push({
      observationId: c.observationId,
      observationKind: c.observationKind,
      ...dialCountOf(c, pred.minutes),
      component: 'reading',
      measured: c.readingMinutes,
      predicted,
      unit: 'min',
      sigma: c.precisionMinutes,
      normalised: -p.residuals[row],
    });
    row += 1;
  }
  for (const t of model.moons) {
    const values = p.moon ? moonValuesOf(t.evidence, p.moon) : [];
    for (let k = 0; k < t.count; k += 1) {
      const v = values[k] ?? { component: `residual-${k + 1}`, measured: NaN, predicted: NaN, unit: '', sigma: NaN };
      measuredRows.push({ observationId: t.observationId, observationKind: t.observationKind, ...v, normalised: -p.residuals[row] });
      row += 1;
    }
  }
  row += model.nuisances.length;
  const facts: FactEntry[] = model.facts.map((f) => {
    const r = p.residuals[row++];
    const satisfied = !(Math.abs(r) > 1e-9);
    return {
      observationId: f.observationId,
      observationKind: f.fact,
      ...(f.light ? { light: f.light } : {}),
      satisfied,
      penalty: r * r,
      note: factNote(model, f, p.sun, wallAzimuthOf(model, f.wallId, raw.nuisances), satisfied, raw.nuisances, p.moon),
    };
  });
  for (const f of model.moonFacts) {
    const r = p.residuals[row++];
    const satisfied = !(Math.abs(r) > 1e-9);
    facts.push({
      observationId: f.observationId,
      observationKind: f.fact,
      satisfied,
      penalty: r * r,
      note: p.moon ? moonFactNote(f, p.moon, satisfied) : 'the moon was not evaluated here',
    });
  }
  const cov = raw.rep.covariance;
  const nuisances: NuisanceEntry[] = model.nuisances.map((n, k) => ({
    name: n.name,
    unit: n.kind === 'camera' ? 'camera sigma' : 'deg',
    priorDeg: n.priorDeg,
    priorSigmaDeg: n.sigmaDeg,
    fittedDeg: n.kind === 'latitude' ? latitudeOf(model, raw.nuisances) : raw.nuisances[k], // the latitude as used: held to [-90, 90]
    posteriorSigmaDeg: cov ? Math.sqrt(cov[k + 2][k + 2]) : NaN,
  }));
  const dof = Math.max(0, model.measuredCount - 2);
  const weekday = weekdayOfJd(raw.dayJd0 + 0.5);
  const utFraction = p.jdUT - 0.5 - Math.floor(p.jdUT - 0.5);
  return {
    id,
    rank,
    clockAssumption: assumption,
    clockAssumptionLabel: clockAssumptionLabel(assumption),
    jdUT: p.jdUT,
    civilDate: named,
    civilReckoning: civilAnswer.reckoning === 'julian' || civilAnswer.reckoning === 'gregorian' ? undefined : civilAnswer.reckoning,
    otherCalendarDate: other,
    weekday,
    weekdayName: WEEKDAY_NAMES[weekday],
    times: {
      localApparentMinutes: wrapDay(raw.apparentMinutes),
      localMeanMinutes: wrapDay(raw.apparentMinutes - e),
      utMinutes: utFraction * 1440,
      utDate: plainDate(jdToCalendarDate(p.jdUT, civil.calendar).date),
      clock,
      equationOfTimeMinutes: e,
      deltaTSeconds: deltaTAtJdUT(p.jdUT, scene.deltaT).seconds,
    },
    sun: { azimuthDeg: raw.sun.azimuthDeg, altitudeDeg: raw.sun.altitudeDeg, declinationDeg: raw.sun.declinationDeg, hourAngleDeg: raw.sun.hourAngleDeg },
    chiSquare: raw.chiSquare,
    softPenalty: raw.penalty,
    degreesOfFreedom: dof,
    pValue: dof > 0 ? chiSquarePValue(raw.chiSquare, dof) : null,
    relativeWeight,
    residuals: measuredRows,
    facts,
    nuisances,
    uncertainty: candidateUncertainty(raw, win, dc.cache, false, dc.profileScans),
    fit: raw.fit,
    mapped: raw.mapped,
    ...(p.moon ? { moon: candidateMoonOf(p.moon) } : {}),
  };
}

/** The moon of a candidate as the answer shows it. */
export function candidateMoonOf(m: MoonPosition): CandidateMoon {
  return {
    azimuthDeg: m.azimuthDeg,
    altitudeDeg: m.altitudeDeg,
    illuminatedFraction: m.illuminatedFraction,
    phaseLongitudeDeg: m.phaseLongitudeDeg,
    elongationDeg: m.elongationDeg,
    litSideTiltDeg: m.brightLimbTiltFromVerticalDeg,
    words: moonLookWords(m),
  };
}

/** hh:mm of minutes after midnight, rounded to the minute. */
export function hhmm(minutes: number): string {
  const m = Math.round(wrapDay(minutes)) % 1440;
  return `${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`;
}

/**
 * A count with its noun in the right number.
 * @example countWords(1, 'degree of freedom', 'degrees of freedom') // "1 degree of freedom"
 */
export function countWords(n: number, singular: string, plural: string): string {
  return `${n} ${n === 1 ? singular : plural}`;
}
