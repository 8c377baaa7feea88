/**
 * Contour lines of a sampled scalar field by marching squares (Lorensen and Cline, "Marching
 * cubes", SIGGRAPH 1987, in its two-dimensional form): each grid cell whose corners lie on both
 * sides of the level contributes one or two straight segments, their ends found by linear
 * interpolation along the cell edges. Ambiguous (saddle) cells are decided by the mean of the
 * four corners. Cells with a non-finite corner are skipped.
 */

/**
 * The smallest value of a row, NaN when a value is NaN: Math.min(...row) for every comparison made
 * with it here (it may differ in the sign of a zero only), without spreading the row into arguments,
 * which boxes every double of it as a new heap number (garbage for the collector, a grid's worth per pass).
 * @example rowMinimum([3, 1, Infinity]) // 1; rowMinimum([]) // Infinity; rowMinimum([1, NaN]) // NaN
 */
export function rowMinimum(row: readonly number[]): number {
  let m = Infinity;
  for (let i = 0; i < row.length; i += 1) {
    const v = row[i];
    if (v < m) m = v;
    else if (v !== v) return NaN; // NaN: as Math.min
  }
  return m;
}

/** A field sampled at xs[i], ys[j]: values[j][i]. */
export interface SampledField {
  readonly xs: readonly number[];
  readonly ys: readonly number[];
  readonly values: readonly (readonly number[])[];
}

export type Segment = readonly [readonly [number, number], readonly [number, number]];

/**
 * Segments of the level-`level` contour, in the field's own coordinates.
 * @example isolineSegments({ xs: [0, 1], ys: [0, 1], values: [[0, 2], [0, 2]] }, 1) // [[[0.5, 0], [0.5, 1]]]
 */
export function isolineSegments(field: SampledField, level: number): Segment[] {
  const { xs, ys, values } = field;
  const out: Segment[] = [];
  // A square gives a segment only when a corner is not above the level (at or below it, or NaN):
  // on each row, the first and last such column; a pair of rows with none is skipped whole, and
  // otherwise only the squares between them are looked at (in the same order).
  const first: number[] = [];
  const last: number[] = [];
  for (const row of values) {
    let a = -1;
    let b = -1;
    for (let i = 0; i < row.length; i += 1) {
      if (row[i] > level) continue;
      if (a < 0) a = i;
      b = i;
    }
    first.push(a);
    last.push(b);
  }
  for (let j = 0; j + 1 < ys.length; j += 1) {
    if (first[j] < 0 && first[j + 1] < 0) continue;
    const lower = values[j];
    const upper = values[j + 1];
    const from = Math.max(0, Math.min(first[j] < 0 ? Infinity : first[j], first[j + 1] < 0 ? Infinity : first[j + 1]) - 1);
    const to = Math.max(last[j], last[j + 1]); // the square (i, i + 1) with i + 1 = to is the last to hold such a corner
    for (let i = from; i + 1 < xs.length && i <= to; i += 1) {
      const v0 = lower[i]; // (x0, y0)
      const v1 = lower[i + 1]; // (x1, y0)
      const v2 = upper[i + 1]; // (x1, y1)
      const v3 = upper[i]; // (x0, y1)
      const code = (v0 > level ? 1 : 0) | (v1 > level ? 2 : 0) | (v2 > level ? 4 : 0) | (v3 > level ? 8 : 0);
      // Most cells lie wholly on one side: tested first, as they give no segment whatever their corners.
      if (code === 0 || code === 15) continue;
      if (!Number.isFinite(v0) || !Number.isFinite(v1) || !Number.isFinite(v2) || !Number.isFinite(v3)) continue;
      const x0 = xs[i];
      const x1 = xs[i + 1];
      const y0 = ys[j];
      const y1 = ys[j + 1];
      const t = (a: number, b: number): number => (a === b ? 0.5 : (level - a) / (b - a));
      // Edge points: bottom (v0-v1), right (v1-v2), top (v3-v2), left (v0-v3).
      const bottom = (): [number, number] => [x0 + t(v0, v1) * (x1 - x0), y0];
      const right = (): [number, number] => [x1, y0 + t(v1, v2) * (y1 - y0)];
      const top = (): [number, number] => [x0 + t(v3, v2) * (x1 - x0), y1];
      const left = (): [number, number] => [x0, y0 + t(v0, v3) * (y1 - y0)];
      const centreAbove = (v0 + v1 + v2 + v3) / 4 > level;
      switch (code) {
        case 1: case 14: out.push([left(), bottom()]); break;
        case 2: case 13: out.push([bottom(), right()]); break;
        case 3: case 12: out.push([left(), right()]); break;
        case 4: case 11: out.push([right(), top()]); break;
        case 6: case 9: out.push([bottom(), top()]); break;
        case 7: case 8: out.push([left(), top()]); break;
        case 5: // v0 and v2 above
          if (centreAbove) out.push([left(), top()], [bottom(), right()]);
          else out.push([left(), bottom()], [right(), top()]);
          break;
        case 10: // v1 and v3 above
          if (centreAbove) out.push([left(), bottom()], [right(), top()]);
          else out.push([left(), top()], [bottom(), right()]);
          break;
      }
    }
  }
  return out;
}

/** Horizontal runs of grid cells where `inside(j, i)` holds, one rectangle per run: [i0, i1) on row j. */
export function cellRuns(rows: number, cols: number, inside: (j: number, i: number) => boolean): { j: number; i0: number; i1: number }[] {
  return cellRunsByClass(rows, cols, (j, i) => (inside(j, i) ? 1 : -1))[1] ?? [];
}

/**
 * The runs of cellRuns for every class at once, in one pass: `classOf(j, i)` gives a cell's class
 * (a small whole number; negative: none), and entry k of the result lists the runs of class k, in
 * the order cellRuns gives them (by row, then from left to right). `rowWithoutClass(j)`, when
 * given, names rows known to hold no cell of any class, which are passed over unread.
 */
export function cellRunsByClass(
  rows: number,
  cols: number,
  classOf: (j: number, i: number) => number,
  rowWithoutClass?: (j: number) => boolean,
): { j: number; i0: number; i1: number }[][] {
  const out: { j: number; i0: number; i1: number }[][] = [];
  for (let j = 0; j < rows; j += 1) {
    if (rowWithoutClass?.(j) === true) continue;
    let start = 0;
    let current = cols > 0 ? classOf(j, 0) : -1;
    for (let i = 1; i <= cols; i += 1) {
      const k = i < cols ? classOf(j, i) : -1;
      if (k === current) continue;
      if (current >= 0) (out[current] ??= []).push({ j, i0: start, i1: i });
      start = i;
      current = k;
    }
  }
  return out;
}

/**
 * The runs of cellRuns for the cells whose value is at or below `level` (not NaN), read straight
 * from the values: the same runs, in the same order, as
 * cellRunsByClass(rows, cols, (j, i) => (values[j][i] <= level ? 0 : -1))[0] ?? [].
 * @example runsAtOrBelow([[2, 0.5, 0.7, 3]], 1) // [{ j: 0, i0: 1, i1: 3 }]
 */
export function runsAtOrBelow(values: readonly (readonly number[])[], level: number): { j: number; i0: number; i1: number }[] {
  const out: { j: number; i0: number; i1: number }[] = [];
  for (let j = 0; j < values.length; j += 1) {
    const row = values[j];
    let start = -1;
    for (let i = 0; i < row.length; i += 1) {
      if (row[i] <= level) {
        if (start < 0) start = i;
      } else if (start >= 0) {
        out.push({ j, i0: start, i1: i });
        start = -1;
      }
    }
    if (start >= 0) out.push({ j, i0: start, i1: row.length });
  }
  return out;
}
