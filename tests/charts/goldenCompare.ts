/**
 * Comparing generated SVG/HTML with a stored golden file after rounding: the text between
 * numbers must be identical, and every number must agree within a tolerance (default 0.11,
 * just over one unit of the first decimal that the charts write), so that a last-digit flip
 * of floating-point rounding on another machine does not fail the test, while any change of
 * structure, wording or drawing does.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

const NUMBER = /-?\d+(?:\.\d+)?/g;

interface Tokens {
  readonly texts: string[];
  readonly numbers: number[];
  readonly offsets: number[];
}

function tokens(s: string): Tokens {
  const texts: string[] = [];
  const numbers: number[] = [];
  const offsets: number[] = [];
  let last = 0;
  for (const m of s.matchAll(NUMBER)) {
    texts.push(s.slice(last, m.index));
    numbers.push(Number(m[0]));
    offsets.push(m.index ?? 0);
    last = (m.index ?? 0) + m[0].length;
  }
  texts.push(s.slice(last));
  return { texts, numbers, offsets };
}

/** null when alike, else a message showing the first difference with context. */
export function goldenDifference(actual: string, expected: string, tolerance = 0.11): string | null {
  const a = tokens(actual);
  const e = tokens(expected);
  const context = (s: string, at: number): string => JSON.stringify(s.slice(Math.max(0, at - 80), at + 80));
  const n = Math.min(a.texts.length, e.texts.length);
  for (let i = 0; i < n; i += 1) {
    if (a.texts[i] !== e.texts[i]) {
      const at = i === 0 ? 0 : a.offsets[i - 1];
      return `text differs near token ${i}:\n  actual:   ${context(actual, at)}\n  expected: ${context(expected, i === 0 ? 0 : e.offsets[i - 1])}`;
    }
    if (i < a.numbers.length && i < e.numbers.length && Math.abs(a.numbers[i] - e.numbers[i]) > tolerance) {
      return `number ${i} differs: ${a.numbers[i]} against ${e.numbers[i]}\n  actual:   ${context(actual, a.offsets[i])}\n  expected: ${context(expected, e.offsets[i])}`;
    }
  }
  if (a.texts.length !== e.texts.length) return `lengths differ: ${a.numbers.length} numbers against ${e.numbers.length}`;
  return null;
}

/** Whether golden files are to be rewritten (only on explicit request, never in CI). */
export function updatingGolden(): boolean {
  const update = process.env.HELIOCHRON_UPDATE_GOLDEN === '1';
  if (update && process.env.CI) throw new Error('HELIOCHRON_UPDATE_GOLDEN=1 is refused in CI: golden files are regenerated only by hand and reviewed');
  return update;
}

/**
 * Compare with the golden file at `path`, or rewrite it when HELIOCHRON_UPDATE_GOLDEN=1.
 * @returns null when alike (or rewritten), else the difference in words
 */
export function checkGolden(path: string, actual: string): string | null {
  if (updatingGolden()) {
    mkdirSync(dirname(path), { recursive: true });
    writeFileSync(path, actual);
    return null;
  }
  if (!existsSync(path)) {
    return `golden file ${path} is missing; create it with HELIOCHRON_UPDATE_GOLDEN=1 npx vitest run tests/charts/golden.test.ts and review it`;
  }
  return goldenDifference(actual, readFileSync(path, 'utf8'));
}
