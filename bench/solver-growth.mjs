#!/usr/bin/env node
/**
 * How the date solver's work grows with the window, on every bundled example (issue: speed).
 * Run after `npx tsc -p tsconfig.json` and `node src/cli/build.mjs`:
 *   node bench/solver-growth.mjs [--before <checkout>] [--only-first] [--runs <n>] [--only <text>] [--part <1,2,3,4>] [--memory]
 *   (--only: the examples whose path holds <text>, or any of several given with commas; --part: those parts alone;
 *   --memory: part 4 alone, five times over, with the median ratio)
 *
 * Each example is solved with its own evidence, restrictions and calendar, over a 500-year window
 * (1400-1899) and a 3000-year one (-1100 to 1899), and the bench prints, each beside its target:
 * 1. calls of the full ephemeris (sunPosition) made by the search over 500 years, against the
 *    floor: one per candidate year reported plus one per year refined in full. Target <= 1.5x.
 * 2. the warm solve time of the 3000-year window over the 500-year one (medians of 5 interleaved
 *    runs after a warm-up, consistency test on). Target <= 6.5x (linear growth would be 6x). Elapsed
 *    time is judged; the CPU time of the process (garbage collection on helper threads included) is
 *    printed beside it, less moved by other work on the machine. With --before <checkout>, that
 *    checkout's solver (its dist) is timed in the same rounds, the two alternating, and both printed.
 * 3. the first solve in a fresh process against the settled solve of the same scene in that process
 *    (the 500-year bench scene of bench/solver-window.mjs; each process solves it 41 times: the first,
 *    then `warm`, the median of the 6th to 12th, and `settled`, the median of the last 10, once V8 has
 *    optimised the hot code; medians of --runs fresh processes, 7 unless given). Target <= 3x, judged
 *    against the settled solve; the warm ratio is printed beside it.
 *    Beside elapsed time, CPU time of the process (every thread: V8's optimising compiler and the
 *    garbage collector's helpers run beside the main thread) and of the main thread alone (Linux).
 *    Then the same as the command-line user meets it (bench/first-solve-cli.cjs): the bundled program
 *    loaded with its code cache as the bin loads it, the first `date examples/marktgasse-print.yaml`
 *    of the process against the warm ones. With --before <checkout>, that checkout's own bench script
 *    runs the same fresh processes (and bench/first-solve-cli.cjs that checkout's bundle), alternating
 *    with this one's, and both are printed. --only-first runs part 3 alone.
 * 4. peak memory (maximum resident set) of a fresh process that solves the Marktgasse example
 *    over 3000 years, against a fresh process that loads the same modules and solves nothing.
 *    Target <= 1.5x.
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
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

/** CPU time of this process's main thread so far, ms (Linux: schedstat's first field, nanoseconds on the CPU); NaN elsewhere. */
function mainThreadMs() {
  try {
    return Number(readFileSync(`/proc/self/task/${process.pid}/schedstat`, 'latin1').split(' ')[0]) / 1e6;
  } catch {
    return NaN;
  }
}

/** The value after a flag, or null. */
const flagValue = (name) => {
  const at = process.argv.indexOf(name);
  return at > 0 ? process.argv[at + 1] : null;
};
const only = flagValue('--only');
const parts = flagValue('--part') ? new Set(flagValue('--part').split(',').map(Number)) : new Set([1, 2, 3, 4]);

/**
 * Warm solve times (elapsed and CPU) of pairs of scenes, each pair [solve, scene at 500 years, scene at 3000
 * years]: after a warm-up, `runs` rounds in which every scene is solved once, so that other work on the
 * machine hits them all alike.
 */
function timeSolveRounds(pairs, runs) {
  for (const [solve, a, b] of pairs) {
    solve(a); // warm-up
    solve(b);
  }
  const lists = pairs.map(() => ({ a: [], b: [], aCpu: [], bCpu: [] }));
  for (let i = 0; i < runs; i += 1) {
    // Alternate which checkout goes first from round to round.
    const order = pairs.map((_, k) => k);
    if (i % 2 === 1) order.reverse();
    for (const k of order) {
      const [solve, a, b] = pairs[k];
      for (const [scene, wall, cpuList] of [[a, lists[k].a, lists[k].aCpu], [b, lists[k].b, lists[k].bCpu]]) {
        const c0 = process.cpuUsage();
        const t0 = performance.now();
        solve(scene);
        wall.push(performance.now() - t0);
        const c = process.cpuUsage(c0);
        cpuList.push((c.user + c.system) / 1000);
      }
    }
  }
  return lists.map((l) => ({ a: median(l.a), b: median(l.b), aMin: Math.min(...l.a), bMin: Math.min(...l.b), aCpu: median(l.aCpu), bCpu: median(l.bCpu) }));
}

if (args.has('--child-first')) {
  // Child: the first solve in this fresh process, then the warm solve (median of 7).
  const { benchScene } = await import('./solver-window-scene.mjs');
  const cpuMs = (c) => (c.user + c.system) / 1000;
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  const m0 = mainThreadMs();
  solveDates(benchScene, { consistency: false });
  const firstMain = mainThreadMs() - m0;
  const firstCpu = cpuMs(process.cpuUsage(c0));
  const first = performance.now() - t0;
  // Then 40 more: `warm` is the median of the 6th to 12th (as a few runs in one process meet it),
  // `settled` of the last 10 (the code as V8 leaves it once every hot function is optimised).
  const ts = [];
  const cs = [];
  const ms = [];
  for (let i = 0; i < 40; i += 1) {
    const t = performance.now();
    const c = process.cpuUsage();
    const m = mainThreadMs();
    solveDates(benchScene, { consistency: false });
    ms.push(mainThreadMs() - m);
    cs.push(cpuMs(process.cpuUsage(c)));
    ts.push(performance.now() - t);
  }
  const orNull = (x) => (Number.isFinite(x) ? x : null);
  const warmOf = (xs) => median(xs.slice(5, 12));
  const settledOf = (xs) => median(xs.slice(30));
  console.log(JSON.stringify({
    first, warm: warmOf(ts), settled: settledOf(ts),
    firstCpu, warmCpu: warmOf(cs), settledCpu: settledOf(cs),
    firstMain: orNull(firstMain), warmMain: orNull(warmOf(ms)), settledMain: orNull(settledOf(ms)),
  }));
  process.exit(0);
}
if (args.has('--child-memory')) {
  // Child: load the modules (and the scene), then solve over 3000 years unless --idle.
  const scene = withWindow(readSceneFile(`${root}examples/marktgasse-print.yaml`), -1100, 1899);
  if (!args.has('--idle')) solveDates(scene);
  console.log(JSON.stringify({ maxRssKb: process.resourceUsage().maxRSS }));
  process.exit(0);
}

if (args.has('--memory')) {
  // Part 4 alone (peak memory), measured 5 times over: each a pair of fresh processes, solving and idle.
  const rssOf = (extra) => JSON.parse(spawnSync(process.execPath, [fileURLToPath(import.meta.url), '--child-memory', ...extra], { encoding: 'utf8' }).stdout).maxRssKb;
  const ratios = [];
  for (let i = 0; i < 5; i += 1) {
    const idle = rssOf(['--idle']);
    const busy = rssOf([]);
    ratios.push(busy / idle);
    console.log(`4. solve ${(busy / 1024).toFixed(1)} MB, modules loaded ${(idle / 1024).toFixed(1)} MB: ${(busy / idle).toFixed(2)}x`);
  }
  const m = median(ratios);
  console.log(`4. peak memory of a 3000-year solve of marktgasse-print.yaml over Node with the modules loaded, median of 5: ${m.toFixed(2)}x (worst ${Math.max(...ratios).toFixed(2)}x)   target <= 1.5x   ${m <= 1.5 ? 'met' : 'NOT met'}`);
  process.exit(0);
}

if (args.has('--only-first')) {
  firstSolvePart();
  process.exit(0);
}

const files = exampleFiles().filter((f) => !only || only.split(',').some((text) => f.includes(text)));
let worstSun = 0;
if (parts.has(1)) {
  console.log('1. Sun evaluations of the search over a 500-year window (1400-1899), against the floor (one per candidate year reported + one per year refined in full); target <= 1.5x');
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
}

const beforeAt = process.argv.indexOf('--before');
const beforeRoot = beforeAt > 0 ? process.argv[beforeAt + 1].replace(/\/$/, '') : null;
let worstGrowth = 0;
if (parts.has(2)) {
  console.log(`2. Warm solve, 3000-year window (-1100 to 1899) over 500-year window (1400-1899), medians of 5 interleaved runs, leave-one-out on; target <= 6.5x${beforeRoot ? `; before: ${beforeRoot}'s solver in the same rounds` : ''}`);
  // The before checkout's own modules (its dist), loaded beside these.
  const before = beforeRoot
    ? {
        solveDates: (await import(`${beforeRoot}/dist/solver/solveDates.js`)).solveDates,
        readSceneFile: (await import(`${beforeRoot}/dist/cli/sceneFile.js`)).readSceneFile,
        withWindow: (await import(`${beforeRoot}/bench/solver-growth-lib.mjs`)).withWindow,
      }
    : null;
  const growthWords = (t) => {
    const ratio = t.b / t.a;
    return { ratio, words: `${t.a.toFixed(0).padStart(5)} ms -> ${t.b.toFixed(0).padStart(6)} ms: ${ratio.toFixed(2)}x   ${ratio <= 6.5 ? 'met' : 'NOT met'}   (fastest runs: ${(t.bMin / t.aMin).toFixed(2)}x; CPU ${t.aCpu.toFixed(0)} -> ${t.bCpu.toFixed(0)} ms: ${(t.bCpu / t.aCpu).toFixed(2)}x)` };
  };
  for (const file of files) {
    const base = readSceneFile(file);
    const pairs = [[solveDates, withWindow(base, 1400, 1899), withWindow(base, -1100, 1899)]];
    if (before) {
      const old = before.readSceneFile(file);
      pairs.push([before.solveDates, before.withWindow(old, 1400, 1899), before.withWindow(old, -1100, 1899)]);
    }
    const [t, tBefore] = timeSolveRounds(pairs, 5);
    const now = growthWords(t);
    worstGrowth = Math.max(worstGrowth, now.ratio);
    console.log(`   ${file.slice(root.length + 9).padEnd(44)} ${now.words}`);
    if (tBefore) console.log(`   ${'  before'.padEnd(44)} ${growthWords(tBefore).words}`);
  }
}

let first = NaN;
let warm = NaN;
if (parts.has(3)) ({ first, warm } = firstSolvePart());

/**
 * Part 3: the first solve of fresh processes against their warm solves, printed; returns the medians of this checkout's
 * library figures (elapsed ms). With --before <checkout>: that checkout's own bench script (its dist) runs the same
 * child, and bench/first-solve-cli.cjs its bundle, each alternating with this checkout's.
 */
function firstSolvePart() {
  console.log(`3. First solve in a fresh process against the settled solve (bench/solver-window.mjs scene, 500 years, leave-one-out off); target <= 3x`);
  const beforeAt = process.argv.indexOf('--before');
  const beforeRoot = beforeAt > 0 ? process.argv[beforeAt + 1].replace(/\/$/, '') : null;
  const beforeScript = beforeRoot ? `${beforeRoot}/bench/solver-growth.mjs` : null;
  const runsAt = process.argv.indexOf('--runs');
  const runs = runsAt > 0 ? Math.max(1, Number(process.argv[runsAt + 1])) : 7;
  const child = (command) => {
    const r = spawnSync(process.execPath, command, { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`${command.join(' ')} failed: ${r.stderr}`);
    return JSON.parse(r.stdout);
  };
  const cliChild = `${root}bench/first-solve-cli.cjs`;
  const lib = [];
  const libBefore = [];
  const cli = [];
  const cliBefore = [];
  for (let i = 0; i < runs; i += 1) {
    lib.push(child([fileURLToPath(import.meta.url), '--child-first']));
    if (beforeScript) libBefore.push(child([beforeScript, '--child-first']));
  }
  for (let i = 0; i < runs; i += 1) {
    cli.push(child([cliChild, root]));
    if (beforeRoot && existsSync(`${beforeRoot}/dist/bin/program.js`)) cliBefore.push(child([cliChild, beforeRoot]));
  }
  const ratioWords = (a, b, name = 'warm') => `first ${a.toFixed(0)} ms, ${name} ${b.toFixed(1)} ms: ${(a / b).toFixed(1)}x`;
  // The target is judged against the settled solve (the code once V8 has optimised it); an older child
  // (--before) without one is judged against its warm solve.
  const firstLine = (list) => {
    const m = (k) => median(list.map((f) => f[k]));
    const has = (k) => list.every((f) => typeof f[k] === 'number');
    const first = m('first');
    const warm = has('settled') ? m('settled') : m('warm');
    const name = has('settled') ? 'settled' : 'warm';
    const main = has('firstMain') && has(name === 'settled' ? 'settledMain' : 'warmMain')
      ? `; main thread's CPU ${ratioWords(m('firstMain'), m(`${name}Main`), name)}`
      : '';
    return {
      first,
      warm,
      words:
        `elapsed ${ratioWords(first, warm, name)}   target <= 3x   ${first / warm <= 3 ? 'met' : 'NOT met'} (medians of ${list.length} fresh processes)\n` +
        (name === 'settled' ? `      against the 6th to 12th solves of the process (warm ${m('warm').toFixed(1)} ms): ${(first / m('warm')).toFixed(1)}x\n` : '') +
        `      CPU of every thread (compiler and garbage collector included) ${ratioWords(m('firstCpu'), m(`${name}Cpu`), name)}${main}`,
    };
  };
  const mine = firstLine(lib);
  console.log(`   library (dist/, no code cache): ${mine.words}`);
  if (beforeScript) console.log(`   before, ${beforeScript}: ${firstLine(libBefore).words}`);
  const cliLine = (list) => `${firstLine(list).words}; the program loaded in ${median(list.map((f) => f.load)).toFixed(0)} ms${list.some((f) => f.cacheRejected) ? ', its code cache REJECTED in some runs' : ''}`;
  console.log(`   command line (bundle with its code cache, \`date examples/marktgasse-print.yaml --json\` in one process, leave-one-out on): ${cliLine(cli)}`);
  if (beforeRoot) console.log(`   before, ${beforeRoot}/dist/bin: ${cliBefore.length > 0 ? cliLine(cliBefore) : 'no bundle there (node src/cli/build.mjs makes it)'}`);
  return mine;
}

let busy = NaN;
let idle = NaN;
if (parts.has(4)) {
  console.log('4. Peak memory (max resident set) of a 3000-year solve of marktgasse-print.yaml against Node with the same modules loaded; target <= 1.5x');
  const rss = (extra) => JSON.parse(spawnSync(process.execPath, [fileURLToPath(import.meta.url), '--child-memory', ...extra], { encoding: 'utf8' }).stdout).maxRssKb;
  idle = rss(['--idle']);
  busy = rss([]);
  console.log(`   solve ${(busy / 1024).toFixed(1)} MB, modules loaded ${(idle / 1024).toFixed(1)} MB: ${(busy / idle).toFixed(2)}x   target <= 1.5x   ${busy / idle <= 1.5 ? 'met' : 'NOT met'}`);
}
const worst = [
  parts.has(1) ? `sun evaluations ${worstSun.toFixed(2)}x (target 1.5)` : '',
  parts.has(2) ? `growth ${worstGrowth.toFixed(2)}x (target 6.5)` : '',
  parts.has(3) ? `first/warm ${(first / warm).toFixed(1)}x (target 3)` : '',
  parts.has(4) ? `memory ${(busy / idle).toFixed(2)}x (target 1.5)` : '',
].filter(Boolean);
console.log(`worst: ${worst.join(', ')}`);
