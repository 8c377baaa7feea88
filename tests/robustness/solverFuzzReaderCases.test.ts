/**
 * The date solver and the proposal check on every scene the reader accepts from its own fuzz
 * cases (tests/scene/fuzzCases.ts, seeded). The contract checked is in solverFuzzRun.ts.
 */
import { describe, expect, it } from 'vitest';
import { runSceneFuzz } from '../scene/fuzzCases.js';
import { runAll, tally } from './solverFuzzRun.js';

describe('the solver and the proposal check under the reader\'s fuzz cases', () => {
  const fuzz = runSceneFuzz({ numRuns: 13_000 });

  it('answer every scene the reader accepts from its fuzz cases, or refuse it with a typed error', () => {
    const r = runAll(fuzz.accepted);
    const t = tally(r.outcomes);
    const solved = r.outcomes.filter((o) => o.kind === 'solved').length;
    // eslint-disable-next-line no-console
    console.log(
      `solver fuzz (reader cases): ${fuzz.tried} tried, ${fuzz.rejected} rejected by the reader, ${fuzz.accepted.length} accepted ` +
        `(${r.distinct} distinct); solved ${solved}, refused by the solver ${r.outcomes.length - solved}; ${JSON.stringify(t)}; ` +
        `slowest call ${r.slowestMs.toFixed(0)} ms, total ${(r.totalMs / 1000).toFixed(1)} s`,
    );
    expect(fuzz.accepted.length).toBeGreaterThanOrEqual(1000);
    expect(r.outcomes.length).toBe(fuzz.accepted.length);
    expect(solved).toBeGreaterThan(fuzz.accepted.length / 2);
  });
});
