/**
 * The answer must not mislead: scenes written as a new user would write them (the fictional market
 * town of Orlau, downriver from Velmar; invented data), and what the answer says about them.
 *
 * - orlau-square.yaml: a cornice depth ratio, a flagpole's shadow azimuth and a church clock of unknown
 *   keeping, 1760-1790 under the Austrian calendar (the "four-family" scene: spring and autumn, each
 *   under two clock keepings).
 * - orlau-clock.yaml: a clock alone. orlau-flagpole.yaml: one pole's shadow direction alone.
 * - orlau-square-from-south.yaml: the square with every azimuth measured from south.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readSceneText } from '../../src/scene/readScene.js';
import type { Scene } from '../../src/scene/types.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { checkProposal } from '../../src/solver/checkDate.js';
import { renderCheckText, renderDateText } from '../../src/report/text.js';
import { checkAnswerJson, dateAnswerJson, stableJson } from '../../src/report/json.js';
import { dateAnswerCsv } from '../../src/report/csv.js';
import { dateHourMapData } from '../../src/charts/dateHourMapData.js';
import { chiSquarePValue } from '../../src/math/chiSquare.js';
import { expectClose } from '../helpers/expectClose.js';

const sceneText = (name: string): string => readFileSync(new URL(`./scenes/${name}`, import.meta.url), 'utf8');
const scene = (name: string, edit: (t: string) => string = (t) => t): Scene => readSceneText(edit(sceneText(name)), name);

const square = scene('orlau-square.yaml');
const squareAnswer = solveDates(square);
const clockScene = scene('orlau-clock.yaml');
const clockAnswer = solveDates(clockScene);
const poleScene = scene('orlau-flagpole.yaml');
const poleAnswer = solveDates(poleScene);

/** Four-digit years named in a text, other than those given. */
function yearsNamed(text: string, except: readonly number[]): number[] {
  return [...text.matchAll(/\b(1[5-9]\d\d)\b/g)].map((m) => Number(m[1])).filter((y) => !except.includes(y));
}

describe('years the light cannot tell apart (issue 9, point 1)', () => {
  it('names no single year in the verdict, the headline or the map title when every year of the window fits alike', () => {
    expect(squareAnswer.status).toBe('fits');
    const f1 = squareAnswer.families[0];
    expect(f1.yearsTold.singledOut).toBe(false);
    expect(f1.yearsTold.alikeYears).toHaveLength(31);
    // Alike: within 3.841 of the best, the 95% Delta chi-square of one parameter (Numerical Recipes 3rd ed., 15.6.5).
    expect(f1.yearsTold.spreadChiSquare).toBeLessThan(3.841);
    expect(squareAnswer.verdict).toContain('any year 1760-1790 (the light alone cannot tell these years apart)');
    expect(yearsNamed(squareAnswer.verdict, [1760, 1790])).toEqual([]);
    expect(yearsNamed(squareAnswer.headline ?? '', [1760, 1790])).toEqual([]);
    expect(squareAnswer.yearsWords).toBe('any year 1760-1790');
    expect(dateHourMapData(square, squareAnswer).titleYears).toMatch(/^any year 1760-1790 \(drawn on the days of 1\d{3}\)$/);
  });

  it('names the year when the documentary bounds leave only one, and says that they did', () => {
    const bounded = scene('orlau-square.yaml', (t) => t.replace('window: { fromYear: 1760, toYear: 1790 }', 'window: { fromYear: 1760, toYear: 1790, notBefore: 1784-01-01, notAfter: 1784-12-31 }'));
    const a = solveDates(bounded, { consistency: false });
    const f1 = a.families[0];
    expect(f1.yearsTold.singledOut).toBe(true);
    expect(f1.yearsTold.singledOutBy).toMatch(/documentary bounds: not before 1 January 1784, not after 31 December 1784/);
    expect(a.headline).toMatch(/ 1784 \(Gregorian\), 09:\d\d local apparent time \(the year singled out by the window's restrictions/);
    expect(a.yearsWords).toBe('1784');
    expect(dateHourMapData(bounded, a).titleYears).toBe('1784');
  });
});

describe('evidence that cannot fix day and hour (issue 9, point 2)', () => {
  it('a clock alone gets its own status, and the first line says what is free and what would fix it', () => {
    expect(clockAnswer.status).toBe('undetermined');
    expect(clockAnswer.freedom?.kind).toBe('clock-only');
    expect(clockAnswer.verdict).toMatch(/^Undetermined: a clock alone fixes the hour, not the day\. Any day of 1760-1790 fits/);
    expect(clockAnswer.verdict).toContain('A measured shadow');
    // Local mean time 09:15 plus the equation of time, which spans about -14.2 to +16.4 min in a year
    // (Meeus, Astronomical Algorithms, 2nd ed., ch. 28; from memory): 09:01 to 09:31.
    expect(clockAnswer.verdict).toMatch(/09:15 local mean time, which is 09:0[01]-09:3[12] local apparent time/);
    const text = renderDateText(clockAnswer, clockScene);
    expect(text.split('\n')[1]).toBe('Years searched: 1760 to 1790; 1 measured value; seed 1');
    expect(text.split('\n')[3]).toMatch(/^Verdict: Undetermined: a clock alone fixes the hour, not the day\./);
    expect(text).not.toContain('The evidence fits');
  });

  it('a clock alone gives no candidate outside the window, none at night, no negative degrees of freedom, no interval and no year count beyond the window', () => {
    for (const c of clockAnswer.candidates) {
      expect(c.civilDate.year).toBeGreaterThanOrEqual(1760);
      expect(c.civilDate.year).toBeLessThanOrEqual(1790);
      expect(c.sun.altitudeDeg, `${c.id} at ${c.times.localApparentMinutes} min`).toBeGreaterThan(0);
      expect(c.degreesOfFreedom).toBe(0);
      expect(c.pValue).toBeNull();
      expect(c.uncertainty.method).toBe('not-fixed');
      expect(c.uncertainty.fixesDayAndHour).toBe(false);
      expect(c.uncertainty.profile).toBeUndefined();
    }
    for (const f of clockAnswer.families) expect(f.yearCount).toBeLessThanOrEqual(31);
    const text = renderDateText(clockAnswer, clockScene);
    expect(text).not.toMatch(/ -1 /);
    for (const m of text.matchAll(/(\d+) of the years (\d+)-(\d+)/g)) expect(Number(m[1])).toBeLessThanOrEqual(Number(m[3]) - Number(m[2]) + 1);
    expect(text).not.toMatch(/profile scan/);
    expect(text).toContain('not fixed (see below)');
    expect(dateAnswerCsv(clockAnswer, clockScene)).not.toMatch(/NaN/);
  });

  it('one pole azimuth is undetermined: one number puts the sun on a line, a second measurement would fix it', () => {
    expect(poleAnswer.status).toBe('undetermined');
    expect(poleAnswer.freedom?.kind).toBe('one-number');
    expect(poleAnswer.verdict).toMatch(/^Undetermined: one measured number puts the sun on a line across the sky/);
    expect(poleAnswer.verdict).toContain('A second measurement of the same moment');
    // Every candidate puts the sun opposite the shadow: azimuth 300 - 180 = 120 deg (common practice).
    for (const c of poleAnswer.candidates) expectClose(c.sun.azimuthDeg, 120, 0.5, `${c.id} sun azimuth`);
  });

  it('facts without numbers are undetermined too', () => {
    const facts = scene('orlau-flagpole.yaml', (t) =>
      t.replace('observations:\n  - { id: flagpole, kind: pole-shadow, shadowAzimuthDeg: 300, shadowAzimuthSigmaDeg: 3 }', 'walls:\n  - { id: town-hall-front, azimuthDeg: 135, azimuthSigmaDeg: 2 }\nobservations:\n  - { id: lit-front, kind: wall-lit, wall: town-hall-front }'),
    );
    const a = solveDates(facts);
    expect(a.status).toBe('undetermined');
    expect(a.freedom?.kind).toBe('facts-only');
    expect(a.verdict).toMatch(/^Undetermined: facts without a measured number/);
  });

  it('a fixed scene is not undetermined, and its uncertainty is an ellipse or a scan holding its own day', () => {
    for (const c of squareAnswer.candidates) {
      expect(c.uncertainty.fixesDayAndHour).toBe(true);
      const p = c.uncertainty.profile;
      if (p) {
        expect(p.fromDays).toBeLessThanOrEqual(0);
        expect(p.toDays).toBeGreaterThanOrEqual(0);
        expect(p.fromDate.year).toBeGreaterThanOrEqual(1760);
      }
    }
  });
});

describe('check judged both ways (issue 9, point 3)', () => {
  it('a proposal as good as the best is "consistent: as good as any date in the window", with Delta chi-square, its p and the likelihood ratio', () => {
    const r = checkProposal(square, { kind: 'day', day: { year: 1775, month: 4, day: 2 }, timeMinutes: 555, timeClock: { kind: 'mean' }, timeToleranceMinutes: 10 });
    expect(r.verdict).toBe('consistent');
    expect(r.relative?.region).toBe('as-good');
    expect(r.verdictText).toMatch(/^2 April 1775 at 09:15 is consistent: as good as any date in the window \(Delta chi-square \d\.\d\d against the best in the window, p = [\d.]+, likelihood ratio [\d.]+\)/);
    const rel = r.relative!;
    // Chi-square with 2 degrees of freedom: Q = exp(-x/2) (NIST/SEMATECH e-Handbook, 1.3.6.6.6);
    // the likelihood ratio of a Gaussian likelihood is exp(-Delta chi2 / 2) (Wilks 1938).
    expect(rel.degreesOfFreedom).toBe(2);
    expectClose(rel.pValue, Math.exp(-rel.deltaChiSquare / 2), 1e-9, 'p of Delta chi2, 2 dof');
    expectClose(rel.likelihoodRatio, Math.exp(-rel.deltaChiSquare / 2), 1e-12, 'likelihood ratio');
    // The absolute fit: the time is fitted within +/- 10 min, so 3 numbers - 1 = 2 degrees of freedom.
    expect(r.absolute?.degreesOfFreedom).toBe(2);
    expectClose(r.absolute!.pValue!, Math.exp(-r.absolute!.chiSquare / 2), 1e-9, 'absolute p, 2 dof');
    const text = renderCheckText(r, square);
    expect(text).toMatch(/on its own: chi2 \d\.\d\d with 2 degrees of freedom, p [\d.]+/);
    expect(text).toMatch(/against the best in the window: Delta chi2 \d\.\d\d with 2 degrees of freedom/);
    expect(text).toContain('Fit of the evidence as a whole: the evidence as a whole fits well');
  });

  it('a season that holds the best fit is as good as the best', () => {
    const r = checkProposal(square, { kind: 'season', months: [3, 4] });
    expect(r.verdict).toBe('consistent');
    expect(r.relative?.deltaChiSquare).toBeLessThan(0.01);
    expect(r.verdictText).toContain('consistent: as good as any date in the window');
  });

  it('a proposal far from the best is inconsistent against the best, whatever its own fit', () => {
    const r = checkProposal(square, { kind: 'day', day: { year: 1775, month: 7, day: 1 }, timeMinutes: 555, timeClock: { kind: 'mean' } });
    expect(r.verdict).toBe('inconsistent');
    expect(r.relative!.pValue).toBeLessThan(0.001);
    expect(r.relative!.region).toBe('outside-99.9');
  });

  it('a weak fit of the evidence as a whole is said apart from the verdict', () => {
    const weak = scene('orlau-square.yaml', (t) => t.replace('shadowAzimuthDeg: 300', 'shadowAzimuthDeg: 298'));
    const r = checkProposal(weak, { kind: 'season', months: [3, 4] });
    expect(r.verdict).toBe('consistent');
    expect(r.overall?.weak).toBe(true);
    expect(r.verdictText).toContain('Apart from the proposal: the evidence as a whole fits only weakly');
    expect(renderCheckText(r, weak)).toContain('Fit of the evidence as a whole: the evidence as a whole fits only weakly');
  });
});

describe('families (issue 9, point 5)', () => {
  it('candidates on the same days that differ only in the clock keeping tried are one family listing the keepings', () => {
    expect(squareAnswer.familyCount).toBe(2);
    expect(squareAnswer.families.map((f) => f.keepings.map((k) => k.clockAssumptionLabel.match(/kept (local \w+)/)?.[1]).sort())).toEqual([
      ['local apparent', 'local mean'],
      ['local apparent', 'local mean'],
    ]);
    const [spring, autumn] = squareAnswer.families;
    expect(spring.fromMonthDay.month).toBe(4);
    expect(autumn.fromMonthDay.month).toBe(9);
    expect(spring.clockAssumptionLabel).toMatch(/^clock kept local mean time \(best chi2 3\.\d\d\) or local apparent \(sundial\) time \(best chi2 4\.\d\d\); tried: the scene does not say$/);
    expect(squareAnswer.verdict).toContain('2 families of candidates (days searched: 1760-1790)');
  });
});

describe('JSON numbers (issue 9, point 18; issue 15, point 12)', () => {
  it('carries each ellipse centre and covariance at full precision, and its semi-axes agree with the covariance', () => {
    const c = squareAnswer.candidates[0];
    const json = dateAnswerJson(squareAnswer, square, 'test');
    const u = JSON.parse(stableJson(json)).candidates[0].uncertainty;
    expect(u.centre).toEqual({ days: c.uncertainty.centre.days, localApparentMinutes: c.uncertainty.centre.localApparentMinutes });
    expect(u.covariance).toEqual(c.uncertainty.covariance);
    // Eigenvalues of a 2x2 symmetric matrix (closed form): semi-axis^2 = Delta chi2 * eigenvalue
    // (Press et al., Numerical Recipes 3rd ed., 15.6.5).
    const { days2: a, daysMinutes: b, minutes2: d } = u.covariance;
    const mean = (a + d) / 2;
    const root = Math.sqrt(((a - d) / 2) ** 2 + b * b);
    const e95 = u.ellipses.find((e: { probability: number }) => e.probability === 0.95);
    const major = Math.hypot(e95.semiAxes[0].days, e95.semiAxes[0].minutes);
    const minor = Math.hypot(e95.semiAxes[1].days, e95.semiAxes[1].minutes);
    expectClose(major ** 2, e95.deltaChiSquare * (mean + root), 1e-9 * major ** 2, 'major semi-axis squared');
    expectClose(minor ** 2, e95.deltaChiSquare * (mean - root), 1e-9 * major ** 2, 'minor semi-axis squared');
    expectClose(e95.halfWidthDays, Math.sqrt(e95.deltaChiSquare * a), 1e-9, 'half-width in days');
  });

  it('a number that cannot be given is absent, with the reason stated, never null', () => {
    const text = stableJson(dateAnswerJson(clockAnswer, clockScene, 'test'));
    expect(text).not.toMatch(/"(pValue|bestPValue|sigmaDays|sigmaMinutes|correlation|minutesPerDay|covariance|posteriorSigmaDeg)": null/);
    const c = JSON.parse(text).candidates[0];
    expect(c).not.toHaveProperty('pValue');
    expect(c.absent.pValue).toBe('no degrees of freedom left: 1 measured value for the 2 unknowns (day and hour), so chi-square cannot be judged');
    expect(c.uncertainty).not.toHaveProperty('sigmaDays');
    expect(c.uncertainty.absent.sigmaDays).toMatch(/^the evidence does not fix the day and the hour separately/);
    expect(JSON.parse(text).freedom.leftFree).toBe('a clock alone fixes the hour, not the day');
    const check = stableJson(checkAnswerJson(checkProposal(clockScene, { kind: 'day', day: { year: 1775, month: 4, day: 2 } }), clockScene, 'test'));
    expect(check).not.toMatch(/"pValue": null/);
    expect(JSON.parse(check).absent.pValue).toMatch(/^no degrees of freedom left/);
  });
});

describe('azimuths measured from south (issue 9, point 16)', () => {
  it('when nothing fits and every azimuth turned by 180 deg would, the answer says so and how azimuths are measured', () => {
    const fromSouth = scene('orlau-square-from-south.yaml');
    const a = solveDates(fromSouth);
    expect(a.status).toBe('nothing-fits');
    expect(a.turnedAzimuths).toBeDefined();
    // Turned back, the scene is the square itself: the same best fit.
    expectClose(a.turnedAzimuths!.best.chiSquare, squareAnswer.candidates[0].chiSquare, 0.01, 'chi-square with the azimuths turned');
    expect(a.verdict).toContain('Every stated azimuth turned by 180 deg would fit');
    expect(a.verdict).toContain('Azimuths are measured clockwise from true north');
    expect(a.verdict).toContain('an azimuth measured from south needs 180 added');
  });

  it('says nothing of turned azimuths when the scene fits as stated', () => {
    expect(squareAnswer.turnedAzimuths).toBeUndefined();
    expect(squareAnswer.verdict).not.toContain('turned by 180');
  });
});

describe('wording (issue 9, point 14)', () => {
  it('counts in the singular for one, and a single year once', () => {
    expect(renderDateText(poleAnswer, poleScene)).toContain('; 1 measured value; seed 1');
    const oneYear = scene('orlau-square.yaml', (t) => t.replace('fromYear: 1760, toYear: 1790', 'fromYear: 1775, toYear: 1775'));
    const a = solveDates(oneYear, { consistency: false });
    expect(renderDateText(a, oneYear).split('\n')[1]).toMatch(/^Year searched: 1775; 3 measured values/);
    expect(a.verdict).toContain(' (days searched: 1775).');
    expect(a.verdict).not.toContain('1775-1775');
    const r = checkProposal(square, { kind: 'season', months: [3, 4], fromYear: 1775, toYear: 1775 });
    expect(r.verdictText).toMatch(/^A date in March or April of 1775 is consistent/);
    expect(renderCheckText(r, square)).toContain('Proposal: in March, April 1775');
    expect(renderCheckText(r, square)).toMatch(/with 1 degree of freedom/);
  });

  it('writes "an" before a kind that begins with a vowel', () => {
    expect(() => scene('orlau-square.yaml', (t) => t.replace('depthRatio: 0.68', 'depth: 0.68'))).toThrow(/an overhang-shadow observation/);
  });
});
