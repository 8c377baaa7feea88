import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { disputedSwitchIn, isNameDisputed, namesUnderReadings } from '../../src/calendar/disputedSwitch.js';
import { civilDateToJd, findRegion, loadReformTable, parseCalendarRule, regionReadings, resolveCalendarRule } from '../../src/calendar/regions.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';

// JD 2299160.5 is 15 October 1582 (Gregorian) at 0h (Meeus 1998 ch. 7); 81 days later is 4 January 1583 (Gregorian).
const JULIAN_25_DEC_1582 = 2299160.5 + 81;

describe('disputed switches are recorded with each reading and its source', () => {
  // The rows a reviewer found disagreeing with other tables (issue 12), plus the ones noted before.
  it.each([
    ['holland', 'placaet', '1583-01-12'],
    ['brabant', 'anjou', '1582-12-25'],
    ['flanders', 'anjou', '1582-12-25'],
    ['styria', 'wikipedia', '1583-12-22'],
    ['austria', 'wikipedia', '1583-10-31'],
    ['salzburg', 'wikipedia', '1583-02-21'],
    ['cologne', 'later', '1583-11-14'],
    ['munster', 'earlier', '1583-11-27'],
    ['lusatia', 'bohemia', '1584-01-17'],
    ['hungary', 'legal', '1587-11-01'],
    ['prussia', '1610', '1610-09-02'],
    ['greece', '1924', '1924-03-23'],
    ['romania', 'april', '1919-04-14'],
  ])('%s has the reading %s (first Gregorian day %s) with its own source', (regionId, readingId, firstGregorian) => {
    const region = findRegion(regionId);
    const readings = regionReadings(region);
    expect(readings.length).toBeGreaterThanOrEqual(2);
    const reading = readings.find((r) => r.id === readingId);
    expect(reading, `${regionId}@${readingId}`).toBeDefined();
    expect(reading?.source.length).toBeGreaterThan(20);
    expect(reading?.sourceText.length).toBeGreaterThan(5);
    const [y, m, d] = firstGregorian.split('-').map(Number);
    const last = reading!.periods[reading!.periods.length - 1];
    expect(last.firstJd).toBe(calendarDateToJd({ calendar: 'gregorian', year: y, month: m, day: d }));
  });
  it('every disputed row is listed in docs/calendars.md with both readings', () => {
    const docs = readFileSync(new URL('../../docs/calendars.md', import.meta.url), 'utf8');
    for (const region of loadReformTable().filter((r) => r.readings !== undefined)) {
      expect(docs, region.id).toContain(`\`${region.id}\``);
      for (const r of region.readings ?? []) expect(docs, `${region.id}@${r.id}`).toContain(`${region.id}@${r.id}`);
    }
  });
});

describe('a day near a disputed switch has a name under each reading', () => {
  it('Julian 25 December 1582 is 4 January 1583 in Holland by Grotefend and 25 December 1582 by the Plakaet reading', () => {
    const dispute = disputedSwitchIn({ kind: 'region', regionId: 'holland' }, JULIAN_25_DEC_1582 - 30, JULIAN_25_DEC_1582 + 30);
    expect(dispute).not.toBeNull();
    const names = namesUnderReadings(dispute!, JULIAN_25_DEC_1582);
    expect(names.map((n) => [n.reading.id, n.reckoning, n.civil])).toEqual([
      ['grotefend1941', 'gregorian', { year: 1583, month: 1, day: 4 }],
      ['placaet', 'julian', { year: 1582, month: 12, day: 25 }],
    ]);
    expect(isNameDisputed(dispute!, JULIAN_25_DEC_1582)).toBe(true);
    expect(isNameDisputed(dispute!, JULIAN_25_DEC_1582 + 40)).toBe(false); // both Gregorian by then
  });
  it('is not disputed far from the switch, for a stated reading, or for an undisputed region', () => {
    expect(disputedSwitchIn({ kind: 'region', regionId: 'holland' }, 2378496.5, 2378861.5)).toBeNull(); // 1800
    expect(disputedSwitchIn({ kind: 'region', regionId: 'holland', reading: 'placaet' }, JULIAN_25_DEC_1582, JULIAN_25_DEC_1582)).toBeNull();
    expect(disputedSwitchIn({ kind: 'region', regionId: 'france' }, JULIAN_25_DEC_1582, JULIAN_25_DEC_1582)).toBeNull();
  });
  it('reads a stated reading as region@reading, and refuses an unknown reading naming the readings', () => {
    const rule = parseCalendarRule('holland@placaet', '--calendar');
    expect(rule).toEqual({ kind: 'region', regionId: 'holland', reading: 'placaet' });
    expect(civilDateToJd(rule, { year: 1582, month: 12, day: 25 })).toBe(JULIAN_25_DEC_1582);
    expect(resolveCalendarRule(rule).label).toContain('1 January 1583 (Julian) followed by 12 January 1583');
    expect(parseCalendarRule('holland@grotefend1941', '--calendar')).toEqual({ kind: 'region', regionId: 'holland' });
    expect(() => parseCalendarRule('holland@sizes', '--calendar')).toThrow(/holland@grotefend1941, holland@placaet/);
  });
});

describe('regions that left the Julian calendar late, and regions outside the scope', () => {
  // Each first Gregorian day as its row's source gives it (data/calendar-reforms.json names the source).
  it.each([
    ['drenthe', '1701-05-12'], // Wikipedia list (2018): 1701-04-30 / 1701-05-12
    ['bulgaria', '1916-04-14'], // sci.aha.ru table: 31.III.1916 / 14.IV.1916
    ['serbia', '1919-02-01'], // same table: 18.I.1919 / 1.II.1919
    ['romania', '1919-02-01'], // same table
    ['greece', '1923-03-01'], // Wikipedia list (2018): 1923-02-15 / 1923-03-01
    ['estonia', '1918-03-01'], // Wikipedia list (2018)
    ['courland', '1915-05-25'], // Wikipedia list (2018), first Gregorian day only
    ['kovno-vilna', '1915-05-25'], // Wikipedia list (2018), first Gregorian day only
    ['latvia', '1918-02-15'], // DateTime::Calendar::Christian
  ])('%s switches to the Gregorian calendar on %s', (regionId, firstGregorian) => {
    const region = findRegion(regionId);
    const [y, m, d] = firstGregorian.split('-').map(Number);
    expect(region.periods[1].firstJd).toBe(calendarDateToJd({ calendar: 'gregorian', year: y, month: m, day: d }));
    expect(region.source.length).toBeGreaterThan(20);
  });
  it.each([['japan', 'Japan', '1873'], ['china', 'China', '1912']])('refuses %s: its calendar is outside heliochron\'s scope', (id, name, year) => {
    expect(() => parseCalendarRule(id, '--calendar')).toThrow(new RegExp(`${name} left .* in ${year}, not the Julian calendar; that calendar is outside heliochron's scope`));
  });
});
