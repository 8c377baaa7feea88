/**
 * The JSON answers of `heliochron date --json` and `heliochron check --json`.
 *
 * Byte-identical for the same input: no timestamps, no paths from the machine, every
 * number rounded to the digits stated in `digits`, keys in a fixed order (the order in
 * which the objects below are written). Julian Days are UT (`jd`), with the renderings
 * beside them (civil date text, hh:mm times) so that a reader needs no calendar code.
 */
import type { GroupTest } from '../solver/groupConsistency.js';
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
import { countWords } from '../solver/candidates.js';

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
    // The light of a shadow cast by moonlight; absent: the sun (or no light: a clock, the moon's own evidence).
    ...(r.light === 'moon' ? { light: r.light } : {}),
    component: r.component,
    unit: r.unit,
    measured: roundTo(r.measured, DIGITS.ratio),
    predicted: roundTo(r.predicted, DIGITS.ratio),
    sigma: roundTo(r.sigma, DIGITS.ratio),
    normalised: roundTo(r.normalised, DIGITS.ratio),
    ...(r.fullCount ? { fullCount: { minutes: mo(r.fullCount.minutes), turnsOfDial: r.fullCount.turnsOfDial, dialHours: r.fullCount.dialHours } } : {}),
  };
}

function factJson(f: FactEntry) {
  return { observationId: f.observationId, observationKind: f.observationKind, ...(f.light === 'moon' ? { light: f.light } : {}), satisfied: f.satisfied, penalty: roundTo(f.penalty, DIGITS.chiSquare), note: f.note };
}

/**
 * Numbers that cannot be given are left out, and the object's `absent` map says why, field by field
 * (never a null standing for "no number"). `present(obj, reasons)` drops the keys whose value is null,
 * undefined or not finite and lists them with their reason.
 */
export function present<T extends Record<string, unknown>>(obj: T, reasons: Readonly<Record<string, string>>): Partial<T> & { absent?: Record<string, string> } {
  const out: Record<string, unknown> = {};
  const absent: Record<string, string> = {};
  for (const [k, v] of Object.entries(obj)) {
    if (k in reasons && (v === null || v === undefined || (typeof v === 'number' && !Number.isFinite(v)))) absent[k] = reasons[k];
    else out[k] = v;
  }
  return (Object.keys(absent).length ? { ...out, absent } : out) as Partial<T> & { absent?: Record<string, string> };
}

/** Why a candidate's p-value is absent: no degrees of freedom left with this many measured values. */
function noPReason(measured: number): string {
  return `no degrees of freedom left: ${countWords(measured, 'measured value', 'measured values')} for the 2 unknowns (day and hour), so chi-square cannot be judged`;
}

const NO_DOF_PROPOSAL = 'no degrees of freedom left: the proposal fixes as many unknowns as there are measured values, so chi-square cannot be judged';

const NO_SCAN_MINUTE = 'no day of the scan could be fitted, so no hour is known there';

const FREE = 'the evidence does not fix the day and the hour separately (the covariance is singular): the day is free along a curve';

function uncertaintyJson(c: Candidate) {
  const u = c.uncertainty;
  const e = ellipse95(u);
  const p = u.profile;
  const noCov = u.fixesDayAndHour ? 'the covariance could not be computed' : FREE;
  const noProfile = !u.fixesDayAndHour ? FREE : u.method === 'ellipse' ? 'the ellipse holds, so no profile scan was needed' : 'the profile scan was not run';
  const cov = u.covariance;
  const covOk = Number.isFinite(cov.days2) && Number.isFinite(cov.minutes2) && Number.isFinite(cov.daysMinutes);
  return present(
    {
      method: u.method,
      words: uncertaintyWords(c),
      ellipseValid: u.ellipseValid,
      fixesDayAndHour: u.fixesDayAndHour,
      ...(u.invalidReason === undefined ? {} : { invalidReason: u.invalidReason }),
      sigmaDays: roundOrNull(u.sigmaDays, DIGITS.days),
      sigmaMinutes: roundOrNull(u.sigmaMinutes, DIGITS.minutes),
      correlation: roundOrNull(u.correlation, DIGITS.ratio),
      minutesPerDay: roundOrNull(u.minutesPerDay, DIGITS.minutes),
      // Full precision (not rounded), so that a reader can redraw and test every ellipse.
      centre: { days: u.centre.days, localApparentMinutes: u.centre.localApparentMinutes },
      covariance: covOk ? { days2: cov.days2, daysMinutes: cov.daysMinutes, minutes2: cov.minutes2 } : null,
      ellipses: covOk
        ? u.ellipses.map((x) => ({
            probability: x.probability,
            deltaChiSquare: x.deltaChiSquare,
            halfWidthDays: x.halfWidthDays,
            halfWidthMinutes: x.halfWidthMinutes,
            semiAxes: x.semiAxes.map((a) => ({ days: a.days, minutes: a.minutes })),
            orientationDeg: x.orientationDeg,
          }))
        : null,
      ellipse95:
        e && covOk
          ? {
              halfWidthDays: roundOrNull(e.halfWidthDays, DIGITS.days),
              halfWidthMinutes: roundOrNull(e.halfWidthMinutes, DIGITS.minutes),
              orientationDeg: roundOrNull(e.orientationDeg, DIGITS.angleDeg),
            }
          : null,
      profile: p
        ? present({
            fromDate: formatIsoDay(p.fromDate),
            toDate: formatIsoDay(p.toDate),
            fromDays: p.fromDays,
            toDays: p.toDays,
            fromLocalApparent: hhmm(p.fromLocalApparentMinutes),
            toLocalApparent: hhmm(p.toLocalApparentMinutes),
            fromLocalApparentMinutes: p.fromLocalApparentMinutes,
            toLocalApparentMinutes: p.toLocalApparentMinutes,
            deltaChiSquare: p.deltaChiSquare,
            open: p.open,
          }, { fromLocalApparentMinutes: NO_SCAN_MINUTE, toLocalApparentMinutes: NO_SCAN_MINUTE })
        : null,
    },
    {
      sigmaDays: noCov,
      sigmaMinutes: noCov,
      correlation: noCov,
      minutesPerDay: noCov,
      covariance: noCov,
      ellipses: noCov,
      ellipse95: noCov,
      profile: noProfile,
    },
  );
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
    ...(c.moon
      ? {
          moon: {
            azimuthDeg: roundTo(c.moon.azimuthDeg, DIGITS.angleDeg),
            altitudeDeg: roundTo(c.moon.altitudeDeg, DIGITS.angleDeg),
            illuminatedFraction: roundTo(c.moon.illuminatedFraction, DIGITS.ratio),
            phaseLongitudeDeg: roundTo(c.moon.phaseLongitudeDeg, DIGITS.angleDeg),
            elongationDeg: roundTo(c.moon.elongationDeg, DIGITS.angleDeg),
            litSideTiltDeg: roundTo(c.moon.litSideTiltDeg, DIGITS.angleDeg),
            words: c.moon.words,
          },
        }
      : {}),
    chiSquare: roundTo(c.chiSquare, DIGITS.chiSquare),
    degreesOfFreedom: c.degreesOfFreedom,
    ...present({ pValue: roundProbability(c.pValue, DIGITS.probabilitySignificant) }, { pValue: noPReason(c.residuals.length) }),
    softPenalty: roundTo(c.softPenalty, DIGITS.chiSquare),
    weight: roundTo(c.relativeWeight, DIGITS.weight),
    uncertainty: uncertaintyJson(c),
    residuals: c.residuals.map(residualJson),
    facts: c.facts.map(factJson),
    nuisances: c.nuisances.map((n) =>
      present(
        {
          name: n.name,
          unit: n.unit,
          priorDeg: roundTo(n.priorDeg, DIGITS.angleDeg),
          priorSigmaDeg: roundTo(n.priorSigmaDeg, DIGITS.angleDeg),
          fittedDeg: roundTo(n.fittedDeg, DIGITS.angleDeg),
          posteriorSigmaDeg: roundOrNull(n.posteriorSigmaDeg, DIGITS.angleDeg),
        },
        { posteriorSigmaDeg: 'the covariance of the fit is singular' },
      ),
    ),
    fit: { converged: c.fit.converged, iterations: c.fit.iterations },
  };
}

const monthDay = (md: { month: number; day: number }): string => `${String(md.month).padStart(2, '0')}-${String(md.day).padStart(2, '0')}`;

function familyJson(f: CandidateFamily, scene: Scene, allYears: boolean) {
  return {
    id: f.id,
    rank: f.rank,
    summary: f.summary,
    headline: f.headline,
    yearsTold: {
      singledOut: f.yearsTold.singledOut,
      alikeYears: [...f.yearsTold.alikeYears],
      spreadChiSquare: roundTo(f.yearsTold.spreadChiSquare, DIGITS.chiSquare),
      alikeSpreadChiSquare: roundTo(f.yearsTold.alikeSpreadChiSquare, DIGITS.chiSquare),
      ...(f.yearsTold.singledOutBy === undefined ? {} : { singledOutBy: f.yearsTold.singledOutBy }),
      words: f.yearsTold.words,
    },
    clockAssumption: clockAssumptionCode(f.clockAssumption),
    clockAssumptionLabel: f.clockAssumptionLabel,
    keepings: f.keepings.map((k) =>
      present(
        {
          clockAssumption: clockAssumptionCode(k.clockAssumption),
          label: k.clockAssumptionLabel,
          fit: k.fit,
          bestChiSquare: roundTo(k.bestChiSquare, DIGITS.chiSquare),
          bestPValue: roundProbability(k.bestPValue, DIGITS.probabilitySignificant),
          yearCount: k.yearCount,
        },
        { bestPValue: noPReason(f.best.residuals.length) },
      ),
    ),
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
    ...present({ bestPValue: roundProbability(f.bestPValue, DIGITS.probabilitySignificant) }, { bestPValue: noPReason(f.best.residuals.length) }),
    weight: roundTo(f.relativeWeight, DIGITS.weight),
    ...(allYears ? { members: (f.members ?? []).map((m) => candidateJson(m, scene)) } : {}),
  };
}

function groupTestJson(g: GroupTest) {
  return {
    group: g.group,
    observationIds: [...g.observationIds],
    restIds: [...g.restIds],
    residualCount: g.residualCount,
    chiSquareOneSun: roundTo(g.chiSquareOneSun, DIGITS.chiSquare),
    chiSquareSeparate: roundTo(g.chiSquareSeparate, DIGITS.chiSquare),
    ownSun: { azimuthDeg: roundTo(g.ownSun.azimuthDeg, DIGITS.angleDeg), altitudeDeg: roundTo(g.ownSun.altitudeDeg, DIGITS.angleDeg) },
    deltaChiSquare: roundTo(g.deltaChiSquare, DIGITS.chiSquare),
    degreesOfFreedom: g.degreesOfFreedom,
    pValue: roundProbability(g.pValue, DIGITS.probabilitySignificant),
    pThreshold: g.pThreshold,
    differs: g.differs,
    sentence: g.sentence,
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
      ...present({ chiSquareWithout: roundOrNull(e.chiSquareWithout, DIGITS.chiSquare) }, { chiSquareWithout: 'no candidate was found without this observation' }),
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
  nuisances: 'in the unit of each entry: "deg" for a wall azimuth and the site latitude and longitude; "camera sigma" for a component of the camera\'s shared error (its *Deg fields are then in sigmas of that error, not degrees)',
};

/** The `date` answer as one plain object (stringify with stableJson). */
export function dateAnswerJson(answer: DateAnswer, scene: Scene, version: string, options: { allYears?: boolean } = {}) {
  const best = answer.candidates[0] ?? null;
  return {
    heliochronVersion: version,
    scene: answer.sceneTitle,
    status: answer.status,
    verdict: answer.verdict,
    ...(answer.headline === null ? {} : { headline: answer.headline, yearsWords: answer.yearsWords }),
    ...(answer.freedom ? { freedom: { ...answer.freedom } } : {}),
    ...(answer.turnedAzimuths ? { turnedAzimuths: { words: answer.turnedAzimuths.words, best: candidateJson(answer.turnedAzimuths.best, scene) } } : {}),
    window: { fromYear: answer.window.fromYear, toYear: answer.window.toYear },
    seed: answer.seed,
    measuredResiduals: answer.measuredResiduals,
    familyCount: answer.familyCount,
    families: answer.families.map((f) => familyJson(f, scene, options.allYears === true)),
    candidates: answer.candidates.map((c) => candidateJson(c, scene, familyIdOf(answer, c))),
    consistency: consistencyJson(answer.consistency, scene),
    ...(answer.groupTests ? { groupTests: answer.groupTests.map(groupTestJson) } : {}),
    ...(answer.moon
      ? {
          moon: {
            bestYear: answer.moon.bestYear,
            years: [...answer.moon.years],
            alike: answer.moon.alike.map((a) => ({
              year: a.year,
              offsetYears: a.offsetYears,
              lunations: a.lunations,
              date: civilDateRendering(a.civilDate, scene).text,
              deltaChiSquare: roundTo(a.deltaChiSquare, DIGITS.chiSquare),
              pValue: roundProbability(a.pValue, DIGITS.probabilitySignificant),
              sameLight: a.sameLight,
            })),
            words: answer.moon.words,
            nearRepeats: answer.moon.nearRepeats.map((n) => ({
              year: n.year,
              offsetYears: n.offsetYears,
              cycle: n.cycle,
              deltaChiSquare: n.deltaChiSquare === null ? null : roundTo(n.deltaChiSquare, DIGITS.chiSquare),
              pValue: roundProbability(n.pValue, DIGITS.probabilitySignificant),
              fitsAlike: n.fitsAlike,
              refined: n.refined,
            })),
            impossible: [...answer.moon.impossible],
          },
        }
      : {}),
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
  const json = {
    heliochronVersion: version,
    scene: answer.sceneTitle,
    proposal: proposalJson(answer.proposal),
    verdict: answer.verdict,
    verdictText: answer.verdictText,
    chiSquare: roundOrNull(answer.chiSquare, DIGITS.chiSquare),
    degreesOfFreedom: answer.degreesOfFreedom,
    pValue: roundProbability(answer.pValue, DIGITS.probabilitySignificant),
    absolute: answer.absolute
      ? present(
          {
            chiSquare: roundTo(answer.absolute.chiSquare, DIGITS.chiSquare),
            degreesOfFreedom: answer.absolute.degreesOfFreedom,
            pValue: roundProbability(answer.absolute.pValue, DIGITS.probabilitySignificant),
            softPenalty: roundTo(answer.absolute.softPenalty, DIGITS.chiSquare),
          },
          { pValue: NO_DOF_PROPOSAL },
        )
      : null,
    relative: answer.relative
      ? {
          deltaChiSquare: roundTo(answer.relative.deltaChiSquare, DIGITS.chiSquare),
          degreesOfFreedom: answer.relative.degreesOfFreedom,
          pValue: roundProbability(answer.relative.pValue, DIGITS.probabilitySignificant),
          likelihoodRatio: roundProbability(answer.relative.likelihoodRatio, DIGITS.probabilitySignificant),
          region: answer.relative.region,
        }
      : null,
    overall: answer.overall
      ? present(
          {
            chiSquare: roundTo(answer.overall.chiSquare, DIGITS.chiSquare),
            degreesOfFreedom: answer.overall.degreesOfFreedom,
            pValue: roundProbability(answer.overall.pValue, DIGITS.probabilitySignificant),
            weak: answer.overall.weak,
            words: answer.overall.words,
          },
          { pValue: 'no degrees of freedom left, so chi-square cannot be judged' },
        )
      : null,
    best: answer.best ? candidateJson(answer.best, scene) : null,
    globalBest: answer.globalBest ? candidateJson(answer.globalBest, scene) : null,
    globalHeadline: answer.globalHeadline ?? null,
    deltaChiSquareToGlobal: roundOrNull(answer.deltaChiSquareToGlobal, DIGITS.chiSquare),
    assumptions: assumptionsJson(scene, [], answer.best ?? answer.globalBest),
    seed: scene.seed,
    notes: [...answer.notes],
    caution: CAUTION,
    units: UNITS,
    digits: DIGITS,
  };
  const noFit = 'no fit was found inside the proposal';
  return present(json, {
    chiSquare: noFit,
    pValue: answer.best ? NO_DOF_PROPOSAL : noFit,
    deltaChiSquareToGlobal: 'no fit inside the proposal or in the window to compare',
  });
}

/** JSON text with two-space indent and a final newline (key order as built). */
export function stableJson(value: unknown): string {
  return `${JSON.stringify(value, null, 2)}\n`;
}
