/// <reference lib="dom" />
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync, type ChildProcess } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { CHROMIUM, launchChromium } from '../helpers/chromium.js';
import { parse, stringify } from 'yaml';
import { tiffFile } from './tiffFile.js';
import { CLI, OUT_DIR, ROOT, clickPixel, cli, expectShownAsMeasured, fillField, pickTool, startDesk, toolField, watch as watchPage } from './deskPage.js';

// The measuring desk in a real browser (issue 10, "What it must show"): Debian's Chromium through
// playwright-core, as tests/report/browser.test.ts does. The desk is started by the command line on
// a copy of the Tanners' Hall picture with an empty scene; every pixel point of
// examples/tanners-hall-photo/tanners-hall-photo.yaml is placed with mouse clicks at 200% zoom (so
// the screen-to-picture mapping is exercised), the other fields through the forms. The values the
// page shows are compared with what `heliochron measure` prints for the example file, its first
// candidate with `heliochron date`'s, and the file it saves is dated again by the command line.
const EXAMPLE_DIR = join(ROOT, 'examples', 'tanners-hall-photo');
const EXAMPLE = join(EXAMPLE_DIR, 'tanners-hall-photo.yaml');
const PICTURE = 'tanners-hall-photo.png';
const ZOOM = 2;

interface Example {
  groundPlane: { pointsPx: [number, number][]; widthM: number; heightM: number; firstEdgeAzimuthDeg: number };
  walls: { id: string; azimuthDeg: number; azimuthSigmaDeg: number; imagePlane: { pointsPx: [number, number][]; planePointsM: [number, number][] } }[];
  observations: { id: string; kind: string; wall?: string; pixels?: { fromPx: [number, number]; toPx: [number, number]; projectionM?: number; projectionSigmaM?: number; heightM?: number; heightSigmaM?: number } }[];
}

let browser: Browser | undefined;
let desk: ChildProcess | undefined;
let deskUrl = '';
let folder = '';
const example = parse(readFileSync(EXAMPLE, 'utf8')) as Example;

beforeAll(async () => {
  if (!existsSync(CHROMIUM)) {
    throw new Error(`Chromium was not found at ${CHROMIUM}: install the Debian package "chromium" (apt-get install chromium) to run the browser test of the desk`);
  }
  if (!existsSync(CLI)) throw new Error(`${CLI} is missing: the tests' global set-up bundles it (tests/helpers/buildCli.ts)`);
  // the page is built as `npm ci` builds it
  const build = spawnSync(process.execPath, [join(ROOT, 'src', 'desk', 'build.mjs')], { cwd: ROOT, encoding: 'utf8' });
  if (build.status !== 0) throw new Error(`building the desk page failed: ${build.stderr}`);
  mkdirSync(OUT_DIR, { recursive: true });
  folder = mkdtempSync(join(tmpdir(), 'heliochron-desk-browser-'));
  copyFileSync(join(EXAMPLE_DIR, PICTURE), join(folder, PICTURE));
  ({ child: desk, url: deskUrl } = await startDesk(folder, PICTURE));
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
  desk?.kill('SIGINT');
  if (folder) rmSync(folder, { recursive: true, force: true });
});

/** Watch a page (deskPage.ts), by default at the address of the desk started above. */
function watch(page: Page, address = deskUrl): ReturnType<typeof watchPage> {
  return watchPage(page, address);
}

describe('the measuring desk in Chromium', () => {
  it('measures the Tanners\' Hall picture by clicks, dates it as the command line does, saves a file the command line dates the same, and restores the work after a reload', async () => {
    const context = await browser!.newContext({ viewport: { width: 1500, height: 1000 } });
    const page = await context.newPage();
    const watched = watch(page);
    await page.goto(deskUrl);
    await page.waitForSelector('body[data-ready="true"]');
    expect(await page.locator('[data-field="image.widthPx"]').inputValue()).toBe('1600');
    expect(await page.locator('[data-field="image.heightPx"]').inputValue()).toBe('1200');
    await page.screenshot({ path: join(OUT_DIR, '1-opened.png') });

    // the forms: what is not clicked
    await fillField(page, 'title', "The Tanners' Hall, west front, photograph of about 1890");
    await fillField(page, 'seed', '1890');
    await fillField(page, 'site.latitudeDeg', '47.62');
    await fillField(page, 'site.longitudeDeg', '9.35');
    await fillField(page, 'site.elevationM', '410');
    await page.locator('[data-field="calendar"]').selectOption('gregorian');
    await fillField(page, 'window.fromYear', '1890');
    await fillField(page, 'window.toYear', '1890');
    await fillField(page, 'window.months', '5 6 7 8 9 10');
    await page.locator('summary', { hasText: 'Air (for refraction)' }).click();
    await fillField(page, 'air.pressureHPa', '965');
    await fillField(page, 'air.temperatureC', '18');
    const wall = example.walls[0];
    await page.getByRole('button', { name: 'Add a wall' }).click();
    await fillField(page, 'walls[0].id', wall.id);
    await fillField(page, 'walls[0].azimuthDeg', String(wall.azimuthDeg));
    await fillField(page, 'walls[0].azimuthSigmaDeg', String(wall.azimuthSigmaDeg));
    // the fact comes first, as in the example file (the observations keep its order)
    await page.locator('summary', { hasText: 'Facts without numbers' }).click();
    await page.locator('#new-fact-kind').selectOption('wall-lit');
    await page.getByRole('button', { name: 'Add this fact' }).click();
    await fillField(page, 'observations[0].id', 'front-lit');
    await page.locator('[data-field="observations[0].wall"]').selectOption(wall.id);

    // the clicks, at 200%
    await page.locator('#zoom-select').selectOption(String(ZOOM));
    expect(Number(await page.locator('#viewer').getAttribute('data-zoom'))).toBe(ZOOM);

    await pickTool(page, 'wall-figure');
    await toolField(page, 'form', 'points', true);
    await toolField(page, 'coordinates', wall.imagePlane.planePointsM.map(([u, v]) => `${u} ${v}`).join('\n'));
    await toolField(page, 'wall', wall.id, true);
    expect(await page.locator('#instruction').textContent()).toContain('click 1 of 8');
    for (const p of wall.imagePlane.pointsPx) await clickPixel(page, p);

    const ground = example.groundPlane;
    await page.keyboard.press('g');
    await toolField(page, 'widthM', String(ground.widthM));
    await toolField(page, 'heightM', String(ground.heightM));
    await toolField(page, 'firstEdgeAzimuthDeg', String(ground.firstEdgeAzimuthDeg));
    for (const p of ground.pointsPx) await clickPixel(page, p);

    for (const o of example.observations.filter((x) => x.pixels)) {
      await pickTool(page, o.kind);
      await toolField(page, 'id', o.id);
      if (o.wall) await toolField(page, 'wall', o.wall, true);
      for (const key of ['projectionM', 'projectionSigmaM', 'heightM', 'heightSigmaM'] as const) {
        if (o.pixels![key] !== undefined) await toolField(page, key, String(o.pixels![key]));
      }
      await clickPixel(page, o.pixels!.fromPx);
      await clickPixel(page, o.pixels!.toPx);
    }
    await page.keyboard.press('Escape');
    await page.locator('#zoom-select').selectOption('fit');
    await page.locator('.panels').evaluate((el) => { el.scrollTop = 0; });
    await page.mouse.move(10, 990); // the pointer off the picture: no magnifier in the picture of the docs
    await page.screenshot({ path: join(OUT_DIR, '2-measured.png') });

    // every clicked point is where the example file has it (the pixel mapping at 200%)
    const saved = await page.evaluate(() => localStorage.getItem(Object.keys(localStorage).find((k) => k.startsWith('heliochron-desk:'))!));
    const draft = JSON.parse(saved!).draft as Example;
    expect(draft.walls[0].imagePlane.pointsPx).toEqual(wall.imagePlane.pointsPx);
    expect(draft.groundPlane.pointsPx).toEqual(ground.pointsPx);
    for (const o of example.observations.filter((x) => x.pixels)) {
      const placed = draft.observations.find((x) => x.id === o.id)!;
      expect(placed.pixels!.fromPx, o.id).toEqual(o.pixels!.fromPx);
      expect(placed.pixels!.toPx, o.id).toEqual(o.pixels!.toPx);
    }

    // the values shown equal `heliochron measure`'s for the example file
    const measured = JSON.parse(cli(['measure', EXAMPLE, '--json'])) as { observations: { id: string; values: { name: string; value: number; sigma: number }[] }[] };
    expect(measured.observations.length).toBe(3);
    await expectShownAsMeasured(page, measured);
    expect(await page.locator('.message').count()).toBe(0); // the reader takes the whole scene

    // "Date it" gives the command line's first candidate
    const dated = JSON.parse(cli(['date', EXAMPLE, '--json'])) as { candidates: { date: { text: string }; times: { localApparent: string } }[] };
    const first = `${dated.candidates[0].date.text}, ${dated.candidates[0].times.localApparent} local apparent time`;
    await page.locator('#date-it').click();
    await page.waitForFunction(
      () => (document.getElementById('answer-area')!.dataset.firstCandidate ?? '') !== '' || /^Not /.test(document.getElementById('progress')!.textContent ?? ''),
      undefined,
      { timeout: 200_000 },
    );
    expect(await page.locator('#progress').textContent()).toMatch(/^Dated in/);
    expect(await page.locator('#answer-area').getAttribute('data-first-candidate')).toBe(first);
    expect(await page.locator('#answer-text').textContent()).toContain('Verdict: The evidence fits.');
    expect(await page.locator('#charts svg').count()).toBe(3);
    // the predicted shadows of the chosen candidate are drawn over the picture
    expect(await page.locator('#overlay line[stroke-dasharray="8 5"]').count()).toBeGreaterThan(0);
    await page.screenshot({ path: join(OUT_DIR, '3-dated.png'), fullPage: true });

    // Save, then the command line dates the saved file with the same first candidate
    await page.locator('#save-name').fill('tanners-hall-desk.yaml');
    await page.locator('#save').click();
    await page.waitForFunction(() => document.getElementById('unsaved')!.textContent === '');
    const savedFile = join(folder, 'tanners-hall-desk.yaml');
    expect(existsSync(savedFile)).toBe(true);
    const again = JSON.parse(cli(['date', 'tanners-hall-desk.yaml', '--json'], folder)) as typeof dated;
    expect(`${again.candidates[0].date.text}, ${again.candidates[0].times.localApparent} local apparent time`).toBe(first);
    const savedYaml = parse(readFileSync(savedFile, 'utf8')) as { image: { file: string } };
    expect(savedYaml.image.file).toBe(PICTURE); // relative to the scene file

    // a reload restores the work
    await page.reload();
    await page.waitForSelector('body[data-ready="true"]');
    expect(await page.locator('[data-field="title"]').inputValue()).toBe("The Tanners' Hall, west front, photograph of about 1890");
    expect(await page.locator('li[data-id]').count()).toBe(3);
    expect(await page.locator('#unsaved').textContent()).toBe('');
    expect(await page.locator('#save-name').inputValue()).toBe('tanners-hall-desk.yaml');

    // a refused value: the scene reader's own message stands beside the field
    await fillField(page, 'site.latitudeDeg', '95');
    expect(await page.locator('.field.refused .message').textContent()).toContain('site.latitudeDeg: 95 is not allowed');
    await fillField(page, 'site.latitudeDeg', '47.62');
    expect(await page.locator('.field.refused').count()).toBe(0);

    // choose a point, nudge it 1 px and 0.1 px with the keys, undo both, redo one, undo it
    const storedDraft = async (): Promise<Example> =>
      (JSON.parse((await page.evaluate(() => localStorage.getItem('heliochron-desk:tanners-hall-photo.png')))!) as { draft: Example }).draft;
    await page.keyboard.press('Escape');
    await clickPixel(page, ground.pointsPx[0]);
    await page.keyboard.press('ArrowRight');
    await page.keyboard.press('Shift+ArrowDown');
    expect((await storedDraft()).groundPlane.pointsPx[0]).toEqual([ground.pointsPx[0][0] + 1, ground.pointsPx[0][1] + 0.1]);
    expect(await page.locator('#unsaved').textContent()).toBe('(unsaved changes)');
    await page.keyboard.press('Control+z');
    await page.keyboard.press('Control+z');
    expect((await storedDraft()).groundPlane.pointsPx[0]).toEqual(ground.pointsPx[0]);
    await page.keyboard.press('Control+Shift+z');
    expect((await storedDraft()).groundPlane.pointsPx[0]).toEqual([ground.pointsPx[0][0] + 1, ground.pointsPx[0][1]]);
    await page.locator('#undo').click();
    expect((await storedDraft()).groundPlane.pointsPx[0]).toEqual(ground.pointsPx[0]);
    expect(await page.locator('#unsaved').textContent()).toBe('');

    // a point placed with the keyboard alone: a tool's key, the arrows move the cross, Enter places it
    await page.keyboard.press('p');
    await page.locator('#viewer').focus();
    await page.keyboard.press('ArrowLeft');
    await page.keyboard.press('Enter');
    expect(await page.locator('#instruction').textContent()).toContain('Pole shadow, click 2 of 2');
    await page.keyboard.press('Escape');
    expect(await page.locator('#instruction').textContent()).toContain('Select and move');

    // the overlay written from the page is the command line's, byte for byte
    await page.locator('#export-overlay').click();
    await page.waitForFunction(() => (document.getElementById('notice')!.textContent ?? '').startsWith('Written'));
    cli(['measure', 'tanners-hall-desk.yaml', '--overlay', 'cli-overlay.svg'], folder);
    expect(readFileSync(join(folder, 'tanners-hall-desk-overlay.svg')).equals(readFileSync(join(folder, 'cli-overlay.svg')))).toBe(true);

    // check: the verdict of `heliochron check` on the saved file, word for word
    await page.locator('#check-on').fill('1890-09-02');
    await page.locator('#check-it').click();
    await page.waitForFunction(() => !/^(Checking\.\.\.)?$/.test(document.getElementById('check-text')!.textContent ?? ''));
    expect(await page.locator('#check-text').textContent()).toBe(cli(['check', 'tanners-hall-desk.yaml', '--on', '1890-09-02'], folder));
    await page.screenshot({ path: join(OUT_DIR, '4-checked.png'), fullPage: true });

    expect(watched.errors).toEqual([]);
    expect(watched.offMachine).toEqual([]);
    await context.close();
  }, 400_000);

  it('writes the HTML report of an opened scene file byte for byte as `heliochron report` does, shows a typed title as text, and asks before leaving unsaved work', async () => {
    const reportFolder = mkdtempSync(join(tmpdir(), 'heliochron-desk-report-'));
    copyFileSync(join(ROOT, 'examples', 'marktgasse-print.yaml'), join(reportFolder, 'marktgasse-print.yaml'));
    const started = await startDesk(reportFolder, 'marktgasse-print.yaml');
    try {
      const context = await browser!.newContext({ viewport: { width: 1500, height: 1000 } });
      const page = await context.newPage();
      const watched = watch(page, started.url);
      await page.goto(started.url);
      await page.waitForSelector('body[data-ready="true"]');
      expect(await page.locator('[data-field="title"]').inputValue()).toBe('Marktgasse view, anonymous print');
      await page.locator('#export-report').click();
      await page.waitForFunction(() => (document.getElementById('notice')!.textContent ?? '').startsWith('Written'), undefined, { timeout: 200_000 });
      cli(['report', 'marktgasse-print.yaml', '-o', 'cli-report.html'], reportFolder);
      const fromPage = readFileSync(join(reportFolder, 'marktgasse-print-report.html'), 'utf8');
      const fromCli = readFileSync(join(reportFolder, 'cli-report.html'), 'utf8');
      // the one difference: the command line named in the report's reproducibility block (each names its own output)
      expect(fromPage.replace('-o marktgasse-print-report.html', '-o cli-report.html')).toBe(fromCli);
      expect(fromPage.length).toBeGreaterThan(20_000);

      // a user's text is shown as text, never as markup
      const hostile = 'Marktgasse <img src=x onerror="document.title=1"><b>bold</b>';
      await fillField(page, 'title', hostile);
      expect(await page.locator('#doc-name').textContent()).toBe(hostile);
      expect(await page.locator('img, b').count()).toBe(0);
      expect(await page.title()).toBe('heliochron measuring desk');

      // leaving with unsaved changes asks first
      let asked = '';
      page.on('dialog', (dialog) => {
        asked = dialog.type();
        void dialog.dismiss();
      });
      await page.close({ runBeforeUnload: true });
      await expect.poll(() => asked).toBe('beforeunload');
      expect(watched.errors).toEqual([]);
      expect(watched.offMachine).toEqual([]);
      await context.close();
    } finally {
      started.child.kill('SIGINT');
      rmSync(reportFolder, { recursive: true, force: true });
    }
  }, 300_000);

  it('measures a picture with no sizes in metres from its own perspective: camera lines and object-shadow pairs clicked at 50%, the camera and the groups\' suns as `heliochron measure` finds them, saved and dated as the command line dates the example', async () => {
    // examples/kornplatz-figures: the invented print of Velmar with no size in metres anywhere. The
    // desk opens a copy of its scene file with the camera block and the object-shadow pairs taken out;
    // every camera line and pair of the example is then placed by simulated clicks.
    const dir = join(ROOT, 'examples', 'kornplatz-figures');
    const source = parse(readFileSync(join(dir, 'kornplatz-figures.yaml'), 'utf8')) as {
      camera: { verticalLines: [number, number][][]; wallLines: { wall: string; lines: [number, number][][] }[] };
      observations: { id: string; kind: string; group?: string; objectPx?: [number, number]; shadowPx?: [number, number] }[];
    };
    const pairs = source.observations.filter((o) => o.kind === 'object-shadow');
    const start: Record<string, unknown> = { ...source, observations: source.observations.filter((o) => o.kind !== 'object-shadow') };
    delete start.camera;
    const kornFolder = mkdtempSync(join(tmpdir(), 'heliochron-desk-perspective-'));
    copyFileSync(join(dir, 'kornplatz-figures.png'), join(kornFolder, 'kornplatz-figures.png'));
    writeFileSync(join(kornFolder, 'kornplatz-figures.yaml'), stringify(start));
    const started = await startDesk(kornFolder, 'kornplatz-figures.yaml');
    try {
      const context = await browser!.newContext({ viewport: { width: 1500, height: 1000 } });
      const page = await context.newPage();
      const watched = watch(page, started.url);
      await page.goto(started.url);
      await page.waitForSelector('body[data-ready="true"]');
      expect(await page.locator('[data-item="camera"]').count()).toBe(0); // an empty camera
      await page.locator('#zoom-select').selectOption('0.5');
      expect(Number(await page.locator('#viewer').getAttribute('data-zoom'))).toBe(0.5);

      // the vertical edges, picked by their key; one instruction per click
      await page.locator('#viewer').focus();
      await page.keyboard.press('v');
      expect(await page.locator('#instruction').textContent()).toContain('Vertical edges, click 1 of 2: Click one end of an edge that is vertical');
      for (const line of source.camera.verticalLines) for (const p of line) await clickPixel(page, p);
      // one direction only: the scene reader's own message stands beside the camera
      expect(await page.locator('[data-item="camera"] .message').textContent()).toBe(
        'Not accepted: camera.wallLines is missing; expected lines along the horizontal edges of one or more walls: [{ wall: <wall id>, lines: [...] }]. The camera block needs "wallLines".');

      await page.keyboard.press('h');
      const [front, side] = source.camera.wallLines;
      await toolField(page, 'wall', front.wall, true);
      expect(await page.locator('#instruction').textContent()).toContain(`Wall courses, click 1 of 2: Click one end of an edge that is horizontal on wall ${front.wall}`);
      for (const p of front.lines[0]) await clickPixel(page, p);
      // one line along a wall is no family either
      expect(await page.locator('[data-item="camera"] .message').textContent()).toContain('camera.wallLines[0].lines: ');
      for (const line of front.lines.slice(1)) for (const p of line) await clickPixel(page, p);
      // the vertical and one wall: a camera, with the principal point assumed at the centre and said so
      expect(await page.locator('[data-item="camera"] .message').count()).toBe(0);
      expect(await page.locator('[data-note="principal-point-assumed"]').count()).toBe(1);
      expect(await page.locator('[data-item="camera"] [data-value="principalXPx"]').getAttribute('data-number')).toBe('1200');
      await toolField(page, 'wall', side.wall, true);
      for (const line of side.lines) for (const p of line) await clickPixel(page, p);
      expect(await page.locator('[data-item="camera"] .message').count()).toBe(0);
      await page.keyboard.press('Escape');
      await page.locator('#zoom-select').selectOption('fit');
      await page.mouse.move(10, 990);
      await page.screenshot({ path: join(OUT_DIR, '5-camera.png') });

      // the pairs, with their group typed in a field
      await page.locator('#zoom-select').selectOption('0.5');
      await page.keyboard.press('s');
      for (const o of pairs) {
        await toolField(page, 'id', o.id);
        await toolField(page, 'group', o.group ?? '');
        expect(await page.locator('#instruction').textContent()).toContain('Object and shadow, click 1 of 2: Click the object point');
        await clickPixel(page, o.objectPx!);
        expect(await page.locator('#instruction').textContent()).toContain('click 2 of 2: Click the shadow of that same point');
        await clickPixel(page, o.shadowPx!);
      }
      await page.keyboard.press('Escape');

      // every clicked point is where the example has it (the mapping at 50%)
      const stored = JSON.parse((await page.evaluate(() => localStorage.getItem('heliochron-desk:kornplatz-figures.yaml')))!) as { draft: typeof source };
      expect(stored.draft.camera).toEqual(source.camera);
      expect(stored.draft.observations.filter((o) => o.kind === 'object-shadow').map((o) => [o.id, o.group, o.objectPx, o.shadowPx]))
        .toEqual(pairs.map((o) => [o.id, o.group, o.objectPx, o.shadowPx]));

      // the camera and the groups' suns shown are those of `heliochron measure --json` on the example
      const measured = JSON.parse(cli(['measure', join(dir, 'kornplatz-figures.yaml'), '--json'])) as {
        camera: {
          focalLengthPx: { value: number; sigma: number }; principalPointPx: { value: number }[]; principalPointAssumed: boolean;
          viewAzimuthDeg: { value: number; sigma: number }; viewAltitudeDeg: { value: number; sigma: number };
          vanishingPoints: { field: string; note: string }[];
          groups: { group: string; azimuthDeg: number; altitudeDeg: number; reported: { azimuthSigmaDeg: number; altitudeSigmaDeg: number }; againstRest: { sentence: string } | null }[];
        };
      };
      const cam = measured.camera;
      const shown = async (scope: string, name: string): Promise<{ value: number; sigma: number }> => {
        const cell = page.locator(`${scope} [data-value="${name}"]`);
        return { value: Number(await cell.getAttribute('data-number')), sigma: Number(await cell.getAttribute('data-sigma')) };
      };
      const focal = await shown('[data-item="camera"]', 'focalLengthPx');
      expect(Math.abs(focal.value / cam.focalLengthPx.value - 1)).toBeLessThanOrEqual(0.001); // 0.1% (issue 11)
      expect(Math.abs(focal.sigma / cam.focalLengthPx.sigma - 1)).toBeLessThanOrEqual(0.001);
      expect(Math.abs((await shown('[data-item="camera"]', 'principalXPx')).value - cam.principalPointPx[0].value)).toBeLessThanOrEqual(0.1);
      expect(Math.abs((await shown('[data-item="camera"]', 'principalYPx')).value - cam.principalPointPx[1].value)).toBeLessThanOrEqual(0.1);
      for (const name of ['viewAzimuthDeg', 'viewAltitudeDeg'] as const) {
        const v = await shown('[data-item="camera"]', name);
        expect(Math.abs(v.value - cam[name].value), name).toBeLessThanOrEqual(0.01);
        expect(Math.abs(v.sigma - cam[name].sigma), `${name} sigma`).toBeLessThanOrEqual(0.01);
      }
      expect(cam.principalPointAssumed).toBe(false); // three square directions: the orthocentre, no note
      expect(await page.locator('[data-note="principal-point-assumed"]').count()).toBe(0);
      // how closely each family meets: the library's sentence beside it
      for (const v of cam.vanishingPoints) expect(await page.locator(`[data-item="${v.field}"]`).textContent()).toContain(v.note);
      expect(cam.groups.length).toBe(2);
      for (const g of cam.groups) {
        const scope = `[data-group="${g.group}"]`;
        const az = await shown(scope, 'azimuthDeg');
        const alt = await shown(scope, 'altitudeDeg');
        expect(Math.abs(az.value - g.azimuthDeg), `${g.group} azimuth`).toBeLessThanOrEqual(0.01);
        expect(Math.abs(alt.value - g.altitudeDeg), `${g.group} altitude`).toBeLessThanOrEqual(0.01);
        expect(Math.abs(az.sigma - g.reported.azimuthSigmaDeg), `${g.group} azimuth sigma`).toBeLessThanOrEqual(0.01);
        expect(Math.abs(alt.sigma - g.reported.altitudeSigmaDeg), `${g.group} altitude sigma`).toBeLessThanOrEqual(0.01);
        expect(await page.locator(`${scope} [data-group-test]`).textContent()).toBe(g.againstRest!.sentence);
      }
      // drawn over the picture: the vanishing lines, each group's shadow lines and the ellipse where they meet
      expect(await page.locator('#overlay g.perspective line').count()).toBe(2 * (6 + 4 + 4));
      expect(await page.locator('#overlay g.light-group').count()).toBe(2);
      expect(await page.locator('#overlay g.light-group ellipse').count()).toBe(2);
      expect(await page.locator('#overlay g.light-group line').count()).toBe(2 * pairs.length);

      // undo and redo through the log: the last pair taken back, then put again
      await page.keyboard.press('Control+z');
      expect(await page.locator('li[data-item^="observations"][data-id]').count()).toBe(pairs.length - 1);
      await page.keyboard.press('Control+Shift+z');
      expect(await page.locator('li[data-item^="observations"][data-id]').count()).toBe(pairs.length);

      await page.locator('#zoom-select').selectOption('fit');
      await page.locator('[data-item="camera"]').evaluate((el) => el.scrollIntoView({ block: 'start' }));
      await page.mouse.move(10, 990);
      await page.screenshot({ path: join(OUT_DIR, '6-perspective.png') });
      await page.locator('[data-group="figures"]').evaluate((el) => el.scrollIntoView({ block: 'start' }));
      await page.screenshot({ path: join(OUT_DIR, '7-suns.png') });

      // Save; the command line dates the saved file with the example's first candidate
      await page.locator('#save-name').fill('kornplatz-desk.yaml');
      await page.locator('#save').click();
      await page.waitForFunction(() => document.getElementById('unsaved')!.textContent === '');
      const first = (answer: string): string => {
        const d = JSON.parse(answer) as { candidates: { date: { text: string }; times: { localApparent: string } }[] };
        return `${d.candidates[0].date.text}, ${d.candidates[0].times.localApparent} local apparent time`;
      };
      const firstOfExample = first(cli(['date', join(dir, 'kornplatz-figures.yaml'), '--json']));
      expect(first(cli(['date', 'kornplatz-desk.yaml', '--json'], kornFolder))).toBe(firstOfExample);
      // and "Date it" in the page gives it too
      await page.locator('#date-it').click();
      await page.waitForFunction(
        () => (document.getElementById('answer-area')!.dataset.firstCandidate ?? '') !== '' || /^Not /.test(document.getElementById('progress')!.textContent ?? ''),
        undefined,
        { timeout: 200_000 },
      );
      expect(await page.locator('#answer-area').getAttribute('data-first-candidate')).toBe(firstOfExample);
      // the overlay written from the page (vanishing lines, shadow lines, ellipses) is the command line's, byte for byte
      await page.locator('#export-overlay').click();
      await page.waitForFunction(() => (document.getElementById('notice')!.textContent ?? '').startsWith('Written'));
      cli(['measure', 'kornplatz-desk.yaml', '--overlay', 'cli-overlay.svg'], kornFolder);
      const fromPage = readFileSync(join(kornFolder, 'kornplatz-desk-overlay.svg'));
      expect(fromPage.includes('class="light-group"')).toBe(true);
      expect(fromPage.equals(readFileSync(join(kornFolder, 'cli-overlay.svg')))).toBe(true);

      expect(watched.errors).toEqual([]);
      expect(watched.offMachine).toEqual([]);
      await context.close();
    } finally {
      started.child.kill('SIGINT');
      rmSync(kornFolder, { recursive: true, force: true });
    }
  }, 400_000);

  it('opens a TIFF scan: its size read from the file, drawn without errors', async () => {
    const tiffFolder = mkdtempSync(join(tmpdir(), 'heliochron-desk-tiff-'));
    // 64 x 48 px, 8-bit RGB, a gradient: red across, green down
    const pixels: number[] = [];
    for (let y = 0; y < 48; y += 1) for (let x = 0; x < 64; x += 1) pixels.push(x * 4, y * 5, 128);
    writeFileSync(join(tiffFolder, 'scan.tif'), tiffFile(64, 48, 8, 3, 2, pixels));
    const started = await startDesk(tiffFolder, 'scan.tif');
    try {
      const page = await browser!.newPage({ viewport: { width: 1200, height: 900 } });
      const watched = watch(page, started.url);
      await page.goto(started.url);
      await page.waitForSelector('body[data-ready="true"]');
      expect(await page.locator('[data-field="image.widthPx"]').inputValue()).toBe('64');
      expect(await page.locator('[data-field="image.heightPx"]').inputValue()).toBe('48');
      // the picture is drawn: the canvas at the picture's centre shows the gradient's colour there
      const viewer = page.locator('#viewer');
      const zoom = Number(await viewer.getAttribute('data-zoom'));
      const panX = Number(await viewer.getAttribute('data-pan-x'));
      const panY = Number(await viewer.getAttribute('data-pan-y'));
      const rgb = await page.evaluate(([x, y]) => {
        const canvas = document.getElementById('picture') as HTMLCanvasElement;
        const ratio = window.devicePixelRatio || 1;
        return Array.from(canvas.getContext('2d')!.getImageData(Math.round(x * ratio), Math.round(y * ratio), 1, 1).data.subarray(0, 3));
      }, [panX + zoom * 40.5, panY + zoom * 20.5]);
      expect(Math.abs(rgb[0] - 160)).toBeLessThanOrEqual(8); // x = 40: red 160
      expect(Math.abs(rgb[1] - 100)).toBeLessThanOrEqual(8); // y = 20: green 100
      expect(Math.abs(rgb[2] - 128)).toBeLessThanOrEqual(8);
      expect(watched.errors).toEqual([]);
      expect(watched.offMachine).toEqual([]);
      await page.close();
    } finally {
      started.child.kill('SIGINT');
      rmSync(tiffFolder, { recursive: true, force: true });
    }
  }, 120_000);
});
