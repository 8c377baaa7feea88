/**
 * Suggestions for a mistyped key or value: "did you mean slopeDeg? angles are in degrees".
 *
 * A key is compared with the allowed keys after removing case, '_' and '-',
 * then with its unit suffix removed (so `slope`, `slopeRad` and `slope_deg`
 * all lead to `slopeDeg`), then by edit distance (Levenshtein 1966, the
 * classic dynamic-programming form; Wagner and Fischer 1974).
 */

/** Unit suffixes a key may carry, longest first, and what the allowed unit means in words. */
const UNIT_SUFFIXES = [
  'Radians', 'Degrees', 'Minutes', 'Seconds', 'Pixels', 'Metres', 'Meters', 'Hours',
  'Mbar', 'HPa', 'Deg', 'Rad', 'Min', 'Sec', 'Px', 'Cm', 'Mm', 'Ft', 'Km', 'Pa', 'M', 'C', 'F', 'K',
] as const;

const UNIT_WORDS: Readonly<Record<string, string>> = {
  Deg: 'angles are in degrees',
  M: 'lengths are in metres',
  Px: 'image positions are in pixels',
  Minutes: 'times are in minutes',
  HPa: 'pressure is in hectopascals (millibars)',
  C: 'temperature is in degrees Celsius',
  Hours: 'dials are counted in hours',
};

/** Common short names a scholar may write, mapped to our key. */
const ALIASES: Readonly<Record<string, string>> = {
  lat: 'latitudeDeg',
  latitude: 'latitudeDeg',
  lon: 'longitudeDeg',
  lng: 'longitudeDeg',
  long: 'longitudeDeg',
  longitude: 'longitudeDeg',
  elevation: 'elevationM',
  altitude: 'altitudeDeg',
  height: 'heightM',
  width: 'widthM',
  azimuth: 'azimuthDeg',
  bearing: 'mapAzimuthDeg',
  wallid: 'wall',
  type: 'kind',
  name: 'id',
  dial: 'dialHours',
  precision: 'precisionMinutes',
  time: 'reading',
  version: 'heliochron',
  formatversion: 'heliochron',
  pressure: 'pressureHPa',
  temperature: 'temperatureC',
  mirror: 'mirrored',
  points: 'pointsPx',
};

/** Edit distance between two strings (Levenshtein), with a cap: returns cap + 1 when larger. */
export function editDistance(a: string, b: string, cap = 8): number {
  if (Math.abs(a.length - b.length) > cap) return cap + 1;
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    let rowMin = i;
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      const v = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + cost);
      current.push(v);
      if (v < rowMin) rowMin = v;
    }
    if (rowMin > cap) return cap + 1;
    previous = current;
  }
  return previous[b.length];
}

function squash(key: string): string {
  return key.replace(/[_\-\s]/g, '').toLowerCase();
}

function splitUnit(key: string): { stem: string; unit: string } {
  const k = key.replace(/[_\-\s]/g, '');
  for (const u of UNIT_SUFFIXES) {
    if (k.length > u.length && k.toLowerCase().endsWith(u.toLowerCase())) {
      return { stem: k.slice(0, k.length - u.length).toLowerCase(), unit: u };
    }
  }
  return { stem: k.toLowerCase(), unit: '' };
}

/** The allowed unit of a key in words, e.g. "angles are in degrees" for `slopeDeg`. */
function unitWords(allowedKey: string): string | undefined {
  const { unit } = splitUnit(allowedKey);
  return UNIT_WORDS[unit];
}

/**
 * The best suggestion for an unknown key among the allowed ones, as a sentence, or undefined.
 * @example suggestKey('slope', ['id', 'slopeDeg']) // 'Did you mean "slopeDeg"? Angles are in degrees.'
 */
export function suggestKey(key: string, allowed: readonly string[]): string | undefined {
  const found = closestKey(key, allowed);
  if (found === undefined) return undefined;
  const { unit: givenUnit } = splitUnit(key);
  const { unit: wantedUnit } = splitUnit(found);
  const words = unitWords(found);
  const unitNote = words && givenUnit !== wantedUnit ? ` ${words[0].toUpperCase()}${words.slice(1)}.` : '';
  return `Did you mean "${found}"?${unitNote}`;
}

/** The allowed key a mistyped key most likely meant, or undefined. */
export function closestKey(key: string, allowed: readonly string[]): string | undefined {
  const squashed = squash(key);
  const bySquash = allowed.find((a) => squash(a) === squashed);
  if (bySquash !== undefined) return bySquash;
  const alias = ALIASES[squashed];
  if (alias !== undefined && allowed.includes(alias)) return alias;
  const { stem } = splitUnit(key);
  const byStem = allowed.find((a) => splitUnit(a).stem === stem);
  if (byStem !== undefined) return byStem;
  const aliasOfStem = ALIASES[stem];
  if (aliasOfStem !== undefined && allowed.includes(aliasOfStem)) return aliasOfStem;
  return closestWord(key, allowed);
}

/** The allowed word nearest to `word` by edit distance (case-insensitive), if near enough; else undefined. */
export function closestWord(word: string, allowed: readonly string[]): string | undefined {
  const w = squash(word);
  if (w.length === 0) return undefined;
  const limit = Math.min(3, Math.max(1, Math.floor(w.length / 3)));
  let best: string | undefined;
  let bestDistance = limit + 1;
  for (const a of allowed) {
    const d = editDistance(w, squash(a), limit);
    if (d < bestDistance) {
      best = a;
      bestDistance = d;
    }
  }
  return best;
}
