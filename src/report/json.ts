/**
 * The JSON answers of `heliochron date --json` and `heliochron check --json`.
 *
 * Byte-identical for the same input: no timestamps, no paths from the machine, every
 * number rounded to the digits stated in `digits`, keys in a fixed order (the order in
 * which the objects below are written). Julian Days are UT (`jd`), with the renderings
 * beside them (civil date text, hh:mm times) so that a reader needs no calendar code.
 */
import { deltaTModelName } from '../time/deltaT.js';
import type { Scene } from '../scene/types.js';
import type {
  Candidate,
  CandidateFamily,
  CheckAnswer,
  ConsistencyReport,
  DateAnswer,
  FactEntry,
  Proposal,
  ResidualEntry,
} from '../solver/types.js';
import { formatIsoDay } from '../calendar/format.js';
import { deltaTAtJdUT } from '../time/timeScales.js';
import { STANDARD_AIR } from '../ephemeris/refraction.js';
import {
  CAUTION,
  calendarRuleWords,
  civilDateRendering,
  clockAssumptionCode,
  clockAssumptionWords,
  ellipse95,
  familyIdOf,
  hhmm,
  roundOrNull,
  roundProbability,
  roundTo,
  uncertaintyWords,
  yearStartWords,
} from './formatTimes.js';
import { proposalWords } from './text.js';

/** Decimal digits of each kind of number in the JSON and CSV answers. */
export const DIGITS = {
  jd: 6,
  angleDeg: 3,
  minutes: 2,
  days: 2,
  chiSquare: 4,
  /** Probabilities (p-values): significant digits, not decimals. */
  probabilitySignificant: 4,
  weight: 6,
  ratio: 4,
  seconds: 1,
} as const;

const mo = (m: number): number => roundTo(m, DIGITS.minutes);

function residualJson(r: ResidualEntry) {
  return {
    observationId: r.observationId,
    observationKind: r.observationKind,
    component: r.component,
    unit: r.unit,
    measured: roundTo(r.measured, DIGITS.ratio),
    predicted: roundTo(r.predicted, DIGITS.ratio),
    sigma: roundTo(r.sigma, DIGITS.ratio),
    normalised: roundTo(r.normalised, DIGITS.ratio),
  };
}

function factJson(f: FactEntry) {
  return { observationId: f.observationId, observationKind: f.observationKind, satisfied: f.satisfied, penalty: roundTo(f.penalty, DIGITS.chiSquare), note: f.note };
}

function uncertaintyJson(c: Candidate) {
  const u = c.uncertainty;
  const e = ellipse95(u);
  const p = u.profile;
  return {
    method: u.method,
    words: uncertaintyWords(c),
    ellipseValid: u.ellipseValid,
    ...(u.invalidReason === undefined ? {} : { invalidReason: u.invalidReason }),
    sigmaDays: roundOrNull(u.sigmaDays, DIGITS.days),
    sigmaMinutes: roundOrNull(u.sigmaMinutes, DIGITS.minutes),
    correlation: roundOrNull(u.correlation, DIGITS.ratio),
    minutesPerDay: roundOrNull(u.minutesPerDay, DIGITS.minutes),
    ellipse95: e
      ? {
          halfWidthDays: roundOrNull(e.halfWidthDays, DIGITS.days),
          halfWidthMinutes: roundOrNull(e.halfWidthMinutes, DIGITS.minutes),
          orientationDeg: roundOrNull(e.orientationDeg, DIGITS.angleDeg),
        }
      : null,
    profile: p
      ? {
          fromDate: formatIsoDay(p.fromDate),
          toDate: formatIsoDay(p.toDate),
          fromDays: roundTo(p.fromDays, DIGITS.days),
          toDays: roundTo(p.toDays, DIGITS.days),
          fromLocalApparent: hhmm(p.fromLocalApparentMinutes),
          toLocalApparent: hhmm(p.toLocalApparentMinutes),
          open: p.open,
        }
      : null,
  };
}

/** One candidate as JSON: `jd` (UT) and the renderings beside it. */
export function candidateJson(c: Candidate, scene: Scene, familyId?: string) {
  const date = civilDateRendering(c.civilDate, scene);
  return {
    id: c.id,
    rank: c.rank,
    ...(familyId === undefined ? {} : { family: familyId }),
    jd: roundTo(c.jdUT, DIGITS.jd),
    date: {
      text: date.text,
      iso: date.iso,
      calendar: date.calendar,
      ...(date.oldStyle === undefined ? {} : { oldStyle: date.oldStyle, newStyle: date.newStyle }),
      ...(date.dualYear === undefined ? {} : { dualYear: date.dualYear }),
    },
    weekday: c.weekdayName,
    clockAssumption: clockAssumptionCode(c.clockAssumption),
    clockAssumptionLabel: c.clockAssumptionLabel,
    times: {
      localApparent: hhmm(c.times.localApparentMinutes),
      localMean: hhmm(c.times.localMeanMinutes),
      ut: hhmm(c.times.utMinutes),
      utDate: formatIsoDay(c.times.utDate),
      ...(c.times.clock ? { clock: { time: hhmm(c.times.clock.minutes), label: c.times.clock.label } } : {}),
      localApparentMinutes: mo(c.times.localApparentMinutes),
      localMeanMinutes: mo(c.times.localMeanMinutes),
      utMinutes: mo(c.times.utMinutes),
      equationOfTimeMinutes: mo(c.times.equationOfTimeMinutes),
      deltaTSeconds: roundTo(c.times.deltaTSeconds, DIGITS.seconds),
    },
    sun: {
      azimuthDeg: roundTo(c.sun.azimuthDeg, DIGITS.angleDeg),
      altitudeDeg: roundTo(c.sun.altitudeDeg, DIGITS.angleDeg),
      declinationDeg: roundTo(c.sun.declinationDeg, DIGITS.angleDeg),
      hourAngleDeg: roundTo(c.sun.hourAngleDeg, DIGITS.angleDeg),
    },
    chiSquare: roundTo(c.chiSquare, DIGITS.chiSquare),
    degreesOfFreedom: c.degreesOfFreedom,
    pValue: roundProbability(c.pValue, DIGITS.probabilitySignificant),
    softPenalty: roundTo(c.softPenalty, DIGITS.chiSquare),
    weight: roundTo(c.relativeWeight, DIGITS.weight),
    uncertainty: uncertaintyJson(c),
    residuals: c.residuals.map(residualJson),
    facts: c.facts.map(factJson),
    nuisances: c.nuisances.map((n) => ({
      name: n.name,
      priorDeg: roundTo(n.priorDeg, DIGITS.angleDeg),
      priorSigmaDeg: roundTo(n.priorSigmaDeg, DIGITS.angleDeg),
      fittedDeg: roundTo(n.fittedDeg, DIGITS.angleDeg),
      posteriorSigmaDeg: roundOrNull(n.posteriorSigmaDeg, DIGITS.angleDeg),
    })),
    fit: { converged: c.fit.converged, iterations: c.fit.iterations },
  };
}

const monthDay = (md: { month: number; day: number }): string => `${String(md.month).padStart(2, '0')}-${String(md.day).padStart(2, '0')}`;

function familyJson(f: CandidateFamily, scene: Scene, allYears: boolean) {
  return {
    id: f.id,
    rank: f.rank,
    summary: f.summary,
    clockAssumption: clockAssumptionCode(f.clockAssumption),
    calendar: f.calendar,
    fromYear: f.fromYear,
    toYear: f.toYear,
    yearCount: f.yearCount,
    fromMonthDay: monthDay(f.fromMonthDay),
    toMonthDay: monthDay(f.toMonthDay),
    fromLocalApparent: hhmm(f.fromLocalApparentMinutes),
    toLocalApparent: hhmm(f.toLocalApparentMinutes),
    bestCandidateId: f.best.id,
    bestJd: roundTo(f.best.jdUT, DIGITS.jd),
    bestChiSquare: roundTo(f.bestChiSquare, DIGITS.chiSquare),
    bestPValue: roundProbability(f.bestPValue, DIGITS.probabilitySignificant),
    weight: roundTo(f.relativeWeight, DIGITS.weight),
    ...(allYears ? { members: (f.members ?? []).map((m) => candidateJson(m, scene)) } : {}),
  };
}

function consistencyJson(c: ConsistencyReport, scene: Scene) {
  return {
    rule: c.rule,
    pThreshold: c.pThreshold,
    flagged: [...c.flaggedIds],
    entries: c.entries.map((e) => ({
      observationId: e.observationId,
      observationKind: e.observationKind,
      residualCount: e.residualCount,
      chiSquareAll: roundTo(e.chiSquareAll, DIGITS.chiSquare),
      chiSquareWithout: roundOrNull(e.chiSquareWithout, DIGITS.chiSquare),
      improvement: roundTo(e.improvement, DIGITS.chiSquare),
      pValue: roundProbability(e.pValue, DIGITS.probabilitySignificant),
      flagged: e.flagged,
      note: e.note,
      bestWithout: e.bestWithout
        ? {
            jd: roundTo(e.bestWithout.jdUT, DIGITS.jd),
            date: civilDateRendering(e.bestWithout.civilDate, scene).text,
            localApparent: hhmm(e.bestWithout.times.localApparentMinutes),
            chiSquare: roundTo(e.bestWithout.chiSquare, DIGITS.chiSquare),
          }
        : null,
    })),
  };
}

function assumptionsJson(scene: Scene, clockAssumptions: DateAnswer['clockAssumptions'], best: Candidate | null) {
  const air = scene.air ?? STANDARD_AIR;
  return {
    calendar: calendarRuleWords(scene.calendar),
    yearStart: scene.yearStart,
    yearStartWords: yearStartWords(scene.yearStart),
    clocks: clockAssumptions.map((a) => ({ code: clockAssumptionCode(a), words: clockAssumptionWords(a) })),
    deltaT: {
      model: deltaTModelName(scene.deltaT),
      secondsAtBest: best ? roundTo(best.times.deltaTSeconds, DIGITS.seconds) : null,
      sigmaSecondsAtBest: best ? roundTo(deltaTAtJdUT(best.jdUT, scene.deltaT).sigmaSeconds, DIGITS.seconds) : null,
    },
    refraction: {
      model: 'Bennett (1982) in the NREL SPA form (Reda and Andreas 2008)',
      pressureHPa: air.pressureHPa,
      temperatureC: air.temperatureC,
      stated: scene.air !== undefined,
    },
    site: { latitudeDeg: scene.site.latitudeDeg, longitudeDeg: scene.site.longitudeDeg, elevationM: scene.site.elevationM },
  };
}

const UNITS = {
  jd: 'Julian Day, UT',
  angles: 'degrees; azimuth clockwise from true north, altitude refracted',
  times: 'hh:mm, rounded to the minute; *Minutes fields in minutes after local midnight',
};

/** The `date` answer as one plain object (stringify with stableJson). */
export function dateAnswerJson(answer: DateAnswer, scene: Scene, version: string, options: { allYears?: boolean } = {}) {
  const best = answer.candidates[0] ?? null;
  return {
    heliochronVersion: version,
    scene: answer.sceneTitle,
    status: answer.status,
    verdict: answer.verdict,
    window: { fromYear: answer.window.fromYear, toYear: answer.window.toYear },
    seed: answer.seed,
    measuredResiduals: answer.measuredResiduals,
    families: answer.families.map((f) => familyJson(f, scene, options.allYears === true)),
    candidates: answer.candidates.map((c) => candidateJson(c, scene, familyIdOf(answer, c))),
    consistency: consistencyJson(answer.consistency, scene),
    conflictingIds: [...answer.conflictingIds],
    assumptions: assumptionsJson(scene, answer.clockAssumptions, best),
    notes: [...answer.notes],
    caution: CAUTION,
    units: UNITS,
    digits: DIGITS,
  };
}

function proposalJson(p: Proposal) {
  switch (p.kind) {
    case 'day':
      return {
        kind: p.kind,
        day: formatIsoDay(p.day),
        time: p.timeMinutes === undefined ? null : hhmm(p.timeMinutes),
        clock: p.timeMinutes === undefined ? null : clockAssumptionCode({ ...(p.timeClock ?? { kind: 'apparent' }), stated: true }),
        withinMinutes: p.timeMinutes === undefined ? null : (p.timeToleranceMinutes ?? 0),
        words: proposalWords(p),
      };
    case 'range':
      return { kind: p.kind, from: formatIsoDay(p.from), to: formatIsoDay(p.to), words: proposalWords(p) };
    case 'season':
      return { kind: p.kind, months: [...p.months], fromYear: p.fromYear ?? null, toYear: p.toYear ?? null, words: proposalWords(p) };
  }
}

/** The `check` answer as one plain object. */
export function checkAnswerJson(answer: CheckAnswer, scene: Scene, version: string) {
  return {
    heliochronVersion: version,
    scene: answer.sceneTitle,
    proposal: proposalJson(answer.proposal),
    verdict: answer.verdict,
    verdictText: answer.verdictText,
    chiSquare: roundOrNull(answer.chiSquare, DIGITS.chiSquare),
    degreesOfFreedom: answer.degreesOfFreedom,
    pValue: roundProbability(answer.pValue, DIGITS.probabilitySignificant),
    best: answer.best ? candidateJson(answer.best, scene) : null,
    globalBest: answer.globalBest ? candidateJson(answer.globalBest, scene) : null,
    deltaChiSquareToGlobal: roundOrNull(answer.deltaChiSquareToGlobal, DIGITS.chiSquare),
    assumptions: assumptionsJson(scene, [], answer.best ?? answer.globalBest),
    seed: scene.seed,
    notes: [...answer.notes],
    caution: CAUTION,
    units: UNITS,
    digits: DIGITS,
  };
}

/** JSON text with two-space indent and a final newline (key order as built). */
export function stableJson(value: unknown): string {
  return `${JSON.stringify(value, null, 2)}\n`;
}
