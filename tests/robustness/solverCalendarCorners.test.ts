/**
 * Calendar corners in the date solver: a window across a region's switch (the families split
 * by calendar, both calendars shown), negative years, 29 February 1700 (Julian leap day, not
 * Gregorian) as a documentary bound, and year-start styles near 1 January and 25 March in the
 * bounds, with a dual year. Every scene goes through the real reader.
 *
 * Sources: Meeus, Astronomical Algorithms, 2nd ed. (1998), ch. 7 (Julian and Gregorian leap
 * rules: 1700 is a Julian leap year and not a Gregorian one; the Julian calendar runs 10 days
 * behind the Gregorian from 1582 to 28 February 1700 Julian, 11 days after); the Protestant
 * German switch 18 February 1700 (Julian) -> 1 March 1700 (Gregorian) (Grotefend 1941, as in
 * /work/shared/REFERENCES.md and data/calendar-reforms.json); English year-start style,
 * 25 March before 1752 (Grotefend 1941, as quoted in data/calendar-reforms.json; the region's own data);
 * Delta T at -500 of 17190 s (Espenak and Meeus 2006, NASA TP-2006-214141, table of Delta T).
 */
import { describe, expect, it } from 'vitest';
import { calendarDateToJd, weekdayOfJd } from '../../src/calendar/julianDay.js';
import { InvalidInputError } from '../../src/errors.js';
import { dateAnswerJson } from '../../src/report/json.js';
import { solveDates } from '../../src/solver/solveDates.js';
import type { Candidate } from '../../src/solver/types.js';
import { nonFinitePaths, sceneOf, velmar, type Data } from './robustHelpers.js';

let solved = 0;
function solve(data: Data, perYear = false) {
  const scene = sceneOf(data);
  const answer = solveDates(scene, { perYear, maxCandidates: 40 });
  expect(nonFinitePaths(dateAnswerJson(answer, scene, 'test'))).toEqual([]);
  solved += 1;
  return { scene, answer };
}

function refusal(data: Data): InvalidInputError {
  try {
    sceneOf(data);
  } catch (e) {
    if (e instanceof InvalidInputError) return e;
    throw e;
  }
  throw new Error('the scene was accepted');
}

const jdOf = (c: Candidate) => calendarDateToJd(c.civilDate);

describe('a window across the Protestant German switch of 1700', () => {
  // Morning light of the Marktgasse example (rod 49 deg left on a 135 deg wall, shadow of a post).
  const { answer } = solve(velmar({
    calendar: 'protestant-germany',
    yearStart: 'jan1',
    window: { fromYear: 1694, toYear: 1706, months: [7, 8] },
    observations: [
      { id: 'bracket', kind: 'rod-shadow', wall: 'tanners-hall-front', slopeDeg: 49, side: 'left', sigmaDeg: 1.5 },
      { id: 'post', kind: 'pole-shadow', shadowAzimuthDeg: 279, shadowAzimuthSigmaDeg: 2, lengthRatio: 1.5, lengthRatioSigma: 0.05 },
    ],
  }), true);

  it('splits the families by calendar: Julian up to 1699, Gregorian from 1700', () => {
    expect(answer.status).toBe('fits');
    const julian = answer.families.filter((f) => f.calendar === 'julian');
    const gregorian = answer.families.filter((f) => f.calendar === 'gregorian');
    expect(julian.length).toBeGreaterThan(0);
    expect(gregorian.length).toBeGreaterThan(0);
    for (const f of julian) expect(f.toYear).toBeLessThanOrEqual(1699);
    for (const f of gregorian) expect(f.fromYear).toBeGreaterThanOrEqual(1700);
    for (const c of answer.candidates) expect(c.civilDate.calendar).toBe(c.civilDate.year < 1700 ? 'julian' : 'gregorian');
  });

  it('names the same light 10 days earlier in the Julian years (the Julian calendar was 10 days behind)', () => {
    // Pair a Julian-family member (1699) and a Gregorian-family member (1700) of the same track.
    const f = answer.families.find((x) => x.calendar === 'julian' && x.members?.some((m) => m.civilDate.year === 1699))!;
    const g = answer.families.find((x) => x.calendar === 'gregorian' && x.clockAssumptionLabel === f.clockAssumptionLabel && x.best.times.localApparentMinutes - f.best.times.localApparentMinutes < 30 && x.members?.some((m) => m.civilDate.year === 1700))!;
    expect(f).toBeDefined();
    expect(g).toBeDefined();
    const a = f.members!.find((m) => m.civilDate.year === 1699)!;
    const b = g.members!.find((m) => m.civilDate.year === 1700)!;
    // Day of year in each calendar's own names: the Gregorian name runs ~10 days ahead (plus up to a day of the yearly drift).
    const doy = (c: Candidate) => jdOf(c) - calendarDateToJd({ calendar: c.civilDate.calendar, year: c.civilDate.year, month: 1, day: 1 });
    const shift = doy(b) - doy(a);
    expect(shift).toBeGreaterThanOrEqual(9);
    expect(shift).toBeLessThanOrEqual(12);
    // The other calendar's date is given beside each candidate near a switch.
    expect(a.otherCalendarDate?.calendar).toBe('gregorian');
    expect(b.otherCalendarDate?.calendar).toBe('julian');
  });
});

describe('negative years', () => {
  it('a window from -500 to -490 (Julian) gives candidates in those years, with weekdays from the Julian Day', () => {
    const { answer } = solve(velmar({ calendar: 'julian', window: { fromYear: -500, toYear: -490 } }));
    expect(answer.status).toBe('undetermined'); // one rod slope: day and hour are not both fixed
    expect(answer.candidates.length).toBeGreaterThan(0);
    for (const c of answer.candidates) {
      expect(c.civilDate.calendar).toBe('julian');
      expect(c.civilDate.year).toBeGreaterThanOrEqual(-500);
      expect(c.civilDate.year).toBeLessThanOrEqual(-490);
      // Meeus 1998 ch. 7: the weekday is (JD + 1.5) mod 7 of the civil day.
      expect(c.weekday).toBe(weekdayOfJd(jdOf(c) + 0.5));
      // Espenak and Meeus (2006): Delta T = 17190 s at -500 (uncertainty several hundred s).
      expect(c.times.deltaTSeconds).toBeGreaterThan(16_000);
      expect(c.times.deltaTSeconds).toBeLessThan(17_300);
    }
  });
});

describe('29 February 1700 as a documentary bound', () => {
  it('is accepted as notBefore where the Julian calendar was in force, and the candidates start there', () => {
    const { answer } = solve(velmar({ calendar: 'julian', window: { fromYear: 1700, toYear: 1700, notBefore: '1700-02-29' } }));
    expect(answer.candidates.length).toBeGreaterThan(0);
    const first = calendarDateToJd({ calendar: 'julian', year: 1700, month: 2, day: 29 });
    for (const c of answer.candidates) expect(jdOf(c)).toBeGreaterThanOrEqual(first);
  });

  it('is accepted in Great Britain, Julian until 1752', () => {
    expect(() => sceneOf(velmar({ calendar: 'great-britain', yearStart: 'jan1', window: { fromYear: 1700, toYear: 1701, notBefore: '1700-02-29' } }))).not.toThrow();
  });

  it('is refused in the Gregorian calendar and in a region Gregorian since 1582, naming the bound', () => {
    for (const calendar of ['gregorian', 'france']) {
      const e = refusal(velmar({ calendar, window: { fromYear: 1700, toYear: 1701, notBefore: '1700-02-29' } }));
      expect(e.field).toBe('window.notBefore');
      expect(e.message).toMatch(/^window\.notBefore: "1700-02-29" is not allowed; expected /);
    }
  });
});

describe('year-start styles in the documentary bounds', () => {
  const base = (yearStart: string, window: Data) => velmar({ calendar: 'great-britain', yearStart, window });

  it('a dual year "1650/1-02-10" is 10 February 1651 under every style', () => {
    for (const style of ['jan1', 'mar25-forward']) {
      const { answer } = solve(base(style, { fromYear: 1650, toYear: 1652, notBefore: '1650/1-02-10' }));
      const first = calendarDateToJd({ calendar: 'julian', year: 1651, month: 2, day: 10 });
      expect(answer.candidates.length).toBeGreaterThan(0);
      for (const c of answer.candidates) expect(jdOf(c)).toBeGreaterThanOrEqual(first);
      // Something falls in the months right after the bound (the window is not emptied by a misread year).
      expect(answer.candidates.some((c) => jdOf(c) < first + 400)).toBe(true);
    }
  });

  it('under the 25 March style, 24 March 1650 is followed by 25 March 1651: a two-day window', () => {
    // English style (mar25-forward): 1650 ran from 25 March 1650 to 24 March 1650/1, so "1650-03-24" is
    // 24 March 1651 in January years and "1651-03-25" the next day.
    const { answer } = solve(base('mar25-forward', { fromYear: 1650, toYear: 1652, notBefore: '1650-03-24', notAfter: '1651-03-25' }));
    const days = new Set(answer.candidates.map((c) => `${c.civilDate.year}-${c.civilDate.month}-${c.civilDate.day}`));
    expect(answer.candidates.length).toBeGreaterThan(0);
    for (const d of days) expect(['1651-3-24', '1651-3-25']).toContain(d);
  });

  it('under the 1 January style the same bounds are a year apart, and a reversed pair is refused', () => {
    const { answer } = solve(base('jan1', { fromYear: 1650, toYear: 1652, notBefore: '1650-03-24', notAfter: '1651-03-25' }));
    const years = new Set(answer.candidates.map((c) => c.civilDate.year));
    expect(years.has(1650)).toBe(true);
    // "1651-03-24" (mar25-forward: 24 March 1652) after "1651-03-25" (25 March 1651) is not reversed; the other way round is.
    const e = refusal(base('mar25-forward', { fromYear: 1650, toYear: 1652, notBefore: '1651-03-25', notAfter: '1650-03-26' }));
    expect(e.field).toBe('window.notAfter');
    expect(e.message).toMatch(/not before notBefore/);
  });
});

describe('the calendar corners above', () => {
  it('all ran', () => {
    // eslint-disable-next-line no-console
    console.log(`solver calendar corners: ${solved} scenes solved`);
    expect(solved).toBeGreaterThanOrEqual(7);
  });
});
