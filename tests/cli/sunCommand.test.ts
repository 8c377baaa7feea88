/**
 * The `sun` command end to end, through the package's `bin` (the bundled command line, built before
 * the tests by tests/helpers/buildCli.ts), else through main() imported from src/cli/main.ts.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { BIN } from '../helpers/runCli.js';
import { expectClose } from '../helpers/expectClose.js';

const root = fileURLToPath(new URL('../../', import.meta.url));
const compiled = BIN;

interface Ran { code: number; out: string; err: string }

async function cli(args: string[]): Promise<Ran> {
  if (existsSync(compiled)) {
    const r = spawnSync(process.execPath, [compiled, ...args], { encoding: 'utf8', cwd: root });
    return { code: r.status ?? -1, out: r.stdout, err: r.stderr };
  }
  const { main } = await import('../../src/cli/main.js');
  let out = '';
  let err = '';
  const code = await main(args, { out: (t) => { out += t; }, err: (t) => { err += t; }, errIsTerminal: false, cwd: root });
  return { code, out, err };
}

// NREL SPA worked example site and moment (Reda and Andreas 2008, Table A5.1), asked in UT.
const SPA = ['sun', '--lat', '39.742476', '--lon', '-105.1786', '--elevation', '1830.14', '--date', '2003-10-17', '--time', '19:30:30', '--clock', 'ut', '--pressure', '820', '--temperature', '11'];

describe('heliochron sun', () => {
  it('prints the sun, the time scales, both calendars and the defaults used', async () => {
    const r = await cli(['sun', '--lat', '47.62', '--lon', '9.35', '--elevation', '410', '--date', '1650-03-10', '--time', '10:30', '--clock', 'apparent']);
    expect(r.code).toBe(0);
    for (const text of ['azimuth', 'refracted', 'geometric', 'declination', 'hour angle', 'equation of time', 'Delta T', 'local mean time', 'local apparent time', '(Julian)', '(Gregorian)', 'Thursday', 'Julian Day', 'Defaults used: --calendar gregorian']) {
      expect(r.out).toContain(text);
    }
    // 10 March 1650 Gregorian = 28 February 1650 Julian (Meeus 1998 ch. 7: 10 days apart in the 17th century).
    expect(r.out).toContain('28 February 1650 (Julian) = 10 March 1650 (Gregorian)');
    expect(r.err).toBe('');
  });
  it('--json gives jd, azimuth, altitude, declination and equationOfTime at the top level, matching the SPA example', async () => {
    const r = await cli([...SPA, '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as Record<string, number>;
    expectClose(j.jd, 2452930.312847, 1e-6, 'JD (UT)'); // Reda and Andreas (2008), Table A5.1
    expectClose(j.azimuth, 194.34024, 0.001, 'azimuth'); // Table A5.1 (our Delta T 64.6 s vs 67 s moves it < 0.0001 deg)
    expectClose(90 - j.altitude, 50.11162, 0.01, 'zenith'); // Table A5.1
    expectClose(j.declination, -9.31434, 0.01, 'declination'); // Table A5.1 (geocentric; topocentric differs by parallax)
    expect(typeof j.equationOfTime).toBe('number');
  });
  it('--day lists sunrise, transit, sunset and a row every --step minutes', async () => {
    const r = await cli(['sun', '--lat', '47.62', '--lon', '9.35', '--date', '1700-02-18', '--calendar', 'julian', '--day', '--step', '60', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { day: { sunrise: string; transit: string; sunset: string; rows: { time: string; altitude: number }[] } };
    expect(j.day.sunrise).toMatch(/^0[67]:\d\d:\d\d$/);
    expect(j.day.transit).toMatch(/^12:\d\d:\d\d$/); // local mean time: noon +/- the equation of time (-13.6 min then)
    expect(j.day.rows.length).toBeGreaterThanOrEqual(10);
    for (const row of j.day.rows) expect(row.altitude).toBeGreaterThan(-1);
    const text = await cli(['sun', '--lat', '47.62', '--lon', '9.35', '--date', '1700-02-18', '--calendar', 'julian', '--day']);
    expect(text.out).toContain('sunrise');
    expect(text.out).toContain('--step 30 min');
  });
  it('reports polar night with no rows', async () => {
    const r = await cli(['sun', '--lat', '78.2', '--lon', '15.6', '--date', '1900-12-21', '--day', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as { day: { polar: string; rows: unknown[]; sunrise: null } };
    expect(j.day.polar).toBe('night');
    expect(j.day.rows).toHaveLength(0);
  });
});

describe('heliochron sun refuses bad input with exit 2 and nothing written', () => {
  it.each([
    [['--lat', '95', '--lon', '9.35', '--date', '1700-02-18', '--time', '10:00'], '--lat', '"95"'],
    [['--lat', '45', '--lon', '9.35', '--date', '1700-13-18', '--time', '10:00'], '--date', '"1700-13-18"'],
    [['--lat', '45', '--lon', '9.35', '--date', '1700-01-18', '--time', '25:00'], '--time', '"25:00"'],
    [['--lat', '45', '--lon', '9.35', '--date', '1900-01-18', '--time', '10:00', '--clock', 'zone:Mars/Base'], '--clock', 'Mars/Base'],
    [['--lat', '45', '--lon', '9.35', '--date', '1700-01-18', '--time', '10:00', '--clock', 'zone:UTC'], '--clock', '1847'],
    [['--lat', '45', '--lon', '9.35', '--date', '1700-01-18', '--time', '10:00', '--clock', 'meridian:abc'], '--clock', 'meridian:abc'],
  ])('%j', async (args, field, quoted) => {
    const r = await cli(['sun', ...args]);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toContain(field);
    expect(r.err).toContain(quoted);
  });
});
