import { describe, expect, it } from 'vitest';
import { CSV_COLUMNS, csvField, dateAnswerCsv } from '../../src/report/csv.js';
import { answer, sceneWith } from './answerFixtures.js';

const scene = sceneWith('gregorian', 1765, 1785);

/** Split one CSV line into fields (RFC 4180 quoting), for reading back in the test. */
function parseLine(line: string): string[] {
  const out: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') { field += '"'; i++; } else if (ch === '"') quoted = false; else field += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') { out.push(field); field = ''; } else field += ch;
  }
  out.push(field);
  return out;
}

describe('dateAnswerCsv', () => {
  const csv = dateAnswerCsv(answer(), scene);
  const lines = csv.split('\r\n').filter((l) => l !== '');

  it('has a header row and one row per candidate, in rank order, CRLF line ends', () => {
    expect(lines[0]).toBe(CSV_COLUMNS.join(','));
    expect(lines.length).toBe(1 + 3);
    expect(lines.slice(1).map((l) => parseLine(l)[0])).toEqual(['1', '2', '3']);
    expect(csv.endsWith('\r\n')).toBe(true);
  });
  it('every row has as many fields as the header, and the values read back', () => {
    for (const l of lines) expect(parseLine(l).length).toBe(CSV_COLUMNS.length);
    const row = Object.fromEntries(CSV_COLUMNS.map((k, i) => [k, parseLine(lines[1])[i]]));
    expect(row.date).toBe('30 July 1771 (Gregorian)');
    expect(row.jd_ut).toBe('2368114.811508');
    expect(row.local_apparent).toBe('08:00');
    expect(row.family).toBe('f1');
    expect(row.half_width_days_95).toBe('9.79');
    const scanned = Object.fromEntries(CSV_COLUMNS.map((k, i) => [k, parseLine(lines[2])[i]]));
    expect(scanned.uncertainty_method).toBe('profile-scan');
    expect(scanned.interval_from).toBe('1771-06-06');
    expect(scanned.half_width_days_95).toBe('');
  });
  it('with allYears gives one row per member of each family', () => {
    const all = dateAnswerCsv(answer(), scene, { allYears: true }).split('\r\n').filter((l) => l !== '');
    // f1 has two members, f2 none listed (its best stands for it).
    expect(all.length).toBe(1 + 3);
    expect(all.slice(1).map((l) => parseLine(l)[2])).toEqual(['f1', 'f1', 'f2']);
  });
});

describe('edge cases', () => {
  it('quotes fields holding commas, quotes or line breaks (RFC 4180 sec. 2)', () => {
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "x"')).toBe('"say ""x"""');
    expect(csvField(null)).toBe('');
    expect(csvField(3.5)).toBe('3.5');
  });
});
