/**
 * Zone offsets before 1970 from the full IANA history, including its `backzone` file
 * (data/tz-history.json, built by scripts/build-tz-history.mjs from Debian's tzdata, which is
 * compiled with backzone). Node's built-in ICU zone data merges zones that agree since 1970, so
 * before 1970 it gives, for example, Brussels's history for Europe/Amsterdam; after 1970 both agree
 * and luxon (ICU) is used. The file names its tz version; answers name it (`tzDataWords`).
 * Its text reaches the library through tzHistoryJson.generated.ts (no file is read, so this runs
 * in a browser too); it is parsed once, on first use, and never changed (the one cache of this module).
 */
import { TZ_HISTORY_JSON } from './tzHistoryJson.generated.js';

/** Unix time (seconds) of 1970-01-01 0h UT, where the file's history ends. */
export const HISTORY_END_UNIX_SECONDS = 0;

interface ZoneHistory {
  readonly before: number;
  readonly transitions: readonly (readonly [number, number, number])[];
}
interface HistoryFile {
  readonly version: string;
  readonly zones: Readonly<Record<string, ZoneHistory>>;
}

let cache: HistoryFile | undefined;

function historyFile(): HistoryFile {
  cache ??= JSON.parse(TZ_HISTORY_JSON) as HistoryFile;
  return cache;
}

/** The tz database version of the pre-1970 history, e.g. "2025b". */
export function historyTzVersion(): string {
  return historyFile().version;
}

/** The tz version of the runtime's own zone data (ICU), when the runtime says it; else null. */
export function runtimeTzVersion(): string | null {
  const versions = (globalThis as { process?: { versions?: Record<string, string | undefined> } }).process?.versions;
  return versions?.tz ?? null;
}

/**
 * Offset of a zone from UT (minutes, east positive) at a Unix time before 1970 by the full IANA
 * history; null at or after 1970, or for a zone the file does not hold.
 * @example historicalOffsetMinutes('Europe/Amsterdam', -2208988800) // 19.533 (1900-01-01: Amsterdam Mean Time, +0:19:32)
 */
export function historicalOffsetMinutes(zone: string, unixSeconds: number): number | null {
  return historicalEntry(zone, unixSeconds)?.offsetMinutes ?? null;
}

/** The history's entry at a Unix time before 1970: offset (minutes east) and whether it is summer time; null otherwise. */
export function historicalEntry(zone: string, unixSeconds: number): { offsetMinutes: number; summerTime: boolean } | null {
  if (unixSeconds >= HISTORY_END_UNIX_SECONDS) return null;
  const h = historyFile().zones[zone];
  if (h === undefined) return null;
  // Binary search for the last transition at or before the instant.
  let lo = 0;
  let hi = h.transitions.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (h.transitions[mid][0] <= unixSeconds) lo = mid + 1;
    else hi = mid;
  }
  return lo === 0 ? { offsetMinutes: h.before / 60, summerTime: false } : { offsetMinutes: h.transitions[lo - 1][1] / 60, summerTime: h.transitions[lo - 1][2] === 1 };
}

/** The tz data behind zone times, in words for answers. */
export function tzDataWords(): string {
  const runtime = runtimeTzVersion();
  return `IANA tz ${historyTzVersion()} with backzone before 1970${runtime === null ? '' : `, the runtime's tz ${runtime} from 1970`}`;
}
