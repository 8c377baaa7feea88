/**
 * The command line as a new user meets it: one --clock default, negative-year dates, coordinates
 * in degrees-minutes-seconds, hints for unquoted spaces and misplaced arguments, the output form
 * from the file's name, chart --kind all, missing values said to be missing, dual years that
 * contradict their day. Every refusal: one line naming the field, the value and what is allowed,
 * exit code 2, nothing on the output stream and no file written.
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { cli, tempDir } from '../robustness/robustHelpers.js';
import { proposalFromOptions } from '../../src/cli/proposalOptions.js';
import { readSceneText } from '../../src/scene/readScene.js';

const EXAMPLE = fileURLToPath(new URL('../../examples/marktgasse-print.yaml', import.meta.url));

/** A small scene a new user might write: the invented town square at 48.2 N, 16.4 E. */
const SQUARE = [
  'heliochron: 1',
  'title: Velmar town square (invented)',
  "site: { latitudeDeg: 48°12'N, longitudeDeg: 16 24 E }",
  'calendar: julian',
  'window: { fromYear: -120, toYear: -80 }',
  'observations:',
  '  - { id: up, kind: sun-up }',
  '',
].join('\n');

/** Run a command that must be refused, and check the refusal's shape; returns its one line. */
async function refused(args: readonly string[], dir: string): Promise<string> {
  const before = readdirSync(dir).sort();
  const r = await cli(args, dir);
  expect(r.thrown).toBeUndefined();
  expect(r.code, r.err).toBe(2);
  expect(r.out).toBe('');
  const lines = r.err.trimEnd().split('\n');
  expect(lines, r.err).toHaveLength(1);
  expect(lines[0]).toMatch(/^heliochron: (\S+: )?\S+( is missing|: .+ is not allowed); expected .+/);
  expect(readdirSync(dir).sort(), 'nothing written').toEqual(before);
  return lines[0];
}

describe('--clock has one default everywhere, local apparent time', () => {
  it('sun without --clock reads the time as apparent time and says so', async () => {
    const dir = tempDir();
    const base = ['sun', '--lat', '47.62', '--lon', '9.35', '--date', '1650-03-10', '--time', '10:30', '--json'];
    const plain = JSON.parse((await cli(base, dir)).out);
    const apparent = JSON.parse((await cli([...base, '--clock', 'apparent'], dir)).out);
    const mean = JSON.parse((await cli([...base, '--clock', 'mean'], dir)).out);
    expect(plain.azimuth).toBe(apparent.azimuth);
    // On 10 March the equation of time is about -10.6 min (Meeus 1998, ch. 28): mean and apparent differ.
    expect(Math.abs(plain.azimuth - mean.azimuth)).toBeGreaterThan(1);
    expect(plain.input.clock).toBe('apparent');
    expect(plain.defaults).toContain('clock');
  });

  it('check without --clock reads --time as apparent time, the same default', () => {
    const scene = readSceneText(readFileSync(EXAMPLE, 'utf8'), 'marktgasse-print.yaml');
    const p = proposalFromOptions({ on: '1771-07-30', time: '08:00', json: false, force: false, version: '' }, scene);
    expect(p).toMatchObject({ kind: 'day', timeClock: { kind: 'apparent' } });
  });

  it('both --help texts state the default', async () => {
    const dir = tempDir();
    for (const command of ['sun', 'check']) {
      const r = await cli([command, '--help'], dir);
      expect(r.code).toBe(0);
      expect(r.out.replace(/\s+/g, ' '), command).toMatch(/default: "?apparent"?/);
    }
  });
});

describe('a negative year is a date, not an option', () => {
  it('calendar -44-03-15 --calendar julian reads 15 March 45 BC (astronomical year -44)', async () => {
    const r = await cli(['calendar', '-44-03-15', '--calendar', 'julian'], tempDir());
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    // Astronomical year -44 = 45 BC (Meeus 1998, ch. 7: year 0 = 1 BC).
    expect(r.out).toContain('read as 15 March 45 BC');
  });

  it('check --between takes two negative-year days, and --on one', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'square.yaml'), SQUARE);
    const between = await cli(['check', 'square.yaml', '--between', '-100-03-01', '-90-03-01', '--json'], dir);
    expect(between.err).toBe('');
    expect(between.code).toBe(0);
    expect(JSON.parse(between.out).proposal).toMatchObject({ kind: 'range' });
    const on = await cli(['check', 'square.yaml', '--on', '-99-06-21'], dir);
    expect(on.code, on.err).toBe(0);
  });

  it('sun --date takes a negative year', async () => {
    const r = await cli(['sun', '--lat', '41.9', '--lon', '12.5', '--date', '-43-03-15', '--calendar', 'julian', '--time', '11:00', '--json'], tempDir());
    expect(r.code, r.err).toBe(0);
    expect(JSON.parse(r.out).input.date).toBe('-0043-03-15');
  });
});

describe('coordinates as written on maps', () => {
  it("sun reads --lat 48°12'30\"N --lon 16.4W as 48.208333 and -16.4", async () => {
    const r = await cli(['sun', '--lat', `48°12'30"N`, '--lon', '16.4W', '--date', '1780-04-01', '--time', '10:00', '--json'], tempDir());
    expect(r.code, r.err).toBe(0);
    const input = JSON.parse(r.out).input;
    expect(input.lat).toBeCloseTo(48 + 12 / 60 + 30 / 3600, 9); // 1 deg = 60' = 3600" (common practice)
    expect(input.lon).toBe(-16.4);
  });

  it('refuses a longitude letter on a latitude, naming the field', async () => {
    const line = await refused(['sun', '--lat', '48 E', '--lon', '16.4', '--date', '1780-04-01', '--time', '10:00'], tempDir());
    expect(line).toMatch(/^heliochron: --lat: "48 E" is not allowed; expected a latitude .* E marks a longitude; a latitude takes N or S\.$/);
  });

  it('refuses a form it does not read with the decimal form suggested', async () => {
    const line = await refused(['sun', '--lat', '48:12', '--lon', '16.4', '--date', '1780-04-01', '--time', '10:00'], tempDir());
    expect(line).toMatch(/in decimal degrees that is 48\.2\.$/);
  });
});

describe('hints for the arguments a new user gets wrong', () => {
  it('a path with spaces given unquoted gets the quoted form', async () => {
    const dir = tempDir();
    copyFileSync(EXAMPLE, join(dir, 'my scene.yaml'));
    const line = await refused(['date', 'my', 'scene.yaml'], dir);
    expect(line).toBe(
      'heliochron: <scene>: ["my","scene.yaml"] is not allowed; expected one argument: the scene file (.yaml, .yml or .json); see docs/scene-file.md. ' +
        'A name or date with spaces goes in quotes: heliochron date "my scene.yaml"',
    );
  });

  it('a date with spaces given unquoted gets the quoted form', async () => {
    const line = await refused(['calendar', '15', 'March', '1650'], tempDir());
    expect(line).toMatch(/heliochron calendar "15 March 1650"$/);
  });

  it('the scene given after --between gets the order of the arguments', async () => {
    const dir = tempDir();
    copyFileSync(EXAMPLE, join(dir, 'scene.yaml'));
    const line = await refused(['check', '--between', '1771-05-01', '1771-05-31', 'scene.yaml'], dir);
    expect(line).toMatch(/^heliochron: <scene> is missing; expected the scene file/);
    expect(line).toMatch(/put <scene> before --between: heliochron check scene\.yaml --between 1771-05-01 1771-05-31$/);
  });

  it('a command without arguments given one says it takes options only', async () => {
    const line = await refused(['sun', 'Velmar'], tempDir());
    expect(line).toMatch(/^heliochron: sun: \["Velmar"\] is not allowed; expected no argument\. sun takes options only/);
  });
});

describe('the output form follows the file name, or the mismatch is refused', () => {
  it('date -o report.html is refused, pointing to heliochron report', async () => {
    const dir = tempDir();
    copyFileSync(EXAMPLE, join(dir, 'scene.yaml'));
    const line = await refused(['date', 'scene.yaml', '-o', 'report.html'], dir);
    expect(line).toBe(
      'heliochron: --output: "report.html" is not allowed; expected a file name ending in .txt (text), .json (JSON), .csv (CSV), or without an extension. ' +
        'date writes text, JSON or CSV, not HTML; for HTML use heliochron report.',
    );
  });

  it('date --json -o answer.csv is refused as a mismatch', async () => {
    const dir = tempDir();
    copyFileSync(EXAMPLE, join(dir, 'scene.yaml'));
    const line = await refused(['date', 'scene.yaml', '--json', '-o', 'answer.csv'], dir);
    expect(line).toMatch(/The name says CSV but --json asks for JSON; change one of them\.$/);
  });

  it('check -o answer.json writes JSON without --json; report and chart refuse a wrong extension', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'square.yaml'), SQUARE);
    const r = await cli(['check', 'square.yaml', '--on', '-99-06-21', '-o', 'answer.json'], dir);
    expect(r.code, r.err).toBe(0);
    expect(JSON.parse(readFileSync(join(dir, 'answer.json'), 'utf8')).proposal.kind).toBe('day');
    expect(await refused(['report', 'square.yaml', '-o', 'report.txt'], dir)).toMatch(/report writes HTML, not text/);
    expect(await refused(['chart', 'square.yaml', '--kind', 'map', '-o', 'map.png'], dir)).toMatch(/chart writes SVG, not a \.png file/);
  });
});

describe('chart --kind', () => {
  it('--help says --kind is required and offers all', async () => {
    const r = await cli(['chart', '--help'], tempDir());
    const help = r.out.replace(/\s+/g, ' ');
    expect(help).toContain('which chart (required): map, sky, residuals, or all');
    expect(help).toContain('NAME-map.svg, NAME-sky.svg, NAME-residuals.svg');
  });

  it('without --kind it is refused, saying what is missing', async () => {
    const dir = tempDir();
    copyFileSync(EXAMPLE, join(dir, 'scene.yaml'));
    expect(await refused(['chart', 'scene.yaml'], dir)).toBe('heliochron: --kind is missing; expected one of map, sky, residuals, all (this option is required)');
  });

  it('--kind all writes the three charts, named after -o', async () => {
    const dir = tempDir();
    copyFileSync(EXAMPLE, join(dir, 'scene.yaml'));
    const r = await cli(['chart', 'scene.yaml', '--kind', 'all', '-o', 'velmar.svg'], dir);
    expect(r.code, r.err).toBe(0);
    expect(r.err).toBe('heliochron: wrote velmar-map.svg\nheliochron: wrote velmar-sky.svg\nheliochron: wrote velmar-residuals.svg\n');
    for (const kind of ['map', 'sky', 'residuals']) {
      expect(readFileSync(join(dir, `velmar-${kind}.svg`), 'utf8')).toMatch(/^<svg[\s\S]*<\/svg>\s*$/);
    }
    // A second run without --force refuses before writing anything.
    const again = await cli(['chart', 'scene.yaml', '--kind', 'all', '-o', 'velmar.svg'], dir);
    expect(again.code).toBe(2);
    expect(again.err).toBe('heliochron: output file "velmar-map.svg" exists already; add --force to replace it\n');
  });
});

describe('a missing value is said to be missing', () => {
  it('a scene without observations: "observations is missing"', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'square.yaml'), SQUARE.replace(/observations:[\s\S]*$/, ''));
    const line = await refused(['date', 'square.yaml'], dir);
    expect(line).toBe('heliochron: square.yaml: observations is missing; expected a list of 1 or more observations. A scene needs "observations".');
    expect(line).not.toMatch(/nothing is not allowed/);
  });
});

describe('a dual year that contradicts its day', () => {
  it('1650/1-03-30 under mar25-forward is refused, naming both plain readings', async () => {
    const line = await refused(['calendar', '1650/1-03-30', '--year-start', 'mar25-forward'], tempDir());
    expect(line).toBe(
      'heliochron: <date>: "1650/1-03-30" is not allowed; expected a single year for a day that carries one year number under mar25-forward. ' +
        'Under mar25-forward only 1 January to 24 March are written with two years; write 1650-03-30 or 1651-03-30, or state the year start the document used.',
    );
  });

  it('in a scene file with yearStart mar25-forward, the same date is refused with its line', async () => {
    const dir = tempDir();
    const text = SQUARE.replace('calendar: julian', 'calendar: julian\nyearStart: mar25-forward').replace(
      'window: { fromYear: -120, toYear: -80 }',
      'window: { fromYear: 1640, toYear: 1660, notBefore: 1650/1-03-30 }',
    );
    writeFileSync(join(dir, 'square.yaml'), text);
    const line = await refused(['date', 'square.yaml'], dir);
    expect(line).toMatch(/^heliochron: square\.yaml: window\.notBefore: "1650\/1-03-30" is not allowed; .* See line 6 of square\.yaml\.$/);
  });

  it('1650/1-02-10 under mar25-forward is read as 10 February 1651 (January year)', async () => {
    const r = await cli(['calendar', '1650/1-02-10', '--year-start', 'mar25-forward'], tempDir());
    expect(r.code, r.err).toBe(0);
    expect(r.out).toContain('read as 10 February 1651');
  });
});

describe('installed, heliochron runs from any folder', () => {
  // `npm install -g` puts a symbolic link to the package's bin file on the PATH; .ci/run checks the whole
  // installation (pack, install into a temporary prefix); here the link alone, run from another folder.
  const root = fileURLToPath(new URL('../../', import.meta.url));
  const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as { bin: Record<string, string>; files: string[] };

  it('the package names its bin and ships what the bin reads at run time', () => {
    expect(pkg.bin.heliochron).toBe('dist/bin/heliochron.cjs');
    for (const folder of ['dist', 'data', 'examples']) expect(pkg.files).toContain(folder);
  });

  it('a link to the bin, run from another folder, answers', () => {
    const dir = tempDir();
    symlinkSync(join(root, pkg.bin.heliochron), join(dir, 'heliochron'));
    copyFileSync(EXAMPLE, join(dir, 'scene.yaml'));
    const r = spawnSync(process.execPath, [join(dir, 'heliochron'), 'calendar', '1752-09-14', '--calendar', 'great-britain'], { cwd: dir, encoding: 'utf8' });
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    // 14 September 1752 (Gregorian) = 3 September (Julian) in Great Britain (Calendar (New Style) Act 1750).
    expect(r.stdout).toContain('Julian:        3 September 1752');
  });
});

describe('a dual year read without a stated year start', () => {
  it('calendar 1650/1-03-30 names the only style that writes 30 March with two years', async () => {
    const r = await cli(['calendar', '1650/1-03-30'], tempDir());
    expect(r.code, r.err).toBe(0);
    // Pisan style: from 25 March the next year's number (Cheney, A Handbook of Dates (2000), ch. 1).
    expect(r.out).toContain('read as 30 March 1650 (dual year 1650/1: January year 1650)');
    expect(r.out).toMatch(/Note: +a dual year on 30 March is written only under mar25-backward .*; read so, it is January year 1650; add --year-start/);
  });
});
