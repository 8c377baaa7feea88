/**
 * `heliochron date` end to end through main() of src/cli/main.ts, on the bundled examples
 * (invented scenes in the fictional town of Velmar, examples/README.md).
 */
import { describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { main } from '../../src/cli/main.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const MARKTGASSE = 'examples/marktgasse-print.yaml';
const VERSION = (JSON.parse(readFileSync(`${ROOT}package.json`, 'utf8')) as { version: string }).version;

async function cli(args: string[], cwd = ROOT): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(args, { out: (t) => { out += t; }, err: (t) => { err += t; }, errIsTerminal: false, cwd });
  return { code, out, err };
}

function tempDir(): string {
  return mkdtempSync(join(tmpdir(), 'heliochron-date-'));
}

describe('heliochron date', () => {
  it('prints the verdict first, then families, candidates, residuals, consistency, assumptions and caution', async () => {
    const r = await cli(['date', MARKTGASSE]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const lines = r.out.split('\n');
    expect(lines[0]).toBe('Marktgasse view, anonymous print');
    expect(lines[3]).toMatch(/^Verdict: /);
    const order = ['Families of dates', 'Best candidates', 'Residuals of the best candidate', 'Consistency of the observations', 'Assumptions:', 'Caution:'];
    const at = order.map((s) => r.out.indexOf(s));
    for (let i = 0; i < at.length; i++) expect(at[i], order[i]).toBeGreaterThan(i === 0 ? 0 : at[i - 1]);
    expect(r.out).toContain('July (Gregorian)');
  });
  it('shows the best year of every family in the candidates table, the May side of the solstice too', async () => {
    // examples/README.md (a): the shadows also fit about 10-11 May; the clock only makes it less likely.
    const r = await cli(['date', MARKTGASSE]);
    const table = r.out.slice(r.out.indexOf('Best candidates'), r.out.indexOf('Residuals of the best candidate'));
    expect(table).toMatch(/\n\s+\d+\s+1[01] May 17\d\d \(Gregorian\)/);
    expect(table).toMatch(/\n\s+1\s+(29|30) July 17\d\d \(Gregorian\)/);
  });
  it('--json is one object, byte-identical on two runs, with candidates in rank order and a numeric jd', async () => {
    const a = await cli(['date', MARKTGASSE, '--json']);
    const b = await cli(['date', MARKTGASSE, '--json']);
    expect(a.code).toBe(0);
    expect(a.out).toBe(b.out);
    const j = JSON.parse(a.out) as { heliochronVersion: string; seed: number; status: string; candidates: { rank: number; jd: number; date: { text: string }; times: { localApparent: string } }[] };
    expect(j.heliochronVersion).toBe(VERSION);
    expect(j.seed).toBe(7);
    expect(j.status).toBe('fits');
    expect(j.candidates.map((c) => c.rank)).toEqual(j.candidates.map((_, i) => i + 1));
    expect(typeof j.candidates[0].jd).toBe('number');
    expect(j.candidates[0].times.localApparent).toMatch(/^\d\d:\d\d$/);
  });
  it('--csv gives a header row and one row per candidate', async () => {
    const r = await cli(['date', MARKTGASSE, '--csv']);
    const j = JSON.parse((await cli(['date', MARKTGASSE, '--json'])).out) as { candidates: unknown[] };
    const rows = r.out.split('\r\n').filter((l) => l !== '');
    expect(rows[0].startsWith('rank,id,family,')).toBe(true);
    expect(rows.length).toBe(1 + j.candidates.length);
  });
  it('--all-years lists every year of each family', async () => {
    const r = await cli(['date', MARKTGASSE, '--all-years']);
    expect(r.code).toBe(0);
    expect(r.out).toContain('every year:');
    for (let year = 1765; year <= 1785; year++) expect(r.out).toContain(`${year}  `);
  });
  it('-o writes the answer to a file, refuses to overwrite it without --force, and replaces it with --force', async () => {
    const dir = tempDir();
    const target = join(dir, 'answer.json');
    const first = await cli(['date', `${ROOT}${MARKTGASSE}`, '--json', '-o', target]);
    expect(first.code).toBe(0);
    expect(first.out).toBe('');
    const written = readFileSync(target, 'utf8');
    expect(JSON.parse(written)).toHaveProperty('candidates');
    writeFileSync(target, 'keep me');
    const again = await cli(['date', `${ROOT}${MARKTGASSE}`, '--json', '-o', target]);
    expect(again.code).toBe(2);
    expect(again.err).toContain('exists already; add --force');
    expect(readFileSync(target, 'utf8')).toBe('keep me');
    const forced = await cli(['date', `${ROOT}${MARKTGASSE}`, '--json', '-o', target, '--force']);
    expect(forced.code).toBe(0);
    expect(readFileSync(target, 'utf8')).toBe(written);
  });
});

describe('bad input: one line, exit 2, nothing written', () => {
  it('a missing scene file is named', async () => {
    const dir = tempDir();
    const r = await cli(['date', 'no-such-scene.yaml', '-o', 'out.txt'], dir);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toContain('no-such-scene.yaml');
    expect(r.err).toContain('There is no file at this path');
    expect(existsSync(join(dir, 'out.txt'))).toBe(false);
  });
  it('a bad value in the file names the file and the path in it, quoting the value', async () => {
    const dir = tempDir();
    const text = readFileSync(`${ROOT}${MARKTGASSE}`, 'utf8').replace(/slopeDeg: \d+/, 'slopeDeg: 95');
    writeFileSync(join(dir, 'bad.yaml'), text);
    const r = await cli(['date', 'bad.yaml', '-o', 'out.txt'], dir);
    expect(r.code).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/^heliochron: bad\.yaml: observations\[0\]\.slopeDeg: 95 is not allowed; expected/);
    expect(existsSync(join(dir, 'out.txt'))).toBe(false);
  });
  it('--json with --csv is refused', async () => {
    const r = await cli(['date', MARKTGASSE, '--json', '--csv']);
    expect(r.code).toBe(2);
    expect(r.err).toContain('--csv');
    expect(r.err).toContain('not both');
  });
  it('an output folder that does not exist is refused before any work', async () => {
    const dir = tempDir();
    const r = await cli(['date', `${ROOT}${MARKTGASSE}`, '-o', 'no/such/folder/answer.txt'], dir);
    expect(r.code).toBe(2);
    expect(r.err).toContain('heliochron: folder "no/such/folder" for the output file does not exist');
  });
  it('the output may not be the input', async () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'scene.yaml'), readFileSync(`${ROOT}${MARKTGASSE}`, 'utf8'));
    // A .yaml name is no output form at all (refused by its extension); a scene kept as .txt reaches the input guard.
    const r = await cli(['date', 'scene.yaml', '-o', 'scene.yaml', '--force'], dir);
    expect(r.code).toBe(2);
    expect(r.err).toContain('--output: "scene.yaml" is not allowed');
    expect(readFileSync(join(dir, 'scene.yaml'), 'utf8')).toBe(readFileSync(`${ROOT}${MARKTGASSE}`, 'utf8'));
    writeFileSync(join(dir, 'scene.txt'), readFileSync(`${ROOT}${MARKTGASSE}`, 'utf8'));
    const txt = await cli(['date', 'scene.txt', '-o', 'scene.txt', '--force'], dir);
    expect(txt.code).toBe(2);
    expect(txt.err).toContain('is the input file');
    expect(readFileSync(join(dir, 'scene.txt'), 'utf8')).toBe(readFileSync(`${ROOT}${MARKTGASSE}`, 'utf8'));
  });
});
