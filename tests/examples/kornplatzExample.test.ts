/**
 * The invented print "Figures before the Kornhaus" (fictional town of Velmar): no size in metres
 * anywhere; the camera from the picture's perspective, the sun from figures' and posts' shadows on
 * steps and uneven paving; dated end to end through the command line (main() of src/cli/main.ts).
 *
 * The truth is the instant the picture was rendered for (examples/kornplatz-figures/make-picture.mjs):
 * 14 May 1871 (Gregorian), 16:40 local mean time at 47.62 N, 9.35 E; the rendering's sun (heliochron's
 * ephemeris, printed by the script) is azimuth 269.1770 deg, refracted altitude 26.3995 deg, and the
 * rendering's camera has a focal length of 2050 px and its principal point at [1218, 889] px. The
 * variant's figures were rendered under the sun of four hours earlier (azimuth 200.90, altitude 59.63).
 */
import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { cli as run } from '../robustness/robustHelpers.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const DIR = join(ROOT, 'examples/kornplatz-figures');

const cli = (args: string[]) => run(args, ROOT);

describe('the Kornhaus print: dated from its perspective alone', () => {
  it('measure finds the camera and, for each group, the sun of the rendering within two sigma', async () => {
    const r = await cli(['measure', join(DIR, 'kornplatz-figures.yaml'), '--json']);
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.camera.method).toBe('orthocentre');
    expect(Math.abs(j.camera.focalLengthPx.value - 2050)).toBeLessThan(3 * j.camera.focalLengthPx.sigma);
    expect(Math.abs(j.camera.principalPointPx[0].value - 1218)).toBeLessThan(3 * j.camera.principalPointPx[0].sigma);
    expect(j.camera.perspectiveConsistent).toBe(true);
    for (const g of j.camera.groups) {
      expect(Math.abs(g.azimuthDeg - 269.177), g.group).toBeLessThan(2 * g.reported.azimuthSigmaDeg);
      expect(Math.abs(g.altitudeDeg - 26.3995), g.group).toBeLessThan(2 * g.reported.altitudeSigmaDeg);
      expect(g.againstRest.pValue).toBeGreaterThan(0.01);
    }
  });

  it('date puts the true day and hour first (with its twin date across the solstice)', async () => {
    const r = await cli(['date', join(DIR, 'kornplatz-figures.yaml'), '--json']);
    expect(r.code, r.err).toBe(0);
    const a = JSON.parse(r.out);
    expect(a.status).not.toBe('nothing-fits');
    // the rendering's instant, jdUT 2404562.168472 (printed by make-picture.mjs); the candidate's own sigma is a few minutes
    const families: { fromMonthDay: string; bestJd: number }[] = a.families;
    expect(families.map((f) => f.fromMonthDay)).toEqual(['05-14', '07-29']);
    expect(Math.abs(families[0].bestJd - 2404562.168472) * 1440).toBeLessThan(5);
    // the group test of the answer: posts and figures were rendered under one sun
    expect(a.groupTests.map((g: { group: string }) => g.group)).toEqual(['figures', 'lamp-posts']);
    for (const g of a.groupTests) expect(g.differs, g.sentence).toBe(false);
  });

  it('the variant: the group test names the groups, and the dating finds that nothing fits', async () => {
    const m = await cli(['measure', join(DIR, 'kornplatz-figures-variant.yaml')]);
    expect(m.code, m.err).toBe(0);
    expect(m.out).toContain('the shadows of group "figures" do not share the light of the other pairs: p < 0.000001');
    const d = await cli(['date', join(DIR, 'kornplatz-figures-variant.yaml')]);
    expect(d.out).toContain('Nothing fits');
    // each pair is its own observation: the camera would have to be far off its clicks to reconcile them
    expect(d.out).toMatch(/fitted camera error .* in its own sigmas: .*; more than 3 sigmas: the shadows cannot be reconciled through this camera/);
    // the date answer's group test names the figures, with the sun they were rendered under (azimuth 200.90, altitude 59.63)
    expect(d.out).toContain('DIFFERS the shadows of "figures" do not share the light of "lamp-posts": Delta chi-square');
    const j = JSON.parse((await cli(['date', join(DIR, 'kornplatz-figures-variant.yaml'), '--json'])).out);
    const figures = j.groupTests.find((g: { group: string }) => g.group === 'figures');
    expect(figures.pValue).toBeLessThan(0.001);
    expect(Math.abs(figures.ownSun.azimuthDeg - 200.9)).toBeLessThan(2);
    expect(Math.abs(figures.ownSun.altitudeDeg - 59.63)).toBeLessThan(2);
  });
});
