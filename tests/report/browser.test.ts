import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { Browser } from 'playwright-core';
import { CHROMIUM, launchChromium } from '../helpers/chromium.js';
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/io.js';

// The report of the bundled example opened in a real browser: Debian's Chromium, driven by
// playwright-core. The CI script installs it (apt-get install chromium); without it this test
// fails with a message saying so, it does not pass silently.
const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const OUT_DIR = join(ROOT, 'test-output', 'browser');
const REPORT = join(OUT_DIR, 'marktgasse-print-report.html');
const EXAMPLE = 'examples/marktgasse-print.yaml';
// The invented four-family town square, whose family labels used to overprint (issue of the answer's wording).
const SQUARE = 'tests/report/scenes/four-family-square.yaml';
const SQUARE_REPORT = join(OUT_DIR, 'four-family-square-report.html');
// Its twin in a town that changed calendar within the window: four families, crowded in pairs.
const SWITCH = 'tests/report/scenes/four-family-switch.yaml';
const SWITCH_REPORT = join(OUT_DIR, 'four-family-switch-report.html');
/** Width between the margins of an A4 page under the print stylesheet (210 mm - 2 x 16 mm), CSS pixels of 1/96 in. */
const A4_TEXT_WIDTH_PX = ((210 - 2 * 16) / 25.4) * 96;

let browser: Browser | undefined;

beforeAll(async () => {
  if (!existsSync(CHROMIUM)) {
    throw new Error(`Chromium was not found at ${CHROMIUM}: install the Debian package "chromium" (apt-get install chromium) to run the browser test of the HTML report`);
  }
  mkdirSync(OUT_DIR, { recursive: true });
  const io: CliIo = { out: () => undefined, err: () => undefined, errIsTerminal: false, cwd: ROOT };
  for (const [scene, out] of [[EXAMPLE, REPORT], [SQUARE, SQUARE_REPORT], [SWITCH, SWITCH_REPORT]]) {
    const code = await main(['report', scene, '-o', out, '--force'], io);
    if (code !== 0) throw new Error(`heliochron report exited with ${code} for ${scene}`);
  }
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
});

describe('the HTML report in Chromium', () => {
  it('opens from a file:// URL without console errors or any request off the file system', async () => {
    const page = await browser!.newPage({ viewport: { width: 1100, height: 900 } });
    const errors: string[] = [];
    const offline: string[] = [];
    page.on('console', (m) => {
      if (m.type() === 'error') errors.push(m.text());
    });
    page.on('pageerror', (e) => errors.push(String(e)));
    await page.route('**/*', (route) => {
      const url = route.request().url();
      if (url.startsWith('file:') || url.startsWith('data:')) return route.continue();
      offline.push(url);
      return route.abort();
    });
    await page.goto(pathToFileURL(REPORT).href, { waitUntil: 'load' });
    expect(await page.title()).toBe('Marktgasse view, anonymous print - heliochron report');
    expect(errors).toEqual([]);
    expect(offline).toEqual([]);

    // Every chart is laid out with a non-zero size.
    const charts = page.locator('svg.hc-chart');
    expect(await charts.count()).toBe(3);
    for (let i = 0; i < 3; i += 1) {
      const box = await charts.nth(i).boundingBox();
      expect(box, `chart ${i}`).not.toBeNull();
      expect(box!.width).toBeGreaterThan(300);
      expect(box!.height).toBeGreaterThan(150);
    }

    // The candidates table holds the expected first candidate. The example was made from the
    // instant 30 July 1771, 08:00 local apparent time (examples/marktgasse-print.yaml, header);
    // the same light recurs on 29-30 July of every year of the window, so rank 1 is one of those.
    const first = page.locator('#candidates tbody tr[data-rank]').first();
    expect(await first.getAttribute('data-rank')).toBe('1');
    expect(await first.getAttribute('data-date')).toMatch(/^17(6[5-9]|7\d|8[0-5])-07-(29|30)$/);
    const cells = await first.locator('td').allInnerTexts();
    expect(cells[0]).toBe('F1'); // the best of the first family comes first
    expect(cells[2]).toMatch(/^(29|30) July 17\d\d$/); // the calendar, Gregorian for every row, is named in the caption
    expect(cells[4]).toMatch(/^0(7:5[89]|8:0[0-2])$/); // local apparent time

    await page.screenshot({ path: join(OUT_DIR, 'marktgasse-print-report.png'), fullPage: true });
    expect(statSync(join(OUT_DIR, 'marktgasse-print-report.png')).size).toBeGreaterThan(10_000);
    await page.close();
  });

  it('prints: with the print stylesheet the charts keep their size and a PDF is made', async () => {
    const page = await browser!.newPage();
    await page.goto(pathToFileURL(REPORT).href, { waitUntil: 'load' });
    await page.emulateMedia({ media: 'print' });
    const box = await page.locator('#figure-map svg').boundingBox();
    expect(box!.width).toBeGreaterThan(300);
    const pdf = join(OUT_DIR, 'marktgasse-print-report.pdf');
    await page.pdf({ path: pdf, format: 'A4', printBackground: false });
    expect(statSync(pdf).size).toBeGreaterThan(20_000);
    await page.close();
  });

  it('prints the four-family report on A4: every table and chart within the margins, the PDF of A4 size', async () => {
    const page = await browser!.newPage({ viewport: { width: Math.floor(A4_TEXT_WIDTH_PX), height: 1000 } });
    await page.goto(pathToFileURL(SQUARE_REPORT).href, { waitUntil: 'load' });
    await page.emulateMedia({ media: 'print' });
    const widths = await page
      .locator('table, figure svg, dl')
      .evaluateAll((all) => all.map((e) => ({ what: e.id || e.tagName, right: e.getBoundingClientRect().right, scroll: e.scrollWidth, client: e.clientWidth })));
    const body = await page.locator('body').evaluate((b) => b.getBoundingClientRect().right);
    expect(widths.length).toBeGreaterThanOrEqual(8);
    for (const w of widths) {
      expect(w.right, `${w.what} ends within the right margin`).toBeLessThanOrEqual(body + 0.5);
      expect(w.scroll, `${w.what} has nothing hidden beyond its width`).toBeLessThanOrEqual(w.client + 1);
    }
    expect(await page.locator('#candidates').evaluate((t) => t.getBoundingClientRect().width)).toBeLessThanOrEqual(A4_TEXT_WIDTH_PX + 0.5);
    await page.screenshot({ path: join(OUT_DIR, 'four-family-square-print.png'), fullPage: true });
    const pdfPath = join(OUT_DIR, 'four-family-square-report.pdf');
    await page.pdf({ path: pdfPath, preferCSSPageSize: true });
    // ISO 216: A4 is 210 x 297 mm = 595.28 x 841.89 PostScript points; Chromium writes each page's MediaBox.
    const pdf = readFileSync(pdfPath, 'latin1');
    const boxes = [...pdf.matchAll(/\/MediaBox\s*\[\s*0 0 ([\d.]+) ([\d.]+)\s*\]/g)].map((m) => [Number(m[1]), Number(m[2])]);
    expect(boxes.length).toBeGreaterThan(1);
    for (const [w, h] of boxes) {
      expect(Math.abs(w - 595.28)).toBeLessThan(1.5);
      expect(Math.abs(h - 841.89)).toBeLessThan(1.5);
    }
    await page.close();
  });

  it('draws the labels of the four families clear of each other, in the map, its close-up and the sky chart', async () => {
    const page = await browser!.newPage({ viewport: { width: 1100, height: 900 } });
    await page.goto(pathToFileURL(SWITCH_REPORT).href, { waitUntil: 'load' });
    for (const [chart, panels] of [['#hc-map', ['.hc-overview', '.hc-closeup']], ['#hc-sky', [':scope']]] as const) {
      for (const panel of panels) {
        const boxes = await page.locator(chart).evaluate((svg, sel) => {
          const root = sel === ':scope' ? svg : svg.querySelector(sel)!;
          return Array.from(root.querySelectorAll('text.hc-mark-label')).map((t) => {
            const b = t.getBoundingClientRect();
            return { text: t.textContent, x: b.x, y: b.y, w: b.width, h: b.height };
          });
        }, panel);
        expect(boxes.length, `${chart} ${panel}: labels drawn`).toBeGreaterThanOrEqual(panel === '.hc-closeup' ? 1 : 2);
        for (let i = 0; i < boxes.length; i += 1) {
          for (let j = i + 1; j < boxes.length; j += 1) {
            const a = boxes[i];
            const b = boxes[j];
            const overlap = a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
            expect(overlap, `${chart} ${panel}: ${a.text} and ${b.text} overprint`).toBe(false);
          }
        }
      }
    }
    expect(await page.locator('#hc-sky text.hc-mark-label').allTextContents()).toEqual(expect.arrayContaining(['F1', 'F2', 'F3', 'F4']));
    await page.locator('#figure-map').screenshot({ path: join(OUT_DIR, 'four-family-switch-map.png') });
    await page.locator('#figure-sky').screenshot({ path: join(OUT_DIR, 'four-family-switch-sky.png') });
    await page.close();
  });
});
