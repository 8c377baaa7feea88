/**
 * Fuzz test of the scene reader (fast-check): malformed, truncated and mutated
 * scene files in YAML and JSON. Contract: no exception other than
 * InvalidInputError; every refusal names a path or the file, quotes the value
 * and says what is allowed; no case hangs (a 30 s guard, not a speed target:
 * bench/scene-reader.mjs measures speed); and every scene the reader accepts is
 * also valid under docs/scene.schema.json.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { runSceneFuzz } from './fuzzCases.js';
import { schemaViolation } from './miniSchema.js';

const schema = JSON.parse(readFileSync(new URL('../../docs/scene.schema.json', import.meta.url), 'utf8'));
const NUM_RUNS = 12_000;

describe('the scene reader under fuzzing', () => {
  it(`refuses malformed scenes cleanly and accepts only schema-valid ones (${NUM_RUNS} cases)`, () => {
    const result = runSceneFuzz({
      numRuns: NUM_RUNS,
      check: (_scene, text) => {
        const violation = schemaViolation(schema, parse(text));
        if (violation !== null) throw new Error(`reader accepted what the schema refuses (${violation}):\n${text.slice(0, 400)}`);
      },
    });
    // eslint-disable-next-line no-console
    console.log(
      `scene fuzz: ${result.tried} cases tried, ${result.rejected} rejected, ${result.accepted.length} accepted; ` +
        `slowest ${result.slowestMs.toFixed(1)} ms, total ${(result.totalMs / 1000).toFixed(1)} s`,
    );
    expect(result.tried).toBe(NUM_RUNS);
    expect(result.rejected + result.accepted.length).toBe(result.tried);
    // Both outcomes must be exercised: the mutations reach the validation and some survive it.
    expect(result.rejected).toBeGreaterThan(NUM_RUNS / 2);
    expect(result.accepted.length).toBeGreaterThan(50);
  });
});
