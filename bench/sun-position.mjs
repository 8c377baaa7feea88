#!/usr/bin/env node
/**
 * Calls per second of the full sun model (sunPosition), the fast model (fastSunPosition)
 * and the equation of time, side by side in one run, on the compiled library.
 * Build first: npx tsc -p tsconfig.json. Usage: node bench/sun-position.mjs [calls]
 */
import { performance } from 'node:perf_hooks';
const { sunPosition } = await import('../dist/ephemeris/sunPosition.js');
const { fastSunPosition } = await import('../dist/ephemeris/fastSun.js');
const { deltaTAtJdUT } = await import('../dist/time/timeScales.js');

const n = Number(process.argv[2] ?? 100000);
const site = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 };
const jdStart = 2323778.5; // 1650-03-10
const dT = deltaTAtJdUT(jdStart).seconds;
let sink = 0;
function rate(name, f) {
  for (let i = 0; i < 2000; i += 1) sink += f(jdStart + i * 0.0137); // warm-up
  const t0 = performance.now();
  for (let i = 0; i < n; i += 1) sink += f(jdStart + i * 0.0137);
  const s = (performance.now() - t0) / 1000;
  return { name, perSecond: n / s };
}
const results = [
  rate('sunPosition (full)', (jd) => sunPosition(jd, site).azimuthDeg),
  rate('fastSunPosition', (jd) => fastSunPosition(jd, site, dT).azimuthDeg),
  rate('deltaTAtJdUT', (jd) => deltaTAtJdUT(jd).seconds),
];
const full = results[0].perSecond;
for (const r of results) console.log(`${r.name.padEnd(22)} ${Math.round(r.perSecond).toString().padStart(10)} calls/s   x${(r.perSecond / full).toFixed(1)} of full`);
if (!Number.isFinite(sink)) console.log('(sink)');
