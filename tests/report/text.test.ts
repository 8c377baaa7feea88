import { describe, expect, it } from 'vitest';
import { pText, proposalWords, renderCheckText, renderDateText, textTable } from '../../src/report/text.js';
import { answer, checkAnswer, sceneWith } from './answerFixtures.js';

const scene = sceneWith('gregorian', 1765, 1785);

describe('renderDateText', () => {
  const text = renderDateText(answer(), scene);
  const lines = text.split('\n');

  it('puts the verdict first, right after the title and the years searched', () => {
    expect(lines[0]).toBe('Fixture scene, Velmar');
    expect(lines[3]).toBe('Verdict: Several dates fit: the end of July in any year 1765-1785, near 08:00 local apparent time.');
  });
  it('lists the families one line each, in rank order', () => {
    const f1 = lines.findIndex((l) => l.includes('1. any year 1765-1785: 29-30 July (Gregorian)'));
    const f2 = lines.findIndex((l) => l.includes('2. any year 1765-1785: 6 June-3 July'));
    expect(f1).toBeGreaterThan(3);
    expect(f2).toBe(f1 + 1);
    expect(lines[f1]).toContain('best chi2 1.23, p 0.745, weight 0.800');
  });
  it('tabulates the candidates with date, weekday, apparent, mean and UT times, sun, chi2, p, weight and uncertainty', () => {
    const header = lines.find((l) => l.trim().startsWith('rank'));
    expect(header).toBeDefined();
    for (const col of ['date (site calendar)', 'weekday', 'apparent', 'mean', 'UT', 'azimuth', 'altitude', 'chi2', 'p', 'weight', '95% uncertainty']) {
      expect(header).toContain(col);
    }
    const row1 = lines.find((l) => /^\s+1\s+30 July 1771 \(Gregorian\)/.test(l));
    expect(row1).toBeDefined();
    expect(row1).toMatch(/Tuesday\s+08:00\s+08:06\s+07:29\s+99\.4\s+33\.7\s+1\.23\s+3\s+0\.745\s+0\.612\s+\+\/-9\.8 d \+\/-5 min/);
    const row3 = lines.find((l) => /^\s+3\s+29 July 1772/.test(l));
    expect(row3).toContain('4.0e-4'); // small p-values in scientific notation, not "0.000"
  });
  it('says why the ellipse was replaced and gives the scanned interval instead', () => {
    expect(text).toContain('The error ellipse was replaced by a profile scan of the day (rank 2) because near the solstice the date is poorly constrained:');
    expect(text).toContain('rank 2: 95% profile scan 6 June 1771 to 3 July 1771 (-12.0 to +15.0 d), 07:55-08:10 local apparent time');
  });
  it('gives each residual of the best candidate, normalised by its sigma', () => {
    expect(text).toMatch(/well-post\s+pole-shadow\s+shadow-azimuth\s+279\.0\s+279\.4\s+2\.0\s+deg\s+-0\.18/);
    expect(text).toMatch(/figure\s+pole-shadow\s+shadow-azimuth\s+67\.0\s+154\.4\s+3\.0\s+deg\s+-29\.12/);
    expect(text).toContain('holds: sign-bracket - wall tanners-hall-front is lit');
  });
  it('reports the consistency test: the flagged observation and how much the fit improves without it', () => {
    expect(text).toMatch(/FLAGGED figure \(pole-shadow\): chi2 848\.20 -> 0\.30 without it, improvement 847\.90 \(p 1\.0e-186\)/);
    expect(text).toContain('flagged: figure');
  });
  it('ends with the assumptions and the caution', () => {
    const a = text.indexOf('Assumptions:');
    const c = text.indexOf('Caution:');
    expect(a).toBeGreaterThan(text.indexOf('Consistency'));
    expect(c).toBeGreaterThan(a);
    expect(text).toContain('calendar: Gregorian calendar');
    expect(text).toContain('the year begins on 1 January');
    expect(text).toContain('Morrison, Stephenson, Hohenkerk and Zawilski 2021 spline');
    expect(text).toContain('refraction by the Bennett / NREL SPA formula for 1010 hPa and 10 C (standard air, the scene states none)');
    expect(text).toContain('documentary evidence and expert judgement');
  });
  it('with allYears lists the members of each family', () => {
    const all = renderDateText(answer(), scene, { allYears: true });
    expect(all).toContain('Family 1 (no clock), every year:');
    expect(all).toMatch(/1772\s+29 July 1772 \(Gregorian\)\s+Wednesday/);
    expect(all).toContain('family 2: no per-year members in this answer');
    expect(text).not.toContain('every year:');
  });
});

describe('renderCheckText', () => {
  it('gives the one-line verdict, the best fit inside the proposal, chi2 and p, and the global best', () => {
    const text = renderCheckText(checkAnswer(), scene);
    expect(text.split('\n')[1]).toBe('Proposal: on 30 July 1771 at 08:06 local mean time');
    expect(text).toContain('Verdict: doubtful - The light fits 30 July 1771 at 08:06 local mean time only poorly (p = 0.023).');
    expect(text).toContain('chi2 9.50 with 3 degrees of freedom, p 0.023');
    expect(text).toContain('against the best in the window: Delta chi2 8.30 with 2 degrees of freedom (what the proposal fixes), p 0.016, likelihood ratio 0.016');
    expect(text).toContain('Fit of the evidence as a whole: the evidence as a whole fits well');
    expect(text).toContain('Residuals of the best fit inside the proposal:');
  });
  it('says so when the proposal holds no instant', () => {
    const text = renderCheckText(checkAnswer({ best: null, chiSquare: null, pValue: null, verdict: 'inconsistent', verdictText: 'The sun never stands where the shadows put it on that day.' }), scene);
    expect(text).toContain('Best fit inside the proposal: none');
  });
});

describe('edge cases', () => {
  it('an answer without candidates still gives the verdict, the assumptions and the caution', () => {
    const text = renderDateText(answer({ status: 'no-candidates', verdict: 'Nothing fits: the sun never stands where the evidence puts it.', families: [], candidates: [] }), scene);
    expect(text).toContain('Verdict: Nothing fits');
    expect(text).not.toContain('Best candidates');
    expect(text).toContain('Caution:');
  });
  it('proposals are worded for each kind', () => {
    expect(proposalWords({ kind: 'range', from: { year: 1771, month: 5, day: 1 }, to: { year: 1771, month: 5, day: 31 } })).toBe('between 1 May 1771 and 31 May 1771');
    expect(proposalWords({ kind: 'season', months: [5, 6] })).toBe("in May, June, any year of the scene's window");
    expect(proposalWords({ kind: 'day', day: { year: 1771, month: 5, day: 1 } })).toBe('on 1 May 1771 (any hour)');
  });
  it('a clock reading is shown as a time of day', () => {
    const a = answer();
    const c1 = a.candidates[0];
    const withClock = { ...c1, residuals: [{ observationId: 'town-clock', observationKind: 'clock', component: 'reading', measured: 486, predicted: 485.94, unit: 'min', sigma: 2, normalised: 0.03 }] };
    const text = renderDateText({ ...a, candidates: [withClock] }, scene);
    expect(text).toMatch(/town-clock\s+clock\s+reading\s+08:06\.0\s+08:05\.9\s+2\.0\s+min\s+\+0\.03/);
  });
  it('a zone or meridian clock gets its own column; a mean-time clock does not repeat the mean column', () => {
    const a = answer();
    const zoned = { ...a.candidates[0], times: { ...a.candidates[0].times, clock: { kind: { kind: 'zone' as const, zone: 'Europe/Zurich' }, minutes: 545, label: 'zone time Europe/Zurich' } } };
    const text = renderDateText({ ...a, candidates: [zoned] }, scene);
    expect(text).toMatch(/UT\s+clock\s+azimuth/);
    expect(text).toContain('(clock column: the time the clock showed under the assumption of its row, zone time Europe/Zurich)');
    const meaned = { ...a.candidates[0], times: { ...a.candidates[0].times, clock: { kind: { kind: 'mean' as const }, minutes: 486, label: 'local mean time' } } };
    expect(renderDateText({ ...a, candidates: [meaned] }, scene)).not.toMatch(/UT\s+clock\s+azimuth/);
  });
  it('p-values and tables', () => {
    expect(pText(null)).toBe('-');
    expect(pText(0.5)).toBe('0.500');
    expect(pText(0)).toBe('<1e-300');
    expect(textTable([['a', 'bb'], ['ccc', 'd']], [1])).toEqual(['a    bb', '---  --', 'ccc   d']);
  });
});
