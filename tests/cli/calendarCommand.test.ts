import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/io.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const DIST_MAIN = `${ROOT}dist/cli/main.js`;

async function runMain(args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const io: CliIo = { out: (t) => { out += t; }, err: (t) => { err += t; }, errIsTerminal: false, cwd: ROOT };
  const code = await main(args, io);
  return { code, out, err };
}

function runCompiled(args: string[]): { code: number; out: string; err: string } {
  const r = spawnSync(process.execPath, [DIST_MAIN, ...args], { encoding: 'utf8', cwd: ROOT });
  return { code: r.status ?? -1, out: r.stdout, err: r.stderr };
}

// Expected values: 14 September 1752 (Gregorian) = 3 September (Julian), first New Style day in Great Britain,
// a Thursday (Grotefend 1941 pp. 26-28; Calendar (New Style) Act 1750); JD from Meeus (1998) eq. (7.1).
describe('heliochron calendar through main()', () => {
  it('prints both calendars, the JD of 0h and noon, the weekday and Old/New Style, and states the calendar used', async () => {
    const r = await runMain(['calendar', '1752-09-14', '--calendar', 'great-britain']);
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    expect(r.out).toContain('Julian:        3 September 1752');
    expect(r.out).toContain('Gregorian:     14 September 1752');
    expect(r.out).toContain('2361221.5 at 0h');
    expect(r.out).toContain('2361222.0 at noon');
    expect(r.out).toContain('Weekday:       Thursday');
    expect(r.out).toContain('Old/New Style: 3/14 September 1752');
    expect(r.out).toContain('Great Britain');
  });

  it('says when the calendar is the default, proleptic Gregorian', async () => {
    const r = await runMain(['calendar', '2000-01-01']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/Calendar: +Gregorian calendar \(proleptic before 1582\) - the default/);
    expect(r.out).toContain('2451544.5 at 0h'); // Meeus (1998) p. 62: 2000 Jan 1.5 = JD 2451545.0
    expect(r.out).toContain('Saturday'); // 1 January 2000 (common practice)
  });

  it('prints one JSON object with jd, julian, gregorian and weekday', async () => {
    const r = await runMain(['calendar', '333-01-27', '--calendar', 'julian', '--json']);
    expect(r.code).toBe(0);
    const answer = JSON.parse(r.out) as Record<string, any>;
    expect(answer.jd).toBe(1842712.5); // Meeus (1998) Example 7.b: 333 Jan 27.5 = JD 1842713.0
    expect(answer.jdNoon).toBe(1842713.0);
    expect(answer.julian).toMatchObject({ year: 333, month: 1, day: 27 });
    expect(answer.gregorian).toMatchObject({ year: 333, month: 1, day: 28 }); // difference +1 day in the 4th century (Meeus (1998) p. 62 rules)
    expect(answer.weekday.name).toBe(['Sunday', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'][answer.weekday.number]);
    expect(answer.calendar.isDefault).toBe(false);
  });

  it('reads a dual year and a year-start style', async () => {
    const dual = JSON.parse((await runMain(['calendar', '1650/1-02-10', '--calendar', 'great-britain', '--json'])).out) as Record<string, any>;
    const styled = JSON.parse((await runMain(['calendar', '1650-02-10', '--calendar', 'great-britain', '--year-start', 'mar25-forward', '--json'])).out) as Record<string, any>;
    expect(dual.jd).toBe(styled.jd);
    expect(styled.julian).toMatchObject({ year: 1651, month: 2, day: 10 });
    expect(styled.dualYear.text).toBe('1650/1');
  });

  it('accepts a Julian Day as the date', async () => {
    const r = await runMain(['calendar', 'JD 2299160.5', '--calendar', 'rome', '--json']);
    const answer = JSON.parse(r.out) as Record<string, any>;
    expect(answer.civil).toMatchObject({ year: 1582, month: 10, day: 15, reckoning: 'gregorian' }); // Meeus (1998) p. 61
    expect(answer.weekday.name).toBe('Friday');
  });

  it('lists the regions', async () => {
    const r = await runMain(['calendar', '--list-regions']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/great-britain\s+1752-09-02 \/ 1752-09-14 gregorian/);
    expect(r.out).toMatch(/sweden .*1712-02-30 \/ 1712-03-01 julian/);
  });

  describe('bad input: one line on stderr naming the option and quoting the value, exit code 2, nothing on stdout', () => {
    it.each([
      [['calendar', '1752-09-05', '--calendar', 'great-britain'], /<date>: "1752-09-05" .*2 September 1752 \(Julian\) was followed by 14 September 1752/],
      [['calendar', '1650-13-01'], /<date>: "1650-13-01" .*Month 13 does not exist/],
      [['calendar', '1650-01-01', '--calendar', 'great-britian'], /--calendar: "great-britian" .*Did you mean "great-britain"/],
      [['calendar', '1650-01-01', '--year-start', 'easter'], /--year-start: "easter" is not allowed; expected jan1, mar25-forward/],
      [['calendar'], /<date> is missing; expected a date/],
    ])('%j', async (args, pattern) => {
      const r = await runMain(args);
      expect(r.code).toBe(2);
      expect(r.out).toBe('');
      expect(r.err).toMatch(pattern);
      expect(r.err.trim().split('\n')).toHaveLength(1);
    });
  });
});

describe.skipIf(!existsSync(DIST_MAIN))('heliochron calendar, compiled (node dist/cli/main.js, after npx tsc -p tsconfig.json)', () => {
  it('prints a normal date', () => {
    const r = runCompiled(['calendar', '1582-10-15', '--calendar', 'rome']);
    expect(r.code).toBe(0);
    expect(r.out).toContain('Julian:        5 October 1582'); // Meeus (1998) p. 61: 4 Oct (Julian) was followed by 15 Oct
    expect(r.out).toContain('Weekday:       Friday');
  });
  it('prints JSON', () => {
    const r = runCompiled(['calendar', '1957-10-04', '--json']);
    expect(JSON.parse(r.out).jd).toBe(2436115.5); // Meeus (1998) Example 7.a: 1957 Oct 4.81 = JD 2436116.31
  });
  it.each([
    [['calendar', '1582-10-10', '--calendar', 'rome'], /4 October 1582 \(Julian\) was followed by 15 October 1582/],
    [['calendar', '1650-13-01'], /Month 13 does not exist/],
    [['calendar', '1650-01-01', '--calendar', 'narnia'], /--calendar: "narnia"/],
  ])('refuses %j with exit code 2 and one line', (args, pattern) => {
    const r = runCompiled(args);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(pattern);
    expect(r.err.trim().split('\n')).toHaveLength(1);
  });
});
