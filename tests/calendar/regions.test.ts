import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../src/errors.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';
import {
  calendarInForce,
  civilDateToJd,
  findRegion,
  jdToCivilDate,
  jdToCivilDayAndCalendar,
  loadReformTable,
  parseReformTable,
  parseCalendarRule,
  reckoningInForce,
  resolveCalendarRule,
  yearStartInRegion,
} from '../../src/calendar/regions.js';
import type { CalendarRule } from '../../src/scene/types.js';

const region = (regionId: string): CalendarRule => ({ kind: 'region', regionId });
const jul = (year: number, month: number, day: number) => calendarDateToJd({ calendar: 'julian', year, month, day });
const greg = (year: number, month: number, day: number) => calendarDateToJd({ calendar: 'gregorian', year, month, day });

function errorOf(f: () => unknown): InvalidInputError {
  try {
    f();
  } catch (error) {
    if (error instanceof InvalidInputError) return error;
    throw error;
  }
  throw new Error('expected an InvalidInputError');
}

// Switch rows: Grotefend, Taschenbuch der Zeitrechnung (1941) pp. 26-28, as quoted in the IANA tz file `calendars`
// (also /work/shared/REFERENCES.md, "Gregorian reform by region").
const SWITCHES: [string, [number, number, number], [number, number, number], string][] = [
  ['rome', [1582, 10, 4], [1582, 10, 15], 'Grotefend (1941) pp. 26-28'],
  ['spain', [1582, 10, 4], [1582, 10, 15], 'Grotefend (1941) pp. 26-28'],
  ['portugal', [1582, 10, 4], [1582, 10, 15], 'Grotefend (1941) pp. 26-28'],
  ['poland', [1582, 10, 4], [1582, 10, 15], 'Grotefend (1941) pp. 26-28'],
  ['france', [1582, 12, 9], [1582, 12, 20], 'Grotefend (1941) pp. 26-28'],
  ['holland', [1582, 12, 21], [1583, 1, 1], 'Grotefend (1941) pp. 26-28'],
  ['protestant-germany', [1700, 2, 18], [1700, 3, 1], 'Grotefend (1941) pp. 26-28'],
  ['denmark', [1700, 2, 18], [1700, 3, 1], 'Grotefend (1941) pp. 26-28'],
  ['norway', [1700, 2, 18], [1700, 3, 1], 'Grotefend (1941) pp. 26-28'],
  ['great-britain', [1752, 9, 2], [1752, 9, 14], 'Grotefend (1941) pp. 26-28'],
  ['russia', [1918, 1, 31], [1918, 2, 14], 'Haumann, Geschichte Russlands (1996) p. 16: 1./14. Februar 1918'],
];

describe('the reform table', () => {
  it('loads, every row consistent with the calendars and naming its source', () => {
    const table = loadReformTable();
    expect(table.length).toBeGreaterThanOrEqual(40);
    for (const r of table) {
      expect(r.source.length, r.id).toBeGreaterThan(20);
      expect(r.sourceText.length, r.id).toBeGreaterThan(5);
      expect(r.periods[0].firstJd).toBe(-Infinity);
    }
  });

  it.each(SWITCHES)('%s: last Julian day %j, first Gregorian day %j, consecutive JDs (%s)', (id, last, first) => {
    const rule = region(id);
    const jdLast = civilDateToJd(rule, { year: last[0], month: last[1], day: last[2] });
    const jdFirst = civilDateToJd(rule, { year: first[0], month: first[1], day: first[2] });
    expect(jdLast).toBe(jul(...last));
    expect(jdFirst).toBe(greg(...first));
    expect(jdFirst - jdLast).toBe(1);
    expect(calendarInForce(rule, jdLast)).toBe('julian');
    expect(calendarInForce(rule, jdFirst)).toBe('gregorian');
    expect(jdToCivilDate(rule, jdLast).civil).toEqual({ year: last[0], month: last[1], day: last[2] });
    expect(jdToCivilDate(rule, jdFirst + 0.75).civil).toEqual({ year: first[0], month: first[1], day: first[2] });
  });

  it('puts Rome\'s switch at JD 2299159.5 / 2299160.5 (Meeus (1998) p. 61)', () => {
    expect(civilDateToJd(region('rome'), { year: 1582, month: 10, day: 4 })).toBe(2299159.5);
    expect(civilDateToJd(region('rome'), { year: 1582, month: 10, day: 15 })).toBe(2299160.5);
  });

  it('refuses a row whose stated last day is not the day before its first day (self-check of the data file)', () => {
    const row = (last: string) => ({
      sources: { s: 'a source' },
      regions: [{ id: 'x', name: 'X', source: 's', sourceText: 't', periods: [{ reckoning: 'julian' }, { reckoning: 'gregorian', lastDayBefore: last, firstDay: '1700-12-12' }] }],
    });
    expect(parseReformTable(row('1700-11-30'))[0].periods[1].firstJd).toBe(greg(1700, 12, 12));
    expect(() => parseReformTable(row('1700-11-10'))).toThrow(/the day before 1700-12-12 \(gregorian\) is 1700-11-30 \(julian\), not 1700-11-10/);
  });

  it('reads Utrecht as 30 November / 12 December 1700, the only reading consistent with the source\'s first Gregorian day', () => {
    // Grotefend (1941) as quoted: "10 Nov/12 Dec 1700"; 11 day names are skipped in 1700 (Meeus (1998) p. 62 leap rules).
    expect(civilDateToJd(region('utrecht'), { year: 1700, month: 12, day: 12 }) - civilDateToJd(region('utrecht'), { year: 1700, month: 11, day: 30 })).toBe(1);
  });
});

describe('edge cases: days skipped at a reform are refused, naming the neighbours', () => {
  it('refuses 5 October 1582 in Rome with the day before and after the gap', () => {
    const e = errorOf(() => civilDateToJd(region('rome'), { year: 1582, month: 10, day: 5 }, 'window.notBefore'));
    expect(e.field).toBe('window.notBefore');
    expect(e.message).toContain('4 October 1582 (Julian) was followed by 15 October 1582 (Gregorian)');
    expect(e.message).not.toContain('\n');
  });
  it('refuses 3 and 13 September 1752 in Great Britain but accepts 2 and 14 (Calendar (New Style) Act 1750; Grotefend 1941)', () => {
    for (const day of [3, 8, 13]) {
      expect(() => civilDateToJd(region('great-britain'), { year: 1752, month: 9, day })).toThrow(/2 September 1752 \(Julian\) was followed by 14 September 1752/);
    }
  });
  it('refuses a day of the French gap, 10-19 December 1582 (Grotefend 1941)', () => {
    expect(() => civilDateToJd(region('france'), { year: 1582, month: 12, day: 15 })).toThrow(/9 December 1582 \(Julian\) was followed by 20 December 1582/);
  });
  it('accepts 29 February 1700 in the Julian calendar and refuses it where the Gregorian was in force (Meeus (1998) p. 62)', () => {
    expect(civilDateToJd({ kind: 'julian' }, { year: 1700, month: 2, day: 29 })).toBe(jul(1700, 3, 1) - 1);
    expect(() => civilDateToJd({ kind: 'gregorian' }, { year: 1700, month: 2, day: 29 })).toThrow(/does not exist in the Gregorian calendar.*28 days/);
    expect(() => civilDateToJd(region('rome'), { year: 1800, month: 2, day: 29 })).toThrow(InvalidInputError);
    expect(civilDateToJd(region('russia'), { year: 1900, month: 2, day: 29 })).toBe(jul(1900, 2, 29));
    // In Protestant Germany 1700 the last Julian day was 18 February, so 29 February 1700 lies in the gap.
    expect(() => civilDateToJd(region('protestant-germany'), { year: 1700, month: 2, day: 29 })).toThrow(/18 February 1700 \(Julian\) was followed by 1 March 1700/);
  });
});

describe('Sweden 1700-1712: a special reckoning and a return to the Julian calendar', () => {
  // M. Brader (1996) in the IANA tz file `calendars`, after Beckman (1924) and Lodén (1968); Grotefend (1941) for 1753.
  const sweden = region('sweden');
  it('skips 29 February 1700: 28 February was followed by 1 March', () => {
    expect(() => civilDateToJd(sweden, { year: 1700, month: 2, day: 29 })).toThrow(/28 February 1700 \(Julian\) was followed by 1 March 1700 \(Swedish reckoning/);
    expect(civilDateToJd(sweden, { year: 1700, month: 3, day: 1 }) - civilDateToJd(sweden, { year: 1700, month: 2, day: 28 })).toBe(1);
  });
  it('names each day of 1700-1712 one day later than the Julian calendar, with 30 February 1712', () => {
    const jdFeb30 = civilDateToJd(sweden, { year: 1712, month: 2, day: 30 });
    expect(jdFeb30).toBe(jul(1712, 2, 29));
    expect(civilDateToJd(sweden, { year: 1705, month: 6, day: 11 })).toBe(jul(1705, 6, 10));
    expect(civilDateToJd(sweden, { year: 1712, month: 3, day: 1 })).toBe(jul(1712, 3, 1));
    expect(civilDateToJd(sweden, { year: 1712, month: 3, day: 1 }) - jdFeb30).toBe(1);
    expect(jdToCivilDate(sweden, jdFeb30)).toMatchObject({ reckoning: 'swedish', civil: { year: 1712, month: 2, day: 30 }, date: { calendar: 'julian', year: 1712, month: 2, day: 29 } });
    expect(reckoningInForce(sweden, jul(1705, 6, 10))).toBe('swedish');
    expect(calendarInForce(sweden, jul(1705, 6, 10))).toBe('julian');
    expect(reckoningInForce(sweden, jul(1720, 1, 1))).toBe('julian');
  });
  it('had leap days in 1704 and 1708', () => {
    expect(civilDateToJd(sweden, { year: 1704, month: 3, day: 1 }) - civilDateToJd(sweden, { year: 1704, month: 2, day: 29 })).toBe(1);
    expect(civilDateToJd(sweden, { year: 1708, month: 2, day: 29 })).toBe(jul(1708, 2, 28));
  });
  it('switched to the Gregorian calendar on 17 February / 1 March 1753 (Grotefend 1941)', () => {
    expect(civilDateToJd(sweden, { year: 1753, month: 3, day: 1 }) - civilDateToJd(sweden, { year: 1753, month: 2, day: 17 })).toBe(1);
    expect(civilDateToJd(sweden, { year: 1753, month: 3, day: 1 })).toBe(greg(1753, 3, 1));
  });
  it('refuses 30 February 1712 everywhere else', () => {
    expect(() => civilDateToJd(region('denmark'), { year: 1712, month: 2, day: 30 })).toThrow(/does not exist/);
  });
  it('walks day by day through 1699-1754 with every JD named once and named back to the same JD', () => {
    const resolved = resolveCalendarRule(sweden);
    for (let jd = jul(1699, 1, 1); jd < greg(1754, 1, 1); jd++) {
      const { civil } = jdToCivilDate(resolved, jd);
      expect(civilDateToJd(resolved, civil)).toBe(jd);
    }
  });
});

describe('rules written by the user', () => {
  it('reads julian, gregorian, region ids and a switch', () => {
    expect(parseCalendarRule('julian', '--calendar')).toEqual({ kind: 'julian' });
    expect(parseCalendarRule('Gregorian', '--calendar')).toEqual({ kind: 'gregorian' });
    expect(parseCalendarRule('great-britain', '--calendar')).toEqual({ kind: 'region', regionId: 'great-britain' });
    const rule = parseCalendarRule('switch:1700-02-18/1700-03-01', '--calendar');
    expect(rule).toEqual({ kind: 'switch', lastJulian: { year: 1700, month: 2, day: 18 }, firstGregorian: { year: 1700, month: 3, day: 1 } });
    expect(civilDateToJd(rule, { year: 1700, month: 3, day: 1 })).toBe(civilDateToJd(region('denmark'), { year: 1700, month: 3, day: 1 }));
    expect(() => civilDateToJd(rule, { year: 1700, month: 2, day: 20 })).toThrow(/18 February 1700 \(Julian\) was followed by 1 March 1700/);
  });
  it('refuses a switch whose two days are not consecutive, proposing both readings', () => {
    const e = errorOf(() => parseCalendarRule('switch:1700-11-10/1700-12-12', '--calendar'));
    expect(e.message).toContain('switch:1700-11-10/1700-11-22');
    expect(e.message).toContain('switch:1700-11-30/1700-12-12');
  });
  it('suggests near misses for an unknown region', () => {
    const e = errorOf(() => findRegion('great-britian', '--calendar'));
    expect(e.field).toBe('--calendar');
    expect(e.message).toContain('Did you mean "great-britain"');
    expect(() => parseCalendarRule('swden', '--calendar')).toThrow(/Did you mean "sweden"/);
    expect(() => parseCalendarRule('atlantis', '--calendar')).toThrow(/No region of that name/);
  });
  it('names the usual year start where the table has one (Calendar (New Style) Act 1750)', () => {
    const gb = findRegion('great-britain');
    expect(yearStartInRegion(gb, 1700)).toBe('mar25-forward');
    expect(yearStartInRegion(gb, 1752)).toBe('jan1');
    expect(yearStartInRegion(findRegion('rome'), 1700)).toBeUndefined();
  });
});

describe('jdToCivilDayAndCalendar', () => {
  it("gives jdToCivilDate's civil day and date calendar on every day around the switches of Rome (1582), Sweden (1700-1712) and Great Britain (1752) (from the definition)", () => {
    let unequal = 0;
    let days = 0;
    for (const [id, from, to] of [['rome', jul(1582, 9, 1), jul(1583, 1, 1)], ['sweden', jul(1699, 12, 1), jul(1713, 1, 1)], ['great-britain', jul(1752, 8, 1), jul(1753, 1, 1)]] as const) {
      const rule = resolveCalendarRule(region(id));
      for (let jd = from; jd < to; jd += 1) {
        const answer = jdToCivilDate(rule, jd + 0.5);
        const got = jdToCivilDayAndCalendar(rule, jd + 0.5);
        days += 1;
        if (got.year !== answer.civil.year || got.month !== answer.civil.month || got.day !== answer.civil.day || got.calendar !== answer.date.calendar) unequal += 1;
      }
    }
    expect(days).toBeGreaterThan(5000);
    expect(unequal).toBe(0);
  });

  describe('edge cases', () => {
    it('names 30 February 1712 in Sweden, a Julian date (Brader 1996, IANA tz file `calendars`)', () => {
      const jd = civilDateToJd(region('sweden'), { year: 1712, month: 2, day: 30 });
      expect(jdToCivilDayAndCalendar(region('sweden'), jd + 0.5)).toEqual({ year: 1712, month: 2, day: 30, calendar: 'julian' });
    });
  });
});
