/**
 * Reading a latitude or longitude as it is written on maps and in gazetteers:
 * decimal degrees (`48.2`, `-16.4`), degrees-minutes-seconds (`48°12'30"N`, `48 12 30 N`,
 * `48 deg 12 min N`) and hemisphere letters (`16.4 E`, `16.4W`, `N 48.2`).
 *
 * The result is decimal degrees, north and east positive; S and W make it negative
 * (common practice of cartography: 1 degree = 60 minutes = 3600 seconds).
 * A sign and a hemisphere letter together are refused (`-48 S` could mean either),
 * as are minutes or seconds of 60 or more and a letter of the other axis (`48 E` as a latitude).
 * Every refusal suggests the decimal form when the text can be read at all.
 */
import { InvalidInputError } from '../errors.js';

export type CoordinateAxis = 'latitude' | 'longitude';

const LIMIT: Record<CoordinateAxis, number> = { latitude: 90, longitude: 180 };
const LETTERS: Record<CoordinateAxis, string> = { latitude: 'NS', longitude: 'EW' };

/** The allowed forms in words, for the messages and the docs. */
export function coordinateWords(axis: CoordinateAxis): string {
  const limit = LIMIT[axis];
  return axis === 'latitude'
    ? `a latitude in degrees from -${limit} to ${limit}, north positive: 48.2, or with N or S as 48°12'30"N, 48 12 30 N, 48.2 N`
    : `a longitude in degrees from -${limit} to ${limit}, east positive: 16.4, or with E or W as 16°24'E, 16 24 E, 16.4 W`;
}

// Degrees, then optional minutes and seconds; each number may carry its mark (° deg, ' ′ min, " ″ '' sec).
// Single-letter marks (d, m, s) are not read: a final "s" would be taken for south.
// The marks beyond ASCII are written as \u escapes, so that the bundled command line stays ASCII text,
// which Node reads faster at every start (src/cli/build.mjs).
const DEG_MARK = '(?:\u00b0|\u00ba|deg)'; // ° º
const MIN_MARK = "(?:'|\u2032|\u2019|min)"; // ′ ’
const SEC_MARK = '(?:"|\u2033|\u201d|\'\'|\u2032\u2032|sec)'; // ″ ” ′′
const NUMBER = String.raw`(\d+(?:\.\d*)?|\.\d+)`;
const DMS = new RegExp(
  String.raw`^${NUMBER}\s*(${DEG_MARK})?(?:\s*${NUMBER}\s*(${MIN_MARK})?(?:\s*${NUMBER}\s*(${SEC_MARK})?)?)?$`,
  'i',
);

/** Decimal degrees written with as many decimals as the seconds need (1 second = 0.0003 degrees). */
function decimalText(value: number): string {
  return String(Math.round(value * 1e6) / 1e6);
}

/**
 * Read a coordinate written as a number or as text.
 * @param value a number (decimal degrees) or text in one of the forms of the module note
 * @param field the option or scene path, for messages
 * @returns decimal degrees, north and east positive
 * @throws InvalidInputError naming the field, quoting the value and saying what is allowed
 * @example parseCoordinate("48°12'30\"N", 'latitude', '--lat') // 48.208333...
 * @example parseCoordinate('16.4W', 'longitude', '--lon') // -16.4
 */
export function parseCoordinate(value: unknown, axis: CoordinateAxis, field: string): number {
  const words = coordinateWords(axis);
  const limit = LIMIT[axis];
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new InvalidInputError(field, value, words, 'Only finite numbers are allowed.');
    if (Math.abs(value) > limit) throw new InvalidInputError(field, value, words);
    return value;
  }
  if (typeof value !== 'string') {
    throw new InvalidInputError(field, value, words, value === null ? 'The value is missing.' : undefined);
  }
  let text = value.trim().replace(/\s+/g, ' ');
  if (/^[-+]?\.?(inf(inity)?|nan)$/i.test(text)) throw new InvalidInputError(field, value, words, 'Only finite numbers are allowed.');
  // A hemisphere letter before or after the number.
  let letter: string | undefined;
  const after = /^(.*?)\s*([NSEWnsew])$/.exec(text);
  const before = /^([NSEWnsew])\s*(.*)$/.exec(text);
  if (after && /\d/.test(after[1])) [text, letter] = [after[1], after[2].toUpperCase()];
  else if (before && /\d/.test(before[2])) [text, letter] = [before[2], before[1].toUpperCase()];
  let sign = 1;
  const signed = /^([+\-\u2212])\s*(.*)$/.exec(text); // \u2212: the minus sign −
  if (signed) {
    if (letter !== undefined) {
      throw new InvalidInputError(field, value, words, `Give either a sign or the letter ${letter}, not both.`);
    }
    sign = signed[1] === '+' ? 1 : -1;
    text = signed[2];
  }
  if (letter !== undefined && !LETTERS[axis].includes(letter)) {
    const other = axis === 'latitude' ? 'longitude' : 'latitude';
    throw new InvalidInputError(field, value, words, `${letter} marks a ${other}; a ${axis} takes ${LETTERS[axis].split('').join(' or ')}.`);
  }
  if (letter === 'S' || letter === 'W') sign = -sign;
  if (/^[+-]?\d+,\d+$/.test(text)) {
    throw new InvalidInputError(field, value, words, `Write the decimal point as a full stop: ${decimalText(sign * Number(text.replace(',', '.')))}.`);
  }
  const colon = /^(\d+):(\d+)(?::(\d+(?:\.\d*)?))?$/.exec(text);
  if (colon) {
    const read = sign * (Number(colon[1]) + Number(colon[2]) / 60 + Number(colon[3] ?? 0) / 3600);
    throw new InvalidInputError(field, value, words, `Colons are not read; in decimal degrees that is ${decimalText(read)}.`);
  }
  const m = DMS.exec(text);
  if (!m) throw new InvalidInputError(field, value, words);
  const [, degText, degMark, minText, , secText] = m;
  const degrees = Number(degText);
  const minutes = minText === undefined ? 0 : Number(minText);
  const seconds = secText === undefined ? 0 : Number(secText);
  if (minText !== undefined && !/^\d+$/.test(degText)) {
    throw new InvalidInputError(field, value, words, 'With minutes, the degrees are a whole number.');
  }
  if (secText !== undefined && !/^\d+$/.test(minText ?? '')) {
    throw new InvalidInputError(field, value, words, 'With seconds, the minutes are a whole number.');
  }
  if (minutes >= 60 || seconds >= 60) {
    throw new InvalidInputError(field, value, words, 'Minutes and seconds run from 0 to 59.');
  }
  // 1 degree = 60 minutes = 3600 seconds (sexagesimal division, common practice).
  const result = sign * (degrees + minutes / 60 + seconds / 3600);
  if (Math.abs(result) > limit) {
    const plain = letter === undefined && minText === undefined && degMark === undefined;
    throw new InvalidInputError(field, value, words, plain ? undefined : `That is ${decimalText(result)} degrees.`);
  }
  return result;
}
