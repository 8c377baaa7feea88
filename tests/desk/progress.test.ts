/// <reference lib="dom" />
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ChildProcess } from 'node:child_process';
import { copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { parse, stringify } from 'yaml';
import { launchChromium } from '../helpers/chromium.js';
import { OUT_DIR, ROOT, prepareDeskTest, startDesk, watch } from './deskSession.js';

// "Date it" shows the solver's own progress (issue 10: "shows progress, can cancel"): the Tanners'
// Hall example with its window widened to 1000-1900 and a fifth shadow that contradicts the lamp
// post's (its tip moved to the other side), so that nothing fits and the search is rerun without
// each observation: long enough to watch. The page's progress bar and words are recorded as they
// change; Cancel must stop the solve (no answer arrives afterwards), and a new "Date it" must then
// run to its answer.
const EXAMPLE_DIR = join(ROOT, 'examples', 'tanners-hall-photo');

let browser: Browser | undefined;
let desk: ChildProcess | undefined;
let folder = '';
let deskUrl = '';

beforeAll(async () => {
  prepareDeskTest();
  folder = mkdtempSync(join(tmpdir(), 'heliochron-desk-progress-'));
  copyFileSync(join(EXAMPLE_DIR, 'tanners-hall-photo.png'), join(folder, 'tanners-hall-photo.png'));
  const scene = parse(readFileSync(join(EXAMPLE_DIR, 'tanners-hall-photo.yaml'), 'utf8'));
  scene.window = { fromYear: 1000, toYear: 1900 };
  const post = scene.observations.find((o: { id: string }) => o.id === 'lamp-post');
  scene.observations.push({ ...post, id: 'post-turned', note: 'A shadow that contradicts the lamp post (test only).', pixels: { ...post.pixels, toPx: [1400, 1100] } });
  writeFileSync(join(folder, 'long-solve.yaml'), stringify(scene));
  ({ child: desk, url: deskUrl } = await startDesk(folder, 'long-solve.yaml'));
  browser = await launchChromium();
});

afterAll(async () => {
  await browser?.close();
  desk?.kill('SIGINT');
  if (folder) rmSync(folder, { recursive: true, force: true });
});

interface Shown {
  readonly text: string;
  /** The bar's value, or null while it shows work without a fraction (or is hidden). */
  readonly value: number | null;
  readonly hidden: boolean;
}

describe('progress of "Date it"', () => {
  it('shows the solver\'s stage in words and a bar that moves forward, stops at Cancel with no answer after it, and dates again afterwards', async () => {
    const context = await browser!.newContext({ viewport: { width: 1500, height: 1000 } });
    const page = await context.newPage();
    const watched = watch(page, deskUrl);
    await page.goto(deskUrl);
    await page.waitForSelector('body[data-ready="true"]');
    // every change of the progress line, as the page shows it
    await page.evaluate(() => {
      const log: Shown[] = [];
      (window as unknown as { progressLog: Shown[] }).progressLog = log;
      const text = document.getElementById('progress')!;
      const bar = document.getElementById('progress-bar') as HTMLProgressElement;
      new MutationObserver(() => log.push({ text: text.textContent ?? '', value: bar.hasAttribute('value') ? bar.value : null, hidden: bar.hidden })).observe(text, { childList: true, characterData: true, subtree: true });
    });
    const log = (): Promise<Shown[]> => page.evaluate(() => (window as unknown as { progressLog: Shown[] }).progressLog);

    await page.locator('#date-it').click();
    // the reruns without each observation: the solver's own stage, with a fraction
    await expect.poll(async () => (await log()).some((s) => s.text.startsWith('searching again without')), { timeout: 120_000, interval: 50 }).toBe(true);
    await page.locator('#answer-area').screenshot({ path: join(OUT_DIR, 'progress-1-running.png') });
    await page.locator('#cancel').click();
    await expect(page.locator('#progress').textContent()).resolves.toBe('Cancelled.');
    const atCancel = (await log()).length;
    const running = (await log()).slice(0, atCancel - 1);
    const stages = new Set(running.map((s) => s.text.replace(/: \d+%.*| \(\d+\.\d s\)$/, '')));
    expect([...stages]).toEqual(expect.arrayContaining(["searching the sky for the sun's possible places", 'dating each place in every year of the window', 'testing each observation against the rest']));
    // the solver's own steps (the charts drawn after it have their own bar, from 0 again)
    const fractions = running.filter((s) => !s.text.startsWith('drawing')).map((s) => s.value).filter((v): v is number => v !== null);
    expect(new Set(fractions).size).toBeGreaterThan(3);
    fractions.forEach((v, k) => {
      expect(v).toBeGreaterThanOrEqual(0);
      expect(v).toBeLessThan(1);
      if (k > 0) expect(v, `the bar never goes back (step ${k})`).toBeGreaterThanOrEqual(fractions[k - 1]);
    });
    // the percent in words is the bar's
    for (const s of running.filter((x) => x.value !== null && /: \d+%/.test(x.text))) expect(Number(s.text.match(/: (\d+)%/)![1])).toBe(Math.floor(s.value! * 100));

    // after Cancel nothing more comes: no progress, no answer
    expect(await page.locator('#progress-bar').isHidden()).toBe(true);
    expect(await page.locator('#date-it').isEnabled()).toBe(true);
    await page.waitForTimeout(3000);
    expect((await log()).length).toBe(atCancel);
    expect(await page.locator('#answer-text').textContent()).toBe('');
    expect(await page.locator('#answer-area').getAttribute('data-solves')).toBeNull();

    // and a new "Date it" runs to its answer
    await page.locator('#date-it').click();
    await expect.poll(() => page.locator('#progress').textContent(), { timeout: 600_000 }).toMatch(/^Dated in /);
    expect(await page.locator('#answer-text').textContent()).toContain('Nothing fits');
    expect(await page.locator('#progress-bar').isHidden()).toBe(true);
    expect(watched.errors).toEqual([]);
    expect(watched.offMachine).toEqual([]);
    await context.close();
  }, 900_000);
});
