/// <reference lib="dom" />
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync, type ChildProcess } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { parse, stringify } from 'yaml';
import { CHROMIUM, launchChromium } from '../helpers/chromium.js';
import { CLI, OUT_DIR, ROOT, clickPixel, cli, expectShownAsMeasured, startDesk, toolField, watch } from './deskPage.js';

// The desk's tools for an eave's shadow line and for a caster and its shadow point (issue 10), in
// Debian's Chromium through playwright-core. The desk opens a copy of the Tanners' Hall scene with
// its figures and facts but none of its shadows; an eave line on the ground, a caster on the ground
// and a caster on the wall are placed by clicks at 200% zoom, each tool picked by its key. The
// values and sigmas the page shows are compared with `heliochron measure --json` of a scene file
// holding the same clicks typed in (issue 10: within 0.01 deg, 0.001 in a ratio), and the Web
// Annotations written from the page with `heliochron measure --annotations` of the saved file.
const EXAMPLE_DIR = join(ROOT, 'examples', 'tanners-hall-photo');
const PICTURE = 'tanners-hall-photo.png';
const ZOOM = 2;

/** The measurements placed by clicks, as the scene file holds them. */
const EAVE = {
  id: 'arcade-eave', kind: 'eave-shadow', wall: 'tanners-hall-west',
  pixels: { fromPx: [500, 870], alongPx: [1000, 872], toPx: [700, 930], heightM: 5, heightSigmaM: 0.05, projectionM: 1.5, projectionSigmaM: 0.05 },
};
// the top of the square's lamp post (3.20 m, the example's pole) and the tip of its shadow: the same clicks as the example's pole
const BOLLARD = { id: 'lamp-post-top', kind: 'shadow-points', pixels: { fromPx: [1231, 954], toPx: [905, 867], heightM: 3.2, heightSigmaM: 0.05 } };
const SIGN = { id: 'sign-tip', kind: 'shadow-points', pixels: { wall: 'tanners-hall-west', fromPx: [640, 500], toPx: [610, 540], heightM: 0.5, heightSigmaM: 0.02 } };

let browser: Browser | undefined;
let desk: ChildProcess | undefined;
let deskUrl = '';
let folder = '';
let base: Record<string, unknown>;

beforeAll(async () => {
  if (!existsSync(CHROMIUM)) throw new Error(`Chromium was not found at ${CHROMIUM}: install the Debian package "chromium" to run the desk's browser tests`);
  if (!existsSync(CLI)) throw new Error(`${CLI} is missing: the tests' global set-up bundles it (tests/helpers/buildCli.ts)`);
  const build = spawnSync(process.execPath, [join(ROOT, 'src', 'desk', 'build.mjs')], { cwd: ROOT, encoding: 'utf8' });
  if (build.status !== 0) throw new Error(`building the desk page failed: ${build.stderr}`);
  mkdirSync(OUT_DIR, { recursive: true });
  folder = mkdtempSync(join(tmpdir(), 'heliochron-desk-tools-'));
  copyFileSync(join(EXAMPLE_DIR, PICTURE), join(folder, PICTURE));
  const example = parse(readFileSync(join(EXAMPLE_DIR, 'tanners-hall-photo.yaml'), 'utf8')) as { observations: { kind: string }[] };
  base = { ...example, observations: example.observations.filter((o) => o.kind === 'wall-lit') };
  writeFileSync(join(folder, 'figures.yaml'), stringify(base));
  writeFileSync(join(folder, 'expected.yaml'), stringify({ ...base, observations: [...(base.observations as unknown[]), EAVE, BOLLARD, SIGN] }));
  ({ child: desk, url: deskUrl } = await startDesk(folder, 'figures.yaml'));
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
  desk?.kill('SIGINT');
  if (folder) rmSync(folder, { recursive: true, force: true });
});

describe('the eave line and caster tools of the desk in Chromium', () => {
  it('places an eave line and two casters by clicks at 200%, shows the values `heliochron measure` gives, and writes the annotations the command line writes', async () => {
    const context = await browser!.newContext({ viewport: { width: 1500, height: 1000 } });
    const page = await context.newPage();
    const watched = watch(page, deskUrl);
    await page.goto(deskUrl);
    await page.waitForSelector('body[data-ready="true"]');
    await page.locator('#zoom-select').selectOption(String(ZOOM));
    expect(Number(await page.locator('#viewer').getAttribute('data-zoom'))).toBe(ZOOM);

    // the eave line, its tool picked by its key; one instruction per click
    await page.locator('#viewer').focus();
    await page.keyboard.press('e');
    expect(await page.locator('#tool-buttons [data-tool="eave-shadow"]').getAttribute('aria-pressed')).toBe('true');
    await toolField(page, 'id', EAVE.id);
    await toolField(page, 'wall', EAVE.wall, true);
    await toolField(page, 'heightM', String(EAVE.pixels.heightM));
    await toolField(page, 'heightSigmaM', String(EAVE.pixels.heightSigmaM));
    await toolField(page, 'projectionM', String(EAVE.pixels.projectionM));
    await toolField(page, 'projectionSigmaM', String(EAVE.pixels.projectionSigmaM));
    expect(await page.locator('#instruction').textContent()).toContain("Eave's shadow line, click 1 of 3: Click a point of the wall's foot line");
    await clickPixel(page, EAVE.pixels.fromPx as [number, number]);
    expect(await page.locator('#instruction').textContent()).toContain('click 2 of 3: Click a second point further along the same foot line');
    await clickPixel(page, EAVE.pixels.alongPx as [number, number]);
    expect(await page.locator('#instruction').textContent()).toContain("click 3 of 3: Click a point of the eave's shadow line on the ground");
    await clickPixel(page, EAVE.pixels.toPx as [number, number]);

    // a caster on the ground, then one on the wall
    await page.locator('#viewer').focus();
    await page.keyboard.press('k');
    await toolField(page, 'id', BOLLARD.id);
    await toolField(page, 'heightM', String(BOLLARD.pixels.heightM));
    await toolField(page, 'heightSigmaM', String(BOLLARD.pixels.heightSigmaM));
    expect(await page.locator('#instruction').textContent()).toContain("Caster and shadow point, click 1 of 2: Click the caster's foot: the point of the ground straight below");
    await clickPixel(page, BOLLARD.pixels.fromPx as [number, number]);
    await clickPixel(page, BOLLARD.pixels.toPx as [number, number]);
    await toolField(page, 'id', SIGN.id);
    await toolField(page, 'on', 'wall', true);
    await toolField(page, 'wall', SIGN.pixels.wall, true);
    await toolField(page, 'heightM', String(SIGN.pixels.heightM));
    await toolField(page, 'heightSigmaM', String(SIGN.pixels.heightSigmaM));
    expect(await page.locator('#instruction').textContent()).toContain('the point of the wall straight behind');
    await clickPixel(page, SIGN.pixels.fromPx as [number, number]);
    await clickPixel(page, SIGN.pixels.toPx as [number, number]);
    await page.keyboard.press('Escape');
    await page.locator('#zoom-select').selectOption('fit');
    await page.mouse.move(10, 990);
    await page.screenshot({ path: join(OUT_DIR, 'tools-eave-and-casters.png') });

    // the clicks are where the scene file has them (the pixel mapping at 200%)
    const stored = await page.evaluate(() => localStorage.getItem('heliochron-desk:figures.yaml'));
    const draft = JSON.parse(stored!).draft as { observations: { id: string; pixels?: Record<string, unknown> }[] };
    for (const o of [EAVE, BOLLARD, SIGN]) expect(draft.observations.find((x) => x.id === o.id)?.pixels, o.id).toEqual(o.pixels);

    // the values and sigmas shown equal `heliochron measure`'s for the same clicks
    const measured = JSON.parse(cli(['measure', 'expected.yaml', '--json'], folder)) as { observations: { id: string; values: { name: string; value: number; sigma: number }[] }[] };
    const names = measured.observations.map((o) => o.id);
    expect(names).toEqual([EAVE.id, BOLLARD.id, SIGN.id]);
    await expectShownAsMeasured(page, measured);
    expect(await page.locator('.message').count()).toBe(0);
    // the lamp post's top and its shadow give the sun that the example's pole shadow gives (same clicks, same height):
    // azimuth = shadow azimuth + 180, altitude = atan(1 / length ratio) (common practice, src/geometry/groundShadows.ts)
    const example = JSON.parse(cli(['measure', join(EXAMPLE_DIR, 'tanners-hall-photo.yaml'), '--json'])) as typeof measured;
    const pole = example.observations.find((o) => o.id === 'lamp-post')!.values;
    const pair = measured.observations.find((o) => o.id === BOLLARD.id)!.values;
    expect(Math.abs(pair[0].value - ((pole[0].value + 180) % 360))).toBeLessThan(1e-3);
    expect(Math.abs(pair[1].value - (Math.atan2(1, pole[1].value) * 180) / Math.PI)).toBeLessThan(1e-3);

    // save, write the annotations from the page, and compare with the command line's for the saved file
    await page.locator('#save-name').fill('desk-tools.yaml');
    await page.locator('#save').click();
    await page.waitForFunction(() => document.getElementById('unsaved')!.textContent === '');
    await page.locator('#export-annotations').click();
    await page.waitForFunction(() => (document.getElementById('notice')!.textContent ?? '').startsWith('Written')).catch(async (e: unknown) => {
      throw new Error(`${String(e)}; the notice: ${await page.locator('#notice').textContent()}; unsaved: ${await page.locator('#unsaved').textContent()}`);
    });
    cli(['measure', 'desk-tools.yaml', '--annotations', 'cli-annotations.jsonld'], folder);
    const fromPage = readFileSync(join(folder, 'desk-tools-annotations.jsonld'));
    expect(fromPage.equals(readFileSync(join(folder, 'cli-annotations.jsonld')))).toBe(true);
    const doc = JSON.parse(fromPage.toString('utf8')) as { '@context': string; total: number };
    expect(doc['@context']).toBe('http://www.w3.org/ns/anno.jsonld');
    expect(doc.total).toBe(5); // ground, wall, eave, two casters

    expect(watched.errors).toEqual([]);
    expect(watched.offMachine).toEqual([]);
    await context.close();
  }, 300_000);
});
