import { describe, expect, it } from 'vitest';
import { checkAnswerJson, dateAnswerJson, DIGITS, stableJson } from '../../src/report/json.js';
import { answer, checkAnswer, sceneWith } from './answerFixtures.js';

const scene = sceneWith('gregorian', 1765, 1785);

describe('dateAnswerJson', () => {
  const json = dateAnswerJson(answer(), scene, '0.1.0');

  it('has the top-level fields of the answer in a fixed order', () => {
    expect(Object.keys(json)).toEqual([
      'heliochronVersion', 'scene', 'status', 'verdict', 'headline', 'yearsWords', 'window', 'seed', 'measuredResiduals', 'familyCount', 'families', 'candidates',
      'consistency', 'conflictingIds', 'assumptions', 'notes', 'caution', 'units', 'digits',
    ]);
    expect(json.heliochronVersion).toBe('0.1.0');
    expect(json.status).toBe('fits');
    expect(json.seed).toBe(5);
  });
  it('lists the candidates in rank order, each with a numeric UT Julian Day rounded to 6 digits and its renderings', () => {
    expect(json.candidates.map((c) => c.rank)).toEqual([1, 2, 3]);
    const c = json.candidates[0];
    expect(c.jd).toBe(2368114.811508);
    expect(c.date.text).toBe('30 July 1771 (Gregorian)');
    expect(c.date.iso).toBe('1771-07-30');
    expect(c.times.localApparent).toBe('08:00');
    expect(c.times.localMean).toBe('08:06');
    expect(c.times.ut).toBe('07:29');
    expect(c.sun.azimuthDeg).toBe(99.353);
    expect(c.chiSquare).toBe(1.2346);
    expect(c.uncertainty.ellipse95).toEqual({ halfWidthDays: 9.79, halfWidthMinutes: 4.9, orientationDeg: 4.8 });
    expect(json.candidates[1].uncertainty.method).toBe('profile-scan');
    expect(json.candidates[1].uncertainty.profile?.fromDate).toBe('1771-06-06');
  });
  it('carries the families, the consistency test and the assumptions', () => {
    expect(json.families.map((f) => f.id)).toEqual(['f1', 'f2']);
    expect(json.families[0]).not.toHaveProperty('members');
    expect(json.consistency.flagged).toEqual(['figure']);
    expect(json.consistency.entries[1].bestWithout?.date).toBe('30 July 1771 (Gregorian)');
    expect(json.assumptions.refraction).toEqual({ model: 'Bennett (1982) in the NREL SPA form (Reda and Andreas 2008)', pressureHPa: 1010, temperatureC: 10, stated: false });
    expect(json.assumptions.yearStart).toBe('jan1');
  });
  it('with allYears gives the members of each family', () => {
    const all = dateAnswerJson(answer(), scene, '0.1.0', { allYears: true });
    expect(all.families[0].members?.map((m) => m.date.iso)).toEqual(['1771-07-30', '1772-07-29']);
  });
  it('is byte-identical for the same answer and contains no timestamp', () => {
    const a = stableJson(dateAnswerJson(answer(), scene, '0.1.0'));
    const b = stableJson(dateAnswerJson(answer(), scene, '0.1.0'));
    expect(a).toBe(b);
    expect(a.endsWith('}\n')).toBe(true);
    expect(a).not.toMatch(/20\d\d-\d\d-\d\dT/);
  });
});

describe('checkAnswerJson', () => {
  it('gives the proposal, verdict, chi-square, p-value, the best fit and the global best', () => {
    const json = checkAnswerJson(checkAnswer(), scene, '0.1.0');
    expect(json.proposal).toEqual({ kind: 'day', day: '1771-07-30', time: '08:06', clock: 'mean', withinMinutes: 0, words: 'on 30 July 1771 at 08:06 local mean time' });
    expect(json.verdict).toBe('doubtful');
    expect(json.pValue).toBe(0.023);
    expect(json.best?.jd).toBe(2368114.811508);
    expect(json.deltaChiSquareToGlobal).toBe(8.3);
  });
});

describe('edge cases', () => {
  it('a p-value that cannot be given is absent, with the reason in `absent`; small ones keep their digits', () => {
    const a = answer();
    const json = dateAnswerJson({ ...a, candidates: [{ ...a.candidates[0], pValue: null, degreesOfFreedom: 0 }] }, scene, '0.1.0');
    expect(json.candidates[0]).not.toHaveProperty('pValue');
    expect(json.candidates[0].absent?.pValue).toMatch(/^no degrees of freedom left: 4 measured values/);
    expect(DIGITS.probabilitySignificant).toBe(4);
    expect(dateAnswerJson({ ...a, candidates: [{ ...a.candidates[0], pValue: 3.71234e-239 }] }, scene, 'x').candidates[0].pValue).toBe(3.712e-239);
    expect(dateAnswerJson(a, scene, 'x').candidates[2].pValue).toBe(0.0004);
  });
});
