/**
 * What the moon says about the years: the years of the best light that fit alike, the best year's
 * near-repeats of the moon inside the window with their fit, and a moon that cannot be.
 *
 * Near-repeats: the moon's phase returns on almost the same calendar day after 19 years (235
 * lunations = 6939.69 days against 19 tropical years = 6939.60 days: the Metonic cycle), and
 * roughly after 8 years (99 lunations = 2923.53 days, 1.6 days more than 8 years), 11 years (136
 * lunations, 19 - 8) and their sums (Meeus, Astronomical Algorithms, 2nd ed. 1998, ch. 49; the
 * day counts from the mean synodic month 29.530589 days, Meeus eq. 49.1). A year's fit is the
 * difference in objective (chi-square plus penalty) of that year's best candidate, of any light
 * (a day the sun's evidence allows before or after a solstice is the same evidence), against the
 * best, judged with 1 degree of freedom; 3.841 (95%, Press et al., Numerical Recipes, 3rd ed. 2007,
 * section 15.6.5) is the threshold of the years called alike, as for every family. Every year within
 * it is named with its fit, its day and its distance from the best in lunations: besides the cycles
 * above, a loose near-repeat (3 years = 37 lunations, 2.8 days short; 16 years = 198 lunations, 3.2
 * days over; ...) fits alike when the sun's evidence fixes the day only to a few days.
 *
 * A moon that cannot be: its lit side faces the sun at every instant, so a drawn lit side more than
 * 90 deg from the side the sun lights at the best fit is named; and the lit fraction follows the
 * moon's distance from the sun (k = (1 - cos psi) / 2 to within the topocentric difference, Meeus
 * eqs. 48.1-48.3 with i = 180 - psi), so a drawn phase more than 3 sigma from what the drawn moon's
 * distance from the fitted sun allows is named.
 */
import type { Candidate, MoonAlikeYear, MoonNearRepeat, MoonYearsAnswer } from './types.js';
import type { RawCandidate } from './stageB.js';
import { MONTH_NAMES } from '../calendar/julianDay.js';
import type { Solved } from './solveDates.js';
import { chiSquarePValue, DELTA_CHI2_1DOF_95 } from '../math/chiSquare.js';
import { formatYearBcAd } from '../calendar/format.js';
import { jdToCivilDate } from '../calendar/regions.js';
import { acosClamped, cosDeg, radToDeg, sinDeg } from '../math/angles.js';
import { yearListText } from './families.js';
import { NAMED_PHASE_LONGITUDE_DEG } from './moonEvidence.js';

/** Near-repeats of the moon's phase on a calendar day, years, with their lunations. */
export const MOON_NEAR_REPEATS: readonly { readonly years: number; readonly lunations: number }[] = [
  { years: 8, lunations: 99 },
  { years: 11, lunations: 136 },
  { years: 19, lunations: 235 },
  { years: 27, lunations: 334 },
  { years: 38, lunations: 470 },
];

/** Allowance for the topocentric phase against the geocentric estimate from the drawn direction, illuminated fraction. */
const FRACTION_ALLOWANCE = 0.03;

/** Angle between two directions on the sky given by azimuth and altitude, degrees (spherical law of cosines). */
function separationDeg(az1: number, alt1: number, az2: number, alt2: number): number {
  return radToDeg(acosClamped(sinDeg(alt1) * sinDeg(alt2) + cosDeg(alt1) * cosDeg(alt2) * cosDeg(az1 - az2)));
}

function fmtP(p: number | null): string {
  return p === null ? '' : `, p = ${p.toPrecision(2)}`;
}

/** "1744 (9 January, 235 lunations before the best, Delta chi-square 2.4), ...": each year that fits alike, the best one too. */
export function alikeYearsText(alike: readonly MoonAlikeYear[]): string {
  return alike
    .map((a) => {
      const day = `${a.civilDate.day} ${MONTH_NAMES[a.civilDate.month - 1]}`;
      if (a.offsetYears === 0 && a.deltaChiSquare === 0) return `${formatYearBcAd(a.year)} (${day}, the best)`;
      // Whole lunations between the two candidates' days; the years between them are read off the years themselves.
      const n = Math.abs(a.lunations);
      const lun = n === 0 ? 'the same lunation as the best' : `${n} lunation${n === 1 ? '' : 's'} ${a.lunations > 0 ? 'after' : 'before'} the best`;
      return `${formatYearBcAd(a.year)} (${day}, ${lun}, Delta chi-square ${a.deltaChiSquare.toFixed(1)}${a.sameLight ? '' : ', another light'})`;
    })
    .join('; ');
}

/** Words for a moon that cannot be, at the best candidate. */
function impossibleMoon(s: Solved, best: Candidate): string[] {
  const out: string[] = [];
  const model = s.model;
  for (const r of best.residuals) {
    if (r.component === 'lit-side-tilt' && Math.abs(r.measured - r.predicted) > 90) {
      const side = (t: number): string => (Math.abs(t) < 30 ? 'on top' : Math.abs(t) > 150 ? 'at the bottom' : t > 0 ? 'on the left' : 'on the right');
      out.push(
        `The moon ${r.observationId} is lit on the wrong side: drawn lit ${side(r.measured)} (${r.measured.toFixed(0)} deg from straight up), while the sun, ${best.sun.altitudeDeg < 0 ? 'below the horizon' : 'in the sky'} at azimuth ${best.sun.azimuthDeg.toFixed(0)} deg, lights it ${side(r.predicted)} (${r.predicted.toFixed(0)} deg): a moon lit away from the sun cannot be seen at any instant (a painter's convention, or a reversed print not marked as one?).`,
      );
    }
  }
  const direction = model.moons.find((t) => t.evidence.kind === 'moon-direction');
  if (direction && direction.evidence.kind === 'moon-direction') {
    const psi = separationDeg(direction.evidence.azimuthDeg, direction.evidence.altitudeDeg, best.sun.azimuthDeg, best.sun.altitudeDeg);
    const expected = (1 - cosDeg(psi)) / 2;
    for (const t of model.moons) {
      const e = t.evidence;
      if (e.kind === 'moon-fraction' && Math.abs(e.illuminatedFraction - expected) > 3 * e.sigma + FRACTION_ALLOWANCE) {
        out.push(
          `The moon's phase ${t.observationId} is impossible where it is drawn: ${Math.round(100 * e.illuminatedFraction)}% lit, but a moon ${psi.toFixed(0)} deg from the sun (the drawn place against the fitted sun) shows about ${Math.round(100 * expected)}% of its disc lit.`,
        );
      }
      if (e.kind === 'moon-named-phase') {
        const folded = e.folded ? e.phaseLongitudeDeg : Math.min(NAMED_PHASE_LONGITUDE_DEG[e.phase], 360 - NAMED_PHASE_LONGITUDE_DEG[e.phase]);
        if (Math.abs(folded - psi) > 3 * e.sigmaDeg + 5) {
          out.push(
            `The moon's phase ${t.observationId} ("${e.phase}") is impossible where it is drawn: a moon ${psi.toFixed(0)} deg from the sun (the drawn place against the fitted sun) shows about ${Math.round(100 * expected)}% of its disc lit.`,
          );
        }
      }
    }
  }
  return out;
}

/** Mean synodic month, days (Meeus, Astronomical Algorithms, 2nd ed. 1998, eq. 49.1, at J2000). */
const SYNODIC_MONTH_DAYS = 29.530589;

/** A near-repeat year with no candidate: the search kept none of its days (none came close to the evidence). */
export const NO_CANDIDATE_THAT_YEAR = 'no day of that year kept as a candidate: none of its allowed days came close to the evidence';

/** The moon's answer about the years, from a solve whose best raw candidate is `best` (dressed). */
export function moonYearsAnswer(s: Solved, best: Candidate): MoonYearsAnswer {
  const raw = s.kept[0];
  // Each year's best candidate of any light: a year fits alike whatever day of it the sun's evidence allows.
  const byYear = new Map<number, RawCandidate>();
  for (const c of s.search.candidates) {
    const year = jdToCivilDate(s.win.calendar, c.dayJd0 + 0.5).civil.year;
    const held = byYear.get(year);
    if (!held || c.objective < held.objective) byYear.set(year, c);
  }
  const bestYear = best.civilDate.year;
  const bestObjective = raw.objective;
  const alike: MoonAlikeYear[] = [...byYear]
    .filter(([, c]) => c.objective <= bestObjective + DELTA_CHI2_1DOF_95)
    .sort(([a], [b]) => a - b)
    .map(([year, c]) => {
      const civil = jdToCivilDate(s.win.calendar, c.dayJd0 + 0.5);
      const delta = Math.max(0, c.objective - bestObjective);
      return {
        year,
        offsetYears: year - bestYear,
        lunations: Math.round((c.dayJd0 - raw.dayJd0) / SYNODIC_MONTH_DAYS),
        civilDate: { calendar: civil.date.calendar, year: civil.civil.year, month: civil.civil.month, day: civil.civil.day },
        deltaChiSquare: delta,
        pValue: chiSquarePValue(delta, 1),
        sameLight: c.trackKey === raw.trackKey,
      };
    });
  const years = alike.map((a) => a.year);
  const nearRepeats: MoonNearRepeat[] = [];
  for (const r of MOON_NEAR_REPEATS) {
    for (const sign of [-1, 1]) {
      const year = bestYear + sign * r.years;
      if (year < s.win.fromYear || year > s.win.toYear) continue;
      const c = byYear.get(year);
      const delta = c === undefined ? null : Math.max(0, c.objective - bestObjective);
      nearRepeats.push({
        year,
        offsetYears: sign * r.years,
        cycle: `${r.years}-year (${r.lunations} lunations)`,
        deltaChiSquare: delta,
        pValue: delta === null ? null : chiSquarePValue(delta, 1),
        fitsAlike: delta !== null && delta <= DELTA_CHI2_1DOF_95,
        refined: c !== undefined && c.moonRefined !== false,
      });
    }
  }
  nearRepeats.sort((a, b) => Math.abs(a.offsetYears) - Math.abs(b.offsetYears) || a.offsetYears - b.offsetYears);
  const repeatWords = nearRepeats.length
    ? ` Its near-repeats in the window: ${nearRepeats
        .map((n) => `${formatYearBcAd(n.year)} (${n.cycle.replace(/ \(.*\)/, '')}: ${n.deltaChiSquare === null ? NO_CANDIDATE_THAT_YEAR : `Delta chi-square ${n.refined ? '' : 'at most '}${n.deltaChiSquare.toFixed(1)}${fmtP(n.pValue)}${n.fitsAlike ? ', fits as well' : ''}`})`)
        .join('; ')}.`
    : ' No near-repeat of the moon (8, 11, 19, 27 or 38 years) falls inside the window.';
  const words = years.length <= 1
    ? `The moon names ${formatYearBcAd(bestYear)}: every other year of this light fits worse by more than ${DELTA_CHI2_1DOF_95.toFixed(2)} in chi-square.${repeatWords}`
    : `The moon leaves ${yearListText(years)} alike (within ${DELTA_CHI2_1DOF_95.toFixed(2)} in chi-square of the best, ${formatYearBcAd(bestYear)}): ${alikeYearsText(alike)}.${repeatWords}`;
  // The candidates' error ellipses and day intervals include the moon's evidence (candidateUncertainty.ts), so no caution
  // about them is needed here.
  const cautions = [
    "The moon is fitted at each candidate's own instant in every year of the window, never mapped from another year (astronomy-engine's lunar theory, about 1 arcminute); the years it names are an estimate conditional on the drawn moon being the moon of that hour, not a painter's convention or a moon added in the studio.",
  ];
  return { bestYear, years, alike, words, nearRepeats, impossible: impossibleMoon(s, best), cautions };
}
