/**
 * Small readers for the fields of a scene file: each takes a value found at a
 * path in the file (`observations[2].sigmaDeg`) and returns it checked, or
 * throws InvalidInputError naming the path, quoting the value and saying what
 * is allowed. Unknown keys are refused with a "did you mean" suggestion.
 */
import { InvalidInputError } from '../errors.js';
import { EXACT_COUNT_LIMIT, graphemeLength, shortenText } from '../textUnits.js';
import { closestWord, suggestKey } from './didYouMean.js';

/** A map of the file, its path and the keys it may hold. */
export interface Fields {
  readonly path: string;
  readonly what: string;
  readonly data: Readonly<Record<string, unknown>>;
}

/**
 * Path of a key inside a map: `site.latitudeDeg`, or `title` at the top; a key that is
 * not a plain word is quoted in brackets: `site["lat deg"]`.
 */
export function keyPath(path: string, key: string): string {
  if (!/^[A-Za-z_$][\w$-]*$/.test(key)) return `${path}[${JSON.stringify(shortenText(key, 60))}]`;
  return path === '' ? key : `${path}.${key}`;
}

/** Path of an item of a list: `walls[1]`. */
export function itemPath(path: string, index: number): string {
  return `${path}[${index}]`;
}

function typeWords(value: unknown): string {
  if (value === null || value === undefined) return 'nothing';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'object') return 'a map';
  return `a ${typeof value}`;
}

/** What the reader got, in words, when it is not what was asked: "(a list)" or a hint about quoted numbers. */
function typeDetail(value: unknown, wantedNumber: boolean): string | undefined {
  if (typeof value === 'string' && wantedNumber) {
    const t = value.trim();
    if (/^[-+]?(\.?inf(inity)?|nan)$/i.test(t) || /^[-+]?\.(inf|nan)$/i.test(t)) {
      return 'Only finite numbers are allowed.';
    }
    if (t !== '' && Number.isFinite(Number(t))) return 'Write the number without quotes.';
    return undefined;
  }
  if (value === null || value === undefined) return 'The value is missing.';
  return `Found ${typeWords(value)}.`;
}

/**
 * Open a map at `path`, refusing anything that is not a map and any key outside `allowed`.
 * @param what the map in words for messages, e.g. "the site" or "a rod-shadow observation"
 */
export function openFields(value: unknown, path: string, what: string, allowed: readonly string[]): Fields {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    throw new InvalidInputError(
      path === '' ? 'the scene' : path,
      value,
      `${what}: a map of keys (${allowed.join(', ')})`,
      typeDetail(value, false),
    );
  }
  const data = value as Record<string, unknown>;
  for (const key of Object.keys(data)) {
    if (!allowed.includes(key)) {
      const suggestion = suggestKey(key, allowed);
      throw new InvalidInputError(
        keyPath(path, key),
        data[key],
        `one of the keys of ${what}: ${allowed.join(', ')}`,
        `"${key}" is not a known key${suggestion ? `. ${suggestion}` : '.'}`,
      );
    }
  }
  return { path, what, data };
}

/** True when the key is present (with any value, null included). */
export function has(f: Fields, key: string): boolean {
  return Object.prototype.hasOwnProperty.call(f.data, key);
}

/** The raw value of a key (undefined when absent). */
export function raw(f: Fields, key: string): unknown {
  return has(f, key) ? f.data[key] : undefined;
}

/** Refuse a missing key, naming what it should hold. */
export function missing(f: Fields, key: string, allowed: string): InvalidInputError {
  return new InvalidInputError(keyPath(f.path, key), undefined, allowed, `${f.what[0].toUpperCase()}${f.what.slice(1)} needs "${key}".`);
}

/** A range of numbers and how it is said in words. */
export interface NumberRule {
  /** The quantity in words, e.g. "an angle in degrees" */
  readonly words: string;
  readonly min?: number;
  readonly max?: number;
  readonly minExclusive?: boolean;
  readonly maxExclusive?: boolean;
  readonly integer?: boolean;
  /** The value must be 0 or at least this (a sigma where 0 means "known exactly"). */
  readonly zeroOrAtLeast?: number;
}

/**
 * The smallest sigma accepted, in the unit of its field (degrees, ratio, minutes, metres, pixels):
 * a millionth of the unit is far below any measurement made on a picture, and a smaller one makes
 * chi-square overflow (common practice).
 */
export const SIGMA_FLOOR = 0.000001;

/** The rule in words: "an angle in degrees from 0 to 360 (360 excluded)". */
export function describeNumber(rule: NumberRule): string {
  const parts: string[] = [rule.integer ? `${rule.words}, a whole number` : rule.words];
  const { min, max } = rule;
  if (min !== undefined && max !== undefined) {
    const excluded = [rule.minExclusive ? String(min) : '', rule.maxExclusive ? String(max) : ''].filter(Boolean);
    parts.push(
      `from ${min} to ${max}${excluded.length ? ` (${excluded.join(' and ')} excluded)` : ''}`,
    );
  } else if (min !== undefined) {
    parts.push(rule.minExclusive ? `greater than ${min}` : `of at least ${min}`);
  } else if (max !== undefined) {
    parts.push(rule.maxExclusive ? `less than ${max}` : `of at most ${max}`);
  }
  if (rule.zeroOrAtLeast !== undefined) parts.push(`either 0 or at least ${rule.zeroOrAtLeast}`);
  return parts.join(rule.integer ? ' ' : ', ');
}

/** Check a value found at `path` against a number rule. */
export function checkNumber(value: unknown, path: string, rule: NumberRule): number {
  if (typeof value !== 'number') {
    throw new InvalidInputError(path, value, describeNumber(rule), typeDetail(value, true));
  }
  if (!Number.isFinite(value)) {
    throw new InvalidInputError(path, value, describeNumber(rule), 'Only finite numbers are allowed.');
  }
  const { min, max } = rule;
  const tooLow = min !== undefined && (rule.minExclusive ? value <= min : value < min);
  const tooHigh = max !== undefined && (rule.maxExclusive ? value >= max : value > max);
  const inGap = rule.zeroOrAtLeast !== undefined && value !== 0 && Math.abs(value) < rule.zeroOrAtLeast;
  if (tooLow || tooHigh || inGap || (rule.integer && !Number.isInteger(value))) {
    throw new InvalidInputError(path, value, describeNumber(rule));
  }
  return value;
}

/** A required number. */
export function num(f: Fields, key: string, rule: NumberRule): number {
  if (!has(f, key)) throw missing(f, key, describeNumber(rule));
  return checkNumber(f.data[key], keyPath(f.path, key), rule);
}

/** An optional number: `fallback` when absent (undefined when no fallback). */
export function optNum(f: Fields, key: string, rule: NumberRule): number | undefined;
export function optNum(f: Fields, key: string, rule: NumberRule, fallback: number): number;
export function optNum(f: Fields, key: string, rule: NumberRule, fallback?: number): number | undefined {
  if (!has(f, key)) return fallback;
  return checkNumber(f.data[key], keyPath(f.path, key), rule);
}

/** Check a string value: non-empty, at most maxLength characters, optionally matching a pattern. */
export function checkString(value: unknown, path: string, words: string, maxLength: number, pattern?: RegExp): string {
  const allowed = `${words} (text of 1 to ${maxLength} characters)`;
  if (typeof value !== 'string') {
    throw new InvalidInputError(path, value, allowed, typeDetail(value, false));
  }
  // Lengths in user-perceived characters (src/textUnits.ts): an emoji or an accented letter counts once.
  const length = value.length > maxLength ? graphemeLength(value, maxLength + 1) : value.length;
  if (value.trim().length === 0 || length > maxLength) {
    const count = value.length <= EXACT_COUNT_LIMIT ? `${graphemeLength(value)}` : `more than ${EXACT_COUNT_LIMIT}`;
    throw new InvalidInputError(path, value, allowed, length > maxLength ? `It has ${count} characters.` : 'It is empty.');
  }
  // Control characters (a YAML or JSON escape such as "\e[2J" or "\u001b") could act on a terminal
  // when the text is printed: refused, except tab and line feed.
  const control = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/.exec(value);
  if (control) {
    const code = control[0].charCodeAt(0).toString(16).toUpperCase().padStart(4, '0');
    throw new InvalidInputError(path, value, `${words} without control characters`, `It holds U+${code}; write plain text.`);
  }
  if (pattern && !pattern.test(value)) throw new InvalidInputError(path, value, words);
  return value;
}

export function str(f: Fields, key: string, words: string, maxLength: number, pattern?: RegExp): string {
  if (!has(f, key)) throw missing(f, key, words);
  return checkString(f.data[key], keyPath(f.path, key), words, maxLength, pattern);
}

export function optStr(f: Fields, key: string, words: string, maxLength: number, pattern?: RegExp): string | undefined {
  if (!has(f, key)) return undefined;
  return checkString(f.data[key], keyPath(f.path, key), words, maxLength, pattern);
}

/** One word out of a list, with a "did you mean" for a near miss. */
export function checkChoice<T extends string>(value: unknown, path: string, choices: readonly T[], words?: string): T {
  const allowed = `${words ? `${words}: ` : ''}one of ${choices.map((c) => `"${c}"`).join(', ')}`;
  if (typeof value !== 'string') throw new InvalidInputError(path, value, allowed, typeDetail(value, false));
  if ((choices as readonly string[]).includes(value)) return value as T;
  const near = closestWord(value, choices);
  throw new InvalidInputError(path, value, allowed, near ? `Did you mean "${near}"?` : undefined);
}

export function choice<T extends string>(f: Fields, key: string, choices: readonly T[], words?: string): T {
  if (!has(f, key)) throw missing(f, key, `one of ${choices.map((c) => `"${c}"`).join(', ')}`);
  return checkChoice(f.data[key], keyPath(f.path, key), choices, words);
}

export function optBool(f: Fields, key: string, fallback: boolean): boolean {
  if (!has(f, key)) return fallback;
  const value = f.data[key];
  if (typeof value !== 'boolean') {
    throw new InvalidInputError(keyPath(f.path, key), value, 'true or false', typeDetail(value, false));
  }
  return value;
}

/** A list at `path` with a length in [minItems, maxItems]. */
export function checkList(value: unknown, path: string, words: string, minItems: number, maxItems: number): readonly unknown[] {
  const allowed =
    minItems === maxItems
      ? `${words}: a list of exactly ${minItems} items`
      : `${words}: a list of ${minItems} to ${maxItems} items`;
  if (!Array.isArray(value)) throw new InvalidInputError(path, value, allowed, typeDetail(value, false));
  if (value.length < minItems || value.length > maxItems) {
    throw new InvalidInputError(path, value, allowed, `It has ${value.length}.`);
  }
  return value;
}

/** A pair of finite numbers [a, b] each within a rule. */
export function checkPair(value: unknown, path: string, words: string, rules: readonly [NumberRule, NumberRule]): readonly [number, number] {
  const list = checkList(value, path, words, 2, 2);
  return [checkNumber(list[0], itemPath(path, 0), rules[0]), checkNumber(list[1], itemPath(path, 1), rules[1])];
}

/** Refuse keys that may not appear together, or require exactly one of a set. */
export function exactlyOne(f: Fields, keys: readonly string[], words: string): string {
  const present = keys.filter((k) => has(f, k));
  if (present.length === 1) return present[0];
  const where = present.length === 0 ? f.path || 'the scene' : keyPath(f.path, present[1]);
  const value = present.length === 0 ? undefined : raw(f, present[1]);
  throw new InvalidInputError(
    where,
    value,
    `exactly one of ${keys.map((k) => `"${k}"`).join(', ')} in ${f.what} (${words})`,
    present.length === 0 ? 'None is given.' : `Both "${present[0]}" and "${present[1]}" are given.`,
  );
}

/** Refuse any of `keys` when `because` holds. */
export function refuseKeys(f: Fields, keys: readonly string[], allowed: string): void {
  for (const k of keys) {
    if (has(f, k)) throw new InvalidInputError(keyPath(f.path, k), raw(f, k), allowed);
  }
}
