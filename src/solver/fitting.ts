/**
 * The two parametrisations of the fit and their least-squares refinements.
 *
 * - Year-independent (stage A): x = [declination, hour angle, ...nuisances], degrees; the
 *   sun from spherical astronomy alone (sunModel.ts). Clocks other than apparent time are
 *   predicted with E = 0 and a widened sigma (evidenceModel.ts) - a seed, never an answer.
 * - Dated (stage B): x = [d, m, ...nuisances], d the JD of the local day's 0h (continuous),
 *   m minutes of local apparent time. The instant is jdUT(d, m) (sunModel.ts); declination and
 *   equation of time come from the full ephemeris along a track; the hour angle is (m - 720) / 4.
 *   At a whole day (d = n + 0.5) this is the true sun at that hour of that day; between days it
 *   interpolates smoothly, which gives a well-defined 2-D Jacobian.
 * - Fixed day: x = [m, ...nuisances] with d held at a civil day.
 * Refinement by bounded Levenberg-Marquardt (src/math/leastSquares.ts).
 */
import type { ClockKind } from '../scene/types.js';
import { levenbergMarquardt, type LeastSquaresResult } from '../math/leastSquares.js';
import { normalizeDeg180, normalizeDeg360 } from '../math/angles.js';
import type { SunSite } from '../ephemeris/sunPosition.js';
import { moonPosition, type MoonPosition } from '../ephemeris/moonPosition.js';
import { deltaTSeconds } from '../time/deltaT.js';
import { jdToDecimalYear } from '../time/timeScales.js';
import { zoneOffsetMinutes } from '../time/clock.js';
import {
  evidenceResidualVector,
  writeEvidenceResiduals,
  latitudeOf,
  longitudeOf,
  type EvidenceModel,
  type EvaluationContext,
} from './evidenceModel.js';
import {
  instantOfApparentTime,
  jdUTOfApparentTime,
  makeSunTrack,
  solarStateOnTrack,
  sunFromDeclinationHourAngle,
  TRACK_REACH_DAYS,
  type SolarState,
  type SolverSunDirection,
  type SunTrack,
} from './sunModel.js';

/** Finite-difference steps: degrees for angles, days for d, minutes for m. */
const STEP_DEG = 1e-4;
const STEP_DAYS = 1e-3;
const STEP_MINUTES = 0.01;

export function siteOf(model: EvidenceModel): SunSite {
  const s = model.scene.site;
  return { latitudeDeg: s.latitudeDeg, longitudeDeg: s.longitudeDeg, elevationM: s.elevationM };
}

/** The zone offsets of a fit without zone clocks: none is asked for (0, as an unknown zone). */
const NO_ZONE_OFFSETS = (_zone: string): number => 0;

/** Zone offsets held fixed over one fit (taken at one instant). */
export function zoneOffsetsAt(model: EvidenceModel, assumed: ClockKind | null, jdUT: number): (zone: string) => number {
  let zones: Map<string, number> | null = null;
  for (const c of model.clocks) {
    const kind = c.kept ?? assumed;
    if (kind && kind.kind === 'zone' && !zones?.has(kind.zone)) (zones ??= new Map()).set(kind.zone, zoneOffsetMinutes(kind.zone, jdUT));
  }
  if (zones === null) return NO_ZONE_OFFSETS;
  const found = zones;
  return (zone: string) => found.get(zone) ?? 0;
}

// ------------------------------------------------------------ stage A

export interface StageAContext {
  readonly model: EvidenceModel;
  readonly assumed: ClockKind | null;
  /** Zone offsets at a reference instant of the window (stage A only). */
  readonly zoneOffset: (zone: string) => number;
}

/** The evaluation context of stage A at (declination, hour angle, nuisances). */
function stageAContextAt(c: StageAContext, declinationDeg: number, hourAngleDeg: number, nuisances: readonly number[]): EvaluationContext {
  return {
    sun: sunFromDeclinationHourAngle(declinationDeg, hourAngleDeg, latitudeOf(c.model, nuisances), c.model.scene.air),
    nuisances,
    apparentMinutes: 720 + 4 * hourAngleDeg,
    equationOfTimeMinutes: null,
    assumedClock: c.assumed,
    zoneOffsetMinutes: c.zoneOffset,
    moon: undefined, // no moon here, but the field present: one shape of context with datedPoint's, so that the residual writers stay optimised (V8 hidden classes)
  };
}

/** Residual vector at x = [declination, hour angle, ...nuisances]. */
export function stageAResiduals(c: StageAContext, x: readonly number[]): number[] {
  return evidenceResidualVector(c.model, stageAContextAt(c, x[0], x[1], x.slice(2)));
}

/**
 * The residual vector of stageAResiduals written into `out` from index `at` (the same numbers, bit for
 * bit), with the nuisances given apart: for stage A's grid, which evaluates some 1,700 points.
 */
export function writeStageAResiduals(c: StageAContext, declinationDeg: number, hourAngleDeg: number, nuisances: readonly number[], out: Float64Array, at: number): void {
  writeEvidenceResiduals(c.model, stageAContextAt(c, declinationDeg, hourAngleDeg, nuisances), out, at);
}

export function stageASteps(model: EvidenceModel): number[] {
  return [STEP_DEG, STEP_DEG, ...model.nuisances.map(() => STEP_DEG)];
}

/** Refine a stage-A point by bounded LM (declination within +/-25 deg). */
export function refineStageA(c: StageAContext, x0: readonly number[]): LeastSquaresResult {
  const n = x0.length;
  const lower = new Array<number>(n).fill(-Infinity);
  const upper = new Array<number>(n).fill(Infinity);
  lower[0] = -25;
  upper[0] = 25;
  const r = levenbergMarquardt({ residuals: (x) => stageAResiduals(c, x), steps: stageASteps(c.model), lower, upper }, x0, { maxIterations: 60, tolerance: 1e-9 });
  const x = r.x.slice();
  x[1] = normalizeDeg180(x[1]);
  return { ...r, x };
}

// ------------------------------------------------------------ stage B

/** The state of a dated evaluation: instant, solar state, sun direction and residuals. */
export interface DatedPoint {
  readonly dayJd0: number;
  readonly apparentMinutes: number;
  readonly nuisances: readonly number[];
  readonly jdUT: number;
  readonly state: SolarState;
  readonly sun: SolverSunDirection;
  /** The moon at the instant, when the model has moon evidence and the context evaluates it. */
  readonly moon?: MoonPosition;
  readonly residuals: readonly number[];
}

/** Everything a dated fit needs; the track is replaced as the fit moves. */
export interface DatedContext {
  readonly model: EvidenceModel;
  readonly assumed: ClockKind | null;
  readonly site: SunSite;
  track: SunTrack;
  zoneOffset: (zone: string) => number;
  /** Counter of full-ephemeris calls (3 per track). */
  ephemerisCalls: number;
  /**
   * Whether the moon's rows are evaluated (the true moon at whole civil days; between them interpolated at the same
   * local apparent time: moonBetweenDays). Stage B fits the sun's evidence alone and leaves them out.
   */
  readonly moonRows: boolean;
  /** Counter of moon evaluations. */
  moonCalls: number;
}

/** True when the model holds evidence of the moon: its place, look or facts, or a shadow cast by its light. */
export function hasMoonEvidence(model: EvidenceModel): boolean {
  return model.moons.length > 0 || model.moonFacts.length > 0 || model.shadows.some((t) => t.light === 'moon') || model.facts.some((f) => f.light === 'moon');
}

/** A dated context with its track at anchorJdUT (`track`: one already made there, reused). */
export function newDatedContext(model: EvidenceModel, assumed: ClockKind | null, anchorJdUT: number, moonRows = true, track?: SunTrack): DatedContext {
  const site = siteOf(model);
  return {
    model, assumed, site, track: track ?? makeSunTrack(anchorJdUT, site, model.scene.deltaT), zoneOffset: zoneOffsetsAt(model, assumed, anchorJdUT), ephemerisCalls: 3,
    moonRows: moonRows && hasMoonEvidence(model), moonCalls: 0,
  };
}

/** The moon at jdUT for the model's site (the fitted latitude and longitude), air and Delta T. */
export function moonAt(model: EvidenceModel, jdUT: number, nuisances: readonly number[]): MoonPosition {
  const s = model.scene.site;
  // Delta T of the scene's model passed as seconds: the same value, without its published sigma computed at every call.
  const deltaTSecondsNow = deltaTSeconds(jdToDecimalYear(jdUT), model.scene.deltaT);
  return moonPosition(jdUT, { latitudeDeg: latitudeOf(model, nuisances), longitudeDeg: longitudeOf(model, nuisances), elevationM: s.elevationM }, model.scene.air, { deltaTSeconds: deltaTSecondsNow });
}

/** a + t (b - a) on the circle of degrees (the difference wrapped to (-180, 180]). */
function lerpDeg(a: number, b: number, t: number): number {
  return a + t * normalizeDeg180(b - a);
}

/**
 * The moon at (d, m): at a whole day, the moon at that day's instant of local apparent time m; between whole days,
 * its place and look interpolated linearly in d between the neighbouring whole days at the same local apparent time,
 * as the sun's declination is (sunModel.ts). So between days the moon moves against the sun (about 12 deg of phase and
 * some 13 deg of sky a day at a fixed hour), not with the turning of the sky that jdUT(d, m) alone would give it.
 */
function moonBetweenDays(c: DatedContext, dayJd0: number, apparentMinutes: number, nuisances: readonly number[], jdUT: number): MoonPosition {
  const lon = longitudeOf(c.model, nuisances);
  const base = Math.round(dayJd0 - 0.5) + 0.5; // the nearest whole day (window.ts nearestDayJd0)
  const delta = dayJd0 - base;
  c.moonCalls += 1;
  if (Math.abs(delta) < 1e-12) return moonAt(c.model, jdUT, nuisances);
  const m0 = moonAt(c.model, instantOfApparentTime(c.track, base, apparentMinutes, lon).jdUT, nuisances);
  const m1 = moonAt(c.model, instantOfApparentTime(c.track, base + Math.sign(delta), apparentMinutes, lon).jdUT, nuisances);
  c.moonCalls += 1;
  const t = Math.abs(delta);
  const lerp = (a: number, b: number): number => a + t * (b - a);
  return {
    ...m0,
    jdUT,
    azimuthDeg: normalizeDeg360(lerpDeg(m0.azimuthDeg, m1.azimuthDeg, t)),
    altitudeDeg: lerp(m0.altitudeDeg, m1.altitudeDeg),
    geometricAltitudeDeg: lerp(m0.geometricAltitudeDeg, m1.geometricAltitudeDeg),
    illuminatedFraction: lerp(m0.illuminatedFraction, m1.illuminatedFraction),
    phaseAngleDeg: lerp(m0.phaseAngleDeg, m1.phaseAngleDeg),
    elongationDeg: lerp(m0.elongationDeg, m1.elongationDeg),
    phaseLongitudeDeg: normalizeDeg360(lerpDeg(m0.phaseLongitudeDeg, m1.phaseLongitudeDeg, t)),
    brightLimbPositionAngleDeg: normalizeDeg360(lerpDeg(m0.brightLimbPositionAngleDeg, m1.brightLimbPositionAngleDeg, t)),
    parallacticAngleDeg: lerpDeg(m0.parallacticAngleDeg, m1.parallacticAngleDeg, t),
    brightLimbTiltFromVerticalDeg: normalizeDeg180(lerpDeg(m0.brightLimbTiltFromVerticalDeg, m1.brightLimbTiltFromVerticalDeg, t)),
  };
}

/** Move the track so that it covers jdUT (a new track when jdUT is outside its reach). */
export function ensureTrack(c: DatedContext, jdUT: number, reach = TRACK_REACH_DAYS - 0.5): void {
  if (Math.abs(jdUT - c.track.anchorJdUT) <= reach) return;
  c.track = makeSunTrack(jdUT, c.site, c.model.scene.deltaT);
  c.zoneOffset = zoneOffsetsAt(c.model, c.assumed, jdUT);
  c.ephemerisCalls += 3;
}

/** The instant, solar state and sun direction of the dated model at (d, m, nuisances) with the current track (no residuals). */
export function datedSun(c: DatedContext, dayJd0: number, apparentMinutes: number, nuisances: readonly number[]): { jdUT: number; state: SolarState; sun: SolverSunDirection } {
  const jdUT = jdUTOfApparentTime(c.track, dayJd0, apparentMinutes, longitudeOf(c.model, nuisances));
  const state = solarStateOnTrack(c.track, jdUT);
  return { jdUT, state, sun: datedSunDirection(c.model, state, apparentMinutes, nuisances) };
}

/** The sun's direction at a solar state and local apparent time m (hour angle (m - 720) / 4). */
function datedSunDirection(model: EvidenceModel, state: SolarState, apparentMinutes: number, nuisances: readonly number[]): SolverSunDirection {
  return sunFromDeclinationHourAngle(state.declinationDeg, (apparentMinutes - 720) / 4, latitudeOf(model, nuisances), model.scene.air);
}

/**
 * Evaluate the dated model at (d, m, nuisances) with the current track; the moon's rows when the
 * context evaluates them and `withMoon` is not false (the continuous fit passes false).
 */
export function datedPoint(c: DatedContext, dayJd0: number, apparentMinutes: number, nuisances: readonly number[], withMoon = true): DatedPoint {
  const jdUT = jdUTOfApparentTime(c.track, dayJd0, apparentMinutes, longitudeOf(c.model, nuisances));
  const moon = withMoon && c.moonRows ? moonBetweenDays(c, dayJd0, apparentMinutes, nuisances, jdUT) : undefined;
  return datedPointAt(c.model, c.assumed, c.zoneOffset, dayJd0, apparentMinutes, nuisances, jdUT, solarStateOnTrack(c.track, jdUT), moon);
}

/**
 * The residuals of datedPoint alone (the same numbers), for the least-squares fits, which ask for
 * nothing else at their many trial points.
 */
export function datedResiduals(c: DatedContext, dayJd0: number, apparentMinutes: number, nuisances: readonly number[], withMoon = true): number[] {
  const jdUT = jdUTOfApparentTime(c.track, dayJd0, apparentMinutes, longitudeOf(c.model, nuisances));
  const moon = withMoon && c.moonRows ? moonBetweenDays(c, dayJd0, apparentMinutes, nuisances, jdUT) : undefined;
  const state = solarStateOnTrack(c.track, jdUT);
  return evidenceResidualVector(c.model, datedContextAt(c.model, c.assumed, c.zoneOffset, apparentMinutes, nuisances, state, datedSunDirection(c.model, state, apparentMinutes, nuisances), moon));
}

/** The evaluation context of a dated point. One shape, with the moon or without (then `moon` is undefined): no spread in the inner loops. */
function datedContextAt(
  model: EvidenceModel, assumed: ClockKind | null, zoneOffset: (zone: string) => number, apparentMinutes: number, nuisances: readonly number[],
  state: SolarState, sun: SolverSunDirection, moon: MoonPosition | undefined,
): EvaluationContext {
  return { sun, nuisances, apparentMinutes, equationOfTimeMinutes: state.equationOfTimeMinutes, assumedClock: assumed, zoneOffsetMinutes: zoneOffset, moon };
}

/** The residuals of datedPointAt written into `out` from index 0 (the same numbers), without making the point. */
export function writeDatedResiduals(
  model: EvidenceModel, assumed: ClockKind | null, zoneOffset: (zone: string) => number,
  apparentMinutes: number, nuisances: readonly number[], state: SolarState, moon: MoonPosition | undefined, out: Float64Array,
): void {
  const sun = datedSunDirection(model, state, apparentMinutes, nuisances);
  writeEvidenceResiduals(model, datedContextAt(model, assumed, zoneOffset, apparentMinutes, nuisances, state, sun, moon), out, 0);
}

/**
 * The dated point at an instant whose solar state is known (from a track, or from one exact
 * evaluation: stageB.ts exactPoint), the moon given or not.
 */
export function datedPointAt(
  model: EvidenceModel, assumed: ClockKind | null, zoneOffset: (zone: string) => number,
  dayJd0: number, apparentMinutes: number, nuisances: readonly number[], jdUT: number, state: SolarState, moon: MoonPosition | undefined,
): DatedPoint {
  const sun = datedSunDirection(model, state, apparentMinutes, nuisances);
  const residuals = evidenceResidualVector(model, datedContextAt(model, assumed, zoneOffset, apparentMinutes, nuisances, state, sun, moon));
  return { dayJd0, apparentMinutes, nuisances, jdUT, state, sun, moon, residuals };
}

export function datedSteps(model: EvidenceModel): number[] {
  return [STEP_DAYS, STEP_MINUTES, ...model.nuisances.map(() => STEP_DEG)];
}

export interface DatedFit {
  readonly x: number[]; // [d, m, ...nuisances]
  readonly lm: LeastSquaresResult;
  readonly point: DatedPoint;
  readonly iterations: number;
  readonly converged: boolean;
}

const MAX_TRACK_MOVES = 5;
/** The continuous fit may move the day by at most this many days from its seed (half a year would reach the other branch). */
export const MAX_DAY_MOVE = 120;

/** Bring m into [0, 1440) by moving whole days into d. */
function normaliseDayMinute(x: number[]): number[] {
  const shift = Math.floor(x[1] / 1440);
  if (shift !== 0) {
    x[0] += shift;
    x[1] -= 1440 * shift;
  }
  return x;
}

/**
 * Continuous refinement in (d, m, nuisances); the track follows the fit (bounded: at most
 * MAX_TRACK_MOVES re-anchorings, each followed by a new LM run).
 */
export function refineDated(c: DatedContext, x0: readonly number[], maxIterations = 60): DatedFit {
  let x = x0.slice();
  let iterations = 0;
  let lm: LeastSquaresResult | null = null;
  for (let move = 0; move <= MAX_TRACK_MOVES; move += 1) {
    // The moon is left out of the search's continuous fit (stage B fits the sun's evidence alone).
    const res = (p: readonly number[]): number[] => datedResiduals(c, p[0], p[1], p.slice(2), false);
    const lower = x.map(() => -Infinity);
    const upper = x.map(() => Infinity);
    lower[0] = x0[0] - MAX_DAY_MOVE;
    upper[0] = x0[0] + MAX_DAY_MOVE;
    // The minute stays within a day of its start in each run: where the evidence does not depend
    // on the hour (at a pole) its column of the Jacobian is ~0 and an unbounded step could carry
    // m, and through normaliseDayMinute the day, out of every calendar.
    lower[1] = x[1] - 1440;
    upper[1] = x[1] + 1440;
    lm = levenbergMarquardt({ residuals: res, steps: datedSteps(c.model), lower, upper }, x, { maxIterations, tolerance: 1e-10 });
    iterations += lm.iterations;
    x = normaliseDayMinute(lm.x.slice());
    const p = datedPoint(c, x[0], x[1], x.slice(2), false);
    if (Math.abs(p.jdUT - c.track.anchorJdUT) <= TRACK_REACH_DAYS - 0.5) {
      return { x, lm, point: p, iterations, converged: lm.converged };
    }
    ensureTrack(c, p.jdUT, 0);
  }
  const p = datedPoint(c, x[0], x[1], x.slice(2), false);
  return { x, lm: lm!, point: p, iterations, converged: false };
}

/** Refinement of (m, nuisances) on a fixed civil day. */
export function refineOnDay(c: DatedContext, dayJd0: number, x0: readonly number[], maxIterations = 40): DatedFit {
  const guess = datedPoint(c, dayJd0, x0[0], x0.slice(1));
  ensureTrack(c, guess.jdUT);
  const res = (p: readonly number[]): number[] => datedResiduals(c, dayJd0, p[0], p.slice(1));
  const lower = x0.map(() => -Infinity);
  const upper = x0.map(() => Infinity);
  lower[0] = x0[0] - 720; // the minute stays within half a day of its start
  upper[0] = x0[0] + 720;
  const lm = levenbergMarquardt({ residuals: res, steps: datedSteps(c.model).slice(1), lower, upper }, x0, { maxIterations, tolerance: 1e-10 });
  const x = [dayJd0, ...lm.x];
  const point = datedPoint(c, dayJd0, lm.x[0], lm.x.slice(1));
  return { x, lm, point, iterations: lm.iterations, converged: lm.converged };
}
