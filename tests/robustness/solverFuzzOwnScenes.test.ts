/**
 * The date solver and the proposal check on valid scenes of our own at the edges of every range
 * (ownScenes.ts), and a sample of scene files through the CLI (main() with a captured CliIo;
 * `date` as text, --json and --csv --all-years, and `check --season`):
 * exit 0 or 2, no stack trace printed, on exit 2 one line on stderr and nothing on stdout.
 * The contract checked for each scene is in solverFuzzRun.ts.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readSceneText } from '../../src/scene/readScene.js';
import { runSceneFuzz } from '../scene/fuzzCases.js';
import { cli, STACK_LINE, tempDir } from './robustHelpers.js';
import { ownScenes } from './ownScenes.js';
import { BAD_WORDS, runAll, tally, withoutUserText, type Outcome } from './solverFuzzRun.js';

describe('the solver and the proposal check under valid scenes of our own', () => {
  const own = ownScenes(80);
  const fuzz = runSceneFuzz({ numRuns: 1500 });

  it('answer valid scenes at the edges of every range, or refuse them with a typed error', () => {
    const r = runAll(own.accepted);
    const t = tally(r.outcomes);
    const solved = r.outcomes.filter((o) => o.kind === 'solved').length;
    // eslint-disable-next-line no-console
    console.log(
      `solver fuzz (own scenes): ${own.tried} tried, ${own.rejected} rejected by the reader, ${own.accepted.length} accepted ` +
        `(${r.distinct} distinct); solved ${solved}, refused by the solver ${r.outcomes.length - solved}; ${JSON.stringify(t)}; ` +
        `slowest call ${r.slowestMs.toFixed(0)} ms, total ${(r.totalMs / 1000).toFixed(1)} s`,
    );
    const refusals = r.outcomes.filter((o): o is Extract<Outcome, { kind: 'refused' }> => o.kind === 'refused');
    for (const m of new Set(refusals.map((o) => o.message.replace(/\d+/g, 'N').slice(0, 90)))) console.log(`  refusal: ${m}`);
    expect(own.accepted.length).toBeGreaterThan(60);
    // Every status is reached: the generator is not stuck in one corner.
    for (const status of ['fits', 'nothing-fits']) expect(t[status] ?? 0, status).toBeGreaterThan(5);
    expect(solved).toBeGreaterThan(own.accepted.length * 0.8);
  });

  it('through the CLI, a sample of the files exits with 0 or 2, without a stack trace', async () => {
    const dir = tempDir('heliochron-fuzz-cli-');
    const distinctTexts = [...new Set(fuzz.acceptedTexts)];
    const sample = [...distinctTexts.slice(0, 16), ...own.texts.filter((_, i) => i % 5 === 0).slice(0, 16)];
    const codes: Record<number, number> = {};
    for (const [i, text] of sample.entries()) {
      const name = `case-${i}.yaml`;
      writeFileSync(join(dir, name), text, 'utf8');
      const args = [['date', name, '--json'], ['date', name, '--csv', '--all-years'], ['check', name, '--season', '6-7'], ['date', name]][i % 4];
      const r = await cli(args, dir);
      codes[r.code] = (codes[r.code] ?? 0) + 1;
      expect(r.thrown, `${name}: ${String(r.thrown)}`).toBeUndefined();
      expect([0, 2], `${name}: ${r.err}`).toContain(r.code);
      expect(STACK_LINE.test(r.err) || STACK_LINE.test(r.out), `${name}: ${r.err}`).toBe(false);
      if (r.code === 2) {
        expect(r.out).toBe('');
        expect(r.err.trimEnd().split('\n')).toHaveLength(1);
        expect(r.err).toMatch(/^heliochron: /);
      } else {
        expect(r.err).toBe('');
        if (args.includes('--json')) expect(() => JSON.parse(r.out)).not.toThrow();
        const plain = withoutUserText(r.out, readSceneText(text, name));
        expect(BAD_WORDS.test(plain), plain.split('\n').find((l) => BAD_WORDS.test(l))).toBe(false);
      }
    }
    // eslint-disable-next-line no-console
    console.log(`solver fuzz (CLI): ${sample.length} files through main(): exit codes ${JSON.stringify(codes)}`);
    expect(sample.length).toBeGreaterThanOrEqual(30);
    expect(codes[0] ?? 0).toBeGreaterThan(20);
  });
});
