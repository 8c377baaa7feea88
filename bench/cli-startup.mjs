#!/usr/bin/env node
/**
 * Start-up of the command line against a bare `node -e 0`, measured side by side in one run
 * (median of N runs each, interleaved, so that other work on the machine hits every case alike).
 * Each command runs twice: as the package's `bin` runs it (dist/bin/heliochron.cjs, the bundle of
 * src/cli/build.mjs) and as tsc's modules (dist/cli/main.js), to show what the bundle saves.
 * Build first: npm run build (or npx tsc -p tsconfig.json && node src/cli/build.mjs).
 * Targets (issue: speed), as ratios to `node -e 0`: `date` on the bundled example at most 2.5x,
 * `report` at most 4x, `sun` at most 1.4x. Every process loads bench/cpu-at-exit.cjs, which
 * prints its CPU time (user + system, start-up included) when it ends; on a shared machine the CPU
 * ratio is the steadier figure, the elapsed one includes waiting for a core. The last line gives
 * what `report` costs beyond `date` (charts, HTML, their modules) and what the 4x target leaves for it.
 * Usage: node bench/cli-startup.mjs [runs] [--before <checkout>]
 *   --before: also run another checkout's tsc build (<checkout>/dist/cli/main.js) and its bin
 *   (the file its package.json names, when built), e.g. the main branch before a change, in the
 *   same interleaved runs.
 * The first line says whether V8 took the bin's code cache for each target command (src/cli/bin.ts).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir, loadavg, cpus } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';

const root = fileURLToPath(new URL('../', import.meta.url));
const bin = `${root}${JSON.parse(readFileSync(`${root}package.json`, 'utf8')).bin.heliochron}`;
const modules = `${root}dist/cli/main.js`;
for (const file of [bin, modules]) {
  if (!existsSync(file)) {
    console.error(`bench/cli-startup.mjs: ${file.slice(root.length)} is missing; run npm run build first`);
    process.exit(1);
  }
}
const positional = process.argv.slice(2).filter((a, i, all) => !a.startsWith('--') && all[i - 1] !== '--before');
const runs = Number(positional[0] ?? 10);
const beforeAt = process.argv.indexOf('--before');
const beforeRoot = beforeAt > 0 ? `${process.argv[beforeAt + 1].replace(/\/$/, '')}/` : null;
const before = beforeRoot === null ? null : `${beforeRoot}dist/cli/main.js`;
if (before !== null && !existsSync(before)) {
  console.error(`bench/cli-startup.mjs: ${before} is missing; build that checkout first`);
  process.exit(1);
}
// The other checkout's bin too, when it has one built (its package.json names it).
const beforeBin = beforeRoot === null ? null : `${beforeRoot}${JSON.parse(readFileSync(`${beforeRoot}package.json`, 'utf8')).bin?.heliochron}`;
const hasBeforeBin = beforeBin !== null && existsSync(beforeBin);
// Whether V8 takes the code cache that the bin gives each command (src/cli/bin.ts; made by npm run build, not by the tests' set-up).
const binFolder = dirname(bin);
// Each in a fresh process: loading the program sets V8 flags for the command (src/cli/bin.ts, tierUpFlags).
const cacheWords = (args) => {
  const script =
    `const b = require(${JSON.stringify(bin)}); const d = b.cachedDataFor(${JSON.stringify(binFolder)}, ${JSON.stringify(args)});` +
    `console.log(d === undefined ? 'none' : b.loadProgram(${JSON.stringify(binFolder)}, d, ${JSON.stringify(args[0])}).script.cachedDataRejected ? 'rejected' : 'taken');`;
  const answer = spawnSync(process.execPath, ['-e', script], { encoding: 'utf8' }).stdout.trim();
  return { none: 'none (run npm run build to make the code caches)', rejected: 'rejected by this Node', taken: 'taken' }[answer] ?? `not known (${answer})`;
};
const out = mkdtempSync(join(tmpdir(), 'heliochron-startup-'));
const example = `${root}examples/marktgasse-print.yaml`;
const commands = [
  { name: 'sun', args: ['sun', '--lat', '47.62', '--lon', '9.35', '--elevation', '410', '--date', '1650-03-10', '--time', '10:30', '--clock', 'apparent'], target: 1.4 },
  { name: 'calendar', args: ['calendar', '1752-09-14', '--calendar', 'great-britain'] },
  { name: '--help', args: ['--help'] },
  { name: 'date (example)', args: ['date', example], target: 2.5 },
  { name: 'report (example)', args: ['report', example, '-o', join(out, 'report.html'), '--force'], target: 4 },
];
const cases = [
  { name: 'node -e 0', args: ['-e', '0'] },
  ...commands.flatMap((c) => [
    { name: `${c.name} (bin)`, args: [bin, ...c.args], target: c.target },
    { name: `${c.name} (tsc modules)`, args: [modules, ...c.args] },
    ...(before === null ? [] : [{ name: `${c.name} (before)`, args: [before, ...c.args] }]),
    ...(hasBeforeBin ? [{ name: `${c.name} (before, bin)`, args: [beforeBin, ...c.args] }] : []),
  ]),
];
const cpuAtExit = `${root}bench/cpu-at-exit.cjs`;

function once(args) {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, ['--require', cpuAtExit, ...args], { cwd: root, encoding: 'utf8' });
  const ms = performance.now() - t0;
  if (r.status !== 0) throw new Error(`${args.join(' ')} exited ${r.status}: ${r.stderr}`);
  const cpu = /cpu-at-exit (\d+(?:\.\d+)?)/.exec(r.stderr);
  return { ms, cpuMs: cpu === null ? NaN : Number(cpu[1]) };
}
const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

console.log(`code cache of the bin (${bin.slice(root.length)}): ${commands.filter((c) => c.target !== undefined).map((c) => `${c.name.split(' ')[0]} ${cacheWords(c.args)}`).join(', ')}`);
console.log(`machine: ${cpus().length} cores, load average ${loadavg()[0].toFixed(1)} at the start (other work on the machine slows every figure below)`);
const times = cases.map(() => []);
for (let i = 0; i < runs; i += 1) cases.forEach((c, k) => times[k].push(once(c.args))); // interleaved
rmSync(out, { recursive: true, force: true });
const base = median(times[0].map((t) => t.ms));
const baseCpu = median(times[0].map((t) => t.cpuMs));
console.log(`median of ${runs} runs each, interleaved; ratios to node -e 0 (elapsed ${base.toFixed(1)} ms, CPU ${baseCpu.toFixed(1)} ms)`);
for (const [k, c] of cases.entries()) {
  const m = median(times[k].map((t) => t.ms));
  const cpu = median(times[k].map((t) => t.cpuMs));
  const ratio = m / base;
  const cpuRatio = cpu / baseCpu;
  const verdict = c.target === undefined ? '' : `   target <= ${c.target}x   ${ratio <= c.target ? 'met' : cpuRatio <= c.target ? 'met in CPU time, not elapsed' : 'NOT met'}`;
  console.log(`${c.name.padEnd(30)} ${m.toFixed(1).padStart(7)} ms  x${ratio.toFixed(2).padEnd(5)}  CPU ${cpu.toFixed(1).padStart(6)} ms  x${cpuRatio.toFixed(2).padEnd(5)}${verdict}`);
}
// What `report` costs beyond `date` on the same example (its three charts, the HTML and the modules
// they need), in CPU time: the part of the report target that is the report's own work.
const cpuOf = (name) => median(times[cases.findIndex((c) => c.name === name)].map((t) => t.cpuMs));
const beyond = (how) => cpuOf(`report (example) (${how})`) - cpuOf(`date (example) (${how})`);
console.log(
  `report beyond date, CPU: ${beyond('bin').toFixed(1)} ms (bin), ${beyond('tsc modules').toFixed(1)} ms (tsc modules)` +
    (before === null ? '' : `, ${beyond('before').toFixed(1)} ms (before)`) +
    (hasBeforeBin ? `, ${beyond('before, bin').toFixed(1)} ms (before, bin)` : '') +
    `; the report target (<= 4x) leaves ${(4 * baseCpu - cpuOf('date (example) (bin)')).toFixed(1)} ms beyond date (bin)`,
);
