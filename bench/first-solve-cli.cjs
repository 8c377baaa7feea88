#!/usr/bin/env node
/**
 * The first `heliochron date` of a fresh process against the warm one, as the command-line user meets
 * it (issue: speed; part 3 of bench/solver-growth.mjs runs this child): the bundled program
 * (dist/bin/program.js) is loaded the way the bin loads it (src/cli/bin.ts: loadProgram with the code
 * cache of `date`), then `date examples/marktgasse-print.yaml --json` runs in this process once (the
 * first run: what a user's command does after the load), five times more to warm up, and seven times
 * measured (the warm runs, medians). Output is kept in memory, not printed.
 *   node bench/first-solve-cli.cjs [<checkout>]      (default: this checkout; needs `node src/cli/build.mjs`)
 * Prints one JSON line: load (ms), whether V8 rejected the code cache, and for the first and the warm
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
  const { program, script } = loadProgram(folder, cachedDataFor(folder, ARGS));
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
  for (let i = 0; i < 5; i += 1) await run();
  const warm = [];
  for (let i = 0; i < 7; i += 1) warm.push(await run());
  const med = (k) => median(warm.map((r) => r[k]));
  console.log(JSON.stringify({
    load,
    cacheRejected: script.cachedDataRejected === true,
    first: first.wall, warm: med('wall'),
    firstCpu: first.cpu, warmCpu: med('cpu'),
    firstMain: orNull(first.main), warmMain: orNull(med('main')),
  }));
}

measure().catch((error) => {
  process.stderr.write(`${error.stack ?? error}\n`);
  process.exitCode = 1;
});
