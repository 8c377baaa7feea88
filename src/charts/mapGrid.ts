/**
 * The date-and-hour map's grid of chi-square + soft penalty, with the points far beyond the palest
 * band left unfinished without evaluating each of them. The same points as the solver's grid with a
 * ceiling (src/solver/chiSquareGrid.ts chiSquareOnDayMinuteGrid): every point at or under the ceiling
 * is computed, on the same sun track as there, to the same bits; a point left unfinished is +Infinity
 * and certainly above the ceiling. Which points above the ceiling are left unfinished may differ,
 * which the map cannot show (dateHourMapData.ts: such a point is white and away from any contour).
 *
 * Blocks of points first. The sun of the dated model at a point is that of (declination, hour
 * angle) at the site's latitude (src/solver/sunModel.ts sunFromDeclinationHourAngle), the hour angle
 * H = (m - 720) / 4 deg exactly, the declination from the column's sun track. For a block of
 * points and its centre point c, every point's apparent sun lies within
 *   delta = (largest - smallest declination in the block) + (largest |H - H_c|) + 2 R_max
 * degrees of arc of c's apparent sun: on the sphere, the distance of (dec1, H1) from (dec2, H2) is
 * at most |dec1 - dec2| along the hour circle plus |H1 - H2| cos(dec2) along the parallel (triangle
 * inequality; W. M. Smart, Textbook on Spherical Astronomy, 6th ed. 1977, ch. I, the great circle
 * as the shortest path), and the horizon frame is a rotation of the hour-angle frame; refraction
 * lifts each sun along its vertical by R, with |R| <= R_max (src/ephemeris/refraction.ts: R falls
 * from its largest value at the true altitude -0.8333 deg to a few 1e-5 deg below zero at the zenith,
 * and is 0 lower down; R_max is taken as the larger of |R| at those two ends).
 * The facts 'sun-up', 'sun-not-up', 'wall-lit' and 'wall-shaded' of the sun cost (violation /
 * FACT_TOLERANCE_DEG)^2, each violation an altitude or an elevation above a wall's plane
 * (src/geometry/lightFacts.ts), an angle from a great circle, which changes by at most the arc the
 * sun moves: so each such residual is at least r_c - delta / FACT_TOLERANCE_DEG everywhere in the
 * block, and when the sum of the squares of these lower bounds exceeds the ceiling, so does every
 * point of the block (the penalty is part of the value, the other rows add squares). The rows of
 * most kinds of shadow are bounded alike (residualBounds.ts) and add their squares. Such a block
 * is left unfinished whole; any other is split in two, and a block of a few
 * points is tested point by point. A margin of 1e-6 deg in delta covers rounding.
 *
 * Then single points, as the solver's grid tests them: the facts' penalty, then the shadows' rows
 * in the order the value sums them (src/solver/evidenceModel.ts splitChiSquare), each a partial sum
 * of the value's own terms, computed by the same functions; above the ceiling, the point is left.
 *
 * tests/charts/mapGrid.test.ts compares this grid with the exhaustive one point by point on every
 * example and on random scenes.
 */
import { refractionDeg, NO_REFRACTION_BELOW_DEG } from '../ephemeris/refraction.js';
import { evidenceResidualValues } from '../geometry/observationModels.js';
import { isBoundedKind, rowLowerBounds } from './residualBounds.js';
import { rowMinimum } from './contour.js';
import { FACT_TOLERANCE_DEG, factResidual, longitudeOf, splitChiSquare, type EvidenceModel, type FactTerm } from '../solver/evidenceModel.js';
import { datedPoint, datedSun, ensureTrack, newDatedContext, type DatedContext } from '../solver/fitting.js';
import { instantOfApparentTime, solarStateOnTrack, type SunTrack } from '../solver/sunModel.js';
import { exceedsAtContext, rowsBufferFor, shadowTermsAt, type DayMinuteGridSpec } from '../solver/chiSquareGrid.js';

/** Blocks of at most this many points are tested point by point. */
const SMALL_BLOCK = 6;
/** Blocks of at most this many points whose centre the facts alone do not put above the ceiling are tested point by point. */
const MIXED_BLOCK = 64;
/** The first blocks: columns (days) and rows (minutes). */
const FIRST_BLOCK_COLUMNS = 16;
const FIRST_BLOCK_ROWS = 16;
/** Added to delta for rounding, degrees. */
const DELTA_MARGIN_DEG = 1e-6;

/** The facts whose residual changes by at most 1 / FACT_TOLERANCE_DEG per degree the sun moves (see header). */
function isAngleFact(f: FactTerm): boolean {
  return f.light !== 'moon' && (f.fact === 'sun-up' || f.fact === 'sun-not-up' || f.fact === 'wall-lit' || f.fact === 'wall-shaded');
}

/** The largest |refraction| at any altitude for the scene's air, degrees (see header). */
function largestRefractionDeg(model: EvidenceModel): number {
  const air = model.scene.air;
  return Math.max(Math.abs(refractionDeg(NO_REFRACTION_BELOW_DEG, air)), Math.abs(refractionDeg(90, air)));
}

/** The grid of the map: values[j][i] at minutes[j] of day column i, +Infinity where left unfinished. */
export interface MapGrid {
  readonly values: readonly (readonly number[])[];
  /** The smallest finished value. */
  readonly minimum: number;
  /** Points of the grid (each evaluated or left unfinished). */
  readonly evaluations: number;
  /** How many points are left unfinished (each above the ceiling). */
  readonly left: number;
  /** The sun track each day column is evaluated with (as the solver's grid makes them). */
  readonly tracks: readonly SunTrack[];
}

/** Where a contour line could run: finished at every point next to a value at most `level` above the reference. */
export interface ContourFinish {
  /** The reference (the lowest value) is at most this. */
  readonly referenceBound: number;
  /** The highest contour level drawn, above the reference. */
  readonly level: number;
}

/**
 * The grid of the map (see header); spec.ceiling must be given. With `contours`, every unfinished
 * point that a contour line could run next to is then computed exactly: a corner of a grid square
 * whose other corners include one at or under the level above the reference (marching squares
 * interpolates along that square's edges with the true values, contour.ts). Every other unfinished
 * point stays +Infinity: beyond the palest band, drawn unshaded and away from any contour line.
 * @example mapGrid(model, { dayJd0s, minutes, assumedClock: null, nuisances: priorsOf(model), ceiling: 40 }).values
 */
export function mapGrid(model: EvidenceModel, spec: DayMinuteGridSpec & { readonly ceiling: number }, contours?: ContourFinish): MapGrid {
  const cols = spec.dayJd0s.length;
  const rows = spec.minutes.length;
  // Every point starts unfinished (+Infinity) and is then finished or left so. Packed arrays of doubles (quicker to
  // read than holey ones): one row made by map, the others copied from it (slice keeps the kind of elements).
  const blank = spec.dayJd0s.map(() => Infinity);
  const values: number[][] = spec.minutes.map(() => blank.slice());
  const tracks: SunTrack[] = [];
  let minimum = Infinity;
  let left = 0;
  if (cols === 0) return { values, minimum, evaluations: 0, left, tracks };
  const { nuisances, ceiling, minutes, dayJd0s } = spec;
  const lon = longitudeOf(model, nuisances);
  // The sun tracks of the columns, made in the order the solver's grid makes them (the same anchors, so the same bits).
  const walker = newDatedContext(model, spec.assumedClock, dayJd0s[0] + 0.5 - lon / 360);
  const contexts: DatedContext[] = [];
  for (let i = 0; i < cols; i += 1) {
    ensureTrack(walker, dayJd0s[i] + 0.5 - lon / 360);
    tracks.push(walker.track);
    const last = contexts[i - 1];
    contexts.push(last !== undefined && last.track === walker.track ? last : newDatedContext(model, spec.assumedClock, walker.track.anchorJdUT, true, walker.track));
  }
  const angleFacts = model.facts.filter(isAngleFact);
  const shadows = shadowTermsAt(model, nuisances); // the sun's shadows: the partial sums stay lower bounds
  const boundable = angleFacts.length > 0 || shadows.some((t) => isBoundedKind(t.evidence.kind));
  const rowsOut = rowsBufferFor(model);
  const lowerOut = new Float64Array(rowsOut.length);
  const refraction2 = 2 * largestRefractionDeg(model);

  // Leaving a point unfinished writes nothing: it is +Infinity from the start.
  const leave = (): void => {
    left += 1;
  };
  const factContext = (c: DatedContext, i: number, j: number) => {
    const { state, sun } = datedSun(c, dayJd0s[i], minutes[j], nuisances);
    return { sun, nuisances, apparentMinutes: minutes[j], equationOfTimeMinutes: state.equationOfTimeMinutes, assumedClock: c.assumed, zoneOffsetMinutes: c.zoneOffset, moon: undefined };
  };

  /** The solver grid's test of one point: true when its value certainly exceeds the ceiling (partial sums). */
  const exceeds = (i: number, j: number): boolean => exceedsAtContext(model, factContext(contexts[i], i, j), shadows, ceiling, rowsOut);

  /** chi-square + penalty of the dated model, as the solver's grid values a point (chiSquareGrid.ts valueAt). */
  const finish = (i: number, j: number): void => {
    const s = splitChiSquare(model, datedPoint(contexts[i], dayJd0s[i], minutes[j], nuisances).residuals);
    const v = s.chiSquare + s.penalty;
    values[j][i] = v;
    if (v < minimum) minimum = v;
  };
  const point = (i: number, j: number): void => {
    if (exceeds(i, j)) leave();
    else finish(i, j);
  };

  /**
   * Smallest and largest declination of each column over all its rows: the instant grows with the
   * minute (the equation of time changes by under a minute a day, Meeus 1998 ch. 28), so the rows'
   * declinations lie on the track's parabola between the first and the last row's instants, where
   * its extremes are at the ends or at its vertex. (Over a column of daylight hours the declination
   * changes by about 0.3 deg at most, which a block's delta then carries.)
   */
  const decLow = new Float64Array(cols);
  const decHigh = new Float64Array(cols);
  for (let i = 0; i < cols; i += 1) {
    const track = contexts[i].track;
    const a = instantOfApparentTime(track, dayJd0s[i], minutes[0], lon);
    const b = instantOfApparentTime(track, dayJd0s[i], minutes[rows - 1], lon);
    let lo = Math.min(a.state.declinationDeg, b.state.declinationDeg);
    let hi = Math.max(a.state.declinationDeg, b.state.declinationDeg);
    const [v0, v1, v2] = track.declinationDeg;
    const curvature = v2 - 2 * v1 + v0;
    if (curvature !== 0) {
      // parabola v1 + (u/2)(a + b + u(b - a)) (sunModel.ts, Meeus 1998 eq. 3.3) has its vertex at u = -(a + b) / (2 (b - a))
      const vertexJdUT = track.anchorJdUT - (v2 - v0) / (2 * curvature);
      if (vertexJdUT > Math.min(a.jdUT, b.jdUT) && vertexJdUT < Math.max(a.jdUT, b.jdUT)) {
        const dec = solarStateOnTrack(track, vertexJdUT).declinationDeg;
        lo = Math.min(lo, dec);
        hi = Math.max(hi, dec);
      }
    }
    decLow[i] = lo;
    decHigh[i] = hi;
  }

  const block = (i0: number, i1: number, j0: number, j1: number): void => {
    if ((i1 - i0) * (j1 - j0) <= SMALL_BLOCK || !boundable) {
      for (let i = i0; i < i1; i += 1) for (let j = j0; j < j1; j += 1) point(i, j);
      return;
    }
    const ic = (i0 + i1 - 1) >> 1;
    const jc = (j0 + j1 - 1) >> 1;
    let decLo = Infinity;
    let decHi = -Infinity;
    for (let i = i0; i < i1; i += 1) {
      decLo = Math.min(decLo, decLow[i]);
      decHi = Math.max(decHi, decHigh[i]);
    }
    const hourSpanDeg = Math.max(minutes[j1 - 1] - minutes[jc], minutes[jc] - minutes[j0]) / 4;
    const delta = decHi - decLo + hourSpanDeg + refraction2 + DELTA_MARGIN_DEG;
    const ctx = factContext(contexts[ic], ic, jc);
    let bound = 0;
    let atCentre = 0;
    for (const f of angleFacts) {
      const rc = factResidual(model, f, ctx);
      atCentre += rc * rc;
      const r = rc - delta / FACT_TOLERANCE_DEG;
      if (r > 0) bound += r * r;
    }
    for (const t of shadows) {
      if (!isBoundedKind(t.evidence.kind)) continue;
      const n = evidenceResidualValues(t.evidence, ctx.sun, t.wallAzimuthDeg, rowsOut, 0);
      for (let k = 0; k < n; k += 1) atCentre += rowsOut[k] * rowsOut[k];
      if (rowLowerBounds(t.evidence, ctx.sun, t.wallAzimuthDeg, delta, rowsOut, lowerOut)) for (let k = 0; k < n; k += 1) bound += lowerOut[k] * lowerOut[k];
    }
    if (bound > ceiling) {
      left += (i1 - i0) * (j1 - j0); // every point of the block stays +Infinity
      return;
    }
    // Where the bounded rows leave the centre itself under the ceiling, smaller blocks would seldom fare better.
    if (atCentre <= ceiling && (i1 - i0) * (j1 - j0) <= MIXED_BLOCK) {
      for (let i = i0; i < i1; i += 1) for (let j = j0; j < j1; j += 1) point(i, j);
      return;
    }
    // Split across the longer side in degrees of sun motion (a day moves the declination by at most 0.41 deg, a row by minuteStep / 4 deg).
    if (i1 - i0 > 1 && (j1 - j0 === 1 || decHi - decLo >= hourSpanDeg)) {
      const im = (i0 + i1) >> 1;
      block(i0, im, j0, j1);
      block(im, i1, j0, j1);
    } else {
      const jm = (j0 + j1) >> 1;
      block(i0, i1, j0, jm);
      block(i0, i1, jm, j1);
    }
  };

  for (let i0 = 0; i0 < cols; i0 += FIRST_BLOCK_COLUMNS) {
    const i1 = Math.min(cols, i0 + FIRST_BLOCK_COLUMNS);
    for (let j0 = 0; j0 < rows; j0 += FIRST_BLOCK_ROWS) block(i0, i1, j0, Math.min(rows, j0 + FIRST_BLOCK_ROWS));
    spec.onProgress?.(i1, cols);
  }
  if (contours !== undefined && left > 0) {
    // The squares with a corner at or under the level (dateHourMapData.ts draws contours up to it); rows with none passed over.
    const reference = Math.min(minimum, contours.referenceBound);
    const low = (x: number): boolean => x - reference <= contours.level;
    const rowLow = values.map((row) => low(rowMinimum(row)));
    const cells: [number, number][] = [];
    for (let j = 0; j + 1 < rows; j += 1) {
      if (!rowLow[j] && !rowLow[j + 1]) continue;
      const below = values[j];
      const above = values[j + 1];
      for (let i = 0; i + 1 < cols; i += 1) {
        if (!low(below[i]) && !low(below[i + 1]) && !low(above[i + 1]) && !low(above[i])) continue;
        for (const [b, a] of [[j, i], [j, i + 1], [j + 1, i + 1], [j + 1, i]] as const) if (values[b][a] === Infinity) cells.push([b, a]);
      }
    }
    for (const [j, i] of cells) {
      if (values[j][i] !== Infinity) continue; // listed twice
      finish(i, j);
      left -= 1;
    }
  }
  return { values, minimum, evaluations: rows * cols, left, tracks };
}
