/**
 * Stage A: the year-independent search. The geometric evidence fixes the sun's place in the
 * sky, and the sky place at a site depends on the date only through the declination and on
 * the hour only through the hour angle. So chi-square is first minimised over
 * (declination, hour angle, nuisances): a coarse grid over declination [-eps, +eps] (the
 * epoch's obliquity, Meeus 1998 eq. 22.2) and hour angle (-180, 180], every local minimum of
 * the grid kept (8-neighbour test, wrapping in hour angle), each refined by Levenberg-Marquardt,
 * duplicates merged. Cheap: about 1,700 evaluations of spherical astronomy and the residuals.
 *
 * The grid keeps every residual row at every point (`StageAGrid`), so that a rerun of the search
 * with observations left out (nothing fits: the search without each observation) sums the rows it
 * still has instead of evaluating the grid again: each row is a function of the sun's direction,
 * the nuisances at their priors and the clock assumption alone, so its value is the same number
 * in the reduced model, and the sums are taken in the reduced model's own row order (the same
 * numbers, bit for bit, as evaluating the grid afresh).
 */
import type { ClockKind } from '../scene/types.js';
import { residualRowCount, type EvidenceModel } from './evidenceModel.js';
import { refineStageA, writeStageAResiduals, type StageAContext } from './fitting.js';

export interface StageAMinimum {
  readonly declinationDeg: number;
  readonly hourAngleDeg: number;
  readonly nuisances: readonly number[];
  /** Chi-square plus soft penalty of the year-independent model. */
  readonly objective: number;
  readonly converged: boolean;
  readonly iterations: number;
}

export interface StageAResult {
  readonly minima: readonly StageAMinimum[];
  readonly gridPoints: number;
  readonly evaluations: number;
  /** The grid with its rows, for reruns with observations left out; null when too large to keep, or summed from another. */
  readonly grid: StageAGrid | null;
  /** True when the grid was summed from a kept grid instead of evaluated. */
  readonly gridSummed: boolean;
}

/** The stage-A grid of one model and clock assumption with every residual row kept. */
export interface StageAGrid {
  readonly obliquityDeg: number;
  readonly rowCount: number;
  /** Residual row `row` at grid point `point` (declination-major order): values[point * rowCount + row]. */
  readonly values: Float64Array;
}

/** A grid to sum instead of evaluating: the grid of a larger model and, for each row of this model, its row there (-1: a prior, 0 on the grid). */
export interface StageAGridReuse {
  readonly grid: StageAGrid;
  readonly sources: Int32Array;
}

/** Grids with more residual rows than this are not kept (1,728 points x 256 rows = 3.5 MB). */
export const MAX_KEPT_GRID_ROWS = 256;

/** Grid steps: declination 2 deg, hour angle 5 deg (20 minutes). */
const DEC_STEP_DEG = 2;
const HA_STEP_DEG = 5;
/** Minima kept: at most this many, and only those within this much of the best. */
export const MAX_STAGE_A_MINIMA = 10;
export const STAGE_A_CUTOFF = 60;

/**
 * Every local minimum of the year-independent chi-square, refined and ranked.
 * @param obliquityDeg the obliquity of the epoch (bounds of the declination grid)
 * @param onProgress called after each declination row of the grid (done of total rows)
 */
export function stageA(
  model: EvidenceModel,
  assumed: ClockKind | null,
  zoneOffset: (zone: string) => number,
  obliquityDeg: number,
  reuse?: StageAGridReuse,
  onProgress?: (done: number, total: number) => void,
): StageAResult {
  const c: StageAContext = { model, assumed, zoneOffset };
  const prior = model.nuisances.map((n) => n.priorDeg);
  const nDec = Math.floor((2 * obliquityDeg) / DEC_STEP_DEG) + 1;
  const decs = Array.from({ length: nDec }, (_, i) => -obliquityDeg + (i * 2 * obliquityDeg) / (nDec - 1));
  const nHa = Math.round(360 / HA_STEP_DEG);
  const has = Array.from({ length: nHa }, (_, j) => -180 + HA_STEP_DEG / 2 + j * HA_STEP_DEG);
  const { grid, kept, summed } = gridValues(c, decs, has, prior, obliquityDeg, reuse, onProgress);
  let evaluations = nDec * nHa;
  const seeds: { i: number; j: number; v: number }[] = [];
  for (let i = 0; i < nDec; i += 1) {
    for (let j = 0; j < nHa; j += 1) {
      const v = grid[i][j];
      let isMin = true;
      for (let di = -1; di <= 1 && isMin; di += 1) {
        const ii = i + di;
        if (ii < 0 || ii >= nDec) continue;
        for (let dj = -1; dj <= 1; dj += 1) {
          if (di === 0 && dj === 0) continue;
          const jj = (j + dj + nHa) % nHa;
          if (grid[ii][jj] < v) {
            isMin = false;
            break;
          }
        }
      }
      if (isMin) seeds.push({ i, j, v });
    }
  }
  seeds.sort((a, b) => a.v - b.v);
  const refined: StageAMinimum[] = [];
  const gridBest = seeds.length ? seeds[0].v : 0;
  for (const s of seeds.slice(0, 2 * MAX_STAGE_A_MINIMA)) {
    if (s.v > gridBest + 4 * STAGE_A_CUTOFF) break; // far worse on the grid: not worth refining
    const lm = refineStageA(c, [decs[s.i], has[s.j], ...prior]);
    evaluations += lm.iterations * (2 * lm.x.length + 1);
    const m: StageAMinimum = {
      declinationDeg: lm.x[0],
      hourAngleDeg: lm.x[1],
      nuisances: lm.x.slice(2),
      objective: lm.chiSquare,
      converged: lm.converged,
      iterations: lm.iterations,
    };
    const dup = refined.find((r) => Math.abs(r.declinationDeg - m.declinationDeg) < 0.05 && Math.abs(r.hourAngleDeg - m.hourAngleDeg) < 0.1);
    if (!dup) refined.push(m);
  }
  refined.sort((a, b) => a.objective - b.objective);
  const best = refined.length > 0 ? refined[0].objective : 0;
  const minima = refined.filter((m) => m.objective <= best + STAGE_A_CUTOFF).slice(0, MAX_STAGE_A_MINIMA);
  return { minima, gridPoints: nDec * nHa, evaluations, grid: kept, gridSummed: summed };
}

/**
 * Chi-square plus penalty at every grid point: summed from a kept grid when one is given, else
 * evaluated (and its rows kept when there are at most MAX_KEPT_GRID_ROWS).
 */
function gridValues(
  c: StageAContext,
  decs: readonly number[],
  has: readonly number[],
  prior: readonly number[],
  obliquityDeg: number,
  reuse: StageAGridReuse | undefined,
  onProgress?: (done: number, total: number) => void,
): { grid: Float64Array[]; kept: StageAGrid | null; summed: boolean } {
  const nHa = has.length;
  const grid = decs.map(() => new Float64Array(nHa));
  if (reuse !== undefined && reuse.grid.obliquityDeg === obliquityDeg) {
    sumKeptGrid(grid, reuse, onProgress);
    return { grid, kept: null, summed: true };
  }
  // Every residual row of every point, kept for reruns when there are at most MAX_KEPT_GRID_ROWS rows;
  // else one point's rows at a time. Written in place: no array per point.
  const rowCount = residualRowCount(c.model);
  const keep = rowCount <= MAX_KEPT_GRID_ROWS;
  const values = keep ? new Float64Array(decs.length * nHa * rowCount) : null;
  evaluateGrid(c, decs, has, prior, grid, values, rowCount, onProgress);
  return { grid, kept: values === null ? null : { obliquityDeg, rowCount, values }, summed: false };
}

// The two loops over the grid are functions of their own, apart from gridValues' returns: V8 compiles a long
// loop while it runs (on-stack replacement), and code compiled there before a return was ever reached
// deoptimises at that return on every later solve.

/** Chi-square plus penalty at every grid point, summed from the kept rows of a previous grid (the rows `reuse.sources` names). */
function sumKeptGrid(grid: Float64Array[], reuse: StageAGridReuse, onProgress?: (done: number, total: number) => void): void {
  const { values, rowCount } = reuse.grid;
  const sources = reuse.sources;
  for (let i = 0; i < grid.length; i += 1) {
    const nHa = grid[i].length;
    for (let j = 0; j < nHa; j += 1) {
      const base = (i * nHa + j) * rowCount;
      let sum = 0;
      for (let k = 0; k < sources.length; k += 1) {
        const v = sources[k] < 0 ? 0 : values[base + sources[k]];
        sum += v * v;
      }
      grid[i][j] = sum;
    }
    onProgress?.(i + 1, grid.length);
  }
}

/** Chi-square plus penalty at every grid point, evaluated; every point's rows written to `values` when given. */
function evaluateGrid(
  c: StageAContext,
  decs: readonly number[],
  has: readonly number[],
  prior: readonly number[],
  grid: Float64Array[],
  values: Float64Array | null,
  rowCount: number,
  onProgress?: (done: number, total: number) => void,
): void {
  const nHa = has.length;
  const scratch = values === null ? new Float64Array(rowCount) : null;
  for (let i = 0; i < decs.length; i += 1) {
    const row = grid[i];
    for (let j = 0; j < nHa; j += 1) {
      const buffer = values ?? (scratch as Float64Array);
      const base = values === null ? 0 : (i * nHa + j) * rowCount;
      writeStageAResiduals(c, decs[i], has[j], prior, buffer, base);
      let sum = 0;
      for (let k = 0; k < rowCount; k += 1) sum += buffer[base + k] * buffer[base + k];
      row[j] = sum;
    }
    onProgress?.(i + 1, decs.length);
  }
}
