/**
 * The Delta T model is named in every answer and can be chosen: `--delta-t` on the commands
 * that compute the sun, `deltaT:` in a scene file (through the compiled CLI when dist/ is built).
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ROOT as root, runCli } from '../helpers/runCli.js';

const cli = runCli;

const MOMENT = ['sun', '--lat', '47.62', '--lon', '9.35', '--date', '1282-06-10', '--calendar', 'julian', '--time', '10:30', '--clock', 'apparent'];

describe('--delta-t', () => {
  it('sun names the 2021 model by default and Espenak-Meeus when asked; Delta T differs by about 190 s at 1282', async () => {
    const a = await cli([...MOMENT, '--json']);
    const b = await cli([...MOMENT, '--json', '--delta-t', 'espenak-meeus-2006']);
    expect(a.code).toBe(0);
    expect(b.code).toBe(0);
    const ja = JSON.parse(a.out);
    const jb = JSON.parse(b.out);
    expect(ja.deltaT.model).toBe('morrison-2021');
    expect(jb.deltaT.model).toBe('espenak-meeus-2006');
    // Morrison et al. (2021) Table S15 vs Espenak and Meeus (2006): 719.6 s vs 529.4 s in mid-1282.
    expect(ja.deltaT.seconds - jb.deltaT.seconds).toBeGreaterThan(185);
    expect(ja.deltaT.seconds - jb.deltaT.seconds).toBeLessThan(195);
    const text = await cli(MOMENT);
    expect(text.out).toContain('Morrison, Stephenson, Hohenkerk and Zawilski 2021 spline');
  });
  it('refuses an unknown model with exit 2, naming the option and the models', async () => {
    const r = await cli([...MOMENT, '--delta-t', 'meeus']);
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err).toMatch(/--delta-t.*"meeus".*morrison-2021 or espenak-meeus-2006/);
  });
  it('date reads deltaT: from the scene file, --delta-t overrides it, and the answer names the model', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'heliochron-dt-'));
    const scene = readFileSync(join(root, 'examples/marktgasse-print.yaml'), 'utf8');
    const file = join(dir, 'scene.yaml');
    writeFileSync(file, `${scene}\ndeltaT: espenak-meeus-2006\n`);
    const fromScene = await cli(['date', file]);
    expect(fromScene.code).toBe(0);
    expect(fromScene.out).toContain('Espenak and Meeus 2006 polynomials');
    const overridden = await cli(['date', file, '--delta-t', 'morrison-2021']);
    expect(overridden.out).toContain('Morrison, Stephenson, Hohenkerk and Zawilski 2021 spline');
    writeFileSync(file, `${scene}\ndeltaT: nasa\n`);
    const bad = await cli(['date', file]);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/deltaT/);
  }, 120000);
});
