/**
 * The observations of a scene file, one reader per kind. Each measured number
 * must come with its sigma; each observation on a wall must name a known wall;
 * a pixel form replaces the numeric form of the same observation (not both).
 */
import { InvalidInputError } from '../errors.js';
import { parseClockKind } from '../time/clock.js';
import { closestWord } from './didYouMean.js';
import {
  checkChoice, checkList, checkNumber, has, itemPath, keyPath, missing, num, openFields, optBool, optNum,
  optStr, raw, str, type Fields, type NumberRule,
  SIGMA_FLOOR,
} from './fields.js';
import { needImage, PIXEL_SIGMA, readPixelPoint, readSegmentPart, SEGMENT_KEYS } from './readImage.js';
import type { CameraBlock, ClockObservation, EavePixels, ImageInfo, MoonPhaseObservation, MoonPixels, NamedMoonPhase, Observation, ObservationKind, PlaneInImage, ShadowPointsPixels, SitePoint, SundialHours, SundialObservation, Wall } from './types.js';

export const OBSERVATION_KINDS: readonly ObservationKind[] = [
  'rod-shadow', 'overhang-shadow', 'fin-shadow', 'pole-shadow', 'eave-shadow', 'shadow-points',
  'sun-direction', 'wall-lit', 'wall-shaded', 'sun-up', 'sun-not-up', 'clock', 'sundial', 'object-shadow', 'shadow-wedge',
  'moon-direction', 'moon-phase', 'moon-lit-side', 'moon-up', 'moon-not-up',
];

/** The named phases of the moon a scene may write (docs/moon-evidence.md). */
export const NAMED_MOON_PHASES: readonly NamedMoonPhase[] = [
  'new', 'waxing crescent', 'first quarter', 'waxing gibbous', 'full',
  'waning gibbous', 'last quarter', 'waning crescent', 'crescent', 'gibbous',
];

/** The light of a shadow: the sun (default) or the moon (docs/moon-evidence.md). */
const LIGHTS = ['sun', 'moon'] as const;

/** Identifiers of walls and observations: letters, digits, '-', '_', '.'. */
export const ID_PATTERN = /^[\p{L}\p{N}][\p{L}\p{N}_.\-]{0,63}$/u;
export const ID_WORDS = 'an id of letters, digits, "-", "_" or ".", starting with a letter or digit, at most 64 characters';
export const NOTE_MAX = 2000;

const SIDES = ['left', 'right'] as const;
const ANGLE_SIGMA: NumberRule = { words: 'a sigma in degrees', min: SIGMA_FLOOR, max: 45 };
const RATIO: NumberRule = { words: 'a ratio (no unit)', min: 0, max: 1000 };
const RATIO_SIGMA: NumberRule = { words: 'a sigma of the ratio (no unit)', min: SIGMA_FLOOR, max: 1000 };
const LENGTH_M: NumberRule = { words: 'a length in metres', min: 0, max: 10_000, minExclusive: true };
const LENGTH_SIGMA_M: NumberRule = { words: 'a sigma in metres', min: 0, max: 10_000, zeroOrAtLeast: SIGMA_FLOOR };
const AZIMUTH: NumberRule = { words: 'an azimuth in degrees clockwise from true north', min: 0, max: 360, maxExclusive: true };
const SITE_COORD: NumberRule = { words: 'a site coordinate in metres', min: -100_000, max: 100_000 };

/** What the reader knows when it reads the observations. */
export interface ObservationContext {
  readonly walls: ReadonlyMap<string, Wall>;
  readonly image: ImageInfo | undefined;
  readonly groundPlane: PlaneInImage | undefined;
  readonly camera?: CameraBlock | undefined;
}

/** Group labels: the same words as ids. */
const GROUP_WORDS = 'a group label of letters, digits, "-", "_" or ".", starting with a letter or digit, at most 64 characters';

const COMMON = ['id', 'kind', 'note', 'group'];
/** Shadow kinds also take `light` (default "sun"). */
const SHADOW = [...COMMON, 'light'];
const KEYS: Readonly<Record<ObservationKind, readonly string[]>> = {
  'rod-shadow': [...SHADOW, 'wall', 'slopeDeg', 'side', 'sigmaDeg', 'pixels'],
  'overhang-shadow': [...SHADOW, 'wall', 'depthRatio', 'sigma', 'pixels'],
  'fin-shadow': [...SHADOW, 'wall', 'widthRatio', 'side', 'sigma', 'pixels'],
  'pole-shadow': [...SHADOW, 'shadowAzimuthDeg', 'shadowAzimuthSigmaDeg', 'lengthRatio', 'lengthRatioSigma', 'pixels'],
  'eave-shadow': [...SHADOW, 'wall', 'distanceRatio', 'sigma', 'projectionRatio', 'pixels'],
  'shadow-points': [...SHADOW, 'caster', 'shadow', 'sigmaM', 'pixels'],
  'sun-direction': [...COMMON, 'azimuthDeg', 'azimuthSigmaDeg', 'altitudeDeg', 'altitudeSigmaDeg'],
  'wall-lit': [...COMMON, 'wall'],
  'wall-shaded': [...COMMON, 'wall'],
  'sun-up': [...COMMON],
  'sun-not-up': [...COMMON],
  clock: [...COMMON, 'reading', 'precisionMinutes', 'hourHandTrusted', 'dialHours', 'kept'],
  sundial: [...COMMON, 'reading', 'hours', 'precisionMinutes'],
  'object-shadow': [...SHADOW, 'objectPx', 'shadowPx', 'sigmaPx'],
  'shadow-wedge': [...SHADOW, 'shadowPx', 'edgesPx', 'sigmaPx'],
  'moon-direction': [...COMMON, 'azimuthDeg', 'azimuthSigmaDeg', 'altitudeDeg', 'altitudeSigmaDeg', 'pixels'],
  'moon-phase': [...COMMON, 'illuminatedFraction', 'sigma', 'phase', 'sigmaDeg'],
  'moon-lit-side': [...COMMON, 'litSideDeg', 'sigmaDeg'],
  'moon-up': [...COMMON],
  'moon-not-up': [...COMMON],
};

/** Default sigma of a named phase, degrees of phase longitude: a named phase spans 45 deg either side at 2 sigma. */
export const MOON_PHASE_DEFAULT_SIGMA_DEG = 22.5;
const PHASE_SIGMA: NumberRule = { words: 'a sigma of the named phase, degrees of phase longitude', min: SIGMA_FLOOR, max: 90 };
const FRACTION_SIGMA: NumberRule = { words: 'a sigma of the illuminated fraction (no unit)', min: SIGMA_FLOOR, max: 1 };

/** A shadow's light: "sun" (the default) or "moon" (a shadow cast by moonlight, docs/moon-evidence.md). */
function readLight(f: Fields): 'sun' | 'moon' {
  if (!has(f, 'light')) return 'sun';
  return checkChoice(raw(f, 'light'), keyPath(f.path, 'light'), LIGHTS, 'the light that casts the shadow: "sun" or "moon"');
}

/** Azimuth and apparent altitude of a body in the sky, each with its sigma. */
function readSkyDirection(f: Fields, body: string, altitudeWords: string): { azimuthDeg: number; azimuthSigmaDeg: number; altitudeDeg: number; altitudeSigmaDeg: number } {
  return {
    azimuthDeg: num(f, 'azimuthDeg', { ...AZIMUTH, words: `${body} azimuth in degrees clockwise from true north` }),
    azimuthSigmaDeg: num(f, 'azimuthSigmaDeg', ANGLE_SIGMA),
    altitudeDeg: num(f, 'altitudeDeg', { words: altitudeWords, min: -1, max: 90 }),
    altitudeSigmaDeg: num(f, 'altitudeSigmaDeg', ANGLE_SIGMA),
  };
}

function readMoonPhase(f: Fields, base: { id: string; note?: string; group?: string }): MoonPhaseObservation {
  const byFraction = has(f, 'illuminatedFraction');
  const byName = has(f, 'phase');
  if (byFraction === byName) {
    throw new InvalidInputError(
      keyPath(f.path, byFraction ? 'phase' : 'illuminatedFraction'), byFraction ? raw(f, 'phase') : undefined,
      'either "illuminatedFraction" (with "sigma") or a named "phase" (with an optional "sigmaDeg"), not both',
    );
  }
  if (byFraction) {
    if (has(f, 'sigmaDeg')) throw new InvalidInputError(keyPath(f.path, 'sigmaDeg'), raw(f, 'sigmaDeg'), '"sigma" (no unit) with an illuminated fraction; "sigmaDeg" goes with a named phase');
    const illuminatedFraction = num(f, 'illuminatedFraction', { words: 'the lit fraction of the disc, 0 (new) to 1 (full)', min: 0, max: 1 });
    return { ...base, kind: 'moon-phase', illuminatedFraction, sigma: num(f, 'sigma', FRACTION_SIGMA) };
  }
  if (has(f, 'sigma')) throw new InvalidInputError(keyPath(f.path, 'sigma'), raw(f, 'sigma'), '"sigmaDeg" (degrees of phase longitude) with a named phase; "sigma" goes with an illuminated fraction');
  const phase = checkChoice(raw(f, 'phase'), keyPath(f.path, 'phase'), NAMED_MOON_PHASES, 'a named phase of the moon');
  return { ...base, kind: 'moon-phase', phase, sigmaDeg: optNum(f, 'sigmaDeg', PHASE_SIGMA, MOON_PHASE_DEFAULT_SIGMA_DEG) };
}

/**
 * The pixel form of the moon's direction: its centre clicked, and what turns the pixel into a direction: a wall's
 * imagePlane (`wall`), else the scene's camera block, else its groundPlane (src/image/moonPixels.ts).
 */
function readMoonPixels(f: Fields, ctx: ObservationContext): MoonPixels {
  const path = keyPath(f.path, 'pixels');
  const image = needImage(ctx.image, path, raw(f, 'pixels'));
  const p = openFields(raw(f, 'pixels'), path, "the moon's pixel form", ['centrePx', 'sigmaPx', 'wall']);
  if (!has(p, 'centrePx')) throw missing(p, 'centrePx', "the image point [xPx, yPx] of the middle of the moon's disc");
  const centrePx = readPixelPoint(raw(p, 'centrePx'), keyPath(path, 'centrePx'), image);
  const sigmaPx = optNum(p, 'sigmaPx', PIXEL_SIGMA);
  let wallId: string | undefined;
  if (has(p, 'wall')) {
    const wall = wallRef(p, ctx);
    if (wall.imagePlane === undefined) {
      throw new InvalidInputError(
        keyPath(path, 'wall'), wall.id, `a wall with an "imagePlane" (wall "${wall.id}" has none)`,
        ctx.camera !== undefined
          ? 'The moon is turned into a direction through the wall\'s clicked figure; leave "wall" out to use the scene\'s camera block.'
          : 'The moon is turned into a direction through the wall\'s clicked figure (4 or more points of known shape on it), or through a camera block.',
      );
    }
    wallId = wall.id;
  } else if (ctx.camera === undefined && ctx.groundPlane === undefined) {
    throw new InvalidInputError(
      path, raw(f, 'pixels'), 'the moon clicked in a picture with a "camera" block, a "groundPlane", or a wall named with "wall" that has an "imagePlane"',
      'A point in the sky lies on no plane: its pixel becomes a direction only through a camera, which the camera block gives, or which a wall\'s or the ground\'s figure seen at a slant gives (docs/moon-evidence.md).',
    );
  }
  return { centrePx, ...(sigmaPx !== undefined ? { sigmaPx } : {}), ...(wallId !== undefined ? { wallId } : {}) };
}

/** The keys an observation of each kind may hold (for the schema test and the docs). */
export function observationKeys(kind: ObservationKind): readonly string[] {
  return KEYS[kind];
}

function wallRef(f: Fields, ctx: ObservationContext): Wall {
  const known = [...ctx.walls.keys()];
  const knownWords = known.length ? `the id of a wall of this scene: ${known.map((k) => `"${k}"`).join(', ')}` : 'the id of a wall, but the scene lists no walls';
  if (!has(f, 'wall')) throw missing(f, 'wall', knownWords);
  const value = raw(f, 'wall');
  const wall = typeof value === 'string' ? ctx.walls.get(value) : undefined;
  if (wall === undefined) {
    const near = typeof value === 'string' ? closestWord(value, known) : undefined;
    throw new InvalidInputError(keyPath(f.path, 'wall'), value, knownWords, near ? `Did you mean "${near}"?` : undefined);
  }
  return wall;
}

/** Numeric form or pixel form: exactly one. Returns true for the pixel form. */
function pixelForm(f: Fields, numericKeys: readonly string[], numericWords: string): boolean {
  if (!has(f, 'pixels')) return false;
  const mixed = numericKeys.find((k) => has(f, k));
  if (mixed !== undefined) {
    throw new InvalidInputError(
      keyPath(f.path, mixed),
      raw(f, mixed),
      `either the ${numericWords} or "pixels", not both`,
      'The pixel form gives the measurement itself.',
    );
  }
  return true;
}

function openPixels(f: Fields, ctx: ObservationContext, extraKeys: readonly string[]): Fields {
  const path = keyPath(f.path, 'pixels');
  needImage(ctx.image, path, raw(f, 'pixels'));
  return openFields(raw(f, 'pixels'), path, 'a pixel form', [...SEGMENT_KEYS, ...extraKeys]);
}

/**
 * A wall for a pixel measurement: its imagePlane, or (when `cameraWill` and the scene has a camera block) the
 * camera with the wall's azimuth (src/image/planeFromCamera.ts), which gives angles on the wall but no metres.
 */
function needImagePlane(wall: Wall, f: Fields, ctx: ObservationContext, cameraWill: boolean): void {
  if (wall.imagePlane === undefined && !(cameraWill && ctx.camera !== undefined)) {
    throw new InvalidInputError(
      keyPath(f.path, 'pixels'),
      raw(f, 'pixels'),
      cameraWill
        ? `pixel measurements on wall "${wall.id}" only when that wall has an "imagePlane" or the scene has a "camera" block`
        : `this pixel measurement on wall "${wall.id}" only when that wall has an "imagePlane" of known size`,
      cameraWill
        ? 'Give the wall its imagePlane (4 or more points of known shape on it), or the scene a camera block, or give the measurement as numbers.'
        : 'It compares a length on the wall with a depth in metres, and a camera fixes the wall only up to scale: give the wall its imagePlane (a figure of known size), give the measurement as numbers, or (with a camera block) click the front point of the overhang or fin as tipPx in place of projectionM.',
    );
  }
}

function readSitePoint(f: Fields, key: string): SitePoint {
  const path = keyPath(f.path, key);
  if (!has(f, key)) throw missing(f, key, 'a site point [eastM, northM, upM]');
  const list = checkList(raw(f, key), path, 'a site point [eastM, northM, upM]', 3, 3);
  return [0, 1, 2].map((i) => checkNumber(list[i], itemPath(path, i), SITE_COORD)) as unknown as SitePoint;
}

/** A stated length and its sigma in metres, given together (both required). */
function lengthPair(p: Fields, key: string, sigmaKey: string, words: string, zeroAllowed: boolean): { value: number; sigma: number } {
  if (!has(p, key)) throw missing(p, key, words);
  if (!has(p, sigmaKey)) throw missing(p, sigmaKey, `the sigma of ${key} in metres`);
  const value = num(p, key, zeroAllowed ? { words, min: 0, max: 10_000 } : { ...LENGTH_M, words });
  return { value, sigma: num(p, sigmaKey, LENGTH_SIGMA_M) };
}

/** An eave's shadow line in pixels: on the ground plane of known size (src/image/pointPixels.ts). */
function readEavePixels(f: Fields, ctx: ObservationContext): EavePixels {
  const image = needImage(ctx.image, keyPath(f.path, 'pixels'), raw(f, 'pixels'));
  if (ctx.groundPlane === undefined) {
    throw new InvalidInputError(
      keyPath(f.path, 'pixels'), raw(f, 'pixels'), 'pixel measurements of an eave\'s shadow line only when the scene has a "groundPlane" of known size',
      'The distance of the shadow line from the wall is compared with the eave\'s height in metres; a camera alone fixes the ground only up to scale.',
    );
  }
  const p = openPixels(f, ctx, ['alongPx', 'heightM', 'heightSigmaM', 'projectionM', 'projectionSigmaM']);
  const segment = readSegmentPart(p, image);
  if (!has(p, 'alongPx')) throw missing(p, 'alongPx', "a second image point [xPx, yPx] of the wall's foot line (fromPx is the first)");
  const alongPx = readPixelPoint(raw(p, 'alongPx'), keyPath(p.path, 'alongPx'), image);
  const height = lengthPair(p, 'heightM', 'heightSigmaM', "the eave's height above the ground, metres", false);
  const projection = has(p, 'projectionM') || has(p, 'projectionSigmaM')
    ? lengthPair(p, 'projectionM', 'projectionSigmaM', 'how far the eave edge stands out from the wall, metres (0 on the wall plane)', true)
    : { value: 0, sigma: 0 };
  return { ...segment, alongPx, heightM: height.value, heightSigmaM: height.sigma, projectionM: projection.value, projectionSigmaM: projection.sigma };
}

/** A caster's foot and its shadow in pixels, on the ground or a wall (src/image/pointPixels.ts). */
function readPointPairPixels(f: Fields, ctx: ObservationContext): ShadowPointsPixels {
  const image = needImage(ctx.image, keyPath(f.path, 'pixels'), raw(f, 'pixels'));
  const p = openPixels(f, ctx, ['wall', 'heightM', 'heightSigmaM', 'objectPx']);
  let wallId: string | undefined;
  let planeGiven: boolean;
  if (has(p, 'wall')) {
    const wall = wallRef(p, ctx);
    wallId = wall.id;
    planeGiven = wall.imagePlane !== undefined;
  } else {
    planeGiven = ctx.groundPlane !== undefined;
  }
  const where = wallId !== undefined ? `wall "${wallId}"` : 'the ground';
  if (!planeGiven && ctx.camera === undefined) {
    throw new InvalidInputError(
      keyPath(f.path, 'pixels'), raw(f, 'pixels'),
      `a point pair on ${where} only when ${wallId !== undefined ? 'that wall has an "imagePlane"' : 'the scene has a "groundPlane"'} or the scene has a "camera" block`,
    );
  }
  const segment = readSegmentPart(p, image);
  if (planeGiven) {
    if (has(p, 'objectPx')) {
      throw new InvalidInputError(keyPath(p.path, 'objectPx'), raw(p, 'objectPx'), `no objectPx when ${where} is clicked as a figure of known size: give heightM and heightSigmaM`,
        'The caster is placed by its distance from the plane in metres; only a plane from the camera places a clicked caster.');
    }
    const height = lengthPair(p, 'heightM', 'heightSigmaM', "the caster's distance from the plane, metres (its height above the ground, or how far it stands out from the wall)", false);
    return { ...segment, ...(wallId !== undefined ? { wallId } : {}), heightM: height.value, heightSigmaM: height.sigma };
  }
  if (has(p, 'heightM')) {
    throw new InvalidInputError(keyPath(p.path, 'heightM'), raw(p, 'heightM'), `no heightM when ${where} comes from the camera alone: click the caster itself (objectPx)`,
      'The camera fixes the plane only up to scale, so a length in metres cannot be placed on it.');
  }
  if (!has(p, 'objectPx')) throw missing(p, 'objectPx', 'the image point [xPx, yPx] of the caster (the point whose shadow is toPx)');
  const objectPx = readPixelPoint(raw(p, 'objectPx'), keyPath(p.path, 'objectPx'), image);
  return { ...segment, ...(wallId !== undefined ? { wallId } : {}), objectPx };
}

/** The readings a dial of `dialHours` shows, in words for messages. */
function dialReadingWords(dialHours: 6 | 12 | 24): string {
  if (dialHours === 24) return 'a reading "H:MM" from "0:00" to "23:59" (24-hour dial), in quotes';
  return `a reading "H:MM" from "${dialHours}:00" (or "0:00") to "${dialHours - 1}:59" (${dialHours}-hour dial), in quotes`;
}

/**
 * The "reading" "7:40" or "19:05:30" to minutes, for a count of up to `maxHours` hours. `top` says
 * what the hour `maxHours` means: 'hour-is-zero' (a 12-hour dial's 12:30 is 0:30), 'instant-is-zero'
 * (24:00 on an Italian sundial is its 0:00; 24:30 does not exist), 'end' (12:00 in unequal hours
 * is sunset, the end of the count) or 'last-hour' (a 24-hour dial's 23:59, `maxHours` 23).
 */
function readHoursMinutes(f: Fields, maxHours: number, words: string, top: 'hour-is-zero' | 'instant-is-zero' | 'end' | 'last-hour'): number {
  if (!has(f, 'reading')) throw missing(f, 'reading', words);
  const value = raw(f, 'reading');
  const path = keyPath(f.path, 'reading');
  const m = typeof value === 'string' ? /^\s*(\d{1,2}):(\d{2})(?::(\d{2}(?:\.\d+)?))?\s*$/.exec(value) : null;
  if (!m) {
    throw new InvalidInputError(path, value, words, typeof value === 'number' ? 'Write the time as "7:40", with quotes.' : undefined);
  }
  const hours = Number(m[1]);
  const minutes = Number(m[2]);
  const seconds = m[3] === undefined ? 0 : Number(m[3]);
  const total = hours * 60 + minutes + seconds / 60;
  const beyond = top === 'hour-is-zero' || top === 'last-hour' ? hours > maxHours : total > maxHours * 60;
  if (beyond || minutes > 59 || seconds >= 60) throw new InvalidInputError(path, value, words);
  if (top === 'hour-is-zero' && hours === maxHours) return total - maxHours * 60;
  return top === 'instant-is-zero' && total === maxHours * 60 ? 0 : total;
}

/** Hours on a clock dial: 24, 12, or 6 (Italian "sei ore" dials). */
const DIAL_SIZES = [6, 12, 24] as const;

function readClock(f: Fields, id: string, note: string | undefined): ClockObservation {
  const dial = has(f, 'dialHours') ? raw(f, 'dialHours') : 12;
  const dialHours = DIAL_SIZES.find((d) => d === dial);
  if (dialHours === undefined) {
    throw new InvalidInputError(keyPath(f.path, 'dialHours'), dial, '6, 12 or 24 (hours on the dial; 6 for an Italian six-hour dial)');
  }
  // The hour equal to the dial's size (12:00 on a 12-hour dial) is its 0; on a 24-hour dial 24:00 is not written.
  const readingMinutes = readHoursMinutes(f, dialHours === 24 ? 23 : dialHours, dialReadingWords(dialHours), dialHours === 24 ? 'last-hour' : 'hour-is-zero');
  const precisionMinutes = num(f, 'precisionMinutes', { words: 'a sigma of the reading in minutes', min: SIGMA_FLOOR, max: 180 });
  const hourHandTrusted = optBool(f, 'hourHandTrusted', true);
  let kept: ClockObservation['kept'] = { kind: 'unknown' };
  if (has(f, 'kept')) {
    const text = raw(f, 'kept');
    const path = keyPath(f.path, 'kept');
    if (typeof text !== 'string') {
      throw new InvalidInputError(path, text, 'what the clock kept: "unknown", "apparent", "mean", "meridian:<longitude deg>", "zone:<IANA zone>", "ut", "italian", "italian+<minutes>", "italian:dusk", "babylonian" or "unequal"');
    }
    kept = text.trim() === 'unknown' ? { kind: 'unknown' } : parseClockKind(text, path);
  }
  return { id, kind: 'clock', readingMinutes, precisionMinutes, hourHandTrusted, dialHours, kept, ...(note ? { note } : {}) };
}

/** The hour lines a sundial may carry, by the word a scene file uses. */
const SUNDIAL_HOURS: Readonly<Record<string, SundialHours>> = {
  apparent: { kind: 'apparent' },
  equal: { kind: 'apparent' },
  italian: { kind: 'italian', origin: 'sunset', offsetMinutes: 0 },
  babylonian: { kind: 'babylonian' },
  unequal: { kind: 'unequal' },
  temporal: { kind: 'unequal' },
};
const SUNDIAL_HOURS_WORDS = 'the hour lines of the dial: "apparent" (or "equal": equal hours from midnight, local apparent time), "italian" (hours since sunset), "babylonian" (hours since sunrise) or "unequal" (or "temporal": twelfths of the daylight, 0 at sunrise, 12 at sunset)';

function readSundial(f: Fields, id: string, note: string | undefined): SundialObservation {
  const path = keyPath(f.path, 'hours');
  if (!has(f, 'hours')) throw missing(f, 'hours', SUNDIAL_HOURS_WORDS);
  const word = raw(f, 'hours');
  const hours = typeof word === 'string' ? SUNDIAL_HOURS[word.trim().toLowerCase()] : undefined;
  if (hours === undefined) {
    const near = typeof word === 'string' ? closestWord(word, Object.keys(SUNDIAL_HOURS)) : null;
    throw new InvalidInputError(path, word, SUNDIAL_HOURS_WORDS, near ? `Did you mean "${near}"?` : undefined);
  }
  // Unequal hours on a dial run from 0 (sunrise) to 12 (sunset); the other counts run through 24 hours (24:00 = 0:00).
  const maxHours = hours.kind === 'unequal' ? 12 : 24;
  const words = hours.kind === 'unequal'
    ? 'a reading "H:MM" from "0:00" (sunrise) to "12:00" (sunset) in unequal hours, in quotes'
    : `a reading "H:MM" from "0:00" to "24:00" in ${hours.kind === 'apparent' ? 'equal hours of local apparent time' : `${hours.kind} hours`}, in quotes`;
  const readingMinutes = readHoursMinutes(f, maxHours, words, hours.kind === 'unequal' ? 'end' : 'instant-is-zero');
  const precisionMinutes = num(f, 'precisionMinutes', { words: 'a sigma of the reading in minutes', min: SIGMA_FLOOR, max: 180 });
  return { id, kind: 'sundial', readingMinutes, precisionMinutes, hours, ...(note ? { note } : {}) };
}

/** Read observation `index` at `path`. */
export function readObservation(value: unknown, path: string, ctx: ObservationContext): Observation {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    openFields(value, path, 'an observation', ['id', 'kind', 'and the keys of its kind']);
  }
  const kindValue = (value as Record<string, unknown>).kind;
  if (!Object.prototype.hasOwnProperty.call(value, 'kind')) {
    throw new InvalidInputError(keyPath(path, 'kind'), undefined, `the kind of observation: one of ${OBSERVATION_KINDS.join(', ')}`, 'Every observation needs "kind".');
  }
  const kind = checkChoice(kindValue, keyPath(path, 'kind'), OBSERVATION_KINDS, 'the kind of observation');
  const f = openFields(value, path, `${/^[aeiou]/.test(kind) ? 'an' : 'a'} ${kind} observation`, KEYS[kind]);
  const id = str(f, 'id', ID_WORDS, 64, ID_PATTERN);
  const note = optStr(f, 'note', 'a note', NOTE_MAX);
  const group = optStr(f, 'group', GROUP_WORDS, 64, ID_PATTERN);
  // Only the shadow kinds take "light" (openFields refuses it elsewhere); the sun, the default, is not written out.
  const light = readLight(f);
  const base = { id, ...(note !== undefined ? { note } : {}), ...(group !== undefined ? { group } : {}), ...(light === 'moon' ? { light } : {}) };

  switch (kind) {
    case 'rod-shadow': {
      const wall = wallRef(f, ctx);
      if (pixelForm(f, ['slopeDeg', 'side', 'sigmaDeg'], 'numbers (slopeDeg, side, sigmaDeg)')) {
        needImagePlane(wall, f, ctx, true);
        const image = needImage(ctx.image, keyPath(path, 'pixels'), raw(f, 'pixels'));
        const p = openPixels(f, ctx, []);
        return { ...base, kind, wallId: wall.id, pixels: readSegmentPart(p, image) };
      }
      const slopeDeg = num(f, 'slopeDeg', { words: 'the slope of the shadow below the horizontal, degrees', min: 0, max: 90, minExclusive: true, maxExclusive: true });
      if (!has(f, 'side')) throw missing(f, 'side', 'the side the shadow runs down to, seen facing the wall: "left" or "right"');
      const side = checkChoice(raw(f, 'side'), keyPath(path, 'side'), SIDES, 'the side the shadow runs down to, seen facing the wall');
      const sigmaDeg = num(f, 'sigmaDeg', ANGLE_SIGMA);
      return { ...base, kind, wallId: wall.id, slopeDeg, side, sigmaDeg };
    }
    case 'overhang-shadow':
    case 'fin-shadow': {
      const wall = wallRef(f, ctx);
      const ratioKey = kind === 'overhang-shadow' ? 'depthRatio' : 'widthRatio';
      const numeric = kind === 'overhang-shadow' ? ['depthRatio', 'sigma'] : ['widthRatio', 'side', 'sigma'];
      if (pixelForm(f, numeric, `numbers (${numeric.join(', ')})`)) {
        const image = needImage(ctx.image, keyPath(path, 'pixels'), raw(f, 'pixels'));
        const p = openPixels(f, ctx, ['projectionM', 'projectionSigmaM', 'tipPx']);
        const segment = readSegmentPart(p, image);
        if (has(p, 'tipPx')) {
          if (has(p, 'projectionM') || has(p, 'projectionSigmaM')) {
            throw new InvalidInputError(keyPath(p.path, 'tipPx'), raw(p, 'tipPx'), 'either tipPx (through the camera) or projectionM with projectionSigmaM, not both');
          }
          if (wall.imagePlane !== undefined || ctx.camera === undefined) {
            throw new InvalidInputError(
              keyPath(p.path, 'tipPx'), raw(p, 'tipPx'), `tipPx only on a wall put into the picture by the camera (a "camera" block, and no imagePlane on wall "${wall.id}")`,
              'With a figure of known size on the wall, give projectionM and projectionSigmaM in metres instead',
            );
          }
          const tipPx = readPixelPoint(raw(p, 'tipPx'), keyPath(p.path, 'tipPx'), image);
          return { ...base, kind, wallId: wall.id, pixels: { ...segment, tipPx } } as Observation;
        }
        needImagePlane(wall, f, ctx, false);
        const projectionM = num(p, 'projectionM', { ...LENGTH_M, words: 'how far the edge stands out from the wall, metres' });
        const projectionSigmaM = num(p, 'projectionSigmaM', LENGTH_SIGMA_M);
        return { ...base, kind, wallId: wall.id, pixels: { ...segment, projectionM, projectionSigmaM } } as Observation;
      }
      const ratio = num(f, ratioKey, { ...RATIO, words: kind === 'overhang-shadow' ? 'shadow depth / projection depth (no unit)' : 'shadow width / fin depth (no unit)' });
      const sigma = num(f, 'sigma', RATIO_SIGMA);
      if (kind === 'overhang-shadow') return { ...base, kind, wallId: wall.id, depthRatio: ratio, sigma };
      if (!has(f, 'side')) throw missing(f, 'side', 'the side the shadow falls to, seen facing the wall: "left" or "right"');
      const side = checkChoice(raw(f, 'side'), keyPath(path, 'side'), SIDES, 'the side the shadow falls to, seen facing the wall');
      return { ...base, kind, wallId: wall.id, widthRatio: ratio, side, sigma };
    }
    case 'pole-shadow': {
      if (pixelForm(f, ['shadowAzimuthDeg', 'shadowAzimuthSigmaDeg', 'lengthRatio', 'lengthRatioSigma'], 'numbers (shadowAzimuthDeg, lengthRatio and their sigmas)')) {
        const image = needImage(ctx.image, keyPath(path, 'pixels'), raw(f, 'pixels'));
        if (ctx.groundPlane === undefined && ctx.camera === undefined) {
          throw new InvalidInputError(keyPath(path, 'pixels'), raw(f, 'pixels'), 'pixel measurements of a pole only when the scene has a "groundPlane" or a "camera" block');
        }
        const p = openPixels(f, ctx, ['heightM', 'heightSigmaM']);
        if (ctx.groundPlane === undefined && has(p, 'heightM')) {
          throw new InvalidInputError(
            keyPath(p.path, 'heightM'), raw(p, 'heightM'), 'no heightM when the ground comes from the camera alone (no "groundPlane")',
            'The camera fixes the ground only up to scale, so a shadow length cannot be compared with a height in metres; the shadow azimuth is measured.',
          );
        }
        const segment = readSegmentPart(p, image);
        if (has(p, 'heightM') !== has(p, 'heightSigmaM')) {
          const k = has(p, 'heightM') ? 'heightSigmaM' : 'heightM';
          throw missing(p, k, 'the pole height and its sigma in metres, given together');
        }
        const heightM = optNum(p, 'heightM', { ...LENGTH_M, words: 'the height of the pole in metres' });
        const heightSigmaM = optNum(p, 'heightSigmaM', LENGTH_SIGMA_M);
        return { ...base, kind, pixels: heightM === undefined ? segment : { ...segment, heightM, heightSigmaM } };
      }
      const pairs: [string, string][] = [['shadowAzimuthDeg', 'shadowAzimuthSigmaDeg'], ['lengthRatio', 'lengthRatioSigma']];
      for (const [a, b] of pairs) {
        if (has(f, a) !== has(f, b)) throw missing(f, has(f, a) ? b : a, `"${a}" and "${b}" given together`);
      }
      if (!has(f, 'shadowAzimuthDeg') && !has(f, 'lengthRatio')) {
        throw missing(f, 'shadowAzimuthDeg', 'shadowAzimuthDeg (with its sigma), lengthRatio (with its sigma), both, or "pixels"');
      }
      const out: { -readonly [K in keyof Extract<Observation, { kind: 'pole-shadow' }>]: Extract<Observation, { kind: 'pole-shadow' }>[K] } = { ...base, kind };
      if (has(f, 'shadowAzimuthDeg')) {
        out.shadowAzimuthDeg = num(f, 'shadowAzimuthDeg', { ...AZIMUTH, words: 'the azimuth from the foot to the shadow tip, degrees clockwise from true north' });
        out.shadowAzimuthSigmaDeg = num(f, 'shadowAzimuthSigmaDeg', ANGLE_SIGMA);
      }
      if (has(f, 'lengthRatio')) {
        // 0 is allowed: with the sun at the zenith a pole casts no shadow (a site between the tropics).
        out.lengthRatio = num(f, 'lengthRatio', { ...RATIO, words: 'shadow length / pole height (no unit)' });
        out.lengthRatioSigma = num(f, 'lengthRatioSigma', RATIO_SIGMA);
        if (out.lengthRatio === 0 && out.shadowAzimuthDeg !== undefined) {
          throw new InvalidInputError(
            keyPath(f.path, 'shadowAzimuthDeg'),
            raw(f, 'shadowAzimuthDeg'),
            'no shadow direction when lengthRatio is 0',
            'A shadow of length 0 (the sun at the zenith) has no direction; leave shadowAzimuthDeg and its sigma out.',
          );
        }
      }
      return out;
    }
    case 'eave-shadow': {
      const wall = wallRef(f, ctx);
      if (pixelForm(f, ['distanceRatio', 'sigma', 'projectionRatio'], 'numbers (distanceRatio, sigma, projectionRatio)')) {
        return { ...base, kind, wallId: wall.id, pixels: readEavePixels(f, ctx) };
      }
      const distanceRatio = num(f, 'distanceRatio', { ...RATIO, words: 'distance of the shadow line from the wall / height of the eave (no unit)' });
      const sigma = num(f, 'sigma', RATIO_SIGMA);
      const projectionRatio = optNum(f, 'projectionRatio', { ...RATIO, words: 'how far the eave stands out / its height (no unit)' }, 0);
      return { ...base, kind, wallId: wall.id, distanceRatio, sigma, projectionRatio };
    }
    case 'shadow-points': {
      if (pixelForm(f, ['caster', 'shadow', 'sigmaM'], 'surveyed points (caster, shadow, sigmaM)')) {
        return { ...base, kind, pixels: readPointPairPixels(f, ctx) };
      }
      const caster = readSitePoint(f, 'caster');
      const shadow = readSitePoint(f, 'shadow');
      if (!(caster[2] > shadow[2])) {
        throw new InvalidInputError(keyPath(path, 'shadow'), shadow, `a shadow point lower than the caster (upM below ${caster[2]})`, `With the ${light} above the horizon a shadow falls below the point that casts it.`);
      }
      const sigmaM = num(f, 'sigmaM', { ...LENGTH_M, words: 'a sigma in metres', min: SIGMA_FLOOR, minExclusive: false });
      return { ...base, kind, caster, shadow, sigmaM };
    }
    case 'sun-direction':
      return { ...base, kind, ...readSkyDirection(f, "the sun's", "the sun's apparent altitude in degrees") };
    case 'wall-lit':
    case 'wall-shaded':
      return { ...base, kind, wallId: wallRef(f, ctx).id };
    case 'sun-up':
    case 'sun-not-up':
      return { ...base, kind };
    case 'clock':
      return readClock(f, id, note);
    case 'sundial':
      return { ...readSundial(f, id, note), ...base };
    case 'object-shadow':
    case 'shadow-wedge': {
      const image = needImage(ctx.image, keyPath(path, kind === 'object-shadow' ? 'objectPx' : 'shadowPx'), raw(f, kind === 'object-shadow' ? 'objectPx' : 'shadowPx'));
      if (ctx.camera === undefined) {
        throw new InvalidInputError(
          keyPath(path, 'kind'), kind, `${kind === 'object-shadow' ? 'an object-shadow pair' : 'a shadow wedge'} only when the scene has a "camera" block`,
          'The camera (lines along vertical edges and along walls of known azimuth) turns the pair into a sun direction; see docs/measuring.md.',
        );
      }
      if (kind === 'shadow-wedge') return readWedge(f, base, image);
      if (!has(f, 'objectPx')) throw missing(f, 'objectPx', 'the image point [xPx, yPx] of the point that casts the shadow');
      if (!has(f, 'shadowPx')) throw missing(f, 'shadowPx', 'the image point [xPx, yPx] of its shadow');
      const objectPx = readPixelPoint(raw(f, 'objectPx'), keyPath(path, 'objectPx'), image);
      const shadowPx = readPixelPoint(raw(f, 'shadowPx'), keyPath(path, 'shadowPx'), image);
      const sigmaPx = optNum(f, 'sigmaPx', PIXEL_SIGMA);
      return { ...base, kind, objectPx, shadowPx, ...(sigmaPx !== undefined ? { sigmaPx } : {}) };
    }
    case 'moon-direction':
      if (pixelForm(f, ['azimuthDeg', 'azimuthSigmaDeg', 'altitudeDeg', 'altitudeSigmaDeg'], "moon's direction as numbers (azimuthDeg, altitudeDeg and their sigmas)")) {
        return { ...base, kind, pixels: readMoonPixels(f, ctx) };
      }
      return { ...base, kind, ...readSkyDirection(f, "the moon's", "the moon's apparent altitude (of its centre) in degrees") };
    case 'moon-phase':
      return readMoonPhase(f, base);
    case 'moon-lit-side':
      return {
        ...base,
        kind,
        litSideDeg: num(f, 'litSideDeg', { words: 'where the lit edge faces, degrees from straight up in the picture, positive towards the left', min: -180, max: 180, minExclusive: true }),
        sigmaDeg: num(f, 'sigmaDeg', { words: 'a sigma in degrees', min: SIGMA_FLOOR, max: 90 }),
      };
    case 'moon-up':
    case 'moon-not-up':
      return { ...base, kind };
  }
}

/** A shadow-wedge observation: the shadow point and two points bounding the directions of its object point. */
function readWedge(f: Fields, base: { readonly id: string; readonly note?: string; readonly group?: string; readonly light?: 'moon' }, image: ImageInfo): Observation {
  const path = f.path;
  if (!has(f, 'shadowPx')) throw missing(f, 'shadowPx', 'the image point [xPx, yPx] of the shadow');
  if (!has(f, 'edgesPx')) throw missing(f, 'edgesPx', 'two image points [[xPx, yPx], [xPx, yPx]], one on each side of the wedge in which the object point lies');
  const shadowPx = readPixelPoint(raw(f, 'shadowPx'), keyPath(path, 'shadowPx'), image);
  const list = raw(f, 'edgesPx');
  if (!Array.isArray(list) || list.length !== 2) {
    throw new InvalidInputError(keyPath(path, 'edgesPx'), list, 'two image points [[xPx, yPx], [xPx, yPx]], one on each side of the wedge in which the object point lies');
  }
  const edgesPx = [readPixelPoint(list[0], itemPath(keyPath(path, 'edgesPx'), 0), image), readPixelPoint(list[1], itemPath(keyPath(path, 'edgesPx'), 1), image)] as const;
  const sigmaPx = optNum(f, 'sigmaPx', PIXEL_SIGMA);
  return { ...base, kind: 'shadow-wedge', shadowPx, edgesPx, ...(sigmaPx !== undefined ? { sigmaPx } : {}) };
}
