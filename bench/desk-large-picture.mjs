#!/usr/bin/env node
/**
 * Large scans on the measuring desk (issue 10: "5,000 to 20,000-pixel museum scans"): how long the
 * page takes to prepare a picture for zooming (decode once, build the pyramid of tiles) and how much
 * memory Chromium's processes hold at most meanwhile, for PNG and JPEG pictures of growing size.
 * Not a test: it prints what it measured.
 *
 * Run after `npm run build` (or npm ci):  node bench/desk-large-picture.mjs [largest side, default 20000]
 *
 * The pictures (a chequer of 1000 px squares with a disc, 5:3) are encoded by Chromium itself in a
 * first browser, which is then closed; each is opened by `heliochron desk` in a fresh headless
 * Chromium (Debian's), whose processes' resident memory (Linux /proc, summed over the Chromium
 * processes this script started) is sampled every 100 ms until the page is ready. Resident
 * memory counts shared pages once per process: an upper bound.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';

const ROOT = fileURLToPath(new URL('../', import.meta.url));
const CLI = join(ROOT, 'dist', 'cli', 'main.js');
const ARGS = ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'];
const largest = Number(process.argv[2] ?? 20000);
const sides = [5000, 10000, 20000].filter((w) => w <= largest);
const folder = mkdtempSync(join(tmpdir(), 'heliochron-desk-large-bench-'));

/** Encode the picture of `w` x `h` px in Chromium as PNG or JPEG; its bytes. */
async function encode(page, w, h, type) {
  const base64 = await page.evaluate(async ([width, height, mime]) => {
    const canvas = new OffscreenCanvas(width, height);
    const ctx = canvas.getContext('2d');
    for (let y = 0; y < height; y += 1000) for (let x = 0; x < width; x += 1000) {
      ctx.fillStyle = ((x + y) / 1000) % 2 === 0 ? '#E6DCC8' : '#968C7D';
      ctx.fillRect(x, y, 1000, 1000);
    }
    ctx.fillStyle = '#0072B2';
    ctx.beginPath();
    ctx.arc(width / 2, height / 2, height / 5, 0, 2 * Math.PI);
    ctx.fill();
    const blob = await canvas.convertToBlob({ type: mime, quality: 0.9 });
    const bytes = new Uint8Array(await blob.arrayBuffer());
    let text = '';
    for (let i = 0; i < bytes.length; i += 0x8000) text += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
    return btoa(text);
  }, [w, h, type]);
  return Buffer.from(base64, 'base64');
}

/** Resident memory of the Chromium processes started by this script (descendants of it named chrom...), bytes (Linux /proc). */
function chromiumRss() {
  const children = new Map();
  const rss = new Map();
  const names = new Map();
  for (const name of readdirSync('/proc')) {
    if (!/^\d+$/.test(name)) continue;
    try {
      const stat = readFileSync(`/proc/${name}/stat`, 'utf8');
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      const pid = Number(name);
      rss.set(pid, Number(fields[21]) * 4096);
      names.set(pid, stat.slice(stat.indexOf('(') + 1, stat.lastIndexOf(')')));
      children.set(Number(fields[1]), [...(children.get(Number(fields[1])) ?? []), pid]);
    } catch {
      // the process ended meanwhile
    }
  }
  let total = 0;
  const stack = [process.pid];
  while (stack.length) {
    const pid = stack.pop();
    if (pid !== process.pid && names.get(pid)?.startsWith('chrom')) total += rss.get(pid) ?? 0;
    stack.push(...(children.get(pid) ?? []));
  }
  return total;
}

async function startDesk(file) {
  const child = spawn(process.execPath, [CLI, 'desk', file], { cwd: folder, stdio: ['ignore', 'pipe', 'pipe'] });
  const url = await new Promise((resolve, reject) => {
    let text = '';
    child.stdout.on('data', (d) => {
      text += d.toString('utf8');
      if (text.includes('\n')) resolve(text.split('\n')[0]);
    });
    child.on('exit', (code) => reject(new Error(`heliochron desk exited with ${code}`)));
  });
  return { child, url };
}

try {
  const maker = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: ARGS });
  const makerPage = await maker.newPage();
  const files = [];
  for (const w of sides) {
    const h = Math.round((w * 3) / 5);
    for (const [type, ext] of [['image/png', 'png'], ['image/jpeg', 'jpg']]) {
      const name = `scan-${w}.${ext}`;
      const bytes = await encode(makerPage, w, h, type);
      writeFileSync(join(folder, name), bytes);
      files.push({ name, w, h, mb: bytes.length / 1e6 });
    }
  }
  await maker.close();

  console.log(`Large pictures on the desk, headless Chromium (${ARGS.includes('--disable-gpu') ? 'no GPU' : 'GPU'}), time to prepare for zooming and the most memory its processes held:`);
  for (const f of files) {
    const desk = await startDesk(f.name);
    const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', headless: true, args: ARGS });
    let most = 0;
    const sampler = setInterval(() => { most = Math.max(most, chromiumRss()); }, 100);
    const page = await browser.newPage({ viewport: { width: 1500, height: 1000 } });
    const errors = [];
    page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
    page.on('pageerror', (e) => errors.push(String(e)));
    const started = Date.now();
    await page.goto(desk.url);
    await page.waitForSelector('body[data-ready="true"]', { timeout: 1_200_000 });
    const seconds = (Date.now() - started) / 1000;
    const width = await page.locator('[data-field="image.widthPx"]').inputValue();
    const notice = (await page.locator('#notice').isVisible()) ? await page.locator('#notice').textContent() : '';
    clearInterval(sampler);
    const shown = width === String(f.w) && !notice;
    console.log(`  ${f.name.padEnd(16)} ${`${f.w} x ${f.h} px`.padEnd(18)} file ${f.mb.toFixed(1).padStart(5)} MB: ${shown ? 'shown' : 'NOT shown'} after ${seconds.toFixed(1)} s, at most ${(most / 1e9).toFixed(2)} GB in Chromium's processes${notice ? `; the page said: ${notice}` : ''}${errors.length ? `; console errors: ${errors.join(' | ')}` : ''}`);
    await browser.close();
    desk.child.kill('SIGINT');
  }
} finally {
  rmSync(folder, { recursive: true, force: true });
}
