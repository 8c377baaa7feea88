#!/usr/bin/env node
/**
 * A Monte Carlo of pixel clicks (src/image/propagation.ts through src/image/pixelObservations.ts):
 * 10,000 draws of every click of the Tanners' Hall photograph's lamp-bracket shadow on its wall
 * (examples/tanners-hall-photo: eight wall points and two shadow points, the wall's homography
 * refitted by the normalised DLT in every draw), and of its well post's shadow on the ground.
 * Run after `npx tsc -p tsconfig.json`:  node bench/pixel-monte-carlo.mjs
 * Target (issue: speed): 10,000 draws in at most 0.3 s. Median of 5 runs after a warm-up; the
 * process's CPU time is printed beside the elapsed time (on a machine shared with other work the
 * elapsed time includes waiting for a core).
 */
import { fileURLToPath } from 'node:url';
import { readSceneFile } from '../dist/cli/sceneFile.js';
import { rectifyPlane } from '../dist/image/planeInImage.js';
import { monteCarloPixelObservation } from '../dist/image/pixelObservations.js';
import { createRandom } from '../dist/math/random.js';
import { loadavg, cpus } from 'node:os';

console.log(`machine: ${cpus().length} cores, load average ${loadavg()[0].toFixed(1)} at the start (other work on the machine slows every figure below)`);

const root = fileURLToPath(new URL('../', import.meta.url));
const scene = readSceneFile(`${root}examples/tanners-hall-photo/tanners-hall-photo.yaml`);
const wall = scene.walls.find((w) => w.imagePlane);
const cases = [
  { obs: scene.observations.find((o) => o.kind === 'rod-shadow'), plane: rectifyPlane(wall.imagePlane, scene.image, 'wall', 'walls[0].imagePlane') },
  { obs: scene.observations.find((o) => o.kind === 'pole-shadow'), plane: rectifyPlane(scene.groundPlane, scene.image, 'ground', 'groundPlane') },
];
const DRAWS = 10000;
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
for (const { obs, plane } of cases) {
  monteCarloPixelObservation(obs, plane, 'observations[0]', createRandom(1), 500); // warm-up
  const ts = [];
  const cpu = [];
  let r;
  for (let i = 0; i < 5; i += 1) {
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    r = monteCarloPixelObservation(obs, plane, 'observations[0]', createRandom(7), DRAWS);
    const c = process.cpuUsage(c0);
    ts.push(performance.now() - t0);
    cpu.push((c.user + c.system) / 1000);
  }
  const s = median(ts) / 1000;
  const cpuS = median(cpu) / 1000;
  const spread = r.names.map((n, k) => `${n} ${r.values[k].toFixed(3)} +/- ${r.sigmas[k].toFixed(4)}`).join(', ');
  console.log(`${obs.id} (${obs.kind}), ${DRAWS} draws: ${s.toFixed(3)} s (CPU time of this process ${cpuS.toFixed(3)} s)   target <= 0.3 s   measured/target ${(s / 0.3).toFixed(2)}   ${s <= 0.3 ? 'met' : 'NOT met'}   (${spread})`);
}
