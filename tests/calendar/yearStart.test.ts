import { describe, expect, it } from 'vitest';
import {
  dualYearText,
  formatDualYear,
  historicalToJanuaryYear,
  januaryYearToHistorical,
  parseDualYear,
  checkDualYearUnderStyle,
} from '../../src/calendar/yearStart.js';
import type { YearStartStyle } from '../../src/scene/types.js';

// Year-start styles as defined in src/scene/types.ts (common practice of chronology; for England the
// Calendar (New Style) Act 1750, 24 Geo. II c. 23: 1751 began on 25 March, 1752 on 1 January).
const STYLES: YearStartStyle[] = ['jan1', 'mar25-forward', 'mar25-backward', 'mar1', 'dec25'];

describe('historical year <-> January year', () => {
  it.each([
    // [style, month, day, historical year, January year]
    ['jan1', 1, 1, 1650, 1650],
    ['mar25-forward', 1, 1, 1650, 1651], // 1 January 1651 is still 1650 in England
    ['mar25-forward', 3, 24, 1650, 1651],
    ['mar25-forward', 3, 25, 1651, 1651], // Lady Day: the new year begins
    ['mar25-forward', 12, 31, 1650, 1650],
    ['mar25-backward', 3, 24, 1650, 1650], // Pisan: before 25 March the numbers agree
    ['mar25-backward', 3, 25, 1651, 1650], // from 25 March Pisa counts the next year
    ['mar25-backward', 12, 31, 1651, 1650],
    ['mar25-backward', 1, 1, 1651, 1651],
    ['mar1', 2, 28, 1650, 1651], // Venetian: January and February belong to the year before
    ['mar1', 3, 1, 1651, 1651],
    ['dec25', 12, 24, 1650, 1650],
    ['dec25', 12, 25, 1651, 1650], // nativity: from Christmas the next year's number
    ['dec25', 1, 1, 1651, 1651],
  ] as const)('%s: %i/%i written %i is January year %i (common practice)', (style, month, day, historical, january) => {
    expect(historicalToJanuaryYear({ year: historical, month, day }, style)).toBe(january);
    expect(januaryYearToHistorical({ year: january, month, day }, style)).toBe(historical);
  });

  it('undoes itself for every style and every day of a year', () => {
    for (const style of STYLES) {
      for (let month = 1; month <= 12; month++) {
        for (let day = 1; day <= 31; day++) {
          const h = januaryYearToHistorical({ year: 1700, month, day }, style);
          expect(historicalToJanuaryYear({ year: h, month, day }, style)).toBe(1700);
        }
      }
    }
  });
});

describe('dual years', () => {
  it('writes 1650/1, 1659/60 and 1699/1700 (common practice)', () => {
    expect(dualYearText(1650, 1651)).toBe('1650/1');
    expect(dualYearText(1659, 1660)).toBe('1659/60');
    expect(dualYearText(1699, 1700)).toBe('1699/1700');
    expect(formatDualYear({ year: 1651, month: 2, day: 10 }, 'mar25-forward')).toBe('1650/1');
    expect(formatDualYear({ year: 1651, month: 3, day: 25 }, 'mar25-forward')).toBe('1651');
    expect(formatDualYear({ year: 1650, month: 4, day: 1 }, 'mar25-backward')).toBe('1650/1');
    expect(formatDualYear({ year: 1650, month: 4, day: 1 }, 'jan1')).toBe('1650');
    expect(formatDualYear({ year: -43, month: 3, day: 15 }, 'jan1')).toBe('44 BC'); // Meeus (1998) p. 60: year -43 = 44 BC
  });
  it('reads a dual year to the January year by the day: before 25 March the later year, after it the earlier', () => {
    expect(parseDualYear('1650/1', 2, 10, 'date')).toBe(1651);
    expect(parseDualYear('1650/51', 3, 24, 'date')).toBe(1651);
    expect(parseDualYear('1699/1700', 1, 5, 'date')).toBe(1700);
    expect(parseDualYear('1650/1', 12, 28, 'date')).toBe(1650); // nativity or Pisan style
  });
});

describe('edge cases', () => {
  it('refuses a dual year whose second part is not the next year', () => {
    expect(() => parseDualYear('1650/2', 2, 10, 'date')).toThrow(/does not read as 1651/);
    expect(() => parseDualYear('1650-1', 2, 10, 'date')).toThrow(/dual year such as 1650\/1/);
  });
});

describe('a dual year that contradicts its day under the stated year start', () => {
  // Which days carry two year numbers under each style follows from the table above (common practice of
  // chronology; Cheney, A Handbook of Dates (2000), ch. 1): a day is dual exactly when its historical and
  // January years differ.
  it.each([
    ['mar25-forward', 3, 30, '1650/1-03-30'], // 30 March is after Lady Day: plainly 1650 or 1651
    ['mar25-backward', 2, 10, '1650/1-02-10'], // Pisan: before 25 March both counts agree
    ['mar1', 3, 10, '1650/1-03-10'], // Venetian: March already belongs to the new year
    ['dec25', 6, 1, '1650/1-06-01'], // nativity: only 25-31 December are dual
  ] as const)('under %s, %i/%i written %s is refused, naming both plain readings', (style, month, day, text) => {
    const januaryYear = parseDualYear('1650/1', month, day, 'date');
    expect(() => checkDualYearUnderStyle({ year: januaryYear, month, day }, style, 'date', text)).toThrow(
      new RegExp(`^date: "${text.replace(/\//g, '\\/')}" is not allowed; expected a single year .* under ${style}\\. .* write 1650-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')} or 1651-`),
    );
  });
  it.each([
    ['mar25-forward', 2, 10],
    ['mar25-backward', 3, 30],
    ['mar1', 2, 10],
    ['dec25', 12, 28],
    ['jan1', 3, 30], // no style stated: the dual year names its document's style itself
  ] as const)('under %s, %i/%i with a dual year is read', (style, month, day) => {
    const januaryYear = parseDualYear('1650/1', month, day, 'date');
    expect(() => checkDualYearUnderStyle({ year: januaryYear, month, day }, style, 'date', 'x')).not.toThrow();
    // ... and the reading agrees with the style's own historical year: one of the two numbers is the historical year.
    if (style !== 'jan1') expect([1650, 1651]).toContain(januaryYearToHistorical({ year: januaryYear, month, day }, style));
  });
});
