#!/usr/bin/env node
/**
 * Cost of a scene with many observations: copies of the Salt House observations
 * (examples/salt-house-sketch.yaml: four shadows painted from one morning's light and one figure
 * lit from the other side) repeated until the scene has N observations, solved with the
 * consistency (leave-one-out) test on. Times are measured side by side in one run.
 *
 * Run after `npx tsc -p tsconfig.json`:  node bench/large-scenes.mjs [N ...]
 * Targets (issue: large scenes): cost at most linear in N - 1,000 observations at most 12 times
 * the cost of 100 - and a 1,000-observation scene answered in under 10 s.
 */
import { largeScene } from './large-scenes-lib.mjs';
import { solveDates } from '../dist/solver/solveDates.js';
import { loadavg, cpus } from 'node:os';

console.log(`machine: ${cpus().length} cores, load average ${loadavg()[0].toFixed(1)} at the start (other work on the machine slows every figure below)`);

const sizes = process.argv.slice(2).map(Number).filter((n) => n > 0);
const ns = sizes.length ? sizes : [10, 100, 1000];
solveDates(largeScene(5)); // warm-up (the code optimised, as in a long session; a fresh process adds about 0.3 s)

for (const [label, consistent] of [['copies of all five (nothing fits: the figure)', false], ['copies of the four consistent ones (fits)', true]]) {
  console.log(`Salt House observations, ${label}; leave-one-out test on:`);
  const ms = new Map();
  for (const n of ns) {
    const scene = largeScene(n, consistent);
    const t0 = performance.now();
    const answer = solveDates(scene);
    const t = performance.now() - t0;
    ms.set(n, t);
    const c = answer.candidates[0];
    const best = c ? `${c.civilDate.year}-${String(c.civilDate.month).padStart(2, '0')}-${String(c.civilDate.day).padStart(2, '0')}` : '-';
    console.log(`  ${String(n).padStart(5)} observations: ${(t / 1000).toFixed(2).padStart(6)} s   (${answer.status}, best ${best}, flagged ${answer.consistency.flaggedIds.length})`);
  }
  if (ms.has(100) && ms.has(1000)) {
    const ratio = ms.get(1000) / ms.get(100);
    console.log(`  cost of 1,000 / cost of 100: ${ratio.toFixed(1).padStart(5)}     target <= 12     measured/target ${(ratio / 12).toFixed(2)}   ${ratio <= 12 ? 'met' : 'NOT met'}`);
  }
  if (ms.has(1000)) {
    const s = ms.get(1000) / 1000;
    console.log(`  1,000 observations:          ${s.toFixed(2).padStart(5)} s   target < 10 s    measured/target ${(s / 10).toFixed(2)}   ${s < 10 ? 'met' : 'NOT met'}`);
  }
}
