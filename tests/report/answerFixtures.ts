/**
 * Hand-made answers for the renderer tests: invented numbers (demo data, not results),
 * shaped as the solver's types (src/solver/types.ts) so that the renderers can be tested
 * without running the solver.
 */
import type { Candidate, CandidateFamily, CheckAnswer, DateAnswer, SolverCalendarDate } from '../../src/solver/types.js';
import type { Scene } from '../../src/scene/types.js';
import { readSceneText } from '../../src/scene/readScene.js';

export function sceneWith(calendar: string, fromYear: number, toYear: number, yearStart = 'jan1'): Scene {
  return readSceneText(
    [
      'heliochron: 1',
      'title: Fixture scene, Velmar',
      'site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 }',
      `calendar: ${calendar}`,
      `yearStart: ${yearStart}`,
      `window: { fromYear: ${fromYear}, toYear: ${toYear} }`,
      'walls:',
      '  - { id: tanners-hall-front, azimuthDeg: 135, azimuthSigmaDeg: 1 }',
      'observations:',
      '  - { id: sign-bracket, kind: rod-shadow, wall: tanners-hall-front, slopeDeg: 49, side: left, sigmaDeg: 1.5 }',
      '  - { id: well-post, kind: pole-shadow, shadowAzimuthDeg: 279, shadowAzimuthSigmaDeg: 2, lengthRatio: 1.5, lengthRatioSigma: 0.05 }',
      '  - { id: figure, kind: pole-shadow, shadowAzimuthDeg: 67, shadowAzimuthSigmaDeg: 3 }',
      'seed: 5',
    ].join('\n'),
    'fixture.yaml',
  );
}

const day = (year: number, month: number, d: number, calendar: 'julian' | 'gregorian' = 'gregorian'): SolverCalendarDate => ({ calendar, year, month, day: d });

export function candidate(over: Partial<Candidate> & { id: string; rank: number }): Candidate {
  const base: Candidate = {
    id: over.id,
    rank: over.rank,
    clockAssumption: { kind: 'none' },
    clockAssumptionLabel: 'no clock',
    jdUT: 2368114.8115079,
    civilDate: day(1771, 7, 30),
    weekday: 2,
    weekdayName: 'Tuesday',
    times: {
      localApparentMinutes: 480.2,
      localMeanMinutes: 486.17,
      utMinutes: 448.77,
      utDate: day(1771, 7, 30),
      equationOfTimeMinutes: -5.97,
      deltaTSeconds: 16.9,
    },
    sun: { azimuthDeg: 99.3525, altitudeDeg: 33.7274, declinationDeg: 18.59, hourAngleDeg: -59.95 },
    chiSquare: 1.23456,
    softPenalty: 0,
    degreesOfFreedom: 3,
    pValue: 0.745123,
    relativeWeight: 0.61234,
    residuals: [
      { observationId: 'sign-bracket', observationKind: 'rod-shadow', component: 'slope', measured: 49, predicted: 48.9, unit: 'deg', sigma: 1.5, normalised: 0.0667 },
      { observationId: 'well-post', observationKind: 'pole-shadow', component: 'shadow-azimuth', measured: 279, predicted: 279.36, unit: 'deg', sigma: 2, normalised: -0.18 },
      { observationId: 'well-post', observationKind: 'pole-shadow', component: 'length-ratio', measured: 1.5, predicted: 1.497, unit: 'ratio', sigma: 0.05, normalised: 0.06 },
      { observationId: 'figure', observationKind: 'pole-shadow', component: 'shadow-azimuth', measured: 67, predicted: 154.36, unit: 'deg', sigma: 3, normalised: -29.12 },
    ],
    facts: [{ observationId: 'sign-bracket', observationKind: 'wall-lit', satisfied: true, penalty: 0, note: 'wall tanners-hall-front is lit (sun 36 deg from its normal)' }],
    nuisances: [{ name: 'wall:tanners-hall-front:azimuth', unit: 'deg', priorDeg: 135, priorSigmaDeg: 1, fittedDeg: 135.1, posteriorSigmaDeg: 0.9 }],
    uncertainty: {
      method: 'ellipse',
      ellipseValid: true,
      linearityCheck: 0.02,
      covariance: { days2: 16, daysMinutes: 2, minutes2: 4 },
      sigmaDays: 4,
      sigmaMinutes: 2,
      correlation: 0.25,
      minutesPerDay: 0.125,
      ellipses: [
        { probability: 0.6827, deltaChiSquare: 2.3, halfWidthDays: 6.07, halfWidthMinutes: 3.03, semiAxes: [{ days: 6, minutes: 0.5 }, { days: -0.1, minutes: 3 }], orientationDeg: 4.8 },
        { probability: 0.95, deltaChiSquare: 5.991, halfWidthDays: 9.79, halfWidthMinutes: 4.9, semiAxes: [{ days: 9.7, minutes: 0.8 }, { days: -0.2, minutes: 4.8 }], orientationDeg: 4.8 },
      ],
      skyCovariance: { azimuth2: 1, azimuthAltitude: 0, altitude2: 1 },
      skyEllipses: [],
      centre: { days: 0.2, localApparentMinutes: 480.1 },
      fixesDayAndHour: true,
    },
    fit: { converged: true, iterations: 6 },
    mapped: false,
  };
  return { ...base, ...over };
}

/** A candidate whose ellipse was replaced by a profile scan (near the solstice). */
export function scannedCandidate(id: string, rank: number): Candidate {
  const c = candidate({ id, rank, civilDate: day(1771, 6, 18), chiSquare: 2.5, pValue: 0.47, relativeWeight: 0.2 });
  return {
    ...c,
    uncertainty: {
      ...c.uncertainty,
      method: 'profile-scan',
      ellipseValid: false,
      invalidReason: 'near the solstice the date is poorly constrained',
      profile: {
        probability: 0.95,
        deltaChiSquare: 3.841,
        fromDays: -12,
        toDays: 15,
        fromDate: day(1771, 6, 6),
        toDate: day(1771, 7, 3),
        fromLocalApparentMinutes: 475,
        toLocalApparentMinutes: 490,
        open: false,
        points: [],
      },
    },
  };
}

export function family(best: Candidate, over: Partial<CandidateFamily> = {}): CandidateFamily {
  return {
    id: 'f1',
    rank: 1,
    clockAssumption: best.clockAssumption,
    clockAssumptionLabel: best.clockAssumptionLabel,
    keepings: [{ clockAssumption: best.clockAssumption, clockAssumptionLabel: best.clockAssumptionLabel, bestChiSquare: best.chiSquare, bestPValue: best.pValue, fit: 'fits', yearCount: 21 }],
    yearsTold: { singledOut: false, alikeYears: [1765, 1766, 1767], spreadChiSquare: 0.01, alikeSpreadChiSquare: 0.01, words: 'any year 1765-1785 (the light alone cannot tell these years apart)' },
    headline: '29-30 July (Gregorian), any year 1765-1785 (the light alone cannot tell these years apart), 07:59-08:01 local apparent time',
    calendar: best.civilDate.calendar,
    fromYear: 1765,
    toYear: 1785,
    yearCount: 21,
    fromMonthDay: { month: 7, day: 29 },
    toMonthDay: { month: 7, day: 30 },
    fromLocalApparentMinutes: 479,
    toLocalApparentMinutes: 481,
    best,
    bestChiSquare: best.chiSquare,
    bestPValue: best.pValue,
    relativeWeight: 0.8,
    summary: 'any year 1765-1785: 29-30 July (Gregorian), 07:59-08:01 local apparent time',
    ...over,
  };
}

export function answer(over: Partial<DateAnswer> = {}): DateAnswer {
  const c1 = candidate({ id: 'c1', rank: 1 });
  const c2 = scannedCandidate('c2', 2);
  const c3 = candidate({ id: 'c3', rank: 3, civilDate: day(1772, 7, 29), weekdayName: 'Wednesday', chiSquare: 3.1, pValue: 0.0004, relativeWeight: 0.1 });
  const bestWithout = candidate({ id: 'w1', rank: 1, chiSquare: 0.3 });
  return {
    sceneTitle: 'Fixture scene, Velmar',
    status: 'fits',
    verdict: 'Several dates fit: the end of July in any year 1765-1785, near 08:00 local apparent time.',
    window: { fromYear: 1765, toYear: 1785 },
    headline: '29-30 July (Gregorian), any year 1765-1785 (the light alone cannot tell these years apart), 07:59-08:01 local apparent time',
    yearsWords: 'any year 1765-1785',
    familyCount: 2,
    families: [family(c1, { members: [c1, c3] }), family(c2, { id: 'f2', rank: 2, summary: 'any year 1765-1785: 6 June-3 July (Gregorian), 07:55-08:10 local apparent time', relativeWeight: 0.2 })],
    candidates: [c1, c2, c3],
    consistency: {
      rule: 'an observation is flagged when removing it improves chi-square with p < 0.01',
      pThreshold: 0.01,
      entries: [
        { observationId: 'sign-bracket', observationKind: 'rod-shadow', residualCount: 1, chiSquareAll: 848.2, chiSquareWithout: 847.9, improvement: 0.3, pValue: 0.58, flagged: false, note: '' },
        { observationId: 'figure', observationKind: 'pole-shadow', residualCount: 1, chiSquareAll: 848.2, chiSquareWithout: 0.3, improvement: 847.9, pValue: 1e-186, flagged: true, note: 'leaving it out removes the conflict', bestWithout },
      ],
      flaggedIds: ['figure'],
    },
    conflictingIds: [],
    clockAssumptions: [{ kind: 'none' }],
    measuredResiduals: 4,
    notes: ['Mapped years share the ellipse of the nearest representative year.'],
    diagnostics: { stageAGridPoints: 1, stageAMinima: 1, fullRefinements: 1, mappedYears: 0, chiSquareEvaluations: 1, clockAssumptionsTried: 1 },
    seed: 5,
    ...over,
  };
}

export function checkAnswer(over: Partial<CheckAnswer> = {}): CheckAnswer {
  const best = candidate({ id: 'p1', rank: 1, chiSquare: 9.5, pValue: 0.023 });
  const globalBest = candidate({ id: 'g1', rank: 1, chiSquare: 1.2 });
  return {
    sceneTitle: 'Fixture scene, Velmar',
    proposal: { kind: 'day', day: { year: 1771, month: 7, day: 30 }, timeMinutes: 486, timeClock: { kind: 'mean' } },
    verdict: 'doubtful',
    verdictText: 'The light fits 30 July 1771 at 08:06 local mean time only poorly (p = 0.023).',
    best,
    chiSquare: 9.5,
    degreesOfFreedom: 3,
    pValue: 0.023,
    globalBest,
    globalHeadline: '29-30 July (Gregorian), any year 1765-1785 (the light alone cannot tell these years apart), 07:59-08:01 local apparent time',
    deltaChiSquareToGlobal: 8.3,
    absolute: { chiSquare: 9.5, degreesOfFreedom: 3, pValue: 0.023, softPenalty: 0 },
    relative: { deltaChiSquare: 8.3, degreesOfFreedom: 2, pValue: 0.0158, likelihoodRatio: 0.0158, region: 'outside-95' },
    overall: { chiSquare: 1.2, degreesOfFreedom: 2, pValue: 0.55, weak: false, words: 'the evidence as a whole fits well (the best fit in the window: chi-square 1.20 with 2 degrees of freedom, p = 0.55)' },
    notes: [],
    ...over,
  };
}
