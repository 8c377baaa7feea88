#!/usr/bin/env node
/**
 * The first `heliochron date` of a fresh process against the warm and the settled ones, as the command-line user meets
 * it (issue: speed; part 3 of bench/solver-growth.mjs runs this child): the bundled program
 * (dist/bin/program.js) is loaded the way the bin loads it (src/cli/bin.ts: loadProgram with the code
 * cache of `date`), then `date examples/marktgasse-print.yaml --json` runs in this process once (the
 * first run: what a user's command does after the load), then 40 times more: the warm runs are the 6th
 * to 12th, the settled runs the last 10 (medians). Output is kept in memory, not printed.
 *   node bench/first-solve-cli.cjs [<checkout>]      (default: this checkout; needs `node src/cli/build.mjs`)
 * Prints one JSON line: load (ms), whether V8 rejected the code cache, and for the first, the warm and the settled
 * runs: elapsed ms, CPU ms of the process (every thread: the optimising compiler and the garbage
 * collector's helpers run beside the main thread) and CPU ms of the main thread alone (Linux only,
 * from /proc/self/task/<pid>/schedstat; null elsewhere).
 * CommonJS like the bin, so that Node's ES module loader is not started.
 */
'use strict';
const { readFileSync } = require('node:fs');
const { join, resolve } = require('node:path');

const checkout = resolve(process.argv[2] ?? join(__dirname, '..'));
const folder = join(checkout, 'dist', 'bin');
const ARGS = ['date', 'examples/marktgasse-print.yaml', '--json'];

/** CPU time of the main thread so far, ms (Linux: the first field of schedstat is nanoseconds on the CPU); NaN elsewhere. */
function mainThreadMs() {
  try {
    return Number(readFileSync(`/proc/self/task/${process.pid}/schedstat`, 'latin1').split(' ')[0]) / 1e6;
  } catch {
    return NaN;
  }
}
function processCpuMs() {
  const c = process.cpuUsage();
  return (c.user + c.system) / 1000;
}
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const orNull = (x) => (Number.isFinite(x) ? x : null);

async function measure() {
  const now = () => performance.now(); // the global is made on first use: before any clock is read
  now();
  const { loadProgram, cachedDataFor } = require(join(folder, 'heliochron.cjs'));
  const t0 = now();
  const { program, script } = loadProgram(folder, cachedDataFor(folder, ARGS), ARGS[0]);
  const load = now() - t0;
  let errors = '';
  const io = { out: () => undefined, err: (t) => { errors += t; }, errIsTerminal: false, cwd: checkout };
  const run = async () => {
    const [w, c, m] = [now(), processCpuMs(), mainThreadMs()];
    const code = await program.main(ARGS, io);
    const result = { wall: now() - w, cpu: processCpuMs() - c, main: mainThreadMs() - m };
    if (code !== 0) throw new Error(`heliochron ${ARGS.join(' ')} ended with exit code ${code}: ${errors}`);
    return result;
  };
  const first = await run();
  // 40 more: `warm` is the median of the 6th to 12th runs, `settled` of the last 10 (the code once V8 has optimised it).
  const more = [];
  for (let i = 0; i < 40; i += 1) more.push(await run());
  const med = (k, from, to) => median(more.slice(from, to).map((r) => r[k]));
  console.log(JSON.stringify({
    load,
    cacheRejected: script.cachedDataRejected === true,
    first: first.wall, warm: med('wall', 5, 12), settled: med('wall', 30),
    firstCpu: first.cpu, warmCpu: med('cpu', 5, 12), settledCpu: med('cpu', 30),
    firstMain: orNull(first.main), warmMain: orNull(med('main', 5, 12)), settledMain: orNull(med('main', 30)),
  }));
}

measure().catch((error) => {
  process.stderr.write(`${error.stack ?? error}\n`);
  process.exitCode = 1;
});
