/**
 * The moon's stage of the search: every year's candidate of the sun's evidence (stage B) fitted
 * again with the moon, at that year's own instants.
 *
 * The sun's light repeats every year, so stage B maps most years from a few representative ones;
 * the moon does not repeat (its phase on a calendar day returns after 19 years, 235 lunations, and
 * roughly after 8 years, 99 lunations), so it is evaluated per year and never mapped. For each
 * stage-B candidate (one per family track and year):
 * 1. screen: every allowed whole day within 4 sigma of the year's sun-only optimum (at least 2, at
 *    most MAX_MOON_DAYS days either side), and every day within MAX_MOON_DAYS whose sun's declination lies
 *    within 4 sigma of the optimum's (near a solstice these reach further: declinationReach), at the minute the sun's fit predicts for that day (its
 *    conditional mean): days whose quick phase (Meeus eq. 48.4) misses a drawn phase by more than
 *    4 sigma are passed over, the others evaluated with the full sun and moon; where a direction of
 *    the moon is drawn, also at the minute that brings the moon nearest its drawn place as the sky
 *    turns (moonMinuteShift), when that lies within 4 conditional sigmas of the sun's minute, and the
 *    better of the two kept (near the zenith the moon's azimuth sweeps many degrees a minute, and
 *    the sun's minute alone can lead the fit on the true day into a wrong valley);
 * 2. refine: the best screened day (and the second best, when it screened within SECOND_DAY_CUTOFF
 *    of it) of each year whose best screened objective lies within
 *    MOON_REFINE_CUTOFF of the best of all years, by Levenberg-Marquardt in (minute, nuisances) on
 *    that day with the whole evidence (src/solver/fitting.ts refineOnDay); the other years keep
 *    their best screened day (they fit far worse: their objective is an upper bound of their best).
 * Every kept candidate is verified by one exact evaluation (stageB.ts exactPoint).
 * The ellipses of a candidate come from its own continuous fit with the moon (candidateUncertainty.ts).
 */
import type { ClockKind } from '../scene/types.js';
import { latitudeOf, splitChiSquare, type EvidenceModel } from './evidenceModel.js';
import { datedPoint, ensureTrack, newDatedContext, refineOnDay, type DatedContext } from './fitting.js';
import { exactPoint, type RawCandidate } from './stageB.js';
import { isDayAllowed, nearestDayJd0, type DayWindow } from './window.js';
import { moonPhaseLongitudeApproxDeg, MOON_PHASE_APPROX_ALLOWANCE_DEG } from '../ephemeris/moonPhaseApprox.js';
import { normalizeDeg180, sinDeg, cosDeg } from '../math/angles.js';
import type { MoonTerm } from './moonEvidence.js';
import { fastSunPosition } from '../ephemeris/fastSun.js';
import { deltaTSeconds } from '../time/deltaT.js';
import { jdToDecimalYear } from '../time/timeScales.js';

/** Most days either side of a year's sun-only optimum screened for the moon (beyond, the other branch of the solstice takes over). */
export const MAX_MOON_DAYS = 45;
/** Days screened either side: this many sigmas of the sun's day (at least 2 days). */
const DAY_REACH_SIGMAS = 4;
/** Years whose best screened objective is within this of the best year's are refined. */
export const MOON_REFINE_CUTOFF = 30;
/** Screened days refined per year. */
const REFINED_DAYS = 2;
const SECOND_DAY_CUTOFF = 10;
/**
 * A day whose quick phase (Meeus eq. 48.4, src/ephemeris/moonPhaseApprox.ts) misses the drawn phase by
 * more than this in chi-square, with its sigma widened by the quick phase's allowance, is not screened
 * with the full ephemeris (4 sigma: a true day is passed over with probability below 1e-4).
 */
const PHASE_SCREEN_CHI2 = 16;

/** Chi-square of the drawn phases against the quick phase longitude l (sigmas widened by its allowance); also used by src/solver/moonSearch.ts. */
export function quickPhaseChiSquare(terms: readonly MoonTerm[], l: number): number {
  let chi = 0;
  for (const t of terms) {
    const e = t.evidence;
    if (e.kind === 'moon-fraction') {
      // k = (1 - cos L) / 2 (Meeus eq. 48.1 with i = 180 - L); dk/dL = sin(L) / 2 per radian.
      const k = (1 - cosDeg(l)) / 2;
      const sigma = e.sigma + (MOON_PHASE_APPROX_ALLOWANCE_DEG * Math.PI) / 360;
      chi += ((k - e.illuminatedFraction) / sigma) ** 2;
    } else if (e.kind === 'moon-named-phase') {
      const predicted = e.folded ? Math.min(l, 360 - l) : l;
      chi += (normalizeDeg180(predicted - e.phaseLongitudeDeg) / (e.sigmaDeg + MOON_PHASE_APPROX_ALLOWANCE_DEG)) ** 2;
    }
  }
  return chi;
}

/**
 * The moon's mean apparent turn about the celestial pole, degrees per minute: the earth's sidereal
 * rotation, 360.98564736629 deg per day (Meeus, Astronomical Algorithms, 2nd ed. 1998, eq. 12.4),
 * less the moon's mean motion in longitude, 481267.88123421 deg per Julian century (Meeus eq. 47.1),
 * i.e. 13.176 deg per day; divided by 1440.
 */
const MOON_DIURNAL_DEG_PER_MINUTE = (360.98564736629 - 481267.88123421 / 36525) / 1440;
/** Largest shift of the minute tried for the moon's drawn place, minutes (a seed only: the fit on the day then refines it). */
const MOON_SHIFT_LIMIT_MINUTES = 120;
/** Shifts below this, minutes, are left to the fit on the day. */
const MIN_MOON_SHIFT_MINUTES = 1;

/** Unit vector (east, north, up) of a direction given by azimuth and altitude, degrees. */
function horizonVector(azimuthDeg: number, altitudeDeg: number): [number, number, number] {
  return [cosDeg(altitudeDeg) * sinDeg(azimuthDeg), cosDeg(altitudeDeg) * cosDeg(azimuthDeg), sinDeg(altitudeDeg)];
}

/**
 * Minutes to add so that the moon, turning with the sky about the celestial pole from where it
 * stands (azimuth, altitude), comes nearest to the drawn place: the least-squares step along its
 * motion on the unit sphere, v(t) = v0 + t dv/dt with dv/dt = -w (p x v0), p the pole's direction
 * (azimuth 0, altitude = latitude) and w the mean rate above; 0 without a drawn direction. The
 * distance is taken on the sphere, not in azimuth, so that a moon near the zenith, whose azimuth
 * sweeps fast, is found too (common practice: linearised motion on the sphere).
 */
export function moonMinuteShift(drawn: { azimuthDeg: number; altitudeDeg: number } | undefined, moon: { azimuthDeg: number; altitudeDeg: number }, latitudeDeg: number): number {
  if (!drawn) return 0;
  const v = horizonVector(moon.azimuthDeg, moon.altitudeDeg);
  const target = horizonVector(drawn.azimuthDeg, drawn.altitudeDeg);
  const pole = [0, cosDeg(latitudeDeg), sinDeg(latitudeDeg)];
  const w = (MOON_DIURNAL_DEG_PER_MINUTE * Math.PI) / 180;
  // dv/dt = -w (p x v): westward turn of the sky (p x v points east for a body due south of the pole).
  const dv = [-w * (pole[1] * v[2] - pole[2] * v[1]), -w * (pole[2] * v[0] - pole[0] * v[2]), -w * (pole[0] * v[1] - pole[1] * v[0])];
  const speed2 = dv[0] ** 2 + dv[1] ** 2 + dv[2] ** 2;
  if (!(speed2 > 0)) return 0;
  const t = ((target[0] - v[0]) * dv[0] + (target[1] - v[1]) * dv[1] + (target[2] - v[2]) * dv[2]) / speed2;
  return Math.max(-MOON_SHIFT_LIMIT_MINUTES, Math.min(MOON_SHIFT_LIMIT_MINUTES, t));
}

interface Screened {
  readonly day: number;
  readonly minutes: number;
  readonly objective: number;
}

export interface MoonStageResult {
  readonly candidates: RawCandidate[];
  readonly moonEvaluations: number;
  readonly refinedYears: number;
  /** Days evaluated with the full moon ephemeris in the screening. */
  readonly screenedDays: number;
}

function objectiveOf(model: EvidenceModel, r: readonly number[]): { chiSquare: number; penalty: number; objective: number } {
  const s = splitChiSquare(model, r);
  return { chiSquare: s.chiSquare, penalty: s.penalty, objective: s.chiSquare + s.penalty };
}

/** The minute the sun's fit predicts on `day` (its conditional mean; the optimum's minute when the covariance is unusable). */
function minuteOnDay(c: RawCandidate, day: number): number {
  const cov = c.rep.covariance;
  if (!cov || !(cov[0][0] > 0)) return c.continuousMinutes;
  const shift = (cov[1][0] / cov[0][0]) * (day - c.continuousDay);
  return Number.isFinite(shift) && Math.abs(shift) <= 240 ? c.continuousMinutes + shift : c.continuousMinutes;
}

/**
 * Days beyond the reach in days whose sun's declination still lies within DAY_REACH_SIGMAS sigmas of the
 * optimum's (the sigma in declination = the day's sigma times the declination's rate there). Near a solstice
 * the declination changes ever more slowly, so the days that fit the shadows reach further than the
 * linearised day's sigma says (a true day 3 days before the solstice lay 4.2 of those sigmas from its
 * branch's optimum and was passed over: docs/moon-evidence.md). Declination by the low-precision sun
 * (Meeus 1998, ch. 25: src/ephemeris/fastSun.ts), at the candidate's minute.
 */
function declinationReach(model: EvidenceModel, c: RawCandidate, sd: number): (day: number) => boolean {
  if (!Number.isFinite(sd)) return () => false;
  const site = { latitudeDeg: model.scene.site.latitudeDeg, longitudeDeg: model.scene.site.longitudeDeg, elevationM: model.scene.site.elevationM };
  const dt = deltaTSeconds(jdToDecimalYear(c.point.jdUT), model.scene.deltaT);
  const offset = c.point.jdUT - c.continuousDay; // the instant's fraction of the day, held for every day
  const dec = (d: number): number => fastSunPosition(d + offset, site, dt, 'none').declinationDeg;
  const d0 = dec(c.continuousDay);
  const rate = Math.abs(dec(c.continuousDay + 1) - dec(c.continuousDay - 1)) / 2;
  const limit = DAY_REACH_SIGMAS * sd * rate;
  return (day: number) => Math.abs(dec(day) - d0) <= limit;
}

function screenYear(model: EvidenceModel, ctx: DatedContext, c: RawCandidate, win: DayWindow): Screened[] {
  const cov = c.rep.covariance;
  // Near a solstice the sun hardly fixes the day (the covariance is huge or singular): then the widest reach.
  const sd = cov && cov[0][0] > 0 && Number.isFinite(cov[0][0]) ? Math.sqrt(cov[0][0]) : Infinity;
  const reach = Math.min(MAX_MOON_DAYS, Math.max(2, Math.ceil(DAY_REACH_SIGMAS * sd)));
  const centre = nearestDayJd0(c.continuousDay);
  const nearDeclination = declinationReach(model, c, sd);
  const phased = model.moons.some((t) => t.evidence.kind === 'moon-fraction' || t.evidence.kind === 'moon-named-phase');
  const days: { day: number; minutes: number; quick: number }[] = [];
  const wide = Number.isFinite(sd) ? MAX_MOON_DAYS : reach;
  for (let day = centre - wide; day <= centre + wide; day += 1) {
    if (!isDayAllowed(win, day)) continue;
    if (Math.abs(day - centre) > reach && !nearDeclination(day)) continue;
    const minutes = minuteOnDay(c, day);
    // The instant, near enough for the quick phase: local apparent time less the longitude (the equation of time left out).
    const quick = phased ? quickPhaseChiSquare(model.moons, moonPhaseLongitudeApproxDeg(day + minutes / 1440 - model.scene.site.longitudeDeg / 360)) : 0;
    days.push({ day, minutes, quick });
  }
  // Every day that passes the quick phase, or else the year's best by it, is screened in full.
  let passing = days.filter((d) => d.quick <= PHASE_SCREEN_CHI2);
  if (passing.length === 0 && days.length > 0) passing = [days.reduce((a, b) => (b.quick < a.quick ? b : a))];
  const drawn = model.moons.find((t) => t.evidence.kind === 'moon-direction')?.evidence;
  const direction = drawn && drawn.kind === 'moon-direction' ? drawn : undefined;
  const latitudeDeg = latitudeOf(model, c.nuisances);
  // A shifted minute is tried only within 4 sigma of the minute the sun's fit allows on a given day
  // (its conditional sigma); beyond, the shadows rule it out whatever the moon says.
  const conditionalVar = cov && cov[0][0] > 0 ? cov[1][1] - (cov[1][0] * cov[1][0]) / cov[0][0] : NaN;
  const minuteReach = Number.isFinite(conditionalVar) && conditionalVar > 0 ? DAY_REACH_SIGMAS * Math.sqrt(conditionalVar) : MOON_SHIFT_LIMIT_MINUTES;
  const out: Screened[] = [];
  for (const { day, minutes } of passing) {
    ensureTrack(ctx, day + minutes / 1440);
    const p = datedPoint(ctx, day, minutes, c.nuisances);
    let best: Screened = { day, minutes, objective: objectiveOf(model, p.residuals).objective };
    // The minute the sun's fit gives may miss the moon's place by minutes that matter (the moon turns
    // 0.24 deg a minute with the sky, its azimuth far faster near the zenith): the minute that brings
    // the moon nearest its drawn place is screened too, and the better of the two kept.
    const shift = p.moon ? moonMinuteShift(direction, p.moon, latitudeDeg) : 0;
    if (Math.abs(shift) >= MIN_MOON_SHIFT_MINUTES && Math.abs(shift) <= minuteReach) {
      const q = datedPoint(ctx, day, minutes + shift, c.nuisances);
      const o = objectiveOf(model, q.residuals).objective;
      if (o < best.objective) best = { day, minutes: minutes + shift, objective: o };
    }
    out.push(best);
  }
  return out.sort((a, b) => a.objective - b.objective);
}

/** The stage-B candidates of one clock assumption, each year fitted again with the moon. */
export function moonStage(model: EvidenceModel, assumed: ClockKind | null, sunOnly: readonly RawCandidate[], win: DayWindow): MoonStageResult {
  let moonEvaluations = 0;
  let refinedYears = 0;
  const screened = sunOnly.map((c) => {
    const ctx = newDatedContext(model, assumed, c.point.jdUT);
    const days = screenYear(model, ctx, c, win);
    return { c, ctx, days };
  });
  const best = Math.min(...screened.map((s) => (s.days.length ? s.days[0].objective : Infinity)));
  const out: RawCandidate[] = [];
  for (const { c, ctx, days } of screened) {
    if (days.length === 0) continue;
    let pick = { day: days[0].day, rest: [days[0].minutes, ...c.nuisances], iterations: 0, converged: true };
    let pickObjective = days[0].objective;
    const refine = days[0].objective <= best + MOON_REFINE_CUTOFF;
    if (refine) {
      refinedYears += 1;
      for (const d of days.slice(0, REFINED_DAYS).filter((x) => x.objective <= days[0].objective + SECOND_DAY_CUTOFF)) {
        const fit = refineOnDay(ctx, d.day, [d.minutes, ...c.nuisances]);
        const o = objectiveOf(model, fit.point.residuals).objective;
        if (o < pickObjective) {
          pickObjective = o;
          pick = { day: d.day, rest: fit.x.slice(1), iterations: fit.iterations, converged: fit.converged };
        }
      }
    }
    const ex = exactPoint(model, assumed, ctx.site, pick.day, pick.rest[0], pick.rest.slice(1), datedPoint(ctx, pick.day, pick.rest[0], pick.rest.slice(1), false).state.equationOfTimeMinutes);
    moonEvaluations += 1;
    const o = objectiveOf(model, ex.point.residuals);
    out.push({
      ...c,
      dayJd0: pick.day,
      apparentMinutes: pick.rest[0],
      nuisances: pick.rest.slice(1),
      point: ex.point,
      sun: ex.sun,
      chiSquare: o.chiSquare,
      penalty: o.penalty,
      objective: o.objective,
      fit: { converged: c.fit.converged && pick.converged, iterations: c.fit.iterations + pick.iterations },
      atWindowEdge: c.atWindowEdge && pick.day === c.dayJd0,
      moonRefined: refine,
    });
  }
  for (const s of screened) moonEvaluations += s.ctx.moonCalls;
  return { candidates: out, moonEvaluations, refinedYears, screenedDays: screened.reduce((n, x) => n + x.days.length, 0) };
}
