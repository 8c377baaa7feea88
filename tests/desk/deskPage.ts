/// <reference lib="dom" />
/**
 * Test helper for the desk's browser tests: start `heliochron desk` on a file, watch a page for console
 * errors and requests off the machine, click picture pixels at any zoom (moving the picture as a user
 * would), and fill the forms and tool fields.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { expect } from 'vitest';
import { BIN, ROOT } from '../helpers/runCli.js';

export { ROOT };

/** The command line as the package's `bin` names it (the bundle the tests' global set-up builds). */
export const CLI = BIN;
export const OUT_DIR = join(ROOT, 'test-output', 'desk');

/** Run the command line in a folder; its standard output, or an error with its standard error. */
export function cli(args: readonly string[], cwd = ROOT): string {
  const run = spawnSync(process.execPath, [CLI, ...args], { cwd, encoding: 'utf8' });
  if (run.status !== 0) throw new Error(`heliochron ${args.join(' ')} exited with ${run.status}: ${run.stderr}`);
  return run.stdout;
}

/** Start `heliochron desk FILE` in a folder; resolves with the address it prints first. */
export async function startDesk(cwd: string, file: string): Promise<{ child: ChildProcess; url: string }> {
  const child = spawn(process.execPath, [CLI, 'desk', file], { cwd, stdio: ['ignore', 'pipe', 'pipe'] });
  const url = await new Promise<string>((resolve, reject) => {
    let text = '';
    child.stdout!.on('data', (d: Buffer) => {
      text += d.toString('utf8');
      if (text.includes('\n')) resolve(text.split('\n')[0]);
    });
    child.on('exit', (code) => reject(new Error(`heliochron desk exited with ${code}`)));
  });
  expect(url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/[A-Za-z0-9_-]{22}\/$/);
  return { child, url };
}

/** Watch a page: console errors, page errors and every request that is not to the desk's own address. */
export function watch(page: Page, address: string): { errors: string[]; offMachine: string[] } {
  const errors: string[] = [];
  const offMachine: string[] = [];
  const origin = new URL(address).origin;
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(m.text());
  });
  page.on('pageerror', (e) => errors.push(String(e)));
  void page.context().route('**/*', (route) => {
    const url = route.request().url();
    if (url.startsWith(`${origin}/`) || url.startsWith('data:') || url.startsWith('blob:')) return route.continue();
    offMachine.push(url);
    return route.abort();
  });
  return { errors, offMachine };
}

/** Click a picture pixel: the picture is moved (middle-button drag) until the point is well inside the view. */
export async function clickPixel(page: Page, p: readonly [number, number]): Promise<void> {
  const viewer = page.locator('#viewer');
  const box = (await viewer.boundingBox())!;
  const read = async () => ({
    zoom: Number(await viewer.getAttribute('data-zoom')),
    panX: Number(await viewer.getAttribute('data-pan-x')),
    panY: Number(await viewer.getAttribute('data-pan-y')),
  });
  let view = await read();
  let sx = view.panX + view.zoom * p[0];
  let sy = view.panY + view.zoom * p[1];
  if (sx < 220 || sy < 40 || sx > box.width - 40 || sy > box.height - 40) {
    const cx = Math.round(box.width / 2);
    const cy = Math.round(box.height / 2);
    const dx = Math.round(cx - sx);
    const dy = Math.round(cy - sy);
    await page.mouse.move(box.x + cx, box.y + cy);
    await page.mouse.down({ button: 'middle' });
    await page.mouse.move(box.x + cx + dx / 2, box.y + cy + dy / 2);
    await page.mouse.move(box.x + cx + dx, box.y + cy + dy);
    await page.mouse.up({ button: 'middle' });
    view = await read();
    sx = view.panX + view.zoom * p[0];
    sy = view.panY + view.zoom * p[1];
  }
  const now = (await viewer.boundingBox())!; // the box itself, read again just before the click
  await page.mouse.click(now.x + sx, now.y + sy);
}

/** Type into a form field (by its scene path) and leave it. */
export async function fillField(page: Page, field: string, value: string): Promise<void> {
  const input = page.locator(`[data-field="${field}"]`);
  await input.fill(value);
  await input.press('Tab');
}

/** Type into (or choose in) a field of the tool in use. */
export async function toolField(page: Page, name: string, value: string, select = false): Promise<void> {
  const input = page.locator(`#tool-fields [data-tool-field="${name}"]`);
  if (select) await input.selectOption(value);
  else {
    await input.fill(value);
    await input.dispatchEvent('change');
  }
}

export async function pickTool(page: Page, id: string): Promise<void> {
  await page.locator(`#tool-buttons [data-tool="${id}"]`).click();
}

/** What `heliochron measure --json` prints of the observations measured from pixels. */
export interface MeasuredJson {
  readonly observations: readonly { readonly id: string; readonly values: readonly { readonly name: string; readonly value: number; readonly sigma: number }[] }[];
}

/** Every value and sigma the page shows equals the command line's (issue 10: within 0.01 deg, 0.001 in a ratio). */
export async function expectShownAsMeasured(page: Page, measured: MeasuredJson): Promise<void> {
  for (const o of measured.observations) {
    for (const v of o.values) {
      const cell = page.locator(`li[data-id="${o.id}"] [data-value="${v.name}"]`);
      const shown = Number(await cell.getAttribute('data-number'));
      const sigma = Number(await cell.getAttribute('data-sigma'));
      const tolerance = v.name.endsWith('Deg') ? 0.01 : 0.001;
      expect(Math.abs(shown - v.value), `${o.id} ${v.name}`).toBeLessThanOrEqual(tolerance);
      expect(Math.abs(sigma - v.sigma), `${o.id} ${v.name} sigma`).toBeLessThanOrEqual(tolerance);
    }
  }
}
