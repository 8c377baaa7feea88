/**
 * The values of one sky band (skyChartData.ts): the largest |normalised residual| of one shadow
 * observation at every sun direction of an azimuth-altitude grid, 99 where the shadow cannot arise
 * (its wall in shade, the sun at or below the horizon for a ground shadow). The band is drawn from
 * which cells are within 1 sigma (value <= 1) and from the exact values at the corners of every
 * grid square that has a corner within it (the outline interpolates there: contour.ts).
 *
 * Quick pass, then exact where it shows: every cell is first valued from the residual numbers alone
 * (src/geometry/observationModels.ts evidenceResidualValues: the same numbers as evidenceResiduals, bit
 * for bit, without partials, labels or allocation), which does not say whether the shadow can
 * arise there. Then every cell whose quick value is within 1 sigma (with a margin of 1e-9 for
 * rounding), and each of its eight neighbours, is valued again exactly as before (evidenceResiduals,
 * 99 where not defined). So a cell drawn inside the band, and every corner of a square the outline
 * crosses, carry the exact value; any other cell is outside the band (quick value above 1, and
 * its exact value is that one or 99), drawn the same whatever its number, and may keep its quick
 * value. tests/charts/skyBandValues.test.ts compares the drawn band with the exact one on every
 * example and on random scenes.
 */
import { evidenceResidualValues, evidenceResiduals, type ShadowEvidence } from '../geometry/observationModels.js';
import { isWallSunlit } from '../geometry/shadowAngles.js';

/** Value of a cell where the shadow cannot arise: far outside the band. */
export const NO_SHADOW_VALUE = 99;

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
  const values: number[][] = [];
  const near: Uint8Array = new Uint8Array(rows * cols); // 1: within 1 sigma by the quick value
  let anyNear = false;
  for (let j = 0; j < rows; j += 1) {
    const row: number[] = [];
    sun.altitudeDeg = altitudes[j];
    for (let i = 0; i < cols; i += 1) {
      const az = azimuths[i];
      sun.azimuthDeg = ((az % 360) + 360) % 360;
      if (onLitWallOnly && !isWallSunlit(sun, wallAzimuthDeg)) {
        row.push(NO_SHADOW_VALUE);
        continue;
      }
      const n = evidenceResidualValues(evidence, sun, wallAzimuthDeg, out, 0);
      let m = 0;
      for (let k = 0; k < n; k += 1) m = Math.max(m, Math.abs(out[k]));
      row.push(m);
      if (!(m > 1 + QUICK_MARGIN)) {
        near[j * cols + i] = 1;
        anyNear = true;
      }
    }
    values.push(row);
  }
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
