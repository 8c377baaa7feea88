/**
 * The uncertainty of a candidate: covariance of (day, minute of local apparent time) with the
 * nuisances marginalised (the 2x2 block of (J^T J)^-1 at the continuous optimum of its
 * representative year; Press et al., Numerical Recipes 3rd ed. 2007, sections 15.5-15.6),
 * the 1-sigma and 95% ellipses, the sky ellipse from the covariance of (azimuth, altitude)
 * (first-order propagation J_sky C J_sky^T, common practice), the linearity check, and the
 * profile-likelihood scan over the day where the check fails (src/uncertainty/).
 * Mapped years share the covariance, check and scan of their representative year (the yearly
 * pattern repeats to within hours; stated in docs/solver.md).
 *
 * With evidence of the moon beside the sun's (not a night view's candidate from the moon's own search, whose
 * instant is given with the day scanned), the sun's yearly repeat does not hold for the moon: each candidate gets
 * its own continuous fit in (d, m, nuisances) with the moon's rows at the instant jdUT(d, m), started
 * from the candidate (src/solver/moonYears.ts), and its covariance, check and scan from that fit. The
 * moon's place and phase change with the instant (about 0.5 deg an hour against the stars, 12 deg of
 * phase a day), so they pin the hour and the day more tightly than the sun alone.
 */
import type { CandidateUncertainty, DayMinuteEllipse, ProfileScan, SkyEllipse } from './types.js';
import { angleDiffDeg } from '../math/angles.js';
import { DELTA_CHI2_1DOF_95, DELTA_CHI2_2DOF_95 } from '../math/chiSquare.js';
import { ELLIPSE_LEVELS, ellipseAt, isPositiveDefinite, linearityError, LINEARITY_TOLERANCE, type Covariance2 } from '../uncertainty/ellipse.js';
import { profileScan } from '../uncertainty/profileScan.js';
import { jdToCivilDate } from '../calendar/regions.js';
import { splitChiSquare } from './evidenceModel.js';
import { datedPoint, datedSteps, ensureTrack, hasMoonEvidence, newDatedContext, refineOnDay, type DatedContext, type DatedFit } from './fitting.js';
import { covarianceFromJacobian, levenbergMarquardt } from '../math/leastSquares.js';
import { declinationRateOnTrack } from './sunModel.js';
import type { RawCandidate, RepresentativeFit } from './stageB.js';
import { isDayAllowed, nearestDayJd0, type DayWindow } from './window.js';

/** Ellipses wider than this (95%, half-width) are not checked but declared invalid. */
const MAX_ELLIPSE_DAYS = 90;
const MAX_ELLIPSE_MINUTES = 360;
/** Days scanned either side at most. */
export const PROFILE_LIMIT_DAYS = 120;
/** Below this declination rate (deg/day) the day is called poorly constrained near a solstice. */
const SOLSTICE_RATE_DEG_PER_DAY = 0.05;

interface RepUncertainty {
  readonly cov2: Covariance2 | null;
  /** False when the fit is singular: the evidence leaves the day (or the hour) free. */
  readonly fixes: boolean;
  readonly linearity: number;
  readonly valid: boolean;
  readonly reason?: string;
  readonly sky: Covariance2 | null;
  profile?: { from: number; to: number; open: boolean; otherMin: number; otherMax: number; points: { days: number; minutes: number; objective: number }[] };
}

/** Why there is neither ellipse nor scan when the fit is singular. */
export const FREE_REASON = 'the evidence does not fix the day and the hour separately (the fit is singular): the day is free along a curve, so no ellipse or interval is given';

/** Cache of per-representative results (one solve); with the moon, per candidate (its own fit, `moonRep`). */
export type UncertaintyCache = Map<RepresentativeFit | RawCandidate, RepUncertainty & { readonly moonRep?: RepresentativeFit }>;

/** With the moon, the continuous fit stays within this many days of the candidate's day (beyond, another lunation's place). */
const MOON_FIT_REACH_DAYS = 1;

/**
 * The continuous fit of (d, m, nuisances) with the moon's rows, by bounded Levenberg-Marquardt within
 * MOON_FIT_REACH_DAYS of the candidate's day and half a day of its minute (the moon between whole days:
 * fitting.ts datedPoint).
 */
function refineNearCandidate(ctx: DatedContext, x0: readonly number[]): DatedFit {
  ensureTrack(ctx, datedPoint(ctx, x0[0], x0[1], x0.slice(2), false).jdUT);
  const lower = x0.map(() => -Infinity);
  const upper = x0.map(() => Infinity);
  lower[0] = x0[0] - MOON_FIT_REACH_DAYS;
  upper[0] = x0[0] + MOON_FIT_REACH_DAYS;
  lower[1] = x0[1] - 720;
  upper[1] = x0[1] + 720;
  const lm = levenbergMarquardt({ residuals: (p) => datedPoint(ctx, p[0], p[1], p.slice(2)).residuals as number[], steps: datedSteps(ctx.model), lower, upper }, x0, { maxIterations: 60, tolerance: 1e-10 });
  return { x: lm.x, lm, point: datedPoint(ctx, lm.x[0], lm.x[1], lm.x.slice(2)), iterations: lm.iterations, converged: lm.converged };
}

/**
 * The fit a candidate's uncertainty is taken from: its representative year's (the sun's evidence alone), or with
 * moon evidence its own continuous fit with the moon, from the candidate's day, minute and nuisances.
 */
function fitFor(raw: RawCandidate, cache: UncertaintyCache): { rep: RepresentativeFit; day: number; minutes: number } {
  const model = raw.rep.context.model;
  // A night view's candidate (the moon's own search, moonSearch.ts) keeps its instant's account: the day is scanned instead.
  if (!hasMoonEvidence(model) || raw.rep.moonInstant) return { rep: raw.rep, day: raw.continuousDay, minutes: raw.continuousMinutes };
  let rep = cache.get(raw)?.moonRep;
  if (!rep) {
    const ctx = newDatedContext(model, raw.rep.context.assumed, raw.point.jdUT);
    const fit = refineNearCandidate(ctx, [raw.dayJd0, raw.apparentMinutes, ...raw.nuisances]);
    const s = splitChiSquare(model, fit.point.residuals);
    rep = { cycle: raw.cycle, fit, objective: s.chiSquare + s.penalty, covariance: covarianceFromJacobian(fit.lm.jacobian, fit.x.length), context: ctx };
    cache.set(raw, { ...repUncertainty(rep, cache), moonRep: rep });
  }
  return { rep, day: rep.fit.x[0], minutes: rep.fit.x[1] };
}

function objective(rep: RepresentativeFit, r: readonly number[]): number {
  const s = splitChiSquare(rep.context.model, r);
  return s.chiSquare + s.penalty;
}

/** x of the full parameter vector at an offset (dd, dm) with the nuisances at their conditional mean. */
function conditionalPoint(rep: RepresentativeFit, dd: number, dm: number): number[] {
  const x = rep.fit.x;
  const c = rep.covariance!;
  const det = c[0][0] * c[1][1] - c[0][1] * c[0][1];
  const i00 = c[1][1] / det;
  const i01 = -c[0][1] / det;
  const i11 = c[0][0] / det;
  const u0 = i00 * dd + i01 * dm;
  const u1 = i01 * dd + i11 * dm;
  return x.map((v, k) => (k === 0 ? v + dd : k === 1 ? v + dm : v + c[k][0] * u0 + c[k][1] * u1));
}

function repUncertainty(rep: RepresentativeFit, cache: UncertaintyCache): RepUncertainty {
  const hit = cache.get(rep);
  if (hit) return hit;
  const ctx = rep.context;
  const c = rep.covariance;
  let result: RepUncertainty;
  if (!c && rep.moonInstant) {
    // The moon's own search: the instant is fixed; the neighbouring days (the moon there about 50 minutes later) are scanned.
    const m95 = Math.sqrt(DELTA_CHI2_1DOF_95) * rep.moonInstant.sigmaMinutes;
    const hour = Number.isFinite(m95) ? `the hour on this day is known to +/-${m95 < 10 ? m95.toFixed(1) : m95.toFixed(0)} min (95%)` : 'the hour on this day has no sigma (the fit is singular)';
    result = { cov2: null, fixes: true, linearity: Infinity, valid: false, reason: `the moon fixes an instant, not a day and an hour each (a day later it stands in the same place about 50 minutes later): ${hour}, and the neighbouring days are scanned instead of an ellipse`, sky: null };
  } else if (!c) {
    result = { cov2: null, fixes: false, linearity: Infinity, valid: false, reason: FREE_REASON, sky: null };
  } else {
    const cov2: Covariance2 = { xx: c[0][0], xy: c[0][1], yy: c[1][1] };
    // Sky covariance by first-order propagation through central differences of (azimuth, altitude).
    const x = rep.fit.x;
    const n = x.length;
    const steps = [1e-3, 0.01, ...x.slice(2).map(() => 1e-4)];
    const jac: number[][] = [[], []];
    for (let j = 0; j < n; j += 1) {
      const xp = x.slice();
      const xm = x.slice();
      xp[j] += steps[j];
      xm[j] -= steps[j];
      const sp = datedPoint(ctx, xp[0], xp[1], xp.slice(2)).sun;
      const sm = datedPoint(ctx, xm[0], xm[1], xm.slice(2)).sun;
      jac[0].push(angleDiffDeg(sp.azimuthDeg, sm.azimuthDeg) / (2 * steps[j]));
      jac[1].push((sp.altitudeDeg - sm.altitudeDeg) / (2 * steps[j]));
    }
    const prop = (a: number[], b: number[]): number => {
      let s = 0;
      for (let i = 0; i < n; i += 1) for (let j = 0; j < n; j += 1) s += a[i] * c[i][j] * b[j];
      return s;
    };
    const sky: Covariance2 = { xx: prop(jac[0], jac[0]), xy: prop(jac[0], jac[1]), yy: prop(jac[1], jac[1]) };
    if (!isPositiveDefinite(cov2) || ctx.model.measuredCount < 2) {
      result = { cov2, fixes: false, linearity: Infinity, valid: false, reason: FREE_REASON, sky };
    } else if (Math.sqrt(DELTA_CHI2_2DOF_95 * cov2.xx) > MAX_ELLIPSE_DAYS || Math.sqrt(DELTA_CHI2_2DOF_95 * cov2.yy) > MAX_ELLIPSE_MINUTES) {
      result = {
        cov2,
        fixes: true,
        linearity: Infinity,
        valid: false,
        reason: `the linearised 95% ellipse reaches beyond ${MAX_ELLIPSE_DAYS} days or ${MAX_ELLIPSE_MINUTES} minutes, where the linearisation cannot hold`,
        sky,
      };
    } else {
      const linearity = linearityError(cov2, (dd, dm) => {
        const p = conditionalPoint(rep, dd, dm);
        const probe = datedPoint(ctx, p[0], p[1], p.slice(2));
        ensureTrack(ctx, probe.jdUT);
        return objective(rep, datedPoint(ctx, p[0], p[1], p.slice(2)).residuals) - rep.objective;
      });
      const valid = linearity <= LINEARITY_TOLERANCE;
      let reason: string | undefined;
      if (!valid) {
        ensureTrack(ctx, rep.fit.point.jdUT);
        const rate = Math.abs(declinationRateOnTrack(ctx.track, rep.fit.point.jdUT));
        reason =
          rate < SOLSTICE_RATE_DEG_PER_DAY
            ? `near the solstice the declination changes by only ${rate.toFixed(3)} deg a day, so the day is poorly constrained and the ellipse does not hold`
            : `the linearised ellipse fails its check: chi-square on the 95% ellipse differs from the prediction by up to ${(100 * Math.min(linearity, 99)).toFixed(0)}%`;
      }
      result = { cov2, fixes: true, linearity, valid, reason, sky };
    }
  }
  cache.set(rep, result);
  return result;
}

function runProfile(rep: RepresentativeFit, win: DayWindow, u: RepUncertainty): NonNullable<RepUncertainty['profile']> {
  if (u.profile) return u.profile;
  const ctx = rep.context;
  const centreDay = nearestDayJd0(rep.fit.x[0]);
  let last: number[] = rep.fit.x.slice(1);
  const lastByDir = new Map<number, number[]>();
  const scan = profileScan((offset) => {
    const day = centreDay + offset;
    if (!isDayAllowed(win, day)) return null;
    const dir = Math.sign(offset);
    const start = lastByDir.get(dir) ?? last;
    const fit = refineOnDay(ctx, day, start, 20);
    const rest = fit.x.slice(1);
    lastByDir.set(dir, rest);
    if (offset === 0) last = rest;
    return { objective: objective(rep, fit.point.residuals), other: rest[0] };
  }, PROFILE_LIMIT_DAYS, DELTA_CHI2_1DOF_95);
  const shift = centreDay - rep.fit.x[0];
  u.profile = {
    from: scan.from + shift,
    to: scan.to + shift,
    open: scan.open,
    otherMin: scan.otherMin,
    otherMax: scan.otherMax,
    points: scan.points.map((p) => ({ days: p.offset + shift, minutes: p.other, objective: p.objective })),
  };
  return u.profile;
}

/** The uncertainty of one candidate (computed once per representative year and reused). */
export function candidateUncertainty(raw: RawCandidate, win: DayWindow, cache: UncertaintyCache, forceProfile = false, allowProfile = true): CandidateUncertainty {
  const own = fitFor(raw, cache);
  const u = repUncertainty(own.rep, cache);
  const cov2 = u.cov2 ?? { xx: NaN, xy: NaN, yy: NaN };
  const ellipses: DayMinuteEllipse[] = ELLIPSE_LEVELS.map((lv) => {
    const e = ellipseAt(cov2, lv.deltaChiSquare);
    return {
      probability: lv.probability,
      deltaChiSquare: lv.deltaChiSquare,
      halfWidthDays: e.halfWidthX,
      halfWidthMinutes: e.halfWidthY,
      semiAxes: [
        { days: e.semiAxes[0].x, minutes: e.semiAxes[0].y },
        { days: e.semiAxes[1].x, minutes: e.semiAxes[1].y },
      ],
      orientationDeg: e.orientationDeg,
    };
  });
  const sky = u.sky ?? { xx: NaN, xy: NaN, yy: NaN };
  const skyEllipses: SkyEllipse[] = ELLIPSE_LEVELS.map((lv) => {
    const e = ellipseAt(sky, lv.deltaChiSquare);
    return { probability: lv.probability, deltaChiSquare: lv.deltaChiSquare, semiMajorDeg: e.semiMajor, semiMinorDeg: e.semiMinor, orientationDeg: e.orientationDeg };
  });
  let profile: ProfileScan | undefined;
  if (u.fixes && ((!u.valid && allowProfile) || forceProfile)) {
    const p = runProfile(own.rep, win, u);
    // Offsets are relative to the continuous optimum; carry them to this year's candidate day,
    // held to the window and made to hold the candidate's own day (a mapped year's day may fall
    // at the other end of its representative's interval).
    const base = own.day - raw.dayJd0;
    const fromDays = Math.max(win.firstDayJd0 - raw.dayJd0, Math.min(0, Math.round(p.from + base)));
    const toDays = Math.min(win.lastDayJd0 - raw.dayJd0, Math.max(0, Math.round(p.to + base)));
    const dateOf = (offset: number) => {
      const d = jdToCivilDate(win.calendar, raw.dayJd0 + offset + 0.5).date;
      return { calendar: d.calendar, year: d.year, month: d.month, day: d.day };
    };
    profile = {
      probability: 0.95,
      deltaChiSquare: DELTA_CHI2_1DOF_95,
      fromDays,
      toDays,
      fromDate: dateOf(fromDays),
      toDate: dateOf(toDays),
      fromLocalApparentMinutes: p.otherMin,
      toLocalApparentMinutes: p.otherMax,
      open: p.open,
      points: p.points.map((q) => ({ days: Math.round(q.days + base), localApparentMinutes: q.minutes, chiSquare: q.objective })),
    };
  }
  const sd = Math.sqrt(cov2.xx);
  const sm = Math.sqrt(cov2.yy);
  return {
    method: !u.fixes ? 'not-fixed' : u.valid ? 'ellipse' : 'profile-scan',
    ellipseValid: u.valid,
    invalidReason: u.reason,
    linearityCheck: u.linearity,
    covariance: { days2: cov2.xx, daysMinutes: cov2.xy, minutes2: cov2.yy },
    sigmaDays: sd,
    sigmaMinutes: sm,
    correlation: cov2.xy / (sd * sm),
    minutesPerDay: cov2.xy / cov2.xx,
    ellipses,
    skyCovariance: { azimuth2: sky.xx, azimuthAltitude: sky.xy, altitude2: sky.yy },
    skyEllipses,
    centre: { days: own.day - raw.dayJd0, localApparentMinutes: own.minutes },
    profile,
    fixesDayAndHour: u.fixes,
  };
}
