#!/usr/bin/env node
/**
 * Speed of the scene reader against the bare YAML parse of the same text, side by side in one run:
 * for each scene file under examples/ (and the largest scene the reader allows, 1000 observations),
 * the median time of readSceneText and of yaml's parse, and their ratio (the cost of the checks).
 * The fuzz tests only guard against hangs; this is where the reader's speed is watched.
 * Build first: npx tsc -p tsconfig.json.   Usage: node bench/scene-reader.mjs [runs]
 * Target: every file read in well under 50 ms; the checks cost at most a few times the parse.
 */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';
import { parse } from 'yaml';

const root = fileURLToPath(new URL('../', import.meta.url));
if (!existsSync(`${root}dist/scene/readScene.js`)) {
  console.error('bench/scene-reader.mjs: dist/ is missing; run npx tsc -p tsconfig.json first');
  process.exit(1);
}
const { readSceneText } = await import(`${root}dist/scene/readScene.js`);
const runs = Number(process.argv[2] ?? 30);

const files = readdirSync(`${root}examples`)
  .filter((n) => /\.ya?ml$/.test(n))
  .map((n) => ({ name: n, text: readFileSync(`${root}examples/${n}`, 'utf8') }));
// The largest scene the reader accepts: 1000 observations (a sun-up line each, after the Velmar site).
const many = [
  'heliochron: 1',
  'title: Velmar, 1000 observations (bench)',
  "site: { latitudeDeg: 47°37'12\"N, longitudeDeg: 9 21 E }",
  'calendar: gregorian',
  'window: { fromYear: 1700, toYear: 1800 }',
  'observations:',
  ...Array.from({ length: 1000 }, (_, i) => `  - { id: o${i}, kind: sun-up }`),
].join('\n');
files.push({ name: '1000 observations (generated)', text: many });

function median(fn) {
  const times = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    fn();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)];
}

console.log(`scene reader against the bare YAML parse, median of ${runs} runs each (ms)`);
console.log('file                                     parse   reader   reader/parse');
for (const { name, text } of files) {
  // One warm-up each, then the median of each.
  readSceneText(text, name);
  parse(text);
  const p = median(() => parse(text));
  const r = median(() => readSceneText(text, name));
  console.log(`${name.padEnd(40)} ${p.toFixed(2).padStart(6)}  ${r.toFixed(2).padStart(7)}  ${(r / p).toFixed(2).padStart(12)}`);
}
