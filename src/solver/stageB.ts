/**
 * Stage B: from each year-independent minimum (declination, hour angle) to dated candidates
 * in every year of the window.
 *
 * Each stage-A declination is taken by the sun twice a year (once on each side of a
 * solstice; once, at the solstice, when it is at or beyond the tropic: seasons.ts). For a few
 * representative years (all of them in a short window, else the first, the last and one every
 * REP_SPACING years) the full model is refined in (d, m, nuisances) by Levenberg-Marquardt
 * with the whole evidence (clocks, which depend on the equation of time). Between them the
 * yearly pattern repeats to within hours, so the continuous optimum of every other year is
 * mapped: the day offset from k tropical years, the minute and the nuisances interpolated
 * linearly between the representative years around it. Each year's optimum is then snapped
 * to the best allowed civil day (the documentary bounds, months and weekday restrict the day;
 * the day is chosen by the quadratic prediction (d - d_hat)^2 / C_dd of the profile
 * chi-square), and the minute (and nuisances) on that day taken from the conditional mean of
 * the linearised fit. Every candidate is verified by one evaluation of chi-square with the full
 * ephemeris (src/ephemeris/sunPosition.ts) at its instant; a mapped year whose verified value
 * exceeds its prediction by more than max(2, 20%) is refined in full like a representative year.
 */
import type { ClockKind } from '../scene/types.js';
import { covarianceFromJacobian } from '../math/leastSquares.js';
import { sunPosition, type SunPosition, type SunSite } from '../ephemeris/sunPosition.js';
import type { EvidenceModel } from './evidenceModel.js';
import { splitChiSquare, longitudeOf, residualRowCount } from './evidenceModel.js';
import {
  datedPoint,
  datedPointAt,
  hasMoonEvidence,
  writeDatedResiduals,
  newDatedContext,
  refineDated,
  refineOnDay,
  zoneOffsetsAt,
  type DatedContext,
  type DatedFit,
  type DatedPoint,
} from './fitting.js';
import { instantOfSolarLongitude, longitudesOfDeclination, lowPrecisionSun, TROPICAL_YEAR_DAYS } from './seasons.js';
import { flatParabola, parabola, solarStateOnTrack, type SolarState, type SunTrack } from './sunModel.js';
import type { StageAMinimum } from './stageA.js';
import { isDayAllowed, nearestDayJd0, type DayWindow } from './window.js';
import { jdToCivilDay } from '../calendar/regions.js';

/** Years between representative years in a long window. */
export const REP_SPACING = 50;
/** Windows of up to this many cycles are refined in full in every year. */
export const FULL_REFINEMENT_CYCLES = 6;
/** How far (days) from the continuous optimum an allowed day is looked for. */
const MAX_SNAP_DAYS = 60;
/** How far an allowed day is looked for when the restrictions exclude the optimum's neighbourhood. */
const FAR_SNAP_DAYS = 200;

/** A representative year's continuous fit, kept for the uncertainty. */
export interface RepresentativeFit {
  readonly cycle: number;
  readonly fit: DatedFit;
  readonly objective: number;
  /** Full covariance of [d, m, ...nuisances], or null when singular. */
  readonly covariance: number[][] | null;
  readonly context: DatedContext;
  /**
   * A candidate of the moon's own search (src/solver/moonSearch.ts): the moon fixes an instant, not a day and an
   * hour each; covariance is then null and this gives the sigma of the minute on the candidate's day.
   */
  readonly moonInstant?: { readonly sigmaMinutes: number };
}

/** The fit of a mapped year (no iterations of its own), shared by all of them. */
const MAPPED_FIT = Object.freeze({ converged: true, iterations: 0 });

/**
 * A candidate before it is dressed for the answer. Stage B's own are StageBCandidate objects (below),
 * whose numbers are read through getters: a copy by spread must state those anew.
 */
export interface RawCandidate {
  readonly assumptionIndex: number;
  /** Same key = same family track (assumption, stage-A minimum, branch). */
  readonly trackKey: string;
  readonly branch: 'rising' | 'falling' | 'solstice';
  readonly cycle: number;
  readonly dayJd0: number;
  readonly apparentMinutes: number;
  readonly nuisances: readonly number[];
  readonly point: DatedPoint;
  /** The full ephemeris at the candidate's instant, air of the scene. */
  readonly sun: SunPosition;
  readonly chiSquare: number;
  readonly penalty: number;
  readonly objective: number;
  /** This year's continuous optimum (d, m). */
  readonly continuousDay: number;
  readonly continuousMinutes: number;
  readonly rep: RepresentativeFit;
  readonly fit: { readonly converged: boolean; readonly iterations: number };
  readonly mapped: boolean;
  /**
   * True when the continuous optimum lies outside the allowed days (months, bounds, weekday) and the
   * candidate was moved to the nearest allowed day: it is pressed against the edge of the window.
   */
  readonly atWindowEdge: boolean;
  /**
   * With moon evidence (src/solver/moonYears.ts): false when this year was screened only, not refined
   * (it fit far worse than the best year; its objective is then an upper bound of the year's best).
   */
  readonly moonRefined?: boolean;
}

export interface StageBResult {
  readonly candidates: RawCandidate[];
  readonly fullRefinements: number;
  readonly mappedYears: number;
  readonly ephemerisCalls: number;
}

/**
 * One exact evaluation with the full ephemeris at (day, minute, nuisances): one sunPosition
 * call at the instant found with a guess of the equation of time (an error of a minute in the
 * guess moves the declination by under 3e-4 deg), then the instant recomputed with the exact value.
 */
export function exactPoint(
  model: EvidenceModel,
  assumed: ClockKind | null,
  site: SunSite,
  dayJd0: number,
  minutes: number,
  nuisances: readonly number[],
  equationOfTimeGuessMinutes: number,
  moonRows = true,
): { point: DatedPoint; sun: SunPosition } {
  const sun = exactSun(model, site, dayJd0, minutes, nuisances, equationOfTimeGuessMinutes);
  if (!(moonRows && hasMoonEvidence(model))) return { point: pointOfExactSun(model, assumed, dayJd0, minutes, nuisances, sun), sun };
  const track: SunTrack = {
    anchorJdUT: sun.jdUT,
    declinationDeg: [sun.declinationDeg, sun.declinationDeg, sun.declinationDeg],
    equationOfTimeMinutes: [sun.equationOfTimeMinutes, sun.equationOfTimeMinutes, sun.equationOfTimeMinutes],
  };
  const ctx: DatedContext = { model, assumed, site, track, zoneOffset: zoneOffsetsAt(model, assumed, sun.jdUT), ephemerisCalls: 1, moonRows: true, moonCalls: 0 };
  return { point: datedPoint(ctx, dayJd0, minutes, nuisances), sun };
}

/** The one sunPosition call of exactPoint, at the instant found with the guess of the equation of time. */
function exactSun(model: EvidenceModel, site: SunSite, dayJd0: number, minutes: number, nuisances: readonly number[], equationOfTimeGuessMinutes: number): SunPosition {
  const lon = longitudeOf(model, nuisances);
  const approxJdUT = dayJd0 + (minutes - equationOfTimeGuessMinutes) / 1440 - lon / 360;
  const sunSite = lon === site.longitudeDeg ? site : { latitudeDeg: site.latitudeDeg, longitudeDeg: lon, elevationM: site.elevationM };
  return sunPosition(approxJdUT, sunSite, model.scene.air, { deltaTModel: model.scene.deltaT });
}

/**
 * exactPoint's point without the moon, from its sun (computed at sun.jdUT): the track of that one
 * evaluation (declination and equation of time constant: pointSunTrack) read without making it, by
 * datedPoint's operations, so the same numbers; no ephemeris call (a candidate's point is made again from its sun).
 */
function pointOfExactSun(model: EvidenceModel, assumed: ClockKind | null, dayJd0: number, minutes: number, nuisances: readonly number[], sun: SunPosition): DatedPoint {
  const { jdUT, state } = exactInstant(model, dayJd0, minutes, nuisances, sun);
  return datedPointAt(model, assumed, zoneOffsetsAt(model, assumed, sun.jdUT), dayJd0, minutes, nuisances, jdUT, state, undefined);
}

/** The instant and solar state of pointOfExactSun's point. */
function exactInstant(model: EvidenceModel, dayJd0: number, minutes: number, nuisances: readonly number[], sun: SunPosition): { jdUT: number; state: SolarState } {
  const approxJdUT = sun.jdUT;
  const guess = dayJd0 + minutes / 1440 - longitudeOf(model, nuisances) / 360;
  const jdUT = guess - flatParabola(sun.equationOfTimeMinutes, guess - approxJdUT) / 1440;
  const u = jdUT - approxJdUT;
  return { jdUT, state: { declinationDeg: flatParabola(sun.declinationDeg, u), equationOfTimeMinutes: flatParabola(sun.equationOfTimeMinutes, u) } };
}

/** An exact evaluation as stage B's yearly loop keeps it: the sun, the nuisances and the chi-square of pointOfExactSun's residuals. */
interface ExactFit {
  readonly sun: SunPosition;
  readonly nuisances: readonly number[];
  readonly chiSquare: number;
  readonly penalty: number;
  readonly objective: number;
}

/**
 * exactPoint without the moon, reduced to an ExactFit: the residuals written into `rows` (a buffer of the
 * model's row count) and summed by splitChiSquare, the same numbers as from the point, which is not made.
 */
function exactFit(model: EvidenceModel, assumed: ClockKind | null, site: SunSite, dayJd0: number, minutes: number, nuisances: readonly number[], equationOfTimeGuessMinutes: number, rows: Float64Array): ExactFit {
  const sun = exactSun(model, site, dayJd0, minutes, nuisances, equationOfTimeGuessMinutes);
  const { state } = exactInstant(model, dayJd0, minutes, nuisances, sun);
  writeDatedResiduals(model, assumed, zoneOffsetsAt(model, assumed, sun.jdUT), minutes, nuisances, state, undefined, rows);
  const s = splitChiSquare(model, rows);
  return { sun, nuisances, chiSquare: s.chiSquare, penalty: s.penalty, objective: s.chiSquare + s.penalty };
}

/** A stage-B candidate's fields but its point. */
type StageBFields = Omit<RawCandidate, 'point' | 'moonRefined'>;

/** Where each number of a StageBCandidate is kept in its one array of numbers. */
const enum At { DayJd0, ApparentMinutes, ChiSquare, Penalty, Objective, SunJdUT, SunJdTT, SunAzimuth, SunAltitude, SunGeometricAltitude, SunDeclination, SunRightAscension, SunHourAngle, SunEquationOfTime }

/**
 * A candidate of stage B, made for every year of the window (thousands in a long one) and most never
 * dressed; so it is kept small. Its numbers (its own and its sun's) are held in one array of numbers,
 * stored unboxed, rather than in fields each holding a boxed number; its sun is read from them when
 * asked for (the same numbers, a new object each time); and its exact point (residuals, solar state,
 * sun direction) is made again from its sun when first asked for: the same numbers as when it was
 * evaluated, without an ephemeris call. Numbers read through getters are not copied by a spread: a copy
 * ({ ...c, ... }, as moonYears.ts makes) states dayJd0, apparentMinutes, chiSquare, penalty, objective, sun
 * and point anew (continuousDay and continuousMinutes are plain fields, copied).
 */
class StageBCandidate implements RawCandidate {
  // Fields declared only (`declare`: nothing emitted) and set once in the constructor, as solveDates.ts
  // KeptMember: emitted class fields would first hold undefined, and V8 would widen them.
  declare readonly assumptionIndex: number;
  declare readonly trackKey: string;
  declare readonly branch: 'rising' | 'falling' | 'solstice';
  declare readonly cycle: number;
  declare readonly nuisances: readonly number[];
  declare readonly rep: RepresentativeFit;
  declare readonly fit: { readonly converged: boolean; readonly iterations: number };
  declare readonly mapped: boolean;
  declare readonly atWindowEdge: boolean;
  declare readonly continuousDay: number;
  declare readonly continuousMinutes: number;
  private declare readonly model: EvidenceModel;
  private declare readonly assumed: ClockKind | null;
  private declare readonly numbers: number[];
  private declare madePoint: DatedPoint | undefined;

  constructor(f: StageBFields, model: EvidenceModel, assumed: ClockKind | null) {
    this.model = model;
    this.assumed = assumed;
    this.assumptionIndex = f.assumptionIndex;
    this.trackKey = f.trackKey;
    this.branch = f.branch;
    this.cycle = f.cycle;
    this.nuisances = f.nuisances;
    this.rep = f.rep;
    this.fit = f.fit;
    this.mapped = f.mapped;
    this.atWindowEdge = f.atWindowEdge;
    this.continuousDay = f.continuousDay;
    this.continuousMinutes = f.continuousMinutes;
    const sun = f.sun;
    // In the order of At (one literal: an array of unboxed numbers of its exact length).
    this.numbers = [
      f.dayJd0, f.apparentMinutes, f.chiSquare, f.penalty, f.objective,
      sun.jdUT, sun.jdTT, sun.azimuthDeg, sun.altitudeDeg, sun.geometricAltitudeDeg, sun.declinationDeg, sun.rightAscensionDeg, sun.hourAngleDeg, sun.equationOfTimeMinutes,
    ];
    this.madePoint = undefined;
  }

  get dayJd0(): number {
    return this.numbers[At.DayJd0];
  }
  get apparentMinutes(): number {
    return this.numbers[At.ApparentMinutes];
  }
  get chiSquare(): number {
    return this.numbers[At.ChiSquare];
  }
  get penalty(): number {
    return this.numbers[At.Penalty];
  }
  get objective(): number {
    return this.numbers[At.Objective];
  }
  get sun(): SunPosition {
    const n = this.numbers;
    return {
      jdUT: n[At.SunJdUT],
      jdTT: n[At.SunJdTT],
      azimuthDeg: n[At.SunAzimuth],
      altitudeDeg: n[At.SunAltitude],
      geometricAltitudeDeg: n[At.SunGeometricAltitude],
      declinationDeg: n[At.SunDeclination],
      rightAscensionDeg: n[At.SunRightAscension],
      hourAngleDeg: n[At.SunHourAngle],
      equationOfTimeMinutes: n[At.SunEquationOfTime],
    };
  }
  get point(): DatedPoint {
    return (this.madePoint ??= pointOfExactSun(this.model, this.assumed, this.dayJd0, this.apparentMinutes, this.nuisances, this.sun));
  }
}

/**
 * The allowed day with the smallest predicted chi-square near d_hat; when the restrictions
 * (months, bounds, weekday) exclude every day near it, the nearest allowed day up to
 * FAR_SNAP_DAYS away, marked `far` (then refined on that day, not predicted). Null when none.
 */
function chooseDay(win: DayWindow, dHat: number, cdd: number): { day: number; far: boolean } | null {
  const sigma = cdd > 0 && Number.isFinite(cdd) ? Math.sqrt(cdd) : 1;
  const reach = Math.min(MAX_SNAP_DAYS, Math.max(win.weekday !== null ? 4 : 1.5, 3 * sigma));
  const centre = nearestDayJd0(dHat);
  let best: number | null = null;
  let bestCost = Infinity;
  for (let k = 0; k <= Math.ceil(reach); k += 1) {
    // The centre, then the day k before it and the day k after it.
    for (let side = k === 0 ? 1 : -1; side <= 1; side += 2) {
      const day = centre + side * k;
      if (!isDayAllowed(win, day)) continue;
      const cost = cdd > 0 ? ((day - dHat) * (day - dHat)) / cdd : Math.abs(day - dHat);
      if (cost < bestCost) {
        bestCost = cost;
        best = day;
      }
    }
    if (best !== null && k > 1 && win.weekday === null) break;
  }
  if (best !== null) return { day: best, far: false };
  // The nearest allowed day on each side (the earlier one on a tie, as a day-by-day search would find).
  const before = farDistance(win, centre, Math.ceil(reach) + 1, -1);
  const after = farDistance(win, centre, Math.ceil(reach) + 1, 1);
  if (before === null && after === null) return null;
  if (after === null || (before !== null && before <= after)) return { day: centre - (before as number), far: true };
  return { day: centre + after, far: true };
}

/**
 * Distance (days, from `from` up to FAR_SNAP_DAYS) of the nearest allowed day on one side of
 * `centre`, or null. A day in a month the window leaves out is passed over with the rest of its
 * month at once (the skipped days checked to be of that same month: a civil month is one run of
 * days, even across a calendar switch), instead of one day at a time.
 */
function farDistance(win: DayWindow, centre: number, from: number, side: -1 | 1): number | null {
  let k = from;
  while (k <= FAR_SNAP_DAYS) {
    const day = centre + side * k;
    if (isDayAllowed(win, day)) return k;
    let step = 1;
    if (win.months !== null && day >= win.firstDayJd0 && day <= win.lastDayJd0) {
      const civil = jdToCivilDay(win.calendar, day + 0.5);
      if (!win.months.has(civil.month)) {
        const skip = side < 0 ? civil.day : Math.max(1, 29 - civil.day); // days 1..d, or d..28, are of this month
        const end = jdToCivilDay(win.calendar, day + side * (skip - 1) + 0.5);
        if (skip > 1 && end.month === civil.month && end.year === civil.year) step = skip;
      }
    }
    k += step;
  }
  return null;
}

/** Conditional mean of (m, nuisances) given d, from the linearised fit: x_rest + C_rd / C_dd (d - d_hat). */
function conditionalRest(x: readonly number[], cov: number[][] | null, day: number): number[] {
  const rest = x.slice(1);
  if (!cov || !(cov[0][0] > 0)) return rest;
  const dd = day - x[0];
  const moved = new Array<number>(rest.length);
  for (let i = 0; i < rest.length; i += 1) {
    const v = rest[i] + (cov[i + 1][0] / cov[0][0]) * dd;
    // A near-singular fit can predict absurd shifts (the minute by more than 4 h, a nuisance by more than 20 deg); then keep the optimum's values.
    if (!Number.isFinite(v) || Math.abs(v - rest[i]) > (i === 0 ? 240 : 20)) return rest;
    moved[i] = v;
  }
  return moved;
}

interface Continuous {
  readonly x: number[];
  readonly objective: number;
  /** The representative year whose fit (ellipse, context) the year shares. */
  readonly rep: RepresentativeFit;
  readonly mapped: boolean;
  /** The representative years around the year and the weight of the later one. */
  readonly lo: RepresentativeFit;
  readonly hi: RepresentativeFit;
  readonly w: number;
}

/** On-day fits of a representative year at three neighbouring far days (offsets centreOffset - 1, centreOffset, centreOffset + 1 from its optimum). */
interface FarFit {
  readonly centreOffset: number;
  /** Each component of (minute, nuisances) at the three days. */
  readonly rest: readonly [number, number, number][];
  readonly objective: readonly [number, number, number];
  readonly equationOfTimeMinutes: number;
}

interface Track {
  readonly key: string;
  readonly branch: 'rising' | 'falling' | 'solstice';
  readonly longitudeDeg: number;
}

/**
 * Dated candidates for one clock assumption from the stage-A minima.
 * @param onProgress called as the minima's sun tracks are taken in turn (done of total minima, fractional)
 */
export function stageB(model: EvidenceModel, assumed: ClockKind | null, assumptionIndex: number, minima: readonly StageAMinimum[], win: DayWindow, onProgress?: (done: number, total: number) => void): StageBResult {
  const out: RawCandidate[] = [];
  let fullRefinements = 0;
  let mappedYears = 0;
  let ephemerisCalls = 0;
  const midJd = 0.5 * (win.firstDayJd0 + win.lastDayJd0);
  const obliquityDeg = lowPrecisionSun(midJd).obliquityDeg;
  const rows = new Float64Array(residualRowCount(model)); // the residual rows of each exact evaluation (exactFit)

  minima.forEach((seed, seedIndex) => {
    const tracks: Track[] = longitudesOfDeclination(seed.declinationDeg, obliquityDeg).map((l) => ({
      key: `${assumptionIndex}:${seedIndex}:${l.branch}`,
      branch: l.branch,
      longitudeDeg: l.longitudeDeg,
    }));
    for (const [t, track] of tracks.entries()) {
      onProgress?.(seedIndex + t / tracks.length, minima.length);
      // Crossing instants: the first within half a year of the window start, then every tropical year.
      let t0 = instantOfSolarLongitude(track.longitudeDeg, win.firstDayJd0 + TROPICAL_YEAR_DAYS / 2);
      while (t0 - TROPICAL_YEAR_DAYS > win.firstDayJd0 - 30) t0 -= TROPICAL_YEAR_DAYS;
      const cycles: number[] = [];
      for (let k = 0; t0 + k * TROPICAL_YEAR_DAYS <= win.lastDayJd0 + 30; k += 1) {
        if (t0 + k * TROPICAL_YEAR_DAYS >= win.firstDayJd0 - 30) cycles.push(k);
      }
      if (cycles.length === 0) {
        // A short window (a few days, notBefore = notAfter) that this declination never reaches:
        // take the nearest crossing; its days are then snapped far (chooseDay) and refined on the
        // window's own days, so that a curve of solutions (one measured number) or a poor fit
        // there is still reported instead of no candidate at all.
        const nearest = Math.round((midJd - t0) / TROPICAL_YEAR_DAYS);
        if (Math.abs(t0 + nearest * TROPICAL_YEAR_DAYS - midJd) > FAR_SNAP_DAYS) continue;
        cycles.push(nearest);
      }
      const kMin = cycles[0];
      const kMax = cycles[cycles.length - 1];
      const repCycles = new Set<number>();
      if (cycles.length <= FULL_REFINEMENT_CYCLES) cycles.forEach((k) => repCycles.add(k));
      else {
        const intervals = Math.max(1, Math.ceil((kMax - kMin) / REP_SPACING));
        for (let i = 0; i <= intervals; i += 1) repCycles.add(Math.round(kMin + ((kMax - kMin) * i) / intervals));
      }

      const fitCycle = (k: number, start?: readonly number[]): RepresentativeFit => {
        const tk = instantOfSolarLongitude(track.longitudeDeg, t0 + k * TROPICAL_YEAR_DAYS);
        const context = newDatedContext(model, assumed, tk, false); // the sun's evidence alone: the moon is fitted per year after (moonYears.ts)
        const m0 = 720 + 4 * seed.hourAngleDeg;
        const e0 = solarStateOnTrack(context.track, tk).equationOfTimeMinutes;
        const lon = longitudeOf(model, seed.nuisances);
        const x0 = start ?? [tk - (m0 - e0) / 1440 + lon / 360, m0, ...seed.nuisances];
        const fit = refineDated(context, x0);
        fullRefinements += 1;
        const covariance = covarianceFromJacobian(fit.lm.jacobian, fit.x.length);
        return { cycle: k, fit, objective: fit.lm.chiSquare, covariance, context };
      };

      const reps = new Map<number, RepresentativeFit>();
      for (const k of repCycles) reps.set(k, fitCycle(k));
      const repList = [...reps.values()].sort((a, b) => a.cycle - b.cycle);

      /** Continuous optimum of cycle k: its own fit, or mapped from the representatives around it. */
      const continuousOf = (k: number): Continuous => {
        const own = reps.get(k);
        if (own) return { x: own.fit.x, objective: own.objective, rep: own, mapped: false, lo: own, hi: own, w: 0 };
        let lo = repList[0];
        let hi = repList[repList.length - 1];
        for (const r of repList) {
          if (r.cycle <= k) lo = r;
          if (r.cycle >= k) {
            hi = r;
            break;
          }
        }
        const w = hi.cycle === lo.cycle ? 0 : (k - lo.cycle) / (hi.cycle - lo.cycle);
        const x: number[] = [];
        for (let i = 0; i < lo.fit.x.length; i += 1) {
          const v = lo.fit.x[i];
          const a = i === 0 ? v - lo.cycle * TROPICAL_YEAR_DAYS : v;
          const b = i === 0 ? hi.fit.x[0] - hi.cycle * TROPICAL_YEAR_DAYS : hi.fit.x[i];
          const mixed = a + w * (b - a);
          x.push(i === 0 ? mixed + k * TROPICAL_YEAR_DAYS : mixed);
        }
        const objective = lo.objective + w * (hi.objective - lo.objective);
        return { x, objective, rep: w < 0.5 ? lo : hi, mapped: true, lo, hi, w };
      };

      // Far days (the restrictions exclude the optimum's neighbourhood) of the representative years,
      // fitted on three neighbouring days each, once: the far days of the other years are mapped
      // from them like their optima (one full-ephemeris evaluation each), not refitted one by one.
      const farFits = new Map<RepresentativeFit, FarFit[]>();
      const farFitOf = (rep: RepresentativeFit, offset: number): FarFit => {
        const list = farFits.get(rep) ?? [];
        const hit = list.find((f) => Math.abs(f.centreOffset - offset) <= 1.5);
        if (hit) return hit;
        const centreDay = nearestDayJd0(rep.fit.x[0] + offset);
        const context = newDatedContext(model, assumed, centreDay + rep.fit.x[1] / 1440, false);
        const fits = [centreDay - 1, centreDay, centreDay + 1].map((d) => refineOnDay(context, d, rep.fit.x.slice(1)));
        ephemerisCalls += context.ephemerisCalls;
        const f: FarFit = {
          centreOffset: centreDay - rep.fit.x[0],
          rest: fits[0].x.slice(1).map((_, i) => [fits[0].x[i + 1], fits[1].x[i + 1], fits[2].x[i + 1]] as [number, number, number]),
          objective: [fits[0].lm.chiSquare, fits[1].lm.chiSquare, fits[2].lm.chiSquare],
          equationOfTimeMinutes: fits[1].point.state.equationOfTimeMinutes,
        };
        list.push(f);
        farFits.set(rep, list);
        return f;
      };
      /** A mapped year's far day: (minute, nuisances) and chi-square interpolated from the representative years around it. */
      const mappedFarDay = (c: Continuous, day: number): { rest: number[]; objective: number; equationOfTimeMinutes: number } => {
        const offset = day - c.x[0];
        const at = (f: FarFit) => ({
          rest: f.rest.map((v) => parabola(v, offset - f.centreOffset)),
          objective: parabola(f.objective, offset - f.centreOffset),
        });
        const lo = at(farFitOf(c.lo, offset));
        const hi = at(farFitOf(c.hi, offset));
        return {
          rest: lo.rest.map((v, i) => v + c.w * (hi.rest[i] - v)),
          objective: lo.objective + c.w * (hi.objective - lo.objective),
          equationOfTimeMinutes: farFitOf(c.rep, offset).equationOfTimeMinutes,
        };
      };

      for (const k of cycles) {
        let c = continuousOf(k);
        let rep = c.rep;
        const cdd = rep.covariance ? rep.covariance[0][0] : NaN;
        const chosen = chooseDay(win, c.x[0], cdd);
        if (chosen === null) continue;
        let day = chosen.day;
        let rest = conditionalRest(c.x, rep.covariance, day);
        let ex: ExactFit | undefined;
        let iterations = 0;
        let converged = true;
        let mapped = c.mapped;
        let atWindowEdge = chosen.far;
        let farMapped = false;
        if (c.mapped && chosen.far) {
          const m = mappedFarDay(c, day);
          const far = exactFit(model, assumed, rep.context.site, day, m.rest[0], m.rest.slice(1), m.equationOfTimeMinutes, rows);
          ephemerisCalls += 1;
          // Verified like the other mapped years: kept unless it fits worse than predicted by more than max(2, 20%).
          if (far.objective <= m.objective + Math.max(2, 0.2 * m.objective)) {
            ex = far;
            rest = m.rest;
            farMapped = true;
            mappedYears += 1;
          }
        }
        if (farMapped) {
          // mapped from the representative years' far days, verified above
        } else if (!c.mapped || chosen.far) {
          if (chosen.far) rest = c.x.slice(1);
          const onDay = refineOnDay(rep.context, day, rest);
          iterations = rep.fit.iterations + onDay.iterations;
          converged = rep.fit.converged && onDay.converged;
          rest = onDay.x.slice(1);
          ex = exactFit(model, assumed, rep.context.site, day, rest[0], rest.slice(1), onDay.point.state.equationOfTimeMinutes, rows);
          ephemerisCalls += 1;
          // Near a solstice the quadratic prediction can pick the wrong one of two neighbouring days: try the other.
          const other = day + (c.x[0] > day ? 1 : -1);
          if (!chosen.far && isDayAllowed(win, other)) {
            const alt = refineOnDay(rep.context, other, conditionalRest(c.x, rep.covariance, other));
            const altEx = exactFit(model, assumed, rep.context.site, other, alt.x[1], alt.x.slice(2), alt.point.state.equationOfTimeMinutes, rows);
            ephemerisCalls += 1;
            if (altEx.objective < ex.objective) {
              day = other;
              rest = alt.x.slice(1);
              ex = altEx;
              iterations += alt.iterations;
            }
          }
          if (c.mapped) mappedYears += 1;
        } else {
          mappedYears += 1;
          ex = exactFit(model, assumed, rep.context.site, day, rest[0], rest.slice(1), rep.fit.point.state.equationOfTimeMinutes, rows);
          ephemerisCalls += 1;
          const predicted = c.objective + (cdd > 0 ? ((day - c.x[0]) * (day - c.x[0])) / cdd : 0);
          if (ex.objective > predicted + Math.max(2, 0.2 * predicted)) {
            // The mapping did not hold: refine this year in full.
            const own = fitCycle(k, c.x);
            reps.set(k, own);
            c = { x: own.fit.x, objective: own.objective, rep: own, mapped: false, lo: own, hi: own, w: 0 };
            rep = own;
            mapped = false;
            mappedYears -= 1;
            const again = chooseDay(win, own.fit.x[0], own.covariance ? own.covariance[0][0] : NaN);
            if (again === null) continue;
            day = again.day;
            atWindowEdge = again.far;
            const onDay = refineOnDay(own.context, day, again.far ? own.fit.x.slice(1) : conditionalRest(own.fit.x, own.covariance, day));
            rest = onDay.x.slice(1);
            iterations = own.fit.iterations + onDay.iterations;
            converged = own.fit.converged && onDay.converged;
            ex = exactFit(model, assumed, own.context.site, day, rest[0], rest.slice(1), onDay.point.state.equationOfTimeMinutes, rows);
            ephemerisCalls += 1;
          }
        }
        if (!ex) continue; // not reached: every branch above evaluates the candidate
        out.push(new StageBCandidate({
          assumptionIndex,
          trackKey: track.key,
          branch: track.branch,
          cycle: k,
          dayJd0: day,
          apparentMinutes: rest[0],
          nuisances: ex.nuisances, // the same numbers as rest.slice(1) in every branch above
          sun: ex.sun,
          chiSquare: ex.chiSquare,
          penalty: ex.penalty,
          objective: ex.objective,
          continuousDay: c.x[0],
          continuousMinutes: c.x[1],
          rep,
          fit: converged && iterations === 0 ? MAPPED_FIT : { converged, iterations },
          mapped,
          atWindowEdge,
        }, model, assumed));
      }
      for (const r of reps.values()) ephemerisCalls += r.context.ephemerisCalls;
    }
  });
  onProgress?.(minima.length, minima.length);

  return { candidates: dedupeByDayAndHour(out), fullRefinements, mappedYears, ephemerisCalls };
}

/**
 * One candidate per civil day and hour (within 5 minutes) of one assumption: the best, sorted best first.
 * Keyed by day, so that each candidate is compared only with those kept on its own day.
 */
export function dedupeByDayAndHour(candidates: readonly RawCandidate[]): RawCandidate[] {
  const kept: RawCandidate[] = [];
  // The first kept on a day alone, a list only when a second is kept there (most days keep one).
  const keptByDay = new Map<number, RawCandidate | RawCandidate[]>();
  const near = (k: RawCandidate, c: RawCandidate): boolean => Math.abs(k.apparentMinutes - c.apparentMinutes) < 5;
  for (const c of [...candidates].sort((a, b) => a.objective - b.objective)) {
    const sameDay = keptByDay.get(c.dayJd0);
    if (sameDay === undefined) keptByDay.set(c.dayJd0, c);
    else if (Array.isArray(sameDay)) {
      if (sameDay.some((k) => near(k, c))) continue;
      sameDay.push(c);
    } else {
      if (near(sameDay, c)) continue;
      keptByDay.set(c.dayJd0, [sameDay, c]);
    }
    kept.push(c);
  }
  return kept;
}
