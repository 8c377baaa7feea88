#!/usr/bin/env node
/**
 * How the date solver's work grows with the window, on every bundled example (issue: speed).
 * Run after `npx tsc -p tsconfig.json`:  node bench/solver-growth.mjs [--before <checkout>]
 *
 * Each example is solved with its own evidence, restrictions and calendar, over a 500-year window
 * (1400-1899) and a 3000-year one (-1100 to 1899), and the bench prints, each beside its target:
 * 1. calls of the full ephemeris (sunPosition) made by the search over 500 years, against the
 *    floor: one per candidate year reported plus one per year refined in full. Target <= 1.5x.
 * 2. the warm solve time of the 3000-year window over the 500-year one (medians of 5 interleaved
 *    runs after a warm-up, consistency test on). Target <= 6.5x (linear growth would be 6x).
 * 3. the first solve in a fresh process against the warm solve of the same scene (the 500-year
 *    bench scene of bench/solver-window.mjs). Target <= 3x. With --before <checkout>, that checkout's own
 *    bench script runs the same fresh processes, alternating with this one's, and both are printed.
 * 4. peak memory (maximum resident set) of a fresh process that solves the Marktgasse example
 *    over 3000 years, against a fresh process that loads the same modules and solves nothing.
 *    Target <= 1.5x.
 */
import { readdirSync, statSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { readSceneFile } from '../dist/cli/sceneFile.js';
import { withWindow } from './solver-growth-lib.mjs';
import { buildEvidenceModel } from '../dist/solver/evidenceModel.js';
import { solveDates, solveModel } from '../dist/solver/solveDates.js';
import { dayWindowOf } from '../dist/solver/window.js';
import { loadavg, cpus } from 'node:os';

if (!process.argv.some((a) => a.startsWith('--child'))) console.log(`machine: ${cpus().length} cores, load average ${loadavg()[0].toFixed(1)} at the start (other work on the machine slows every figure below)`);

const root = fileURLToPath(new URL('../', import.meta.url));
const args = new Set(process.argv.slice(2));

/** The bundled examples: every scene file in examples/ and its folders. */
function exampleFiles() {
  const out = [];
  for (const name of readdirSync(`${root}examples`)) {
    const path = `${root}examples/${name}`;
    if (name.endsWith('.yaml')) out.push(path);
    else if (statSync(path).isDirectory()) for (const f of readdirSync(path)) if (f.endsWith('.yaml')) out.push(`${path}/${f}`);
  }
  return out.sort();
}

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** Warm solve times of two scenes, interleaved so that other work on the machine hits both alike. */
function timeSolvePair(a, b, runs) {
  solveDates(a); // warm-up
  solveDates(b);
  const ta = [];
  const tb = [];
  for (let i = 0; i < runs; i += 1) {
    for (const [scene, list] of [[a, ta], [b, tb]]) {
      const t0 = performance.now();
      solveDates(scene);
      list.push(performance.now() - t0);
    }
  }
  return { a: median(ta), b: median(tb), aMin: Math.min(...ta), bMin: Math.min(...tb) };
}

if (args.has('--child-first')) {
  // Child: the first solve in this fresh process, then the warm solve (median of 7).
  const { benchScene } = await import('./solver-window-scene.mjs');
  const cpuMs = (c) => (c.user + c.system) / 1000;
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  solveDates(benchScene, { consistency: false });
  const firstCpu = cpuMs(process.cpuUsage(c0));
  const first = performance.now() - t0;
  for (let i = 0; i < 5; i += 1) solveDates(benchScene, { consistency: false });
  const ts = [];
  const cs = [];
  for (let i = 0; i < 7; i += 1) {
    const t = performance.now();
    const c = process.cpuUsage();
    solveDates(benchScene, { consistency: false });
    cs.push(cpuMs(process.cpuUsage(c)));
    ts.push(performance.now() - t);
  }
  console.log(JSON.stringify({ first, warm: median(ts), firstCpu, warmCpu: median(cs) }));
  process.exit(0);
}
if (args.has('--child-memory')) {
  // Child: load the modules (and the scene), then solve over 3000 years unless --idle.
  const scene = withWindow(readSceneFile(`${root}examples/marktgasse-print.yaml`), -1100, 1899);
  if (!args.has('--idle')) solveDates(scene);
  console.log(JSON.stringify({ maxRssKb: process.resourceUsage().maxRSS }));
  process.exit(0);
}

const files = exampleFiles();
console.log('1. Sun evaluations of the search over a 500-year window (1400-1899), against the floor (one per candidate year reported + one per year refined in full); target <= 1.5x');
let worstSun = 0;
for (const file of files) {
  const scene = withWindow(readSceneFile(file), 1400, 1899);
  const s = solveModel(buildEvidenceModel(scene), dayWindowOf(scene), 50);
  const floor = s.search.candidates.length + s.search.fullRefinements;
  if (s.search.sunEvaluations === 0) {
    // A view lit by the moon alone is searched night by night with the moon (src/solver/moonSearch.ts): no sun search to count.
    console.log(`   ${file.slice(root.length + 9).padEnd(44)} lit by the moon alone: searched night by night with the moon, no search of the sun to count`);
    continue;
  }
  const ratio = s.search.sunEvaluations / floor;
  worstSun = Math.max(worstSun, ratio);
  console.log(`   ${file.slice(root.length + 9).padEnd(44)} ${String(s.search.sunEvaluations).padStart(6)} calls, floor ${String(floor).padStart(5)} (${s.search.candidates.length} years + ${s.search.fullRefinements} refined): ${ratio.toFixed(2)}x   ${ratio <= 1.5 ? 'met' : 'NOT met'}`);
}

console.log('2. Warm solve, 3000-year window (-1100 to 1899) over 500-year window (1400-1899), medians of 5 interleaved runs, leave-one-out on; target <= 6.5x');
let worstGrowth = 0;
for (const file of files) {
  const base = readSceneFile(file);
  const t = timeSolvePair(withWindow(base, 1400, 1899), withWindow(base, -1100, 1899), 5);
  const [t500, t3000] = [t.a, t.b];
  const ratio = t3000 / t500;
  worstGrowth = Math.max(worstGrowth, ratio);
  console.log(`   ${file.slice(root.length + 9).padEnd(44)} ${t500.toFixed(0).padStart(5)} ms -> ${t3000.toFixed(0).padStart(6)} ms: ${ratio.toFixed(2)}x   ${ratio <= 6.5 ? 'met' : 'NOT met'}   (fastest runs: ${(t.bMin / t.aMin).toFixed(2)}x)`);
}

console.log('3. First solve in a fresh process against the warm solve (bench/solver-window.mjs scene, 500 years, leave-one-out off); target <= 3x');
// With --before <checkout>: that checkout's own bench script (its dist) runs the same child, the two alternating.
const beforeAt = process.argv.indexOf('--before');
const beforeScript = beforeAt > 0 ? `${process.argv[beforeAt + 1].replace(/\/$/, '')}/bench/solver-growth.mjs` : null;
const firsts = [];
const beforeFirsts = [];
for (let i = 0; i < 5; i += 1) {
  const r = spawnSync(process.execPath, [fileURLToPath(import.meta.url), '--child-first'], { encoding: 'utf8' });
  firsts.push(JSON.parse(r.stdout));
  if (beforeScript) beforeFirsts.push(JSON.parse(spawnSync(process.execPath, [beforeScript, '--child-first'], { encoding: 'utf8' }).stdout));
}
const firstLine = (list) => {
  const first = median(list.map((f) => f.first));
  const warm = median(list.map((f) => f.warm));
  const firstCpu = median(list.map((f) => f.firstCpu));
  const warmCpu = median(list.map((f) => f.warmCpu));
  return { first, warm, firstCpu, warmCpu, words: `first ${first.toFixed(0)} ms, warm ${warm.toFixed(1)} ms (medians of ${list.length} fresh processes): ${(first / warm).toFixed(1)}x   target <= 3x   ${first / warm <= 3 ? 'met' : 'NOT met'}; in CPU time (garbage collection included) first ${firstCpu.toFixed(0)} ms, warm ${warmCpu.toFixed(1)} ms: ${(firstCpu / warmCpu).toFixed(1)}x   ${firstCpu / warmCpu <= 3 ? 'met' : 'NOT met'}` };
};
const { first, warm, words } = firstLine(firsts);
console.log(`   ${words}`);
if (beforeScript) console.log(`   before (${beforeScript}): ${firstLine(beforeFirsts).words}`);

console.log('4. Peak memory (max resident set) of a 3000-year solve of marktgasse-print.yaml against Node with the same modules loaded; target <= 1.5x');
const rss = (extra) => JSON.parse(spawnSync(process.execPath, [fileURLToPath(import.meta.url), '--child-memory', ...extra], { encoding: 'utf8' }).stdout).maxRssKb;
const idle = rss(['--idle']);
const busy = rss([]);
console.log(`   solve ${(busy / 1024).toFixed(1)} MB, modules loaded ${(idle / 1024).toFixed(1)} MB: ${(busy / idle).toFixed(2)}x   target <= 1.5x   ${busy / idle <= 1.5 ? 'met' : 'NOT met'}`);
console.log(`worst: sun evaluations ${worstSun.toFixed(2)}x (target 1.5), growth ${worstGrowth.toFixed(2)}x (target 6.5), first/warm ${(first / warm).toFixed(1)}x (target 3), memory ${(busy / idle).toFixed(2)}x (target 1.5)`);
