import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { cellRuns, cellRunsByClass, isolineSegments, rowMinimum, runsAtOrBelow } from '../../src/charts/contour.js';
import { ellipsePoints, semiAxisVectors } from '../../src/charts/ellipse.js';
import { expectClose } from '../helpers/expectClose.js';

function grid(n: number, lo: number, hi: number): number[] {
  return Array.from({ length: n }, (_, i) => lo + ((hi - lo) * i) / (n - 1));
}

describe('isolineSegments (marching squares)', () => {
  it('traces the unit circle of x^2 + y^2 = 1: every end on the circle, total length 2 pi', () => {
    const xs = grid(81, -2, 2);
    const ys = grid(81, -2, 2);
    const values = ys.map((y) => xs.map((x) => x * x + y * y));
    const segments = isolineSegments({ xs, ys, values }, 1);
    expect(segments.length).toBeGreaterThan(40);
    let length = 0;
    for (const [p, q] of segments) {
      // linear interpolation of a quadratic over a 0.05 cell: radius error below 0.002 (h^2/8 with the curvature 2)
      expectClose(Math.hypot(p[0], p[1]), 1, 0.002, 'radius of a contour point');
      length += Math.hypot(q[0] - p[0], q[1] - p[1]);
    }
    expectClose(length, 2 * Math.PI, 0.01, 'contour length');
  });
  it('puts the crossing where linear interpolation along the edge puts it', () => {
    expect(isolineSegments({ xs: [0, 1], ys: [0, 1], values: [[0, 2], [0, 2]] }, 1)).toEqual([[[0.5, 0], [0.5, 1]]]);
    expect(isolineSegments({ xs: [0, 10], ys: [0, 1], values: [[0, 4], [0, 4]] }, 1)).toEqual([[[2.5, 0], [2.5, 1]]]);
  });
  describe('edge cases', () => {
    it('gives nothing for a field entirely above or below the level, and skips cells with NaN', () => {
      expect(isolineSegments({ xs: [0, 1], ys: [0, 1], values: [[5, 5], [5, 5]] }, 1)).toEqual([]);
      expect(isolineSegments({ xs: [0, 1], ys: [0, 1], values: [[0, NaN], [2, 2]] }, 1)).toEqual([]);
    });
    it('draws the same segments through a row of values above the level whether they are large or +Infinity', () => {
      // Rows that never reach the level are passed over whole; next to a row that does, their cells still count.
      const xs = [0, 1, 2];
      const ys = [0, 1, 2];
      const finite = isolineSegments({ xs, ys, values: [[9, 9, 9], [0, 9, 9], [9, 9, 9]] }, 1);
      expect(finite.length).toBe(2);
      expect(isolineSegments({ xs, ys, values: [[Infinity, Infinity, Infinity], [0, 9, 9], [9, 9, 9]] }, 1)).toEqual(finite.slice(1));
      expect(isolineSegments({ xs, ys, values: [[9, 9, 9], [9, 9, 9], [9, 9, 9]] }, 1)).toEqual([]);
    });
    it('resolves a saddle cell into two segments', () => {
      expect(isolineSegments({ xs: [0, 1], ys: [0, 1], values: [[2, 0], [0, 2]] }, 1).length).toBe(2);
    });
  });
});

describe('cellRuns', () => {
  it('merges neighbouring cells of a row into one run', () => {
    const inside = [
      [true, true, false, true],
      [false, false, false, false],
      [true, true, true, true],
    ];
    expect(cellRuns(3, 4, (j, i) => inside[j][i])).toEqual([
      { j: 0, i0: 0, i1: 2 },
      { j: 0, i0: 3, i1: 4 },
      { j: 2, i0: 0, i1: 4 },
    ]);
  });
});

describe('cellRunsByClass', () => {
  it('gives for every class the runs cellRuns gives for that class alone', () => {
    const classes = [
      [0, 0, 1, -1, 1],
      [-1, -1, -1, -1, -1],
      [2, 2, 0, 0, 1],
    ];
    const byClass = cellRunsByClass(3, 5, (j, i) => classes[j][i]);
    for (const k of [0, 1, 2]) expect(byClass[k]).toEqual(cellRuns(3, 5, (j, i) => classes[j][i] === k));
    expect(byClass[0]).toEqual([{ j: 0, i0: 0, i1: 2 }, { j: 2, i0: 2, i1: 4 }]);
  });
  it('passes over the rows said to hold no class without reading them', () => {
    const read: number[] = [];
    const runs = cellRunsByClass(3, 2, (j) => (read.push(j), 0), (j) => j === 1);
    expect(read).not.toContain(1);
    expect(runs[0]).toEqual([{ j: 0, i0: 0, i1: 2 }, { j: 2, i0: 0, i1: 2 }]);
  });
});

describe('ellipse points', () => {
  it('lie on the ellipse x^T C^-1 x = 1 of the covariance C built from the semi-axes', () => {
    const [a, b] = semiAxisVectors(3, 1, 30);
    // C = a a^T + b b^T for orthogonal semi-axis vectors (common practice: the eigen-decomposition of C).
    const c11 = a[0] * a[0] + b[0] * b[0];
    const c12 = a[0] * a[1] + b[0] * b[1];
    const c22 = a[1] * a[1] + b[1] * b[1];
    const det = c11 * c22 - c12 * c12;
    for (const [x, y] of ellipsePoints([10, -5], a, b, 36)) {
      const dx = x - 10;
      const dy = y + 5;
      expectClose((c22 * dx * dx - 2 * c12 * dx * dy + c11 * dy * dy) / det, 1, 1e-9, 'quadratic form');
    }
  });
  it('turns the major axis by the orientation angle', () => {
    const [a, b] = semiAxisVectors(2, 1, 90);
    expectClose(a[0], 0, 1e-12, 'a.x');
    expectClose(a[1], 2, 1e-12, 'a.y');
    expectClose(b[0], -1, 1e-12, 'b.x');
    expectClose(b[1], 0, 1e-12, 'b.y');
    const points = ellipsePoints([0, 0], a, b, 8);
    expect(points.length).toBe(9);
    expect(points[8]).toEqual(points[0]);
  });
});

describe('isolineSegments looks only between the cells at or below the level', () => {
  /** Every square scanned, the form before rows and columns were skipped (the reference). */
  function everySquare(xs: readonly number[], ys: readonly number[], values: readonly (readonly number[])[], level: number) {
    const out: [number, number, number, number][] = [];
    for (let j = 0; j + 1 < ys.length; j += 1) {
      for (let i = 0; i + 1 < xs.length; i += 1) {
        const corners = [values[j][i], values[j][i + 1], values[j + 1][i + 1], values[j + 1][i]];
        const code = corners.reduce((c, v, k) => c | (v > level ? 1 << k : 0), 0);
        if (code === 0 || code === 15 || !corners.every(Number.isFinite)) continue;
        out.push([j, i, code, 0]);
      }
    }
    return out;
  }
  it('gives the segments of every crossed square, in the same order, on random fields with NaN and Infinity (property test)', () => {
    const cell = fc.oneof(fc.double({ min: -3, max: 3, noNaN: true }), fc.constant(NaN), fc.constant(Infinity), fc.constant(99));
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 7 }), fc.integer({ min: 1, max: 7 }), fc.array(cell, { minLength: 49, maxLength: 49 }), fc.double({ min: -1, max: 1, noNaN: true }), (cols, rows, flat, level) => {
        const xs = grid(Math.max(2, cols), 0, 1).slice(0, cols);
        const ys = grid(Math.max(2, rows), 0, 1).slice(0, rows);
        const values = ys.map((_, j) => xs.map((__, i) => flat[j * 7 + i]));
        const segments = isolineSegments({ xs, ys, values }, level);
        // Each crossed square gives one segment, or two for a saddle (codes 5 and 10), in the order of the squares.
        const expected = everySquare(xs, ys, values, level).flatMap(([j, i, code]) => (code === 5 || code === 10 ? [[j, i], [j, i]] : [[j, i]]));
        expect(segments.length).toBe(expected.length);
        segments.forEach(([p, q], k) => {
          const [j, i] = expected[k];
          for (const [x, y] of [p, q]) {
            expect(x).toBeGreaterThanOrEqual(xs[i]);
            expect(x).toBeLessThanOrEqual(xs[i + 1]);
            expect(y).toBeGreaterThanOrEqual(ys[j]);
            expect(y).toBeLessThanOrEqual(ys[j + 1]);
          }
        });
      }),
      { numRuns: 3000 },
    );
  });
});

describe('runsAtOrBelow', () => {
  it('gives the runs of cellRunsByClass for the cells at or below a level, NaN and Infinity among them (property test)', () => {
    const cell = fc.oneof(fc.double({ min: -3, max: 3, noNaN: true }), fc.constant(NaN), fc.constant(Infinity), fc.constant(1));
    fc.assert(
      fc.property(fc.array(fc.array(cell, { minLength: 0, maxLength: 9 }), { minLength: 0, maxLength: 6 }), fc.double({ min: -1, max: 2, noNaN: true }), (ragged, level) => {
        const cols = ragged.length > 0 ? Math.min(...ragged.map((r) => r.length)) : 0;
        const values = ragged.map((r) => r.slice(0, cols));
        const reference = cellRunsByClass(values.length, cols, (j, i) => (values[j][i] <= level ? 0 : -1))[0] ?? [];
        expect(runsAtOrBelow(values, level)).toEqual(reference);
      }),
      { numRuns: 3000 },
    );
  });
});

describe('rowMinimum', () => {
  // Source: ECMA-262, Math.min (NaN when any argument is NaN; +Infinity with none).
  it('compares with any level as Math.min(...row) does, NaN and infinities included', () => {
    const rows: number[][] = [[], [Infinity, Infinity], [3, 1, Infinity], [1, NaN, 0], [NaN], [-0, 0], [0, -0], [-Infinity, 5], [2.5, 2.5000000001], [Infinity, NaN]];
    for (let k = 0; k < 200; k += 1) rows.push(Array.from({ length: 1 + (k % 37) }, (_, i) => ((k * 7919 + i * 104729) % 1000) / 37 - 5));
    for (const row of rows) {
      const m = Math.min(...row);
      const r = rowMinimum(row);
      expect(Number.isNaN(r)).toBe(Number.isNaN(m));
      if (!Number.isNaN(m)) expect(r === m).toBe(true); // the same value (a zero's sign aside)
      for (const level of [-Infinity, -1, 0, 1, 2.5, 11.829, Infinity]) {
        expect(r > level).toBe(m > level);
        expect(r <= level).toBe(m <= level);
        expect(r === level).toBe(m === level);
      }
    }
  });
});
