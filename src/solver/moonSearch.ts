/**
 * The search of a scene whose light is the moon: no shadow by sunlight, so the sun's stage A (a
 * search of the sky for the sun's place, then one dating per year) cannot start it. The moon's place
 * for a given day and hour differs every year, so every allowed day of the window is scanned with
 * the moon's own ephemeris:
 * 1. screen: each allowed day at every SCAN_STEP_MINUTES of local mean time, with the quick moon
 *    (src/ephemeris/moonQuick.ts, within 0.6 deg) and the fast sun (src/ephemeris/fastSun.ts): the
 *    shadows by moonlight and the moon's direction, its quick phase (Meeus eq. 48.4), the facts (the
 *    moon up, the sun down in a night view) and any clock. The best step of each day is moved to the
 *    vertex of the parabola through it and its neighbours (Meeus 1998, eq. 3.3 form; common practice);
 * 2. keep the days within SCREEN_CUTOFF of the best: the MAX_REFINED best of all and each year's best
 *    (the moon comes back to a place about once a month, and on neighbouring days when its phase is loose);
 * 3. refine each kept day with the whole evidence and the full moon (src/ephemeris/moonPosition.ts)
 *    by Levenberg-Marquardt in (minute, nuisances) on that civil day (src/solver/fitting.ts
 *    refineOnDay), then verify it with one exact evaluation (stageB.ts exactPoint).
 * The moon fixes an instant, not a day and an hour each: a day later it stands at the same place
 * about 50 minutes later. In the solver's (day, minute) the fit is singular, so a candidate carries no
 * ellipse: the sigma of its minute on its day (from the on-day fit's Jacobian, Press et al., Numerical
 * Recipes 3rd ed. 2007, section 15.5), and the profile scan over the neighbouring days
 * (src/solver/candidateUncertainty.ts) says which days fit with their hours.
 */
import type { ClockKind } from '../scene/types.js';
import { covarianceFromJacobian } from '../math/leastSquares.js';
import { normalizeDeg180 } from '../math/angles.js';
import { quickMoonEquatorial, quickMoonHorizontal, QUICK_MOON_ALLOWANCE_DEG, type QuickMoon, type QuickMoonEquatorial } from '../ephemeris/moonQuick.js';
import { fastSunPosition } from '../ephemeris/fastSun.js';
import { moonPhaseLongitudeApproxDeg } from '../ephemeris/moonPhaseApprox.js';
import { deltaTSeconds } from '../time/deltaT.js';
import { jdToDecimalYear } from '../time/timeScales.js';
import { jdToCivilDate } from '../calendar/regions.js';
import { evidenceResidualValues, type ShadowEvidence } from '../geometry/observationModels.js';
import {
  evidenceResidualVector, factResidual, FACT_TOLERANCE_DEG, splitChiSquare, termEvidence, wallAzimuthOf,
  type EvaluationContext, type EvidenceModel,
} from './evidenceModel.js';
import { hasMoonEvidence, newDatedContext, refineOnDay, siteOf, zoneOffsetsAt } from './fitting.js';
import { moonFactViolationDeg } from './moonEvidence.js';
import { quickPhaseChiSquare } from './moonYears.js';
import { moonNightBound } from './moonNightBound.js';
import { exactPoint, type RawCandidate } from './stageB.js';
import { isDayAllowed, type DayWindow } from './window.js';

/** Step of the screening in local mean time, minutes (the moon's hour angle moves 7 deg in 30 minutes). */
export const SCAN_STEP_MINUTES = 30;
/** Days whose screened best lies within this of the best of all are kept (the quick moon errs by up to 0.6 deg). */
export const SCREEN_CUTOFF = 60;
/** Most kept days refined, besides each year's best. */
export const MAX_REFINED = 100;
/** Below this quick altitude (degrees) the moon cannot light a shadow: the step is not evaluated further. */
const BELOW_DEG = -2;

export interface MoonSearchResult {
  readonly candidates: RawCandidate[];
  /** Instants screened with the quick moon, and days refined with the full one. */
  readonly screenedInstants: number;
  readonly refinedDays: number;
  readonly moonEvaluations: number;
}

/** True when the scene's shadows are all cast by moonlight (or there are none) and the moon is observed: the sun's search cannot start. */
export function needsMoonSearch(model: EvidenceModel): boolean {
  return !model.shadows.some((t) => t.light === 'sun');
}

/**
 * True for a scene lit by the moon alone: evidence of the moon and no shadow cast by sunlight, so that it is
 * dated by the moon's own search. Its charts are drawn for the moon, not the sun (src/charts).
 */
export function isLitByMoonAlone(model: EvidenceModel): boolean {
  return hasMoonEvidence(model) && needsMoonSearch(model);
}

interface DayBest {
  readonly day: number;
  readonly meanMinutes: number;
  readonly objective: number;
}

/** What the screening takes of a model once for all its instants: the shadows cast by moonlight with their evidence at the priors. */
interface ScreenTerms {
  readonly moonShadows: readonly { readonly evidence: ShadowEvidence; readonly wallAzimuthDeg: number }[];
  /** Room for the residuals of one shadow (evidenceResidualValues writes them here). */
  readonly values: Float64Array;
}

function screenTermsOf(model: EvidenceModel, priors: readonly number[]): ScreenTerms {
  const shadows = model.shadows.filter((t) => t.light === 'moon');
  const moonShadows = shadows.map((t) => ({ evidence: termEvidence(model, t, priors), wallAzimuthDeg: wallAzimuthOf(model, t.wallId, priors) }));
  // Room for the most rows of one shadow (its count), so that none is cut off.
  return { moonShadows, values: new Float64Array(Math.max(8, ...shadows.map((t) => 2 * t.count))) };
}

/** The screening objective at one instant (see header, step 1). */
function screenObjective(model: EvidenceModel, terms: ScreenTerms, assumed: ClockKind | null, zoneOffset: (zone: string) => number, priors: readonly number[], jdUT: number, day: number, dt: number, mustBeUp: boolean, place: QuickMoonEquatorial, phaseLongitudeDeg: number, bound: number): number {
  const s = model.scene.site;
  const moon: QuickMoon = quickMoonHorizontal(place, jdUT, s.latitudeDeg, s.longitudeDeg, model.scene.air);
  if (mustBeUp && moon.altitudeDeg < BELOW_DEG) return Infinity;
  // The moon's part first: when it alone passes `bound`, the instant is out of the running and the rest is not taken.
  let chi = 0;
  // The residuals' values alone, the same numbers as evidenceResiduals gives (src/geometry/observationModels.ts).
  const v = terms.values;
  for (const t of terms.moonShadows) {
    const n = evidenceResidualValues(t.evidence, moon, t.wallAzimuthDeg, v, 0);
    for (let k = 0; k < n; k += 1) chi += v[k] * v[k];
  }
  for (const f of model.moonFacts) chi += (moonFactViolationDeg(f.fact, moon) / FACT_TOLERANCE_DEG) ** 2;
  for (const t of model.moons) {
    const e = t.evidence;
    if (e.kind !== 'moon-direction') continue;
    chi += (normalizeDeg180(moon.azimuthDeg - e.azimuthDeg) / Math.hypot(e.azimuthSigmaDeg, QUICK_MOON_ALLOWANCE_DEG)) ** 2;
    chi += ((moon.altitudeDeg - e.altitudeDeg) / Math.hypot(e.altitudeSigmaDeg, QUICK_MOON_ALLOWANCE_DEG)) ** 2;
  }
  chi += quickPhaseChiSquare(model.moons, phaseLongitudeDeg);
  if (!(chi < bound)) return Number.isFinite(chi) ? chi : Infinity;
  const sun = fastSunPosition(jdUT, { latitudeDeg: s.latitudeDeg, longitudeDeg: s.longitudeDeg, elevationM: s.elevationM }, dt, model.scene.air);
  const meanMinutes = (jdUT - day + s.longitudeDeg / 360) * 1440;
  const ctx: EvaluationContext = {
    sun,
    nuisances: priors,
    apparentMinutes: meanMinutes + sun.equationOfTimeMinutes,
    equationOfTimeMinutes: sun.equationOfTimeMinutes,
    assumedClock: assumed,
    zoneOffsetMinutes: zoneOffset,
    moon: undefined, // the shape of datedPoint's context (src/solver/fitting.ts)
  };
  // Then the sun's rows, the clocks and the sun's facts (the moon's rows are 0 without a moon in the context).
  const split = splitChiSquare(model, evidenceResidualVector(model, ctx));
  chi += split.chiSquare + split.penalty;
  // ... and the facts of the moon's light (a wall lit by it, a pair's side) at the quick place.
  for (const f of model.facts) if (f.light === 'moon') chi += factResidual(model, f, { ...ctx, moon }) ** 2;
  return Number.isFinite(chi) ? chi : Infinity;
}

/** Three angles made continuous (no jump of 360 deg between neighbours). */
function unwrapped(v: readonly number[]): number[] {
  const out = [v[0]];
  for (let i = 1; i < v.length; i += 1) out.push(out[i - 1] + normalizeDeg180(v[i] - out[i - 1]));
  return out;
}

/** The parabola through (-1, v0), (0, v1), (1, v2) at u (Meeus 1998, eq. 3.3 with n = u). */
function parabola3(v: readonly number[], u: number): number {
  const a = v[1] - v[0];
  const b = v[2] - v[1];
  return v[1] + (u / 2) * (a + b + u * (b - a));
}

/**
 * Every allowed day's best screened instant (local mean minutes), of the days that can come within
 * SCREEN_CUTOFF of the best: a day whose objective is already past the best so far by more is not kept (the
 * best only falls), and a night whose bound (src/solver/moonNightBound.ts) passes that limit is not screened
 * at all (every instant of it, and so its best, would screen above the limit): the days kept are the same,
 * with the same numbers, as when every night is screened.
 */
function screenDays(model: EvidenceModel, assumed: ClockKind | null, win: DayWindow): { days: DayBest[]; instants: number } {
  const priors = model.nuisances.map((n) => n.priorDeg);
  const terms = screenTermsOf(model, priors);
  const nightBound = moonNightBound(model, model.scene.air);
  const lon = model.scene.site.longitudeDeg;
  const zoneOffset = zoneOffsetsAt(model, assumed, 0.5 * (win.firstDayJd0 + win.lastDayJd0));
  const mustBeUp = model.shadows.some((t) => t.light === 'moon') || model.moons.length > 0 || model.moonFacts.some((f) => f.fact === 'moon-up');
  const steps = Math.round(1440 / SCAN_STEP_MINUTES);
  const days: DayBest[] = [];
  const values = new Float64Array(steps);
  let instants = 0;
  let dt = deltaTSeconds(jdToDecimalYear(win.firstDayJd0), model.scene.deltaT);
  let bestSoFar = Infinity; // the best screened objective so far: steps whose moon part alone exceeds it by SCREEN_CUTOFF are not finished
  for (let day = win.firstDayJd0; day <= win.lastDayJd0; day += 1) {
    if (!isDayAllowed(win, day)) continue;
    if ((day - win.firstDayJd0) % 365 === 0) dt = deltaTSeconds(jdToDecimalYear(day), model.scene.deltaT); // Delta T changes slowly: once a year
    // The moon's geocentric place and quick phase at the day's start, middle and end, interpolated between
    // (the parabola through three points, Meeus 1998 eq. 3.3; within 0.01 deg over half a day: common practice).
    const j0 = day - lon / 360;
    const nodes = [0, 0.5, 1].map((f) => quickMoonEquatorial(j0 + f, dt));
    const ra = unwrapped(nodes.map((n) => n.rightAscensionDeg));
    const dec = nodes.map((n) => n.declinationDeg);
    const par = nodes.map((n) => n.parallaxDeg);
    const phase = unwrapped([0, 0.5, 1].map((f) => moonPhaseLongitudeApproxDeg(j0 + f)));
    const limit = bestSoFar + SCREEN_CUTOFF;
    // A night that cannot screen within the limit is passed over (its bound is a lower bound of every instant's objective).
    if (nightBound({ declinationDeg: dec, parallaxDeg: par, phaseLongitudeDeg: phase }) * (1 - 1e-9) > limit) continue;
    const at = (minutes: number): number => {
      const u = 2 * (minutes / 1440) - 1; // -1 at the day's start, +1 at its end
      const place: QuickMoonEquatorial = { rightAscensionDeg: parabola3(ra, u), declinationDeg: parabola3(dec, u), parallaxDeg: parabola3(par, u) };
      return screenObjective(model, terms, assumed, zoneOffset, priors, j0 + minutes / 1440, day, dt, mustBeUp, place, ((parabola3(phase, u) % 360) + 360) % 360, limit);
    };
    for (let k = 0; k < steps; k += 1) values[k] = at(k * SCAN_STEP_MINUTES);
    instants += steps;
    let best = -1;
    for (let k = 0; k < steps; k += 1) if (values[k] < (best < 0 ? Infinity : values[best])) best = k;
    if (best < 0) continue;
    // The vertex of the parabola through the best step and its neighbours (within the day).
    let minutes = best * SCAN_STEP_MINUTES;
    let objective = values[best];
    const a = best > 0 ? values[best - 1] : undefined;
    const c = best < steps - 1 ? values[best + 1] : undefined;
    if (a !== undefined && c !== undefined && Number.isFinite(a) && Number.isFinite(c)) {
      const curvature = a - 2 * values[best] + c;
      if (curvature > 0) {
        const shift = (0.5 * (a - c)) / curvature; // in steps, within (-0.5, 0.5) for a true minimum
        if (Math.abs(shift) < 1) {
          const m = minutes + shift * SCAN_STEP_MINUTES;
          const v = at(m);
          instants += 1;
          if (v < objective) {
            minutes = m;
            objective = v;
          }
        }
      }
    }
    // Past the limit the day cannot come within SCREEN_CUTOFF of the best (which is at most bestSoFar): not kept.
    if (objective <= limit) days.push({ day, meanMinutes: minutes, objective });
    bestSoFar = Math.min(bestSoFar, objective);
  }
  return { days, instants };
}

/**
 * The days to refine: within SCREEN_CUTOFF of the best, the MAX_REFINED best, and each year's best. Neighbouring
 * days are kept alike (the moon stands at the same place about 50 minutes later the next day, its phase 12 deg on:
 * with a loose phase both days may fit).
 */
function daysToRefine(days: readonly DayBest[], win: DayWindow): DayBest[] {
  // A loop, not a spread: a long window holds a day for every night of it (over a million in 3000 years).
  let best = Infinity;
  for (const d of days) best = Math.min(best, d.objective);
  const within = days.filter((d) => d.objective <= best + SCREEN_CUTOFF).sort((x, y) => x.objective - y.objective);
  const chosen = new Set(within.slice(0, MAX_REFINED));
  const seenYears = new Set<number>();
  for (const d of within) {
    const year = jdToCivilDate(win.calendar, d.day + 0.5).civil.year;
    if (seenYears.has(year)) continue;
    seenYears.add(year);
    chosen.add(d);
  }
  return [...chosen].sort((x, y) => x.objective - y.objective);
}

/**
 * The candidates of one clock assumption for a scene lit by the moon (see header).
 * @example moonSearch(model, null, 0, win).candidates[0].dayJd0 // the best civil day's JD of 0h
 */
export function moonSearch(model: EvidenceModel, assumed: ClockKind | null, assumptionIndex: number, win: DayWindow): MoonSearchResult {
  const { days, instants } = screenDays(model, assumed, win);
  const priors = model.nuisances.map((n) => n.priorDeg);
  const site = siteOf(model);
  const lon = model.scene.site.longitudeDeg;
  const out: RawCandidate[] = [];
  let moonEvaluations = 0;
  const picked = days.length ? daysToRefine(days, win) : [];
  for (const d of picked) {
    const jd = d.day + d.meanMinutes / 1440 - lon / 360;
    const guessE = fastSunPosition(jd, site, deltaTSeconds(jdToDecimalYear(jd), model.scene.deltaT)).equationOfTimeMinutes;
    const ctx = newDatedContext(model, assumed, jd);
    let day = d.day;
    let fit = refineOnDay(ctx, day, [d.meanMinutes + guessE, ...priors]);
    // An optimum past midnight belongs to the neighbouring civil day: refit there.
    const m = fit.x[1];
    if (m < 0 || m >= 1440) {
      const shift = Math.floor(m / 1440);
      if (isDayAllowed(win, day + shift)) {
        day += shift;
        fit = refineOnDay(ctx, day, [m - 1440 * shift, ...fit.x.slice(2)]);
      }
    }
    const ex = exactPoint(model, assumed, site, day, fit.x[1], fit.x.slice(2), fit.point.state.equationOfTimeMinutes);
    moonEvaluations += ctx.moonCalls + 1;
    const s = splitChiSquare(model, ex.point.residuals);
    // The covariance of (minute, nuisances) on the day: the sigma of the minute (see the header).
    const onDay = covarianceFromJacobian(fit.lm.jacobian, fit.x.length - 1);
    const sigmaMinutes = onDay && onDay[0][0] > 0 ? Math.sqrt(onDay[0][0]) : NaN;
    const civilYear = jdToCivilDate(win.calendar, day + 0.5).civil.year;
    const dated = { ...fit, x: [day, ...fit.x.slice(1)] };
    out.push({
      assumptionIndex,
      // One family per clock assumption: the same moonlight, its years listed (src/solver/families.ts).
      trackKey: `moon|${assumptionIndex}`,
      branch: 'solstice',
      cycle: civilYear - win.fromYear,
      dayJd0: day,
      apparentMinutes: fit.x[1],
      nuisances: fit.x.slice(2),
      point: ex.point,
      sun: ex.sun,
      chiSquare: s.chiSquare,
      penalty: s.penalty,
      objective: s.chiSquare + s.penalty,
      continuousDay: day,
      continuousMinutes: fit.x[1],
      rep: { cycle: civilYear - win.fromYear, fit: dated, objective: s.chiSquare + s.penalty, covariance: null, context: ctx, moonInstant: { sigmaMinutes } },
      fit: { converged: fit.converged, iterations: fit.iterations },
      mapped: false,
      atWindowEdge: false,
      moonRefined: true,
    });
  }
  return { candidates: out, screenedInstants: instants, refinedDays: picked.length, moonEvaluations };
}

/** Below this altitude of the sun (degrees) the sky is dark enough for moonlight to cast a visible shadow: the end of civil twilight (common practice). */
export const CIVIL_TWILIGHT_DEG = -6;

/**
 * The light of a scene's moonlit shadows at a candidate, in words for the answer's notes: where the moon
 * stands and how high the sun is; null when the scene has no shadow cast by moonlight. A sun above the
 * horizon, or in civil twilight, is said plainly: a shadow by moonlight is then hardly seen.
 */
export function moonlightWords(model: EvidenceModel, point: { readonly sun: { readonly altitudeDeg: number }; readonly moon?: { readonly azimuthDeg: number; readonly altitudeDeg: number } }): { words: string; sunUp: boolean } | null {
  const ids = [...new Set(model.shadows.filter((t) => t.light === 'moon').map((t) => t.observationId))];
  for (const f of model.facts) if (f.light === 'moon' && !f.implicit && !ids.includes(f.observationId)) ids.push(f.observationId);
  if (ids.length === 0) return null;
  const sunAlt = point.sun.altitudeDeg;
  const moon = point.moon ? `the moon stands at azimuth ${point.moon.azimuthDeg.toFixed(1)} deg, altitude ${point.moon.altitudeDeg.toFixed(1)} deg, and ` : '';
  const sky = sunAlt <= CIVIL_TWILIGHT_DEG
    ? 'below the horizon: a night view'
    : sunAlt <= 0
      ? 'below the horizon but within civil twilight (above -6 deg): the sky is still light, and a shadow cast by the moon is hardly seen'
      : 'ABOVE the horizon: in daylight a shadow cast by the moon is not seen; the evidence of the sun and of the moon do not describe one moment, or the light was not the moon';
  return { words: `Shadows cast by moonlight (${ids.join(', ')}): at the best candidate ${moon}the sun is at altitude ${sunAlt.toFixed(1)} deg, ${sky}.`, sunUp: sunAlt > 0 };
}
