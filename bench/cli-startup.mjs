#!/usr/bin/env node
/**
 * Start-up time of `heliochron sun` against a bare `node -e 0`, measured side by side in
 * one run (median of N runs each, interleaved). Build first: npx tsc -p tsconfig.json.
 * Target: the sun command answers in well under half a second.
 * Usage: node bench/cli-startup.mjs [runs]
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';

const root = fileURLToPath(new URL('../', import.meta.url));
const cli = `${root}dist/cli/main.js`;
if (!existsSync(cli)) {
  console.error('bench/cli-startup.mjs: dist/cli/main.js is missing; run npx tsc -p tsconfig.json first');
  process.exit(1);
}
const runs = Number(process.argv[2] ?? 10);
const sunArgs = [cli, 'sun', '--lat', '47.62', '--lon', '9.35', '--elevation', '410', '--date', '1650-03-10', '--time', '10:30', '--clock', 'apparent'];
const cases = [
  { name: 'node -e 0', args: ['-e', '0'] },
  { name: 'heliochron sun ...', args: sunArgs },
  { name: 'heliochron --help', args: [cli, '--help'] },
];

function once(args) {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, args, { cwd: root, encoding: 'utf8' });
  const ms = performance.now() - t0;
  if (r.status !== 0) throw new Error(`${args.join(' ')} exited ${r.status}: ${r.stderr}`);
  return ms;
}
const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

const times = cases.map(() => []);
for (let i = 0; i < runs; i += 1) cases.forEach((c, k) => times[k].push(once(c.args))); // interleaved
const base = median(times[0]);
console.log(`median of ${runs} runs each, interleaved`);
for (const [k, c] of cases.entries()) {
  const m = median(times[k]);
  console.log(`${c.name.padEnd(22)} ${m.toFixed(1).padStart(8)} ms   x${(m / base).toFixed(2)} of node -e 0   +${(m - base).toFixed(1)} ms`);
}
