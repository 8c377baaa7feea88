/**
 * The desk as the browser tests start and watch it: `heliochron desk FILE` started by the command
 * line in a folder, and a page watched for console errors and requests off the machine.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Page } from 'playwright-core';
import { CHROMIUM } from '../helpers/chromium.js';
import { expect } from 'vitest';

export const ROOT = fileURLToPath(new URL('../../', import.meta.url));
export const CLI = join(ROOT, 'dist', 'cli', 'main.js');
/** Where the browser tests of the desk put their screenshots. */
export const OUT_DIR = join(ROOT, 'test-output', 'desk');

/** Before a browser test of the desk: Chromium and the command line are there, the page is built as `npm ci` builds it, the screenshot folder exists. */
export function prepareDeskTest(): void {
  if (!existsSync(CHROMIUM)) throw new Error(`Chromium was not found at ${CHROMIUM}: install the Debian package "chromium" (apt-get install chromium) to run the browser tests of the desk`);
  if (!existsSync(CLI)) throw new Error('dist/cli/main.js is missing: run npx tsc -p tsconfig.json first');
  const build = spawnSync(process.execPath, [join(ROOT, 'src', 'desk', 'build.mjs')], { cwd: ROOT, encoding: 'utf8' });
  if (build.status !== 0) throw new Error(`building the desk page failed: ${build.stderr}`);
  mkdirSync(OUT_DIR, { recursive: true });
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

/** Watch a page: console errors, page errors and every request that is not to the desk's own address (refused). */
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

/** The view transform the page publishes on the viewer element. */
export async function readView(page: Page): Promise<{ zoom: number; panX: number; panY: number }> {
  const viewer = page.locator('#viewer');
  return {
    zoom: Number(await viewer.getAttribute('data-zoom')),
    panX: Number(await viewer.getAttribute('data-pan-x')),
    panY: Number(await viewer.getAttribute('data-pan-y')),
  };
}
