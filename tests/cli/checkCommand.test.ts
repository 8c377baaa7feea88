/**
 * `heliochron check` end to end through main() of src/cli/main.ts, on the bundled example
 * examples/marktgasse-print.yaml (invented; true instant 30 July 1771, 08:00 local apparent
 * time, clock keeping local mean time, see examples/README.md).
 */
import { describe, expect, it } from 'vitest';
import { existsSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { main } from '../../src/cli/main.js';
import { parseSeason } from '../../src/cli/proposalOptions.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const MARKTGASSE = 'examples/marktgasse-print.yaml';

async function cli(args: string[], cwd = ROOT): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(args, { out: (t) => { out += t; }, err: (t) => { err += t; }, errIsTerminal: false, cwd });
  return { code, out, err };
}

interface CheckJson {
  verdict: string;
  verdictText: string;
  chiSquare: number;
  pValue: number;
  proposal: { kind: string; words: string };
  best: { date: { iso: string }; times: { localApparent: string; localMean: string }; residuals: { observationId: string; normalised: number }[] } | null;
  globalBest: { chiSquare: number } | null;
}

describe('heliochron check', () => {
  it('--on a true day with its hour on the clock is consistent, with each residual given', async () => {
    const r = await cli(['check', MARKTGASSE, '--on', '1771-07-30', '--time', '08:06', '--clock', 'mean', '--json']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as CheckJson;
    expect(j.proposal.words).toBe('on 30 July 1771 at 08:06 local mean time');
    expect(j.verdict).toBe('consistent');
    expect(j.best?.date.iso).toBe('1771-07-30');
    expect(j.best?.times.localMean).toBe('08:06');
    expect(j.best?.residuals.map((x) => x.observationId)).toContain('weighhouse-clock');
    expect(j.pValue).toBeGreaterThan(0.05);
  });
  it('--on the mirror day in May at the same clock hour fits worse than the true day', async () => {
    const may = JSON.parse((await cli(['check', MARKTGASSE, '--on', '1771-05-12', '--time', '08:06', '--clock', 'mean', '--json'])).out) as CheckJson;
    const july = JSON.parse((await cli(['check', MARKTGASSE, '--on', '1771-07-30', '--time', '08:06', '--clock', 'mean', '--json'])).out) as CheckJson;
    expect(may.chiSquare - july.chiSquare).toBeGreaterThan(5);
    expect(may.verdict).not.toBe('consistent');
  });
  it('--between and --season give the best fit inside, the one-line verdict and the global best', async () => {
    const r = await cli(['check', MARKTGASSE, '--between', '1771-05-01', '1771-05-31']);
    expect(r.code).toBe(0);
    expect(r.out.split('\n')[1]).toBe('Proposal: between 1 May 1771 and 31 May 1771');
    expect(r.out).toMatch(/^Verdict: (consistent|doubtful|inconsistent) - /m);
    expect(r.out).toMatch(/Best fit inside the proposal: \d+ May 1771/);
    expect(r.out).toContain('Best fit anywhere in the window:');
    const s = JSON.parse((await cli(['check', MARKTGASSE, '--season', 'may-jun', '--json'])).out) as CheckJson;
    expect(s.proposal.kind).toBe('season');
    expect(s.best?.date.iso).toMatch(/^17\d\d-0[56]-\d\d$/);
  });
  it('--within lets the hour move: the proposal then fits at least as well as with the hour fixed', async () => {
    const fixed = JSON.parse((await cli(['check', MARKTGASSE, '--on', '1771-07-30', '--time', '08:20', '--clock', 'mean', '--json'])).out) as CheckJson;
    const loose = JSON.parse((await cli(['check', MARKTGASSE, '--on', '1771-07-30', '--time', '08:20', '--clock', 'mean', '--within', '20', '--json'])).out) as CheckJson;
    expect(loose.proposal.words).toBe('on 30 July 1771 at 08:20 local mean time (+/- 20 min)');
    expect(loose.chiSquare).toBeLessThan(fixed.chiSquare - 5);
    expect(loose.best?.times.localMean).toBe('08:06');
  });
  it('a season over many years names its best year only as an example, with the years that fit alike', async () => {
    const r = await cli(['check', MARKTGASSE, '--season', 'jul-aug']);
    expect(r.code).toBe(0);
    // The shadows and the clock repeat every year: examples/README.md (a), "every year of the window fits alike".
    expect(r.out).toContain('(the year is an example: 21 years of the proposal fit alike, 1765-1785; the light alone cannot tell them apart)');
    const oneYear = await cli(['check', MARKTGASSE, '--between', '1771-07-01', '1771-08-31']);
    expect(oneYear.out).not.toContain('the year is an example');
  });
  it('--json is byte-identical on two runs', async () => {
    const args = ['check', MARKTGASSE, '--season', '7', '--json'];
    expect((await cli(args)).out).toBe((await cli(args)).out);
  });
});

describe('bad input: one line, exit 2, nothing written', () => {
  const cases: [string, string[], RegExp][] = [
    ['no proposal', [], /--on\/--between\/--season is missing; expected exactly one of --on <date>, --between <date> <date>, --season <months>/],
    ['two proposals', ['--on', '1771-07-30', '--season', '5-9'], /"--on --season" is not allowed; expected exactly one of/],
    ['a bad date', ['--on', '1771-13-01'], /--on: "1771-13-01" is not allowed/],
    ['29 February of a common Gregorian year', ['--on', '1771-02-29'], /--on: "1771-02-29" is not allowed/],
    ['one day for --between', ['--between', '1771-05-01'], /--between: "1771-05-01" is not allowed; expected two civil days/],
    ['a range backwards', ['--between', '1771-06-01', '1771-05-01'], /expected the earlier day first/],
    ['a bad season', ['--season', 'may-foo'], /--season: "may-foo" is not allowed; expected months/],
    ['a bad time', ['--on', '1771-07-30', '--time', '25:00'], /--time: "25:00" is not allowed/],
    ['a clock without a time', ['--on', '1771-07-30', '--clock', 'mean'], /--clock: "mean" is not allowed; expected a clock only together with --time/],
    ['a tolerance without a time', ['--on', '1771-07-30', '--within', '10'], /--within: "10" is not allowed; expected a tolerance only together with --time/],
    ['a bad tolerance', ['--on', '1771-07-30', '--time', '08:00', '--within', 'ten'], /--within: "ten" is not allowed; expected a number of minutes from 0 to 720/],
    ['a bad clock', ['--on', '1771-07-30', '--time', '08:00', '--clock', 'sundial'], /--clock: "sundial" is not allowed/],
  ];
  for (const [what, extra, message] of cases) {
    it(`${what} is refused with a clear message`, async () => {
      const dir = mkdtempSync(join(tmpdir(), 'heliochron-check-'));
      const r = await cli(['check', `${ROOT}${MARKTGASSE}`, ...extra, '-o', 'out.txt'], dir);
      expect(r.code).toBe(2);
      expect(r.out).toBe('');
      expect(r.err.trim().split('\n')).toHaveLength(1);
      expect(r.err).toMatch(message);
      expect(existsSync(join(dir, 'out.txt'))).toBe(false);
    });
  }
  it('a day skipped at the site switch is refused, naming the days either side', async () => {
    // Velmar's switch in the example: 18 February 1700 (Julian) was followed by 1 March 1700 (Gregorian).
    const r = await cli(['check', 'examples/upper-gate-drawing.yaml', '--on', '1700-02-25']);
    expect(r.code).toBe(2);
    expect(r.err).toContain('--on: "1700-02-25" is not allowed');
    expect(r.err).toContain('18 February 1700');
    expect(r.err).toContain('1 March 1700');
  });
  it('a missing scene file is named', async () => {
    const r = await cli(['check', 'nowhere.yaml', '--on', '1771-07-30']);
    expect(r.code).toBe(2);
    expect(r.err).toContain('nowhere.yaml');
  });
});

describe('parseSeason', () => {
  it('reads ranges, names, lists and a range across the year end', () => {
    expect(parseSeason('5-9', '--season')).toEqual([5, 6, 7, 8, 9]);
    expect(parseSeason('may-sep', '--season')).toEqual([5, 6, 7, 8, 9]);
    expect(parseSeason('5,6,7', '--season')).toEqual([5, 6, 7]);
    expect(parseSeason('nov-feb', '--season')).toEqual([1, 2, 11, 12]);
    expect(parseSeason('5-6, September', '--season')).toEqual([5, 6, 9]);
  });
  it('refuses empty parts, month 13 and short names', () => {
    expect(() => parseSeason('', '--season')).toThrow(/--season/);
    expect(() => parseSeason('5,,6', '--season')).toThrow(/--season/);
    expect(() => parseSeason('13', '--season')).toThrow(/13 is no month number/);
    expect(() => parseSeason('ma', '--season')).toThrow(/"ma" is not a month/);
  });
});
