/**
 * The scene file reader: YAML or JSON text in, a validated Scene out.
 *
 * Every refusal is an InvalidInputError naming the path in the file
 * (`observations[2].sigmaDeg`) or the file itself, quoting the value and saying
 * what is allowed. Unknown keys are refused with a "did you mean" suggestion,
 * never ignored. The format is described field by field in docs/scene-file.md;
 * its JSON Schema is docs/scene.schema.json.
 *
 * Text in, no file access: reading the file from disk is the front end's (readSceneFile in
 * src/cli/sceneFile.ts), so that this reader runs unchanged in the desk's page.
 */
import { STANDARD_AIR } from '../ephemeris/refraction.js';
import { DELTA_T_MODELS } from '../time/deltaT.js';
import { InvalidInputError, quoteValue, refusalHead } from '../errors.js';
import { readCalendar, readCivilDate, readYearStart } from './calendarFields.js';
import {
  checkChoice, checkList, choice, checkNumber, checkPair, exactlyOne, has, itemPath, keyPath, missing, num, openFields,
  optNum, optStr, raw, str, type NumberRule,
  SIGMA_FLOOR, type Fields,
} from './fields.js';
import { coordinateWords, parseCoordinate, type CoordinateAxis } from './coordinateText.js';
import { MAX_SCENE_BYTES, parseSceneTextWithLines } from './parseSceneText.js';
import { checkGroundWalls, needImage, readImage, readPlane } from './readImage.js';
import { readCamera } from './readCamera.js';
import { ID_PATTERN, ID_WORDS, NOTE_MAX, readObservation } from './readObservation.js';
import { wallAzimuthFromMap } from './wallFromMap.js';
import type { Air, CalendarRule, CivilDay, DateWindow, ImageInfo, Observation, PlaneInImage, Scene, Site, Wall, YearStartStyle } from './types.js';

export { MAX_SCENE_BYTES, MAX_NESTING_DEPTH, MAX_ALIAS_COUNT } from './parseSceneText.js';

/** The only format version this reader knows. */
export const FORMAT_VERSION = 1;
/** Years the window may span, astronomical numbering (where the Delta T models state an uncertainty). */
export const MIN_YEAR = -1999;
export const MAX_YEAR = 3000;
export const MAX_WALLS = 200;
export const MAX_OBSERVATIONS = 1000;

const TOP_KEYS = [
  '$schema', 'heliochron', 'title', 'site', 'calendar', 'yearStart', 'window', 'air', 'deltaT',
  'mapNorthCorrectionDeg', 'image', 'camera', 'groundPlane', 'walls', 'observations', 'seed',
];
const SITE_KEYS = ['latitudeDeg', 'longitudeDeg', 'elevationM', 'latitudeSigmaDeg', 'longitudeSigmaDeg'];
const WINDOW_KEYS = ['fromYear', 'toYear', 'notBefore', 'notAfter', 'months', 'weekday'];
const AIR_KEYS = ['pressureHPa', 'temperatureC'];
const WALL_KEYS = ['id', 'azimuthDeg', 'mapAzimuthDeg', 'mapPoints', 'azimuthSigmaDeg', 'imagePlane', 'note'];
const MAP_POINT_KEYS = ['fromM', 'toM', 'outward'];

export const WEEKDAYS = ['sunday', 'monday', 'tuesday', 'wednesday', 'thursday', 'friday', 'saturday'] as const;
export const MONTHS = [
  'january', 'february', 'march', 'april', 'may', 'june',
  'july', 'august', 'september', 'october', 'november', 'december',
] as const;

/** Standard air when the file's air block leaves a value out (the ephemeris default: 1010 hPa, 10 C). */
export { STANDARD_AIR } from '../ephemeris/refraction.js';

const AZIMUTH: NumberRule = { words: 'an azimuth in degrees clockwise from true north', min: 0, max: 360, maxExclusive: true };
const WALL_SIGMA: NumberRule = { words: 'a sigma in degrees (0 = known exactly)', min: 0, max: 45, zeroOrAtLeast: SIGMA_FLOOR };
const MAP_COORD: NumberRule = { words: 'a map coordinate in metres', min: -1e7, max: 1e7 };

/** A required latitude or longitude: decimal degrees, or degrees-minutes-seconds with a hemisphere letter. */
function coordinate(f: Fields, key: string, axis: CoordinateAxis): number {
  if (!has(f, key)) throw missing(f, key, coordinateWords(axis));
  return parseCoordinate(raw(f, key), axis, keyPath(f.path, key));
}

function readSite(value: unknown): Site {
  const f = openFields(value, 'site', 'the site', SITE_KEYS);
  return {
    latitudeDeg: coordinate(f, 'latitudeDeg', 'latitude'),
    longitudeDeg: coordinate(f, 'longitudeDeg', 'longitude'),
    elevationM: optNum(f, 'elevationM', { words: 'a height above sea level in metres', min: -500, max: 9000 }, 0),
    latitudeSigmaDeg: optNum(f, 'latitudeSigmaDeg', { words: 'a sigma in degrees (0 = known exactly)', min: 0, max: 5, zeroOrAtLeast: SIGMA_FLOOR }, 0),
    longitudeSigmaDeg: optNum(f, 'longitudeSigmaDeg', { words: 'a sigma in degrees (0 = known exactly)', min: 0, max: 5, zeroOrAtLeast: SIGMA_FLOOR }, 0),
  };
}

function readAir(value: unknown): Air {
  const f = openFields(value, 'air', 'the air', AIR_KEYS);
  return {
    pressureHPa: optNum(f, 'pressureHPa', { words: 'an air pressure in hectopascals', min: 500, max: 1100 }, STANDARD_AIR.pressureHPa),
    temperatureC: optNum(f, 'temperatureC', { words: 'an air temperature in degrees Celsius', min: -60, max: 60 }, STANDARD_AIR.temperatureC),
  };
}

function readMonth(value: unknown, path: string): number {
  if (typeof value === 'string') return MONTHS.indexOf(checkChoice(value, path, MONTHS, 'a month name in lower case')) + 1;
  return checkNumber(value, path, { words: 'a month number 1-12 or an English month name', min: 1, max: 12, integer: true });
}

/** The window, with the year-start style chosen once its years are known (the region's style may depend on them). */
function readWindow(
  value: unknown,
  calendar: CalendarRule,
  chooseYearStart: (years: { fromYear: number; toYear: number }) => YearStartStyle,
): { window: DateWindow; yearStart: YearStartStyle } {
  const f = openFields(value, 'window', 'the date window', WINDOW_KEYS);
  const yearRule: NumberRule = { words: 'a year (January-start, astronomical numbering)', min: MIN_YEAR, max: MAX_YEAR, integer: true };
  const fromYear = num(f, 'fromYear', yearRule);
  const toYear = num(f, 'toYear', yearRule);
  if (toYear < fromYear) {
    throw new InvalidInputError('window.toYear', toYear, `a year not before fromYear (${fromYear})`);
  }
  const yearStart = chooseYearStart({ fromYear, toYear });
  const scene = { calendar, yearStart };
  const out: { -readonly [K in keyof DateWindow]: DateWindow[K] } = { fromYear, toYear };
  let before: { day: CivilDay; jd0: number } | undefined;
  if (has(f, 'notBefore')) {
    before = readCivilDate(raw(f, 'notBefore'), 'window.notBefore', scene.calendar, scene.yearStart);
    if (before.day.year > toYear) {
      throw new InvalidInputError('window.notBefore', raw(f, 'notBefore'), `a day in or before the year toYear (${toYear})`, 'The window would be empty.');
    }
    out.notBefore = before.day;
  }
  if (has(f, 'notAfter')) {
    const after = readCivilDate(raw(f, 'notAfter'), 'window.notAfter', scene.calendar, scene.yearStart);
    if (after.day.year < fromYear) {
      throw new InvalidInputError('window.notAfter', raw(f, 'notAfter'), `a day in or after the year fromYear (${fromYear})`, 'The window would be empty.');
    }
    if (before && after.jd0 < before.jd0) {
      throw new InvalidInputError('window.notAfter', raw(f, 'notAfter'), `a day not before notBefore (${String(raw(f, 'notBefore'))})`);
    }
    out.notAfter = after.day;
  }
  if (has(f, 'months')) {
    const list = checkList(raw(f, 'months'), 'window.months', 'the allowed months (numbers 1-12 or names; a list, not a range)', 1, 12);
    const months = list.map((m, i) => readMonth(m, itemPath('window.months', i)));
    const repeated = months.findIndex((m, i) => months.indexOf(m) !== i);
    if (repeated >= 0) throw new InvalidInputError(itemPath('window.months', repeated), list[repeated], 'each month at most once');
    out.months = months;
  }
  if (has(f, 'weekday')) {
    const w = raw(f, 'weekday');
    out.weekday = typeof w === 'string'
      ? WEEKDAYS.indexOf(checkChoice(w, 'window.weekday', WEEKDAYS, 'a weekday name in lower case, or a number 0 (Sunday) to 6 (Saturday)'))
      : checkNumber(w, 'window.weekday', { words: 'a weekday name or number 0 (Sunday) to 6 (Saturday)', min: 0, max: 6, integer: true });
  }
  return { window: out, yearStart };
}

function readWall(value: unknown, path: string, mapNorthCorrectionDeg: number, image: ImageInfo | undefined): Wall {
  const f = openFields(value, path, 'a wall', WALL_KEYS);
  const id = str(f, 'id', ID_WORDS, 64, ID_PATTERN);
  const form = exactlyOne(f, ['azimuthDeg', 'mapAzimuthDeg', 'mapPoints'], 'how the wall faces');
  let azimuthDeg: number;
  let azimuthSource: string;
  if (form === 'azimuthDeg') {
    azimuthDeg = num(f, 'azimuthDeg', { ...AZIMUTH, words: "the azimuth of the wall's outward normal, degrees clockwise from true north" });
    azimuthSource = 'stated, true north';
  } else if (form === 'mapAzimuthDeg') {
    const mapDeg = num(f, 'mapAzimuthDeg', { ...AZIMUTH, words: "the azimuth of the wall's outward normal against map north, degrees" });
    azimuthDeg = ((mapDeg + mapNorthCorrectionDeg) % 360 + 360) % 360;
    azimuthSource = `stated against map north (${mapDeg} deg), map north correction ${mapNorthCorrectionDeg} deg`;
  } else {
    const mp = keyPath(path, 'mapPoints');
    const m = openFields(raw(f, 'mapPoints'), mp, 'the map points of a wall', MAP_POINT_KEYS);
    for (const k of MAP_POINT_KEYS) if (!has(m, k)) throw missing(m, k, k === 'outward' ? 'the side the wall faces, seen walking from fromM to toM: "left" or "right"' : 'a map point [eastM, northM]');
    const fromM = checkPair(raw(m, 'fromM'), keyPath(mp, 'fromM'), 'a map point [eastM, northM]', [MAP_COORD, MAP_COORD]);
    const toM = checkPair(raw(m, 'toM'), keyPath(mp, 'toM'), 'a map point [eastM, northM]', [MAP_COORD, MAP_COORD]);
    const outward = checkChoice(raw(m, 'outward'), keyPath(mp, 'outward'), ['left', 'right'] as const, 'the side the wall faces, seen walking from fromM to toM');
    ({ azimuthDeg, source: azimuthSource } = wallAzimuthFromMap({ fromM, toM, outward }, mapNorthCorrectionDeg, mp));
  }
  const azimuthSigmaDeg = num(f, 'azimuthSigmaDeg', WALL_SIGMA);
  const note = optStr(f, 'note', 'a note', NOTE_MAX);
  let imagePlane: PlaneInImage | undefined;
  if (has(f, 'imagePlane')) {
    const pp = keyPath(path, 'imagePlane');
    imagePlane = readPlane(raw(f, 'imagePlane'), pp, needImage(image, pp, raw(f, 'imagePlane')), false);
  }
  return {
    id, azimuthDeg, azimuthSigmaDeg, azimuthSource,
    ...(imagePlane ? { imagePlane } : {}),
    ...(note !== undefined ? { note } : {}),
  };
}

/** Refuse a repeated id, naming where it was first used. */
function refuseDuplicateIds(items: readonly { id: string }[], listPath: string): void {
  const seen = new Map<string, number>();
  items.forEach((item, i) => {
    const first = seen.get(item.id);
    if (first !== undefined) {
      throw new InvalidInputError(`${itemPath(listPath, i)}.id`, item.id, `an id not used before in ${listPath}`, `${itemPath(listPath, first)} has it already.`);
    }
    seen.set(item.id, i);
  });
}

/** Build a Scene from parsed data (plain maps and lists), checking everything. */
export function sceneFromData(data: unknown): Scene {
  const f = openFields(data, '', 'a scene', TOP_KEYS);
  optStr(f, '$schema', 'the address of the JSON Schema (ignored by the reader)', 2000);
  if (!has(f, 'heliochron')) throw missing(f, 'heliochron', `the format version ${FORMAT_VERSION}: start the file with "heliochron: ${FORMAT_VERSION}"`);
  if (raw(f, 'heliochron') !== FORMAT_VERSION) {
    throw new InvalidInputError('heliochron', raw(f, 'heliochron'), `the format version ${FORMAT_VERSION} (the only one this heliochron reads)`);
  }
  const title = str(f, 'title', 'a title for the scene', 500);
  if (!has(f, 'site')) throw missing(f, 'site', 'the site: { latitudeDeg, longitudeDeg, elevationM }');
  const site = readSite(raw(f, 'site'));
  if (!has(f, 'calendar')) throw missing(f, 'calendar', 'the calendar in force at the site: "julian", "gregorian", a region id, or { lastJulian, firstGregorian }');
  const calendar = readCalendar(raw(f, 'calendar'), 'calendar');
  if (!has(f, 'window')) throw missing(f, 'window', 'the date window: { fromYear, toYear }');
  const { window, yearStart } = readWindow(raw(f, 'window'), calendar, (years) =>
    readYearStart(raw(f, 'yearStart'), has(f, 'yearStart'), 'yearStart', calendar, years),
  );
  const air = has(f, 'air') ? readAir(raw(f, 'air')) : undefined;
  const deltaT = has(f, 'deltaT') ? choice(f, 'deltaT', DELTA_T_MODELS, 'a Delta T model') : undefined;
  const mapNorthCorrectionDeg = optNum(f, 'mapNorthCorrectionDeg', { words: 'a correction in degrees from map north to true north, east positive', min: -180, max: 180 }, 0);
  const image = has(f, 'image') ? readImage(raw(f, 'image'), 'image') : undefined;
  const groundPlane = has(f, 'groundPlane')
    ? readPlane(raw(f, 'groundPlane'), 'groundPlane', needImage(image, 'groundPlane', raw(f, 'groundPlane')), true)
    : undefined;

  const wallList = has(f, 'walls') ? checkList(raw(f, 'walls'), 'walls', 'the walls', 0, MAX_WALLS) : [];
  const walls = wallList.map((w, i) => readWall(w, itemPath('walls', i), mapNorthCorrectionDeg, image));
  refuseDuplicateIds(walls, 'walls');
  checkGroundWalls(groundPlane, walls);
  const camera = has(f, 'camera') ? readCamera(raw(f, 'camera'), 'camera', image, walls) : undefined;

  if (!has(f, 'observations')) throw missing(f, 'observations', 'a list of 1 or more observations');
  const obsList = checkList(raw(f, 'observations'), 'observations', 'the observations', 1, MAX_OBSERVATIONS);
  const ctx = { walls: new Map(walls.map((w) => [w.id, w])), image, groundPlane, camera };
  const observations: Observation[] = obsList.map((o, i) => readObservation(o, itemPath('observations', i), ctx));
  refuseDuplicateIds(observations, 'observations');

  const seed = optNum(f, 'seed', { words: 'a seed for the Monte Carlo runs', min: 0, max: 4294967295, integer: true }, 1);

  return {
    formatVersion: FORMAT_VERSION,
    title,
    site,
    calendar,
    yearStart,
    window,
    ...(air ? { air } : {}),
    ...(deltaT ? { deltaT } : {}),
    mapNorthCorrectionDeg,
    ...(image ? { image } : {}),
    ...(camera ? { camera } : {}),
    ...(groundPlane ? { groundPlane } : {}),
    walls,
    observations,
    seed,
  };
}

/**
 * Read a scene from the text of a YAML or JSON file.
 * @param fileName for messages about the file as a whole (size, syntax, binary content)
 * @example readSceneText('heliochron: 1\ntitle: ...', 'velmar.yaml')
 */
export function readSceneText(text: string, fileName: string): Scene {
  const parsed = parseSceneTextWithLines(text, fileName);
  try {
    return sceneFromData(parsed.data);
  } catch (error) {
    if (!(error instanceof InvalidInputError)) throw error;
    // Say where in the file: "... (line 14 of velmar.yaml)".
    const line = parsed.lineOf(error.field);
    if (line === undefined) throw error;
    const head = refusalHead(error.field, error.value, error.allowed);
    const detail = error.message.startsWith(head) ? error.message.slice(head.length).replace(/^\. /, '') : '';
    const where = `See line ${line} of ${fileName}.`;
    throw new InvalidInputError(error.field, error.value, error.allowed, detail ? `${detail} ${where}` : where);
  }
}
