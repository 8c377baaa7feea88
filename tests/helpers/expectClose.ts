import { expect } from 'vitest';

/**
 * The one shared closeness assertion: |actual - expected| <= tolerance,
 * with a message that shows both values and the difference.
 */
export function expectClose(actual: number, expected: number, tolerance: number, what = 'value'): void {
  const diff = Math.abs(actual - expected);
  expect(
    diff <= tolerance,
    `${what}: got ${actual}, expected ${expected} +/- ${tolerance} (off by ${diff})`,
  ).toBe(true);
}
