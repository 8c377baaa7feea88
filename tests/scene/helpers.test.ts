import { describe, expect, it } from 'vitest';
import { closestKey, editDistance, suggestKey } from '../../src/scene/didYouMean.js';
import { nestingDepth } from '../../src/scene/parseSceneText.js';
import { wallAzimuthFromMap } from '../../src/scene/wallFromMap.js';
import { expectClose } from '../helpers/expectClose.js';

describe('editDistance', () => {
  it('gives the Levenshtein distance of textbook pairs', () => {
    // Classic examples (common practice): kitten -> sitting needs 3 edits, flaw -> lawn needs 2.
    expect(editDistance('kitten', 'sitting')).toBe(3);
    expect(editDistance('flaw', 'lawn')).toBe(2);
    expect(editDistance('', 'abc')).toBe(3);
    expect(editDistance('same', 'same')).toBe(0);
  });
  it('stops early above its cap', () => {
    expect(editDistance('a'.repeat(40), 'b'.repeat(40), 3)).toBe(4);
  });
});

describe('suggestKey', () => {
  const rod = ['id', 'kind', 'note', 'wall', 'slopeDeg', 'side', 'sigmaDeg', 'pixels'];
  it('finds the key with its unit for a key written without one, in another unit, or in snake case', () => {
    expect(closestKey('slope', rod)).toBe('slopeDeg');
    expect(closestKey('slopeRad', rod)).toBe('slopeDeg');
    expect(closestKey('slope_deg', rod)).toBe('slopeDeg');
    expect(closestKey('SlopeDeg', rod)).toBe('slopeDeg');
    expect(closestKey('sigma', rod)).toBe('sigmaDeg');
    expect(closestKey('wallId', rod)).toBe('wall');
  });
  it('says the unit when the unit was missing or wrong, and not when only the spelling was', () => {
    expect(suggestKey('slopeRad', rod)).toBe('Did you mean "slopeDeg"? Angles are in degrees.');
    expect(suggestKey('slopDeg', rod)).toBe('Did you mean "slopeDeg"?');
  });
  it('suggests nothing for a key far from every allowed one', () => {
    expect(suggestKey('photographer', rod)).toBeUndefined();
  });
});

describe('wallAzimuthFromMap', () => {
  // Plane surveying (common practice): walking east along a wall, its right-hand side faces south.
  const cases: [string, [number, number], 'left' | 'right', number][] = [
    ['line east, facing right', [10, 0], 'right', 180],
    ['line east, facing left', [10, 0], 'left', 0],
    ['line north, facing right', [0, 10], 'right', 90],
    ['line north, facing left', [0, 10], 'left', 270],
    ['line south-west, facing right', [-10, -10], 'right', 315],
  ];
  for (const [name, to, outward, expected] of cases) {
    it(`gives the outward normal of a ${name}: ${expected} deg`, () => {
      const { azimuthDeg } = wallAzimuthFromMap({ fromM: [0, 0], toM: to, outward }, 0, 'walls[0].mapPoints');
      expectClose(azimuthDeg, expected, 1e-9, name);
    });
  }
  it('adds the map north correction and wraps into [0, 360)', () => {
    const { azimuthDeg, source } = wallAzimuthFromMap({ fromM: [0, 0], toM: [10, 0], outward: 'left' }, -3, 'walls[0].mapPoints');
    expectClose(azimuthDeg, 357, 1e-9, 'corrected azimuth');
    expect(source).toContain('map north correction -3 deg');
  });
  it('swapping the two points and the side gives the same wall', () => {
    const a = wallAzimuthFromMap({ fromM: [2, 3], toM: [7, -4], outward: 'left' }, 1, 'p').azimuthDeg;
    const b = wallAzimuthFromMap({ fromM: [7, -4], toM: [2, 3], outward: 'right' }, 1, 'p').azimuthDeg;
    expectClose(a, b, 1e-9, 'same wall both ways');
  });
});

describe('nestingDepth', () => {
  it("counts the lists and maps of the parser's own syntax tree, not brackets inside quotes or comments", () => {
    expect(nestingDepth('a: [[1]]').depth).toBe(3);
    expect(nestingDepth('a:\n  b:\n    c: 1\n').depth).toBe(3);
    expect(nestingDepth('a: "[[[[[[" # {{{{{{\n').depth).toBe(1);
    expect(nestingDepth('- - - x').depth).toBe(3);
    expect(nestingDepth('title: the Tanners\' Hall [print]').depth).toBe(1);
  });
});