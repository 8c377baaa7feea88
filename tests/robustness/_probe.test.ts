import { it } from 'vitest';
import { runSceneFuzz } from '../scene/fuzzCases.js';
import { solveDates } from '../../src/solver/solveDates.js';
it('probe', () => {
  const t0 = performance.now();
  const r = runSceneFuzz({ numRuns: 3000 });
  console.log('fuzz', r.tried, r.accepted.length, (performance.now()-t0).toFixed(0));
  const times: number[] = [];
  let errs = 0;
  for (const s of r.accepted.slice(0, 60)) {
    const t = performance.now();
    try { solveDates(s, { consistency: false, profileScans: false }); } catch (e) { errs++; console.log(String(e).slice(0,200)); }
    times.push(performance.now() - t);
  }
  times.sort((a,b)=>a-b);
  console.log('solve fast', errs, times[0].toFixed(0), times[30].toFixed(0), times[59].toFixed(0), times.reduce((a,b)=>a+b,0).toFixed(0));
  const times2: number[] = [];
  for (const s of r.accepted.slice(0, 30)) {
    const t = performance.now();
    try { solveDates(s); } catch (e) { console.log(String(e).slice(0,200)); }
    times2.push(performance.now() - t);
  }
  times2.sort((a,b)=>a-b);
  console.log('solve full', times2[0].toFixed(0), times2[15].toFixed(0), times2[29].toFixed(0), times2.reduce((a,b)=>a+b,0).toFixed(0));
});
