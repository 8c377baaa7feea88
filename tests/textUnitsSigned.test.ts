import { describe, expect, it } from 'vitest';
import { signedFixed } from '../src/textUnits.js';

describe('signedFixed', () => {
  it('writes the sign of every value and never "-0.00" (common practice in residual tables: a rounded zero has no direction)', () => {
    expect(signedFixed(-0.001, 2)).toBe('+0.00');
    expect(signedFixed(-0.004999, 2)).toBe('+0.00');
    expect(signedFixed(0, 1)).toBe('+0.0');
    expect(signedFixed(-0.26, 1)).toBe('-0.3');
    expect(signedFixed(1.234, 2)).toBe('+1.23');
    expect(signedFixed(-1.235, 0)).toBe('-1');
  });
});
