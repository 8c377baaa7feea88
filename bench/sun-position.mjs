#!/usr/bin/env node
/**
 * Calls per second of CPU time (this process's, so that other work on the machine disturbs it
 * less than elapsed time) of the full sun model: sunPosition (the library's pipeline evaluated without
 * its objects, src/ephemeris/sunOfDate.ts) beside sunPositionByEngine (astronomy-engine's own
 * calls, the same numbers), interleaved in rounds in one run, and the bytes each allocates per
 * call (V8's sampling heap profiler, objects collected by minor and major GCs included; an
 * estimate from samples every 256 bytes). Also the fast model (fastSunPosition) and Delta T.
 * Build first: npx tsc -p tsconfig.json. Usage: node bench/sun-position.mjs [calls per round]
 */
import { Session } from 'node:inspector/promises';
import { loadavg, cpus } from 'node:os';
const { sunPosition, sunPositionByEngine } = await import('../dist/ephemeris/sunPosition.js');
const { fastSunPosition } = await import('../dist/ephemeris/fastSun.js');
const { deltaTAtJdUT } = await import('../dist/time/timeScales.js');

const n = Number(process.argv[2] ?? 20000);
const rounds = 9;
const site = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 };
const jdStart = 2323778.5; // 1650-03-10
const dT = deltaTAtJdUT(jdStart).seconds;
let sink = 0;

const cases = [
  { name: 'sunPosition (full)', f: (jd) => sunPosition(jd, site).azimuthDeg },
  { name: 'sunPositionByEngine', f: (jd) => sunPositionByEngine(jd, site).azimuthDeg },
  { name: 'fastSunPosition', f: (jd) => fastSunPosition(jd, site, dT).azimuthDeg },
  { name: 'deltaTAtJdUT', f: (jd) => deltaTAtJdUT(jd).seconds },
];

function median(xs) {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

console.log(`machine: ${cpus().length} cores, load average ${loadavg()[0].toFixed(1)} at the start (only the ratios of this run mean anything)`);
for (const c of cases) for (let i = 0; i < 3000; i += 1) sink += c.f(jdStart + i * 0.0137); // warm-up
const perSecond = cases.map(() => []);
for (let r = 0; r < rounds; r += 1) {
  cases.forEach((c, k) => {
    const c0 = process.cpuUsage();
    for (let i = 0; i < n; i += 1) sink += c.f(jdStart + (r * n + i) * 0.0137);
    const used = process.cpuUsage(c0);
    perSecond[k].push(n / ((used.user + used.system) / 1e6));
  });
}

/** Bytes allocated per call: the sampling heap profiler's total (collected objects included) over `calls` calls. */
async function bytesPerCall(f, calls) {
  const session = new Session();
  session.connect();
  await session.post('HeapProfiler.enable');
  await session.post('HeapProfiler.startSampling', { samplingInterval: 256, includeObjectsCollectedByMinorGC: true, includeObjectsCollectedByMajorGC: true });
  for (let i = 0; i < calls; i += 1) sink += f(jdStart + i * 0.0137);
  const { profile } = await session.post('HeapProfiler.stopSampling');
  await session.post('HeapProfiler.disable');
  session.disconnect();
  let total = 0;
  const inEngine = { bytes: 0 };
  const walk = (node, engine) => {
    const here = engine || node.callFrame.url.includes('astronomy-engine');
    total += node.selfSize;
    if (here) inEngine.bytes += node.selfSize;
    for (const child of node.children) walk(child, here);
  };
  walk(profile.head, false);
  return { perCall: total / calls, engine: inEngine.bytes / calls };
}

const full = median(perSecond[1]);
const allocCalls = 20000;
for (const [k, c] of cases.entries()) {
  const rate = median(perSecond[k]);
  const alloc = k < 2 ? await bytesPerCall(c.f, allocCalls) : null;
  const allocText = alloc ? `   ${alloc.perCall.toFixed(0).padStart(6)} B/call allocated (${alloc.engine.toFixed(0)} B inside astronomy-engine)` : '';
  console.log(`${c.name.padEnd(22)} ${Math.round(rate).toString().padStart(10)} calls per CPU second (median of ${rounds} interleaved rounds of ${n})   x${(rate / full).toFixed(2)} of sunPositionByEngine${allocText}`);
}
if (!Number.isFinite(sink)) console.log('(sink)');
