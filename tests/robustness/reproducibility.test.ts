/**
 * Reproducibility end to end through the CLI (main() with a captured CliIo): the same scene gives
 * byte-identical `date --json` (and `check --json`) output in two runs, also for a scene measured
 * in pixels, whose sigmas come partly from a seeded Monte Carlo run (src/image/resolvePixels.ts);
 * the seed is printed in the text and JSON answers and is set by `seed:` in the scene.
 * (Common practice for scientific software: a run is repeatable from its inputs and printed seed.)
 * Scenes: the bundled Velmar examples (invented) and small variants of them.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { parse, stringify } from 'yaml';
import { cli, tempDir } from './robustHelpers.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const MARKTGASSE = 'examples/marktgasse-print.yaml';
const PIXEL_SCENE = 'examples/tanners-hall-photo/tanners-hall-photo.yaml';

let runs = 0;
async function run(args: string[], cwd = ROOT) {
  const r = await cli(args, cwd);
  runs += 1;
  return r;
}

describe('the same scene gives the same bytes', () => {
  for (const scene of [MARKTGASSE, PIXEL_SCENE]) {
    it(`date --json of ${scene} is byte-identical in two runs`, async () => {
      const a = await run(['date', scene, '--json']);
      const b = await run(['date', scene, '--json']);
      expect(a.err).toBe('');
      expect(a.code).toBe(0);
      expect(a.out.length).toBeGreaterThan(1000);
      expect(b.out).toBe(a.out);
    });
  }

  it('check --json and the text answer are byte-identical in two runs too', async () => {
    for (const args of [['check', MARKTGASSE, '--on', '1771-07-30', '--json'], ['date', MARKTGASSE]]) {
      const a = await run(args);
      const b = await run(args);
      expect(a.code).toBe(0);
      expect(b.out).toBe(a.out);
    }
  });

  it('the JSON answer holds no path of this machine and no time of the run', async () => {
    const a = await run(['date', PIXEL_SCENE, '--json']);
    expect(a.out).not.toContain(ROOT);
    expect(a.out).not.toMatch(/20\d\d-\d\d-\d\dT\d\d:\d\d/); // an ISO timestamp (ISO 8601)
  });
});

describe('the seed', () => {
  it('is printed in the text and JSON answers, and is the scene\'s own', async () => {
    const text = await run(['date', MARKTGASSE]);
    const json = JSON.parse((await run(['date', MARKTGASSE, '--json'])).out) as { seed: number };
    expect(json.seed).toBe(7); // examples/marktgasse-print.yaml: "seed: 7"
    expect(text.out).toMatch(/\bseed 7\b/);
  });

  it('is set by "seed:" in the scene (default 1 without it), and printed as set', async () => {
    const dir = tempDir('heliochron-seed-');
    const data = parse(readFileSync(join(ROOT, PIXEL_SCENE), 'utf8')) as Record<string, unknown>;
    const seen: number[] = [];
    for (const seed of [4294967295, 0, undefined]) {
      const copy: Record<string, unknown> = { ...data };
      if (seed === undefined) delete copy.seed;
      else copy.seed = seed;
      writeFileSync(join(dir, 'scene.yaml'), stringify(copy, { lineWidth: 0 }), 'utf8');
      const j = await run(['date', 'scene.yaml', '--json'], dir);
      expect(j.code, j.err).toBe(0);
      const parsed = JSON.parse(j.out) as { seed: number };
      seen.push(parsed.seed);
      const t = await run(['date', 'scene.yaml'], dir);
      expect(t.out).toMatch(new RegExp(`\\bseed ${parsed.seed}\\b`));
    }
    // docs/scene-file.md: "seed ... default 1".
    expect(seen).toEqual([4294967295, 0, 1]);
  });

  it('--seed overrides the scene file\'s seed and is printed in text and JSON; a bad seed is refused', async () => {
    const help = await run(['date', '--help']);
    expect(help.out).toMatch(/--seed <n>/);
    const t = await run(['date', MARKTGASSE, '--seed', '3']);
    expect(t.code).toBe(0);
    expect(t.out).toMatch(/\bseed 3\b/);
    const j = await run(['date', MARKTGASSE, '--seed', '3', '--json']);
    expect((JSON.parse(j.out) as { seed: number }).seed).toBe(3);
    const bad = await run(['date', MARKTGASSE, '--seed', '-3']);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/^heliochron: .*--seed.*whole number/);
    expect(bad.out).toBe('');
  });
});

describe('the runs above', () => {
  it('all ran', () => {
    // eslint-disable-next-line no-console
    console.log(`reproducibility: ${runs} CLI runs compared`);
    expect(runs).toBeGreaterThanOrEqual(17);
  });
});
