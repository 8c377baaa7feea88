/**
 * The scene's evidence as the solver uses it: a list of residual terms, each a function
 * of the sun's direction, the wall azimuths, the site and (for clocks) the instant.
 *
 * - Shadow evidence (rod, overhang, fin, pole, eave, shadow points, sun direction): the
 *   residuals of src/geometry/observationModels.ts, normalised by their sigmas.
 * - Clocks: predicted reading minus reading, wrapped to the dial (+/-30 min when the hour
 *   hand is not trusted, +/-180 min on a 6-hour dial, +/-360 min on a 12-hour dial, +/-720 min
 *   on a 24-hour dial: the nearest of the readings the dial cannot tell apart), over
 *   the reading's precision.
 * - Sundials: the same residual with the dial's hour lines as its keeping, always stated: equal
 *   hours are local apparent time, which is the sun's hour angle (LAT = 12 h + H / 15 deg per
 *   hour, Meeus 1998 ch. 28), so a sundial is evidence about the sun's hour angle and, for
 *   Italian, Babylonian and unequal lines, about the time since sunset or sunrise
 *   (src/solver/hourSystemPrediction.ts); no clock convention, equation of time or zone enters. What the clock kept decides the prediction (src/time/clock.ts
 *   defines the kinds): apparent m; mean m - E; meridian m - E + 4 (lon0 - lon); UT m - E - 4 lon;
 *   zone: UT + the zone's offset (luxon through src/time/clock.ts).
 * - Nuisance parameters: every wall azimuth and the site latitude/longitude whose sigma is
 *   above zero, with their Gaussian priors as pseudo-observations (Press et al., Numerical
 *   Recipes 3rd ed. 2007, section 15.4 on priors as extra data points; common practice).
 * - Facts without numbers (wall lit / shaded, sun up) and the implicit facts of every shadow
 *   (its wall is lit, the sun is up) and of a clock (read in a sunlit picture: the sun is up),
 *   soft penalties of src/geometry/lightFacts.ts, zero when
 *   they hold, not counted as measured residuals.
 * - Shadows clicked through the picture's camera (src/image/sunConstraints.ts): each object-shadow
 *   pair is one measured residual, the sun's distance from the pair's great circle over its sigma
 *   from the pair's clicks (src/geometry/skyPlanes.ts), and a one-sided fact that keeps the sun on
 *   the pair's arc; a shadow wedge is a one-sided fact only. Their one-sided rows are in sigmas of
 *   the clicks, not over a fixed tolerance. The camera's error, shared by all of them, enters as
 *   nuisances of one sigma each with unit priors ('camera' kind): fitting them carries the
 *   correlation between the pairs (skyPlanes.ts header).
 * - Shadows cast by moonlight (`light: moon`): the same residuals and facts with the moon's topocentric
 *   apparent direction (src/ephemeris/moonPosition.ts, refracted as the sun) in place of the sun's; the
 *   geometry needs only a light direction. Their rows are 0 where the evaluation holds no moon (the
 *   year-independent and continuous fits), like the moon's own terms. A shadow by moonlight implies
 *   that the moon is up and lights its wall; in a night view (moonlit shadows and no evidence of
 *   sunlight) also that the sun is below the horizon ('sun-not-up', implicit).
 */
import { predictHourSystemClock } from './hourSystemPrediction.js';
import { InvalidInputError } from '../errors.js';
import type { ClockKind, Observation, Scene, ShadowLight } from '../scene/types.js';
import { evidenceResiduals, evidenceResidualValues, predictEvidence, type ShadowEvidence } from '../geometry/observationModels.js';
import { lightFactViolationDeg, type LightFact } from '../geometry/lightFacts.js';
import { horizontalShadowAngleDeg } from '../geometry/shadowAngles.js';
import { planeClickSigmaDeg, sideViolation, type SkyPlane } from '../geometry/skyPlanes.js';
import { sunUnitVector } from '../geometry/sunVector.js';
import type { SolverSunDirection } from './sunModel.js';
import type { MoonPosition } from '../ephemeris/moonPosition.js';
import { moonFactViolationDeg, moonResiduals, moonTermsOf, type MoonFactTerm, type MoonTerm } from './moonEvidence.js';

/** Tolerance of the soft penalties, degrees: a violation of this size costs 1 in chi-square. */
export const FACT_TOLERANCE_DEG = 0.5;
/** Extra sigma for a mean-time clock in the year-independent stage, minutes (the equation of time spans -14..+16 min). */
export const STAGE_A_CLOCK_EXTRA_SIGMA_MINUTES = 8;

export interface NuisanceSpec {
  readonly name: string;
  /** 'camera': one standardised component of the picture's camera error (unit: its sigma; prior 0, sigma 1). */
  readonly kind: 'wall-azimuth' | 'latitude' | 'longitude' | 'camera';
  readonly wallId?: string;
  readonly priorDeg: number;
  readonly sigmaDeg: number;
}

export interface ShadowTerm {
  readonly observationId: string;
  readonly observationKind: Observation['kind'];
  /** The light that casts the shadow: its residuals are taken against this body's direction. */
  readonly light: ShadowLight;
  readonly evidence: ShadowEvidence;
  readonly wallId?: string;
  readonly count: number;
}

export interface ClockTerm {
  readonly observationId: string;
  /** A clock, or a sundial (its hour lines always stated; it shows the sun's hour angle, never a clock convention). */
  readonly observationKind: 'clock' | 'sundial';
  /** Hours on the dial: 24, 12 or 6 (a sundial's count runs through the day: 24). */
  readonly dialHours: 6 | 12 | 24;
  readonly readingMinutes: number;
  readonly precisionMinutes: number;
  /** Period of the reading: 60 (hour hand not trusted), 360 (6-hour dial), 720 (12-hour dial) or 1440. */
  readonly modulusMinutes: number;
  /** null: kept was 'unknown' (the solver's assumption applies). */
  readonly kept: ClockKind | null;
}

/** A one-sided fact of a shadow clicked through the camera: the sun on a pair's arc, or inside a wedge. */
export type SideFact = 'pair-side' | 'wedge';

export interface FactTerm {
  readonly observationId: string;
  /** 'sun-not-up': the sun's centre below the horizon (stated, or implied by a night view lit by the moon). */
  readonly fact: LightFact | SideFact | 'sun-not-up';
  /** The body the fact is about: the moon for the facts of a moonlit shadow ('sun-up' then reads "the moon is up"); absent: the sun. */
  readonly light?: 'moon';
  /** For the side facts: the planes on whose positive side the sun must lie. */
  readonly planes?: readonly SkyPlane[];
  readonly wallId?: string;
  /** True for the facts implied by a shadow (its wall lit, the sun up). */
  readonly implicit: boolean;
}

export interface EvidenceModel {
  readonly scene: Scene;
  readonly nuisances: readonly NuisanceSpec[];
  readonly shadows: readonly ShadowTerm[];
  readonly clocks: readonly ClockTerm[];
  readonly facts: readonly FactTerm[];
  /** The moon's measured terms (src/solver/moonEvidence.ts), evaluated at the candidate's own instant. */
  readonly moons: readonly MoonTerm[];
  /** The moon's facts (soft penalties, after the sun's facts). */
  readonly moonFacts: readonly MoonFactTerm[];
  /** Number of measured scalar residuals (shadows, clocks and the moon). */
  readonly measuredCount: number;
  /** Index in `nuisances` of each wall's azimuth, the latitude, the longitude (-1: fixed). */
  readonly wallNuisance: ReadonlyMap<string, number>;
  readonly latitudeNuisance: number;
  readonly longitudeNuisance: number;
  /** Stated azimuth of each wall. */
  readonly wallAzimuths: ReadonlyMap<string, number>;
  /** The camera-error nuisances: index of the first in `nuisances` and how many; null without camera evidence. */
  readonly cameraNuisance: { readonly start: number; readonly count: number } | null;
  /**
   * The wall of each shadow term and each fact, looked up once (wallAzimuthOf at every evaluation looks
   * up two maps): the wall azimuth's index in `nuisances` (-1: fixed, or no wall) and its stated azimuth
   * (0 without a wall), in the order of `shadows` and of `facts`.
   */
  readonly shadowWalls: WallLookup;
  readonly factWalls: WallLookup;
}

/** Per term: the index of its wall's azimuth among the nuisances (-1: fixed or no wall) and the stated azimuth (0 without a wall). */
export interface WallLookup {
  readonly nuisance: Int32Array;
  readonly statedDeg: Float64Array;
}

/** How a residual evaluation sees the instant and the clocks. */
export interface EvaluationContext {
  readonly sun: SolverSunDirection;
  /** Nuisance values, in the order of model.nuisances. */
  readonly nuisances: readonly number[];
  readonly apparentMinutes: number;
  /** Equation of time, minutes; null in the year-independent stage (clock offsets are then approximate). */
  readonly equationOfTimeMinutes: number | null;
  /** The assumed kind of the clocks whose kept is 'unknown'. */
  readonly assumedClock: ClockKind | null;
  /** Offset of each zone from UT at the instant, minutes. */
  readonly zoneOffsetMinutes: (zone: string) => number;
  /**
   * The moon at the instant, when the evaluation is at a whole civil day (src/solver/moonYears.ts);
   * absent in the year-independent and continuous fits, where the moon's rows are 0.
   */
  readonly moon?: MoonPosition;
}

function need<T>(value: T | undefined, field: string, allowed: string): T {
  if (value === undefined || (typeof value === 'number' && !Number.isFinite(value))) {
    throw new InvalidInputError(field, value, allowed, 'The solver needs the number (pixel forms are converted to numbers before solving)');
  }
  return value;
}

function shadowEvidenceOf(o: Observation, i: number): { evidence: ShadowEvidence; wallId?: string } | null {
  const f = `observations[${i}]`;
  switch (o.kind) {
    case 'rod-shadow':
      return {
        evidence: { kind: 'rod-shadow', slopeDeg: need(o.slopeDeg, `${f}.slopeDeg`, 'a slope in degrees (0, 90)'), side: o.side, sigmaDeg: need(o.sigmaDeg, `${f}.sigmaDeg`, 'a sigma in degrees > 0') },
        wallId: o.wallId,
      };
    case 'overhang-shadow':
      return {
        evidence: { kind: 'overhang-shadow', depthRatio: need(o.depthRatio, `${f}.depthRatio`, 'a ratio >= 0'), sigma: need(o.sigma, `${f}.sigma`, 'a sigma > 0') },
        wallId: o.wallId,
      };
    case 'fin-shadow':
      return {
        evidence: { kind: 'fin-shadow', widthRatio: need(o.widthRatio, `${f}.widthRatio`, 'a ratio >= 0'), side: o.side, sigma: need(o.sigma, `${f}.sigma`, 'a sigma > 0') },
        wallId: o.wallId,
      };
    case 'pole-shadow': {
      const hasAz = o.shadowAzimuthDeg !== undefined && o.shadowAzimuthSigmaDeg !== undefined;
      const hasLen = o.lengthRatio !== undefined && o.lengthRatioSigma !== undefined;
      if (!hasAz && !hasLen) {
        throw new InvalidInputError(`${f}`, o.id, 'a pole shadow with shadowAzimuthDeg and its sigma, or lengthRatio and its sigma');
      }
      return {
        evidence: {
          kind: 'pole-shadow',
          shadowAzimuthDeg: hasAz ? o.shadowAzimuthDeg : undefined,
          shadowAzimuthSigmaDeg: hasAz ? o.shadowAzimuthSigmaDeg : undefined,
          lengthRatio: hasLen ? o.lengthRatio : undefined,
          lengthRatioSigma: hasLen ? o.lengthRatioSigma : undefined,
        },
      };
    }
    case 'eave-shadow':
      return {
        evidence: {
          kind: 'eave-shadow',
          distanceRatio: need(o.distanceRatio, `${f}.distanceRatio`, 'a ratio >= 0'),
          sigma: need(o.sigma, `${f}.sigma`, 'a sigma > 0'),
          projectionRatio: o.projectionRatio ?? 0,
        },
        wallId: o.wallId,
      };
    case 'shadow-points':
      return {
        evidence: {
          kind: 'shadow-points',
          caster: need(o.caster, `${f}.caster`, 'a site point [eastM, northM, upM]'),
          shadow: need(o.shadow, `${f}.shadow`, 'a site point [eastM, northM, upM]'),
          sigmaM: need(o.sigmaM, `${f}.sigmaM`, 'a sigma in metres > 0'),
        },
      };
    case 'sun-direction':
      return {
        evidence: { kind: 'sun-direction', azimuthDeg: o.azimuthDeg, azimuthSigmaDeg: o.azimuthSigmaDeg, altitudeDeg: o.altitudeDeg, altitudeSigmaDeg: o.altitudeSigmaDeg },
      };
    case 'object-shadow':
      return { evidence: { kind: 'sun-circle', circle: need(o.circle, `${f}.objectPx`, 'a pair measured through the camera') } };
    default:
      return null;
  }
}

export const WALL_SHADOW_KINDS: ReadonlySet<string> = new Set(['rod-shadow', 'overhang-shadow', 'fin-shadow']);
/** Observations that show sunlight unless their light is the moon (shadows), or always (the sun's place, its facts, a sundial). */
const SUNLIGHT_KINDS: ReadonlySet<string> = new Set([
  'rod-shadow', 'overhang-shadow', 'fin-shadow', 'pole-shadow', 'eave-shadow', 'shadow-points', 'object-shadow', 'shadow-wedge',
  'sun-direction', 'wall-lit', 'wall-shaded', 'sun-up', 'sundial',
]);

/**
 * The evidence model of a scene, leaving out the observations whose ids are in `omit`.
 * @throws InvalidInputError for an observation without the numbers the solver needs or naming an unknown wall.
 */
export function buildEvidenceModel(scene: Scene, omit: ReadonlySet<string> = new Set()): EvidenceModel {
  const walls = new Map(scene.walls.map((w) => [w.id, w]));
  const shadows: ShadowTerm[] = [];
  const clocks: ClockTerm[] = [];
  const facts: FactTerm[] = [];
  const usedWalls = new Set<string>();
  const cameraPlanes: SkyPlane[] = [];
  const f = (i: number): string => `observations[${i}]`;
  const implicitLit = new Set<string>();
  const lightOf = (o: Observation): ShadowLight => ('light' in o && o.light === 'moon' ? 'moon' : 'sun');
  // A night view: shadows cast by moonlight and nothing lit by the sun. Then the sun is below the
  // horizon (implicit), and a clock or sundial read in the picture no longer implies daylight.
  const live = scene.observations.filter((o) => !omit.has(o.id));
  const nightView = live.some((o) => lightOf(o) === 'moon')
    && !live.some((o) => SUNLIGHT_KINDS.has(o.kind) && lightOf(o) === 'sun');
  let implicitSunUp = nightView;
  let implicitMoonUp = false;
  let implicitSunDown = false;
  scene.observations.forEach((o, i) => {
    if (omit.has(o.id)) return;
    if ('wallId' in o && !walls.has(o.wallId)) {
      throw new InvalidInputError(`observations[${i}].wallId`, o.wallId, `one of the walls: ${scene.walls.map((w) => w.id).join(', ') || '(none given)'}`);
    }
    if (o.kind === 'sundial') {
      // A sundial is read only in sunshine: the sun is up (and lights the dial).
      clocks.push({ observationId: o.id, observationKind: 'sundial', dialHours: 24, readingMinutes: o.readingMinutes, precisionMinutes: o.precisionMinutes, modulusMinutes: 1440, kept: o.hours });
      if (!implicitSunUp) {
        implicitSunUp = true;
        facts.push({ observationId: o.id, fact: 'sun-up', implicit: true });
      }
      return;
    }
    if (o.kind === 'clock') {
      const modulus = !o.hourHandTrusted ? 60 : o.dialHours * 60;
      clocks.push({
        observationId: o.id,
        observationKind: 'clock',
        dialHours: o.dialHours,
        readingMinutes: o.readingMinutes,
        precisionMinutes: o.precisionMinutes,
        modulusMinutes: modulus,
        kept: o.kept.kind === 'unknown' ? null : (o.kept as ClockKind),
      });
      // A clock read in a sunlit picture: daylight, so the sun is up (no night-time hour on a 12-hour dial).
      if (!implicitSunUp) {
        implicitSunUp = true;
        facts.push({ observationId: o.id, fact: 'sun-up', implicit: true });
      }
      return;
    }
    if (o.kind === 'wall-lit' || o.kind === 'wall-shaded') {
      facts.push({ observationId: o.id, fact: o.kind, wallId: o.wallId, implicit: false });
      usedWalls.add(o.wallId);
      return;
    }
    if (o.kind === 'sun-up' || o.kind === 'sun-not-up') {
      facts.push({ observationId: o.id, fact: o.kind, implicit: false });
      return;
    }
    const light = lightOf(o);
    const moonLight = light === 'moon' ? ({ light: 'moon' } as const) : {};
    // The implicit facts of a shadow: its light is up (the sun, or the moon), and in a night view the sun is down.
    const lightUp = (): void => {
      if (light === 'sun' && !implicitSunUp) {
        implicitSunUp = true;
        facts.push({ observationId: o.id, fact: 'sun-up', implicit: true });
      }
      if (light === 'moon' && !implicitMoonUp) {
        implicitMoonUp = true;
        facts.push({ observationId: o.id, fact: 'sun-up', light: 'moon', implicit: true });
      }
      if (light === 'moon' && nightView && !implicitSunDown) {
        implicitSunDown = true;
        facts.push({ observationId: o.id, fact: 'sun-not-up', implicit: true });
      }
    };
    if (o.kind === 'shadow-wedge') {
      facts.push({ observationId: o.id, fact: 'wedge', planes: need(o.edges, `${f(i)}.edgesPx`, 'a wedge measured through the camera'), implicit: false, ...moonLight });
      cameraPlanes.push(...o.edges!);
      lightUp();
      return;
    }
    if (o.kind === 'object-shadow') {
      facts.push({ observationId: o.id, fact: 'pair-side', planes: need(o.sides, `${f(i)}.shadowPx`, 'a pair measured through the camera'), implicit: false, ...moonLight });
      cameraPlanes.push(...o.sides!, ...(o.circle ? [o.circle] : []));
    }
    const s = shadowEvidenceOf(o, i);
    if (!s) return;
    const count = evidenceResiduals(s.evidence, { azimuthDeg: 180, altitudeDeg: 30 }, 180).residuals.length;
    shadows.push({ observationId: o.id, observationKind: o.kind, light, evidence: s.evidence, wallId: s.wallId, count });
    if (s.wallId) usedWalls.add(s.wallId);
    if (s.wallId && WALL_SHADOW_KINDS.has(o.kind) && !implicitLit.has(`${light}:${s.wallId}`)) {
      implicitLit.add(`${light}:${s.wallId}`);
      facts.push({ observationId: o.id, fact: 'wall-lit', wallId: s.wallId, implicit: true, ...moonLight });
    }
    lightUp();
  });
  const nuisances: NuisanceSpec[] = [];
  const wallNuisance = new Map<string, number>();
  for (const w of scene.walls) {
    if (!usedWalls.has(w.id) || !(w.azimuthSigmaDeg > 0)) continue;
    wallNuisance.set(w.id, nuisances.length);
    nuisances.push({ name: `wall:${w.id}:azimuth`, kind: 'wall-azimuth', wallId: w.id, priorDeg: w.azimuthDeg, sigmaDeg: w.azimuthSigmaDeg });
  }
  let latitudeNuisance = -1;
  if (scene.site.latitudeSigmaDeg > 0) {
    latitudeNuisance = nuisances.length;
    nuisances.push({ name: 'site:latitude', kind: 'latitude', priorDeg: scene.site.latitudeDeg, sigmaDeg: scene.site.latitudeSigmaDeg });
  }
  let longitudeNuisance = -1;
  if (scene.site.longitudeSigmaDeg > 0) {
    longitudeNuisance = nuisances.length;
    nuisances.push({ name: 'site:longitude', kind: 'longitude', priorDeg: scene.site.longitudeDeg, sigmaDeg: scene.site.longitudeSigmaDeg });
  }
  const cameraCount = Math.max(0, ...cameraPlanes.map((p) => p.cameraSensitivity.length));
  const cameraNuisance = cameraCount > 0 ? { start: nuisances.length, count: cameraCount } : null;
  for (let k = 0; k < cameraCount; k++) {
    nuisances.push({ name: `camera:error-${k + 1}`, kind: 'camera', priorDeg: 0, sigmaDeg: 1 });
  }
  const moon = moonTermsOf(scene, omit);
  const measuredCount = shadows.reduce((n, t) => n + t.count, 0) + clocks.length + moon.terms.reduce((n, t) => n + t.count, 0);
  const wallAzimuths = new Map(scene.walls.map((w) => [w.id, w.azimuthDeg]));
  const lookup = (terms: readonly { readonly wallId?: string }[]): WallLookup => {
    const nuisance = new Int32Array(terms.length).fill(-1);
    const statedDeg = new Float64Array(terms.length);
    terms.forEach((t, i) => {
      if (t.wallId === undefined) return;
      nuisance[i] = wallNuisance.get(t.wallId) ?? -1;
      statedDeg[i] = wallAzimuths.get(t.wallId) ?? 0;
    });
    return { nuisance, statedDeg };
  };
  return {
    scene, nuisances, shadows, clocks, facts, moons: moon.terms, moonFacts: moon.facts, measuredCount, wallNuisance, latitudeNuisance, longitudeNuisance, wallAzimuths, cameraNuisance,
    shadowWalls: lookup(shadows), factWalls: lookup(facts),
  };
}

/** wallAzimuthOf for the term at `index` of a wall lookup (the same number). */
function lookedUpWallAzimuth(walls: WallLookup, index: number, nuisances: readonly number[]): number {
  const k = walls.nuisance[index];
  return k >= 0 ? nuisances[k] : walls.statedDeg[index];
}

/** Wall azimuth in use: the nuisance value when fitted, else the stated azimuth. */
export function wallAzimuthOf(model: EvidenceModel, wallId: string | undefined, nuisances: readonly number[]): number {
  if (wallId === undefined) return 0;
  const k = model.wallNuisance.get(wallId);
  if (k !== undefined) return nuisances[k];
  return model.wallAzimuths.get(wallId) ?? 0;
}

/**
 * The site latitude at a point of the fit: the fitted nuisance, held to [-90, 90] (a fit near a
 * pole with a latitude sigma can step past it, where no latitude exists), else the stated one.
 */
export function latitudeOf(model: EvidenceModel, nuisances: readonly number[]): number {
  if (model.latitudeNuisance < 0) return model.scene.site.latitudeDeg;
  return Math.min(90, Math.max(-90, nuisances[model.latitudeNuisance]));
}

export function longitudeOf(model: EvidenceModel, nuisances: readonly number[]): number {
  return model.longitudeNuisance >= 0 ? nuisances[model.longitudeNuisance] : model.scene.site.longitudeDeg;
}

/** x wrapped into [-period/2, period/2). */
export function wrapSymmetric(x: number, period: number): number {
  return x - period * Math.floor(x / period + 0.5);
}

/** The clock kind a clock term uses under an assumption. */
export function clockKindOf(term: ClockTerm, assumed: ClockKind | null): ClockKind {
  return term.kept ?? assumed ?? { kind: 'apparent' };
}

/**
 * Predicted clock reading, minutes after midnight, and the sigma to use. With the equation of
 * time unknown (year-independent stage) a non-apparent clock is predicted with E = 0 and its
 * sigma widened by STAGE_A_CLOCK_EXTRA_SIGMA_MINUTES (used only to seed the search).
 */
export function predictClock(term: ClockTerm, model: EvidenceModel, ctx: EvaluationContext): { minutes: number; sigma: number } {
  const kind = clockKindOf(term, ctx.assumedClock);
  const m = ctx.apparentMinutes;
  const lon = longitudeOf(model, ctx.nuisances);
  if (kind.kind === 'apparent') return { minutes: m, sigma: term.precisionMinutes };
  if (kind.kind === 'italian' || kind.kind === 'babylonian' || kind.kind === 'unequal') {
    return predictHourSystemClock(kind, m, ctx.sun, latitudeOf(model, ctx.nuisances), term.precisionMinutes); // src/solver/hourSystemPrediction.ts
  }
  const e = ctx.equationOfTimeMinutes ?? 0;
  const sigma = ctx.equationOfTimeMinutes === null ? Math.hypot(term.precisionMinutes, STAGE_A_CLOCK_EXTRA_SIGMA_MINUTES) : term.precisionMinutes;
  const meanMinutes = m - e; // local mean time = apparent - E (Meeus 1998 ch. 28)
  switch (kind.kind) {
    case 'mean':
      return { minutes: meanMinutes, sigma };
    case 'meridian':
      return { minutes: meanMinutes + 4 * (kind.longitudeDeg - lon), sigma }; // 4 min per degree of longitude
    case 'ut':
      return { minutes: meanMinutes - 4 * lon, sigma };
    case 'zone':
      return { minutes: meanMinutes - 4 * lon + ctx.zoneOffsetMinutes(kind.zone), sigma };
  }
}

/** Clock residual (predicted - read, wrapped to the dial) over sigma. */
export function clockResidual(term: ClockTerm, model: EvidenceModel, ctx: EvaluationContext): number {
  const p = predictClock(term, model, ctx);
  return wrapSymmetric(p.minutes - term.readingMinutes, term.modulusMinutes) / p.sigma;
}

/** The camera-error components at a point of the fit (empty without camera evidence). */
export function cameraErrorOf(model: EvidenceModel, nuisances: readonly number[]): readonly number[] {
  const c = model.cameraNuisance;
  return c ? nuisances.slice(c.start, c.start + c.count) : [];
}

/** A term's evidence at a point of the fit: a pair's great circle moved by the fitted camera error. */
export function termEvidence(model: EvidenceModel, t: ShadowTerm, nuisances: readonly number[]): ShadowEvidence {
  return t.evidence.kind === 'sun-circle' ? { ...t.evidence, cameraError: cameraErrorOf(model, nuisances) } : t.evidence;
}

/** How many residual rows the model has: measured (shadows, clocks, the moon), nuisance priors, facts (the sun's, then the moon's). */
export function residualRowCount(model: EvidenceModel): number {
  return model.measuredCount + model.nuisances.length + model.facts.length + model.moonFacts.length;
}

/**
 * Residual vector: measured (shadows, clocks, the moon), then nuisance priors, then soft facts (the
 * sun's, then the moon's). The moon's rows are 0 when the context holds no moon.
 */
export function evidenceResidualVector(model: EvidenceModel, ctx: EvaluationContext): number[] {
  const n = residualRowCount(model);
  if (scratch.length < n) scratch = new Float64Array(2 * n);
  writeEvidenceResiduals(model, ctx, scratch, 0);
  const out: number[] = [];
  for (let i = 0; i < n; i += 1) out.push(scratch[i]);
  return out;
}

/** The rows of one evaluation before they are copied out (the writer stores into typed arrays only: one kind of store in the hot loop). */
let scratch = new Float64Array(64);

/**
 * The residual vector of evidenceResidualVector written into `out` from index `at` (the same numbers,
 * bit for bit), for the solver's inner loops: a buffer kept between evaluations, and no partials
 * computed (src/geometry/observationModels.ts evidenceResidualValues).
 */
export function writeEvidenceResiduals(model: EvidenceModel, ctx: EvaluationContext, out: Float64Array, at: number): void {
  let i = at;
  const shadows = model.shadows;
  for (let s = 0; s < shadows.length; s += 1) {
    const t = shadows[s];
    const light = lightDirectionOf(t.light, ctx);
    if (light === null) {
      for (let k = 0; k < t.count; k += 1) out[i++] = 0;
      continue;
    }
    const evidence = t.evidence.kind === 'sun-circle' ? termEvidence(model, t, ctx.nuisances) : t.evidence;
    i += evidenceResidualValues(evidence, light, lookedUpWallAzimuth(model.shadowWalls, s, ctx.nuisances), out, i);
  }
  for (const c of model.clocks) out[i++] = clockResidual(c, model, ctx);
  for (const t of model.moons) {
    if (ctx.moon) for (const v of moonResiduals(t.evidence, ctx.moon)) out[i++] = v;
    else for (let k = 0; k < t.count; k += 1) out[i++] = 0;
  }
  const nuisances = model.nuisances;
  for (let k = 0; k < nuisances.length; k += 1) out[i++] = (ctx.nuisances[k] - nuisances[k].priorDeg) / nuisances[k].sigmaDeg;
  const facts = model.facts;
  for (let k = 0; k < facts.length; k += 1) out[i++] = factResidualWithWall(model, facts[k], ctx, lookedUpWallAzimuth(model.factWalls, k, ctx.nuisances));
  for (const f of model.moonFacts) out[i++] = ctx.moon ? moonFactViolationDeg(f.fact, ctx.moon) / FACT_TOLERANCE_DEG : 0;
}

/**
 * The direction of a shadow's light at an evaluation: the sun's, or the moon's topocentric apparent
 * place (MoonPosition carries the same azimuth and altitudes); null for the moon where the context holds none.
 */
export function lightDirectionOf(light: ShadowLight | undefined, ctx: { readonly sun: SolverSunDirection; readonly moon?: SolverSunDirection }): SolverSunDirection | null {
  return light === 'moon' ? ctx.moon ?? null : ctx.sun;
}

/** Soft residual of one fact (0 when it holds; 0 for a fact of the moon's light where the context holds no moon). */
export function factResidual(model: EvidenceModel, f: FactTerm, ctx: { readonly sun: SolverSunDirection; readonly moon?: SolverSunDirection; readonly nuisances: readonly number[] }): number {
  return factResidualWithWall(model, f, ctx, wallAzimuthOf(model, f.wallId, ctx.nuisances));
}

/** factResidual with the fact's wall azimuth given (wallAzimuthOf(model, f.wallId, ctx.nuisances)). */
function factResidualWithWall(model: EvidenceModel, f: FactTerm, ctx: { readonly sun: SolverSunDirection; readonly moon?: SolverSunDirection; readonly nuisances: readonly number[] }, wallAzimuthDeg: number): number {
  if (f.fact === 'sun-not-up') return Math.max(0, ctx.sun.altitudeDeg) / FACT_TOLERANCE_DEG; // the sun's centre above the horizon, as the moon's facts
  const light = lightDirectionOf(f.light, ctx);
  if (light === null) return 0;
  if (f.fact === 'pair-side' || f.fact === 'wedge') {
    // one-sided, in sigmas of the clicks (skyPlanes.ts sideViolation); the camera's part through its nuisances
    return sideViolation(f.planes ?? [], sunUnitVector(light.azimuthDeg, light.altitudeDeg), cameraErrorOf(model, ctx.nuisances)).sigmas;
  }
  return lightFactViolationDeg(f.fact, light, wallAzimuthDeg) / FACT_TOLERANCE_DEG; // = lightFactResidual(...).residuals[0]
}

/** Split of a residual vector into chi-square (measured + priors) and the soft penalty (facts). */
export function splitChiSquare(model: EvidenceModel, r: ArrayLike<number>): { chiSquare: number; penalty: number; measured: number } {
  const nMeasured = model.measuredCount;
  const nPrior = model.nuisances.length;
  let chiSquare = 0;
  let penalty = 0;
  let measured = 0;
  for (let i = 0; i < r.length; i += 1) {
    const v = r[i] * r[i];
    if (i < nMeasured) measured += v;
    if (i < nMeasured + nPrior) chiSquare += v;
    else penalty += v;
  }
  return { chiSquare, penalty, measured };
}

/** Which residual rows belong to each observation (for leave-one-out and reports). */
export function residualRowsByObservation(model: EvidenceModel): Map<string, number[]> {
  const rows = new Map<string, number[]>();
  let i = 0;
  for (const t of model.shadows) {
    const list = rows.get(t.observationId) ?? [];
    for (let k = 0; k < t.count; k += 1) list.push(i++);
    rows.set(t.observationId, list);
  }
  for (const c of model.clocks) {
    const list = rows.get(c.observationId) ?? [];
    list.push(i++);
    rows.set(c.observationId, list);
  }
  for (const t of model.moons) {
    const list = rows.get(t.observationId) ?? [];
    for (let k = 0; k < t.count; k += 1) list.push(i++);
    rows.set(t.observationId, list);
  }
  return rows;
}

/**
 * For each residual row of `reduced` (the model of the same scene with observations left out), the
 * row of `full` that computes the same number at any sun and clock assumption with the nuisances
 * at their priors: a shadow's or clock's rows by observation, a fact by what it states (the implicit
 * "sun up" or "wall lit" moves to another observation when its first one is left out), and -1 for
 * a prior (zero there). Null when a row has no such source (then nothing is reused).
 */
export function rowSourcesIn(reduced: EvidenceModel, full: EvidenceModel): Int32Array | null {
  const fullRows = residualRowsByObservation(full);
  const factStart = full.measuredCount + full.nuisances.length;
  const sources = new Int32Array(reduced.measuredCount + reduced.nuisances.length + reduced.facts.length);
  let i = 0;
  for (const [id, rows] of residualRowsByObservation(reduced)) {
    const there = fullRows.get(id);
    if (there === undefined || there.length !== rows.length) return null;
    for (let k = 0; k < rows.length; k += 1) sources[rows[k]] = there[k];
    i += rows.length;
  }
  for (let k = 0; k < reduced.nuisances.length; k += 1) sources[i++] = -1;
  for (const f of reduced.facts) {
    const k = full.facts.findIndex((g) => g.fact === f.fact && g.wallId === f.wallId && g.light === f.light);
    if (k < 0) return null;
    sources[i++] = factStart + k;
  }
  return sources;
}

/** Predicted values in the observation's own units, for reports. */
export function predictedValuesOf(term: ShadowTerm, sun: SolverSunDirection, wallAzimuthDeg: number): { component: string; measured: number; predicted: number; unit: string; sigma: number }[] {
  const e = term.evidence;
  const p = predictEvidence(e, sun, wallAzimuthDeg);
  switch (e.kind) {
    case 'rod-shadow':
      return [{ component: 'slope', measured: e.slopeDeg, predicted: p.kind === 'rod-shadow' ? p.slopeDeg : NaN, unit: 'deg', sigma: e.sigmaDeg }];
    case 'overhang-shadow':
      return [{ component: 'depth-ratio', measured: e.depthRatio, predicted: p.kind === 'overhang-shadow' ? p.depthRatio : NaN, unit: 'ratio', sigma: e.sigma }];
    case 'fin-shadow':
      return [{ component: 'width-ratio', measured: e.widthRatio, predicted: p.kind === 'fin-shadow' ? p.widthRatio : NaN, unit: 'ratio', sigma: e.sigma }];
    case 'pole-shadow': {
      const out = [];
      if (e.shadowAzimuthDeg !== undefined && e.shadowAzimuthSigmaDeg !== undefined) {
        out.push({ component: 'shadow-azimuth', measured: e.shadowAzimuthDeg, predicted: p.kind === 'pole-shadow' ? p.shadowAzimuthDeg : NaN, unit: 'deg', sigma: e.shadowAzimuthSigmaDeg });
      }
      if (e.lengthRatio !== undefined && e.lengthRatioSigma !== undefined) {
        out.push({ component: 'length-ratio', measured: e.lengthRatio, predicted: p.kind === 'pole-shadow' ? p.lengthRatio : NaN, unit: 'ratio', sigma: e.lengthRatioSigma });
      }
      return out;
    }
    case 'eave-shadow':
      return [{ component: 'distance-ratio', measured: e.distanceRatio, predicted: p.kind === 'eave-shadow' ? p.distanceRatio : NaN, unit: 'ratio', sigma: e.sigma }];
    case 'shadow-points': {
      const misfit = p.kind === 'shadow-points' ? p.misfitDeg : NaN;
      const sigma = p.kind === 'shadow-points' ? p.sigmaDeg : NaN;
      return [
        { component: 'across-ray-horizontal', measured: 0, predicted: misfit, unit: 'deg', sigma },
        { component: 'across-ray-vertical', measured: 0, predicted: misfit, unit: 'deg', sigma },
      ];
    }
    case 'sun-direction':
      return [
        { component: 'azimuth', measured: e.azimuthDeg, predicted: sun.azimuthDeg, unit: 'deg', sigma: e.azimuthSigmaDeg },
        { component: 'altitude', measured: e.altitudeDeg, predicted: sun.altitudeDeg, unit: 'deg', sigma: e.altitudeSigmaDeg },
      ];
    case 'sun-circle': {
      const s = sunUnitVector(sun.azimuthDeg, sun.altitudeDeg);
      return [{ component: 'distance-from-great-circle', measured: 0, predicted: p.kind === 'sun-circle' ? p.distanceDeg : NaN, unit: 'deg', sigma: planeClickSigmaDeg(e.circle, s) }];
    }
    default:
      return [];
  }
}

/** Plain words for a fact at a sun direction. */
export function factNote(model: EvidenceModel, f: FactTerm, sun: SolverSunDirection, wallAzimuthDeg: number, satisfied: boolean, nuisances: readonly number[] = [], moon?: SolverSunDirection): string {
  const wallName = f.wallId ?? '';
  if (f.fact === 'sun-not-up') {
    return `the sun is ${satisfied ? 'below the horizon' : 'up'} (altitude ${sun.altitudeDeg.toFixed(1)} deg)${f.implicit ? ', as a view lit by the moon needs' : ''}`;
  }
  const body = f.light === 'moon' ? 'moon' : 'sun';
  const light = f.light === 'moon' ? moon : sun;
  if (light === undefined) return `the ${body} was not evaluated here`;
  if (f.fact === 'pair-side' || f.fact === 'wedge') {
    const where = f.fact === 'pair-side' ? "on the side of the pair's line where its shadow falls away from the light" : 'inside the wedge of its shadow';
    if (satisfied) return `the ${body} lies ${where}`;
    const v = sideViolation(f.planes ?? [], sunUnitVector(light.azimuthDeg, light.altitudeDeg), cameraErrorOf(model, nuisances));
    return `the ${body} lies ${v.degrees.toFixed(1)} deg outside the bound it must keep (${where}; ${v.sigmas.toFixed(1)} sigma of the clicks)`;
  }
  if (f.fact === 'sun-up') {
    const term = model.clocks.find((c) => c.observationId === f.observationId);
    const needs = term ? (term.observationKind === 'sundial' ? ', as a sundial read in sunshine needs' : ', as a clock read in daylight needs') : f.light === 'moon' ? ', as a shadow cast by moonlight needs' : ', as a shadow needs';
    return `the ${body} is ${satisfied ? 'up' : 'below the horizon'} (altitude ${light.altitudeDeg.toFixed(1)} deg)${f.implicit ? needs : ''}`;
  }
  const hsa = horizontalShadowAngleDeg(light.azimuthDeg, wallAzimuthDeg);
  const lit = f.fact === 'wall-lit';
  const words = satisfied === lit ? (f.light === 'moon' ? 'lit by the moon' : 'lit') : 'in shade';
  return `wall ${wallName} is ${words} (${body} ${Math.abs(hsa).toFixed(0)} deg from its normal, altitude ${light.altitudeDeg.toFixed(1)} deg)${f.implicit ? ', as a shadow on it needs' : ''}`;
}
