/**
 * The desk as the browser tests start and watch it: the helpers of deskPage.ts (`heliochron desk
 * FILE` started by the command line in a folder, a page watched for console errors and requests
 * off the machine), plus the preparation of a test and the view transform the page publishes.
 */
import { existsSync, mkdirSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { CHROMIUM } from '../helpers/chromium.js';
import { CLI, OUT_DIR, ROOT } from './deskPage.js';

export { CLI, OUT_DIR, ROOT, startDesk, watch } from './deskPage.js';

/** Before a browser test of the desk: Chromium and the command line are there, the page is built as `npm ci` builds it, the screenshot folder exists. */
export function prepareDeskTest(): void {
  if (!existsSync(CHROMIUM)) throw new Error(`Chromium was not found at ${CHROMIUM}: install the Debian package "chromium" (apt-get install chromium) to run the browser tests of the desk`);
  if (!existsSync(CLI)) throw new Error(`${CLI} is missing: the tests' global set-up bundles it (tests/helpers/buildCli.ts)`);
  const build = spawnSync(process.execPath, [join(ROOT, 'src', 'desk', 'build.mjs')], { cwd: ROOT, encoding: 'utf8' });
  if (build.status !== 0) throw new Error(`building the desk page failed: ${build.stderr}`);
  mkdirSync(OUT_DIR, { recursive: true });
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
