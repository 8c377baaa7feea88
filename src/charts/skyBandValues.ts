/**
 * The values of one sky band (skyChartData.ts): the largest |normalised residual| of one shadow
 * observation at every sun direction of an azimuth-altitude grid, 99 where the shadow cannot arise
 * (its wall in shade, the sun at or below the horizon for a ground shadow). The band is drawn from
 * which cells are within 1 sigma (value <= 1) and from the exact values at the corners of every
 * grid square that has a corner within it (the outline interpolates there: contour.ts).
 *
 * Blocks, then a quick pass, then exact where it shows. A block of cells whose rows are all certainly
 * above 1 sigma everywhere in it (bounded from its centre cell, residualBounds.ts) is left at 99
 * without valuing its cells. Every other cell is first valued from the residual numbers alone
 * (src/geometry/observationModels.ts evidenceResidualValues: the same numbers as evidenceResiduals, bit
 * for bit, without partials, labels or allocation), which does not say whether the shadow can
 * arise there. Then every cell whose quick value is within 1 sigma (with a margin of 1e-9 for
 * rounding), and each of its eight neighbours, is valued again exactly as before (evidenceResiduals,
 * 99 where not defined). So a cell drawn inside the band, and every corner of a square the outline
 * crosses, carry the exact value; any other cell is outside the band (quick value above 1, or in
 * a block left at 99; its exact value is above 1 or 99), drawn the same whatever its number, and
 * may keep that value. tests/charts/skyBandValues.test.ts compares the drawn band with the exact one on every
 * example and on random scenes.
 */
import { evidenceResidualValues, evidenceResiduals, type ShadowEvidence } from '../geometry/observationModels.js';
import { isWallSunlit } from '../geometry/shadowAngles.js';
import { isBoundedKind, rowLowerBounds } from './residualBounds.js';

/** Value of a cell where the shadow cannot arise: far outside the band. */
export const NO_SHADOW_VALUE = 99;

/** Blocks of at most this many cells are valued cell by cell; the first blocks are this many cells a side. */
const SMALL_BLOCK = 4;
const FIRST_BLOCK = 16;
/** Added to a block's arc for rounding, degrees. */
const DELTA_MARGIN_DEG = 1e-9;

/** Margin on the quick test "within 1 sigma", for any rounding between the two ways of valuing a cell. */
const QUICK_MARGIN = 1e-9;

/** The exact value of one cell: the largest |residual|, or NO_SHADOW_VALUE where the shadow cannot arise. */
export function exactBandValue(evidence: ShadowEvidence, azimuthDeg: number, altitudeDeg: number, wallAzimuthDeg: number, onLitWallOnly: boolean): number {
  const sun = { azimuthDeg: ((azimuthDeg % 360) + 360) % 360, altitudeDeg };
  if (onLitWallOnly && !isWallSunlit(sun, wallAzimuthDeg)) return NO_SHADOW_VALUE;
  const r = evidenceResiduals(evidence, sun, wallAzimuthDeg);
  if (!r.defined) return NO_SHADOW_VALUE; // the shadow cannot arise there (wall in shade): far outside the band
  return r.residuals.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
}

/**
 * The band's values[j][i] at altitudes[j], azimuths[i] (azimuths in the chart's unwrapped degrees).
 * @param onLitWallOnly the shadow is cast on a wall, and defined only while the wall is sunlit
 * @param rowCount how many residual rows the observation has (its evidence term's count)
 * @example skyBandValues({ kind: 'sun-direction', azimuthDeg: 180, altitudeDeg: 40, azimuthSigmaDeg: 2, altitudeSigmaDeg: 2 }, 0, false, [170, 180], [40], 2)
 *   // [[5, 0]] (10 deg of azimuth over its 2 deg sigma; 0 at the stated direction)
 */
export function skyBandValues(evidence: ShadowEvidence, wallAzimuthDeg: number, onLitWallOnly: boolean, azimuths: readonly number[], altitudes: readonly number[], rowCount: number): number[][] {
  const rows = altitudes.length;
  const cols = azimuths.length;
  const out = new Float64Array(Math.max(8, rowCount));
  const sun = { azimuthDeg: 0, altitudeDeg: 0 };
  const values: number[][] = altitudes.map(() => new Array<number>(cols).fill(NO_SHADOW_VALUE));
  const near: Uint8Array = new Uint8Array(rows * cols); // 1: within 1 sigma by the quick value
  let anyNear = false;
  const lower = new Float64Array(out.length);
  const bounded = isBoundedKind(evidence.kind);

  const cell = (j: number, i: number): void => {
    sun.altitudeDeg = altitudes[j];
    sun.azimuthDeg = ((azimuths[i] % 360) + 360) % 360;
    if (onLitWallOnly && !isWallSunlit(sun, wallAzimuthDeg)) return; // NO_SHADOW_VALUE
    const n = evidenceResidualValues(evidence, sun, wallAzimuthDeg, out, 0);
    let m = 0;
    for (let k = 0; k < n; k += 1) m = Math.max(m, Math.abs(out[k]));
    values[j][i] = m;
    if (!(m > 1 + QUICK_MARGIN)) {
      near[j * cols + i] = 1;
      anyNear = true;
    }
  };
  // Blocks first: where every row is certainly above 1 sigma in the whole block (residualBounds.ts),
  // its cells are outside the band and keep NO_SHADOW_VALUE unless they are next to a cell within it.
  const block = (i0: number, i1: number, j0: number, j1: number): void => {
    if (!bounded || (i1 - i0) * (j1 - j0) <= SMALL_BLOCK) {
      for (let j = j0; j < j1; j += 1) for (let i = i0; i < i1; i += 1) cell(j, i);
      return;
    }
    const ic = (i0 + i1 - 1) >> 1;
    const jc = (j0 + j1 - 1) >> 1;
    sun.altitudeDeg = altitudes[jc];
    sun.azimuthDeg = ((azimuths[ic] % 360) + 360) % 360;
    // Every cell lies within delta of arc of the centre: along the meridian, then along the parallel (cos(alt) <= 1).
    const delta = Math.max(altitudes[jc] - altitudes[j0], altitudes[j1 - 1] - altitudes[jc]) + Math.max(azimuths[ic] - azimuths[i0], azimuths[i1 - 1] - azimuths[ic]) + DELTA_MARGIN_DEG;
    const n = evidenceResidualValues(evidence, sun, wallAzimuthDeg, out, 0);
    rowLowerBounds(evidence, sun, wallAzimuthDeg, delta, out, lower);
    let least = 0;
    for (let k = 0; k < n; k += 1) least = Math.max(least, lower[k]);
    if (least > 1 + QUICK_MARGIN) return;
    if (i1 - i0 >= j1 - j0) {
      const im = (i0 + i1) >> 1;
      block(i0, im, j0, j1);
      block(im, i1, j0, j1);
    } else {
      const jm = (j0 + j1) >> 1;
      block(i0, i1, j0, jm);
      block(i0, i1, jm, j1);
    }
  };
  for (let j0 = 0; j0 < rows; j0 += FIRST_BLOCK) for (let i0 = 0; i0 < cols; i0 += FIRST_BLOCK) block(i0, Math.min(cols, i0 + FIRST_BLOCK), j0, Math.min(rows, j0 + FIRST_BLOCK));
  if (!anyNear) return values;
  // Exact values at every cell within 1 sigma by the quick value and at its eight neighbours.
  const exact = new Uint8Array(rows * cols);
  for (let j = 0; j < rows; j += 1) {
    for (let i = 0; i < cols; i += 1) {
      if (near[j * cols + i] === 0) continue;
      for (let b = Math.max(0, j - 1); b <= Math.min(rows - 1, j + 1); b += 1) {
        for (let a = Math.max(0, i - 1); a <= Math.min(cols - 1, i + 1); a += 1) {
          if (exact[b * cols + a] === 1) continue;
          exact[b * cols + a] = 1;
          values[b][a] = exactBandValue(evidence, azimuths[a], altitudes[b], wallAzimuthDeg, onLitWallOnly);
        }
      }
    }
  }
  return values;
}
