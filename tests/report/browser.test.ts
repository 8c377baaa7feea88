import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, mkdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import { main } from '../../src/cli/main.js';
import type { CliIo } from '../../src/cli/io.js';

// The report of the bundled example opened in a real browser: Debian's Chromium, driven by
// playwright-core. The CI script installs it (apt-get install chromium); without it this test
// fails with a message saying so, it does not pass silently.
const CHROMIUM = '/usr/bin/chromium';
const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const OUT_DIR = join(ROOT, 'test-output', 'browser');
const REPORT = join(OUT_DIR, 'marktgasse-print-report.html');
const EXAMPLE = 'examples/marktgasse-print.yaml';

let browser: Browser | undefined;

beforeAll(async () => {
  if (!existsSync(CHROMIUM)) {
    throw new Error(`Chromium was not found at ${CHROMIUM}: install the Debian package "chromium" (apt-get install chromium) to run the browser test of the HTML report`);
  }
  mkdirSync(OUT_DIR, { recursive: true });
  const io: CliIo = { out: () => undefined, err: () => undefined, errIsTerminal: false, cwd: ROOT };
  const code = await main(['report', EXAMPLE, '-o', REPORT, '--force'], io);
  if (code !== 0) throw new Error(`heliochron report exited with ${code}`);
  browser = await chromium.launch({
    executablePath: CHROMIUM,
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
  });
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
    const first = page.locator('#candidates tbody tr').first();
    expect(await first.getAttribute('data-rank')).toBe('1');
    expect(await first.getAttribute('data-date')).toMatch(/^17(6[5-9]|7\d|8[0-5])-07-(29|30)$/);
    const cells = await first.locator('td').allInnerTexts();
    expect(cells[1]).toMatch(/^(29|30) July 17\d\d \(Gregorian\)$/);
    expect(cells[3]).toMatch(/^0(7:5[89]|8:0[0-2])$/); // local apparent time

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
});
