/**
 * The data of the sky chart: for each measured shadow observation, the band of sun directions
 * within 1 sigma of it (its normalised residual evaluated on an azimuth-altitude grid, the
 * largest component taken when it has several); the sun's daily paths on the candidates' days
 * with marks at the whole hours of local apparent time; and the candidates' sky ellipses.
 *
 * With `moon: true` (off by default, for scenes with evidence of the moon): the moon's path on the best
 * candidate's day over the hours it is up, and its place, lit fraction and the tilt of its lit side at
 * the best candidate's instant, drawn as a small phase symbol (src/ephemeris/moonPosition.ts).
 *
 * A scene lit by the moon alone (src/solver/moonSearch.ts isLitByMoonAlone) is drawn for the moon: each shadow's
 * band is the same geometry of a light direction, taken as the moon's; the moon's paths on the candidates' days
 * stand in for the sun's, and the moon at each candidate (its place and phase) for the candidates' suns. Nothing
 * of the sun is drawn then (`light: 'moon'`).
 *
 * The wall azimuths are those fitted at the best candidate. Clock readings and facts without
 * numbers (wall lit, sun up) are no band on the sky and are listed in the notes instead.
 * Rendering is in skyChart.ts.
 */
import { calendarReadingNote } from './calendarReadingLabel.js';
import type { Scene } from '../scene/types.js';
import type { DateAnswer } from '../solver/types.js';
import { MONTH_NAMES } from '../calendar/julianDay.js';
import { civilDateToJd, resolveCalendarRule } from '../calendar/regions.js';
import { formatYearBcAd } from '../calendar/format.js';
import { normalizeDeg180, normalizeDeg360 } from '../math/angles.js';
import { sunPosition, type SunSite } from '../ephemeris/sunPosition.js';
import { fastSunPosition } from '../ephemeris/fastSun.js';
import { deltaTSeconds } from '../time/deltaT.js';
import { jdToDecimalYear } from '../time/timeScales.js';
import { moonPosition } from '../ephemeris/moonPosition.js';
import { litSideWords, moonPhaseWords } from '../ephemeris/moonLook.js';
import { resolvePixelObservations } from '../image/resolvePixels.js';
import { WALL_SHADOW_KINDS, buildEvidenceModel, termEvidence, wallAzimuthOf, type EvidenceModel } from '../solver/evidenceModel.js';
import { nuisancesOfCandidate } from '../solver/chiSquareGrid.js';
import { isLitByMoonAlone } from '../solver/moonSearch.js';
import { ellipsePoints, semiAxisVectors } from './ellipse.js';
import { skyBandValues } from './skyBandValues.js';
import { markedCandidates, type MarkedCandidate } from './markedCandidates.js';

export interface SkyBand {
  readonly observationId: string;
  readonly label: string;
  /**
   * For a pole's shadow azimuth: the band lies at the sun's azimuth, opposite the shadow, and
   * says so ("the sun stands opposite the shadow: shadow 300 deg, sun 120 deg").
   */
  readonly opposite?: { readonly shadowAzimuthDeg: number; readonly sunAzimuthDeg: number };
  /**
   * Grid azimuths (in the chart's unwrapped azimuth), altitudes, and max |normalised residual| values[j][i]
   * (99 where the shadow cannot arise). Exact within the band and next to it; away from it a value above 1
   * (skyBandValues.ts: where the shadow cannot arise, the formula's value may stand there instead of 99).
   */
  readonly azimuths: readonly number[];
  readonly altitudes: readonly number[];
  readonly values: readonly (readonly number[])[];
}

export interface SkyPath {
  readonly label: string;
  readonly points: readonly (readonly [number, number])[];
  readonly hourMarks: readonly { readonly azimuthDeg: number; readonly altitudeDeg: number; readonly label: string }[];
}

export interface SkySun {
  /** "F1" (best of family 1) or a candidate rank, as in markedCandidates. */
  readonly label: string;
  readonly azimuthDeg: number;
  readonly altitudeDeg: number;
  readonly ellipses: readonly { readonly probability: number; readonly points: readonly (readonly [number, number])[] }[];
}

/** The moon on the best candidate's day: its path while up, and its look at the candidate's instant. */
export interface SkyMoon {
  /** "29 July 1784 (F1)": the day and the candidate, as the sun paths are labelled. */
  readonly label: string;
  /** The path in pieces (it breaks where the moon sets, or crosses the chart's edge azimuth), unwrapped azimuth and apparent altitude. */
  readonly segments: readonly (readonly (readonly [number, number])[])[];
  /** Marks at whole hours of local apparent time while the moon is up. */
  readonly hourMarks: readonly { readonly azimuthDeg: number; readonly altitudeDeg: number; readonly label: string }[];
  /** The moon at the candidate's instant. */
  readonly at: {
    readonly candidateLabel: string;
    readonly azimuthDeg: number;
    readonly altitudeDeg: number;
    readonly illuminatedFraction: number;
    /** Tilt of the lit side from straight up, positive towards the observer's left (docs/conventions.md). */
    readonly brightLimbTiltFromVerticalDeg: number;
    /** "waxing crescent, 9% lit, lit side towards the lower right". */
    readonly words: string;
  };
}

/** The moon at one marked candidate's instant (a scene lit by the moon alone). */
export interface SkyCandidateMoon {
  readonly label: string;
  readonly azimuthDeg: number;
  readonly altitudeDeg: number;
  readonly illuminatedFraction: number;
  /** Tilt of the lit side from straight up, positive towards the observer's left (docs/conventions.md). */
  readonly brightLimbTiltFromVerticalDeg: number;
}

export interface SkyChartData {
  /** The light the bands and paths are drawn for: 'moon' for a scene lit by the moon alone. */
  readonly light: 'sun' | 'moon';
  /** Which reading of a disputed calendar switch names the best days (src/charts/calendarReadingLabel.ts), or null. */
  readonly calendarNote: readonly string[] | null;
  /** Azimuth at the middle of the chart: 180 (sun paths around the south) or 0 (around the north). */
  readonly centreAzimuthDeg: number;
  /** Unwrapped azimuth range: centre +/- up to 180. */
  readonly azimuthRange: readonly [number, number];
  readonly altitudeRange: readonly [number, number];
  readonly bands: readonly SkyBand[];
  readonly paths: readonly SkyPath[];
  readonly suns: readonly SkySun[];
  readonly notes: readonly string[];
  readonly evaluations: number;
  /** Present when asked for (SkyChartOptions.moon), and always for a scene lit by the moon alone (the best candidate's). */
  readonly moon?: SkyMoon;
  /** A scene lit by the moon alone: the moon's paths on the candidates' days (in place of the sun's), best first. */
  readonly moonPaths?: readonly SkyMoon[];
  /** A scene lit by the moon alone: the moon at each marked candidate (in place of the suns). */
  readonly moons?: readonly SkyCandidateMoon[];
}

export interface SkyChartOptions {
  readonly model?: EvidenceModel;
  /** Most candidate days drawn as sun paths (default 3). */
  readonly maxPaths?: number;
  /** Grid columns and rows of each band (default 241 x 121). */
  readonly columns?: number;
  readonly rows?: number;
  /** Draw the moon's path and phase for the best candidate (default false: a scene without moon evidence is drawn as before). */
  readonly moon?: boolean;
}

/** Unwrap an azimuth around a centre azimuth: centre + (az - centre) in (-180, 180]. */
export function unwrapAzimuth(azimuthDeg: number, centreDeg: number): number {
  return centreDeg + normalizeDeg180(azimuthDeg - centreDeg);
}

/** Apparent-time instant of minute m on the local day with 0h at dayJd0 (one step on the equation of time; Meeus 1998 ch. 28). */
function instantOfApparentMinute(dayJd0: number, minutes: number, site: SunSite): number {
  const guess = dayJd0 + minutes / 1440 - site.longitudeDeg / 360;
  const e = sunPosition(guess, site, 'none').equationOfTimeMinutes;
  return guess - e / 1440;
}

/**
 * Geometric altitude of the fast sun (src/ephemeris/fastSun.ts) at a minute's first guess below
 * which the sun of the full model is certainly below the -1 deg where a path is cut, at the
 * apparent minute: the fast sun errs by 0.012 deg (years 1000-2100, more outside but far below
 * a degree), the guess lies less than 30 minutes from the instant (the equation of time stays
 * within about 20 minutes over the millennia), in which the altitude changes by at most
 * 0.25 deg a minute (15 deg an hour), 7.5 deg; below -0.83 deg there is no refraction (refraction.ts).
 */
const SURELY_BELOW_PATH_DEG = -10;

/** True when the sun at minute m of the day is certainly below the path's cut, judged by the fast sun (no full ephemeris call). */
function surelyBelowPath(dayJd0: number, minutes: number, site: SunSite, deltaTSecondsNow: number): boolean {
  const guess = dayJd0 + minutes / 1440 - site.longitudeDeg / 360;
  return fastSunPosition(guess, site, deltaTSecondsNow, 'none').geometricAltitudeDeg < SURELY_BELOW_PATH_DEG;
}

function pathOfDay(mark: MarkedCandidate, scene: Scene, centre: number): SkyPath {
  const c = mark.candidate;
  const rule = resolveCalendarRule(scene.calendar);
  const dayJd0 = civilDateToJd(rule, c.civilDate);
  const site: SunSite = { latitudeDeg: scene.site.latitudeDeg, longitudeDeg: scene.site.longitudeDeg, elevationM: scene.site.elevationM };
  const points: [number, number][] = [];
  const hourMarks: { azimuthDeg: number; altitudeDeg: number; label: string }[] = [];
  const deltaT = deltaTSeconds(jdToDecimalYear(dayJd0)); // the default model, as sunPosition below takes it
  for (let m = 0; m <= 1440; m += 10) {
    if (surelyBelowPath(dayJd0, m, site, deltaT)) continue;
    const p = sunPosition(instantOfApparentMinute(dayJd0, m, site), site, scene.air);
    if (p.altitudeDeg < -1) continue;
    points.push([unwrapAzimuth(p.azimuthDeg, centre), p.altitudeDeg]);
    if (m % 60 === 0 && p.altitudeDeg > 0) hourMarks.push({ azimuthDeg: unwrapAzimuth(p.azimuthDeg, centre), altitudeDeg: p.altitudeDeg, label: `${m / 60}h` });
  }
  const d = c.civilDate;
  const label = `${d.day} ${MONTH_NAMES[d.month - 1]} ${formatYearBcAd(d.year)} (${mark.label})`;
  return { label, points, hourMarks };
}

/** Largest jump in unwrapped azimuth between neighbouring points of one piece of the moon's path, degrees. */
const MOON_PATH_BREAK_DEG = 90;

/**
 * The moon's path and look for a candidate: over its civil day (the moon layer), or, with `aroundInstant` (a scene
 * lit by the moon alone), over the 24 hours centred on the candidate's instant, so that the path is that of its own
 * night and not half of the night before.
 */
function moonOfCandidate(mark: MarkedCandidate, scene: Scene, centre: number, aroundInstant = false): SkyMoon {
  const c = mark.candidate;
  const dayJd0 = civilDateToJd(resolveCalendarRule(scene.calendar), c.civilDate);
  const site: SunSite = { latitudeDeg: scene.site.latitudeDeg, longitudeDeg: scene.site.longitudeDeg, elevationM: scene.site.elevationM };
  const segments: [number, number][][] = [];
  const hourMarks: { azimuthDeg: number; altitudeDeg: number; label: string }[] = [];
  let piece: [number, number][] = [];
  // Minutes of local apparent time on the candidate's day: whole 10 minutes from 12 hours before its instant to 12 hours after.
  const from = aroundInstant ? Math.ceil((c.times.localApparentMinutes - 720) / 10) * 10 : 0;
  for (let m = from; m <= from + 1440; m += 10) {
    const p = moonPosition(instantOfApparentMinute(dayJd0, m, site), site, scene.air, { deltaTModel: scene.deltaT });
    const point: [number, number] = [unwrapAzimuth(p.azimuthDeg, centre), p.altitudeDeg];
    const last = piece[piece.length - 1];
    if (p.altitudeDeg < -1 || (last !== undefined && Math.abs(point[0] - last[0]) > MOON_PATH_BREAK_DEG)) {
      if (piece.length > 1) segments.push(piece);
      piece = [];
    }
    if (p.altitudeDeg >= -1) piece.push(point);
    if (m % 60 === 0 && p.altitudeDeg > 0) hourMarks.push({ azimuthDeg: point[0], altitudeDeg: point[1], label: `${aroundInstant ? (((m / 60) % 24) + 24) % 24 : m / 60}h` });
  }
  if (piece.length > 1) segments.push(piece);
  const at = moonPosition(c.jdUT, site, scene.air, { deltaTModel: scene.deltaT });
  const d = c.civilDate;
  return {
    label: `${d.day} ${MONTH_NAMES[d.month - 1]} ${formatYearBcAd(d.year)} (${mark.label})`,
    segments,
    hourMarks,
    at: {
      candidateLabel: mark.label,
      azimuthDeg: unwrapAzimuth(at.azimuthDeg, centre),
      altitudeDeg: at.altitudeDeg,
      illuminatedFraction: at.illuminatedFraction,
      brightLimbTiltFromVerticalDeg: at.brightLimbTiltFromVerticalDeg,
      words: `${moonPhaseWords(at.phaseLongitudeDeg)}, ${Math.round(100 * at.illuminatedFraction)}% lit, lit side ${litSideWords(at.brightLimbTiltFromVerticalDeg)}`,
    },
  };
}

/** The moon at a marked candidate's instant: the solver's own (Candidate.moon), else from the ephemeris. */
function candidateMoon(mark: MarkedCandidate, scene: Scene, centre: number): SkyCandidateMoon {
  const c = mark.candidate;
  const m = c.moon;
  if (m) return { label: mark.label, azimuthDeg: unwrapAzimuth(m.azimuthDeg, centre), altitudeDeg: m.altitudeDeg, illuminatedFraction: m.illuminatedFraction, brightLimbTiltFromVerticalDeg: m.litSideTiltDeg };
  const site: SunSite = { latitudeDeg: scene.site.latitudeDeg, longitudeDeg: scene.site.longitudeDeg, elevationM: scene.site.elevationM };
  const p = moonPosition(c.jdUT, site, scene.air, { deltaTModel: scene.deltaT });
  return { label: mark.label, azimuthDeg: unwrapAzimuth(p.azimuthDeg, centre), altitudeDeg: p.altitudeDeg, illuminatedFraction: p.illuminatedFraction, brightLimbTiltFromVerticalDeg: p.brightLimbTiltFromVerticalDeg };
}

/** The marked candidates on different days of the year (month and day), at most max. */
function distinctDays(marked: readonly MarkedCandidate[], max: number): MarkedCandidate[] {
  const seen = new Set<string>();
  const out: MarkedCandidate[] = [];
  for (const c of marked) {
    const key = `${c.candidate.civilDate.month}-${c.candidate.civilDate.day}`;
    if (seen.has(key)) continue;
    seen.add(key);
    out.push(c);
    if (out.length >= max) break;
  }
  return out;
}

const COMPONENT_WORDS: Record<string, string> = {
  'rod-shadow': 'rod shadow',
  'overhang-shadow': 'overhang shadow',
  'fin-shadow': 'fin shadow',
  'pole-shadow': 'pole shadow',
  'eave-shadow': 'eave shadow',
  'shadow-points': 'shadow points',
  'sun-direction': 'sun direction',
};

/** Everything the sky chart draws, from the scene and the solver's answer. */
export function skyChartData(scene: Scene, answer: DateAnswer, options: SkyChartOptions = {}): SkyChartData {
  // Observations measured in pixels become numbers first, as the solver takes them (src/image/resolvePixels.ts).
  const model = options.model ?? buildEvidenceModel(resolvePixelObservations(scene).scene);
  const marked = markedCandidates(answer);
  const best = marked[0]?.candidate;
  const centre = scene.site.latitudeDeg >= 0 ? 180 : 0;
  const byMoon = isLitByMoonAlone(model);
  const days = distinctDays(marked, options.maxPaths ?? 3);
  const paths = byMoon ? [] : days.map((m) => pathOfDay(m, scene, centre));
  const moonPaths = byMoon ? days.map((m) => moonOfCandidate(m, scene, centre, true)) : [];
  const moon = byMoon ? moonPaths[0] : options.moon === true && marked[0] !== undefined ? moonOfCandidate(marked[0], scene, centre) : undefined;

  let azMin = centre - 90;
  let azMax = centre + 90;
  let altMax = 30;
  for (const points of [...paths.map((p) => p.points), ...(moon?.segments ?? []), ...moonPaths.flatMap((p) => p.segments)]) {
    for (const [az, alt] of points) {
      azMin = Math.min(azMin, az);
      azMax = Math.max(azMax, az);
      altMax = Math.max(altMax, alt);
    }
  }
  const azimuthRange: [number, number] = [Math.max(centre - 180, Math.floor((azMin - 5) / 10) * 10), Math.min(centre + 180, Math.ceil((azMax + 5) / 10) * 10)];
  const altitudeRange: [number, number] = [0, Math.min(90, Math.ceil((altMax + 5) / 10) * 10)];

  const nuisances = nuisancesOfCandidate(model, best);
  const columns = options.columns ?? 241;
  const rows = options.rows ?? 121;
  const azimuths = Array.from({ length: columns }, (_, i) => azimuthRange[0] + ((azimuthRange[1] - azimuthRange[0]) * i) / (columns - 1));
  const altitudes = Array.from({ length: rows }, (_, j) => altitudeRange[0] + ((altitudeRange[1] - altitudeRange[0]) * j) / (rows - 1));
  let evaluations = 0;
  const bands: SkyBand[] = model.shadows.map((term) => {
    const wallAz = wallAzimuthOf(model, term.wallId, nuisances);
    const evidence = termEvidence(model, term, nuisances);
    // A wall's shadow is defined only while its wall is sunlit (src/geometry/wallShadows.ts): elsewhere
    // the band's value is known without the residual.
    const onLitWallOnly = WALL_SHADOW_KINDS.has(evidence.kind);
    evaluations += altitudes.length * azimuths.length;
    const values = skyBandValues(evidence, wallAz, onLitWallOnly, azimuths, altitudes, term.count);
    const words = COMPONENT_WORDS[term.observationKind] ?? term.observationKind;
    const e = term.evidence;
    // A pole's shadow points away from the sun: shadow azimuth = sun azimuth + 180 (groundShadows.ts).
    const opposite =
      e.kind === 'pole-shadow' && e.shadowAzimuthDeg !== undefined
        ? { opposite: { shadowAzimuthDeg: e.shadowAzimuthDeg, sunAzimuthDeg: normalizeDeg360(e.shadowAzimuthDeg + 180) } }
        : {};
    return { observationId: term.observationId, label: `${term.observationId} (${words}${term.wallId ? `, wall ${term.wallId}` : ''})`, azimuths, altitudes, values, ...opposite };
  });

  const suns: SkySun[] = byMoon ? [] : marked.map(({ label, candidate: c }) => ({
    label,
    azimuthDeg: unwrapAzimuth(c.sun.azimuthDeg, centre),
    altitudeDeg: c.sun.altitudeDeg,
    ellipses: c.uncertainty.skyEllipses.map((e) => {
      const [a, b] = semiAxisVectors(e.semiMajorDeg, e.semiMinorDeg, e.orientationDeg);
      return { probability: e.probability, points: ellipsePoints([unwrapAzimuth(c.sun.azimuthDeg, centre), c.sun.altitudeDeg], a, b) };
    }),
  }));

  const notes: string[] = [];
  if (model.clocks.length > 0) {
    const one = model.clocks.length === 1;
    const what = model.clocks.every((c) => c.observationKind === 'sundial') ? 'sundial reading' : model.clocks.some((c) => c.observationKind === 'sundial') ? 'clock and sundial reading' : 'clock reading';
    notes.push(`${what}${one ? '' : 's'} (${model.clocks.map((c) => c.observationId).join(', ')}) ${one ? 'fixes' : 'fix'} the hour, not the direction of the sun`);
  }
  const explicitFacts = model.facts.filter((f) => !f.implicit);
  if (explicitFacts.length > 0) notes.push(`facts without numbers (${explicitFacts.map((f) => f.observationId).join(', ')}) are not drawn`);
  const moonMarks = byMoon ? { moonPaths, moons: marked.map((m) => candidateMoon(m, scene, centre)) } : {};
  return { light: byMoon ? 'moon' : 'sun', ...moonMarks, centreAzimuthDeg: centre, azimuthRange, altitudeRange, bands, paths, suns, notes, calendarNote: calendarReadingNote(scene), evaluations, ...(moon ? { moon } : {}) };
}
