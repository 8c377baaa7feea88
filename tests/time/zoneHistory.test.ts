/**
 * Zone time before 1970 from the full IANA history with backzone (data/tz-history.json, built by
 * scripts/build-tz-history.mjs from Debian's tzdata). Check values: the IANA tz database's own
 * entries for Europe/Amsterdam (backzone and europe files, as printed by `zdump -v Europe/Amsterdam`
 * on Debian's tzdata 2025b): Amsterdam Mean Time +0:19:32 from 1835 (local mean time before), summer
 * time +1:19:32 from 1916, +0:20 / +1:20 from 1 July 1937, Central European Summer Time (+2) from
 * 16 May 1940 under German occupation.
 */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { DateTime } from 'luxon';
import { expectClose } from '../helpers/expectClose.js';
import { zoneOffsetMinutes, zoneReading, describeClockKind } from '../../src/time/clock.js';
import { historyTzVersion } from '../../src/time/zoneHistory.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';

/** UT Julian Day of a Gregorian (or, before 1583, Julian) calendar date and hour. */
function jd(calendar: 'julian' | 'gregorian', y: number, m: number, d: number, hours = 12): number {
  return calendarDateToJd({ calendar, year: y, month: m, day: d }) + hours / 24;
}
const AMT = 19 + 32 / 60; // +0:19:32

describe('Europe/Amsterdam before 1970 follows its own history, not Brussels\'s', () => {
  it.each([
    ['1650 (local mean time)', jd('gregorian', 1650, 6, 1), AMT],
    ['1880', jd('gregorian', 1880, 6, 1), AMT],
    ['21 June 1900', jd('gregorian', 1900, 6, 21), AMT],
    ['summer 1938', jd('gregorian', 1938, 6, 1), 80],
    ['17 May 1940', jd('gregorian', 1940, 5, 17), 120],
    ['18 May 1940', jd('gregorian', 1940, 5, 18), 120],
    ['19 May 1940', jd('gregorian', 1940, 5, 19), 120],
  ])('%s: UT + %d min', (_what, jdUT, minutes) => {
    expectClose(zoneOffsetMinutes('Europe/Amsterdam', jdUT), minutes, 1e-9, 'offset');
  });
  it('where the runtime\'s merged data (luxon over ICU) would give Brussels\'s +0:17:30 in 1880 and UT+0 in June 1900', () => {
    const ms = (jdUT: number): number => Math.round((jdUT - 2440587.5) * 86400000);
    const icu1880 = DateTime.fromMillis(ms(jd('gregorian', 1880, 6, 1)), { zone: 'Europe/Amsterdam' }).offset;
    const icu1900 = DateTime.fromMillis(ms(jd('gregorian', 1900, 6, 21)), { zone: 'Europe/Amsterdam' }).offset;
    // Not asserted equal to Brussels (a runtime built with backzone would be right): only that ours differs where ICU merges.
    if (Math.abs(icu1880 - AMT) > 0.01) expect(zoneOffsetMinutes('Europe/Amsterdam', jd('gregorian', 1880, 6, 1))).not.toBe(icu1880);
    if (Math.abs(icu1900 - AMT) > 0.01) expect(zoneOffsetMinutes('Europe/Amsterdam', jd('gregorian', 1900, 6, 21))).not.toBe(icu1900);
    expect(zoneOffsetMinutes('Europe/Brussels', jd('gregorian', 1880, 6, 1))).toBeCloseTo(17.5, 9); // Brussels Mean Time +0:17:30
  });
  it('reads the 1938 offset as local mean time with an hour of summer time (meridian 5 deg E), and names the tz version', () => {
    const r = zoneReading('Europe/Amsterdam', jd('gregorian', 1938, 6, 1));
    expect(r.localMeanTime).toBe(true);
    expectClose(r.meridianDeg ?? 0, 5, 1e-9, 'meridian of +0:20');
    expect(historyTzVersion()).toMatch(/^\d{4}[a-z]$/);
    expect(describeClockKind({ kind: 'zone', zone: 'Europe/Amsterdam' })).toContain(`IANA tz ${historyTzVersion()} with backzone`);
  });
  it('from 1970 on uses the runtime data (the two agree there)', () => {
    expectClose(zoneOffsetMinutes('Europe/Amsterdam', jd('gregorian', 1990, 7, 1)), 120, 1e-9, 'summer 1990');
  });
});

/** Parse a zdump -v line "Zone  Wed Dec 31 23:40:28 1834 UT = ... gmtoff=1172" into (UT JD, offset minutes). */
function zdumpLine(line: string): { jdUT: number; minutes: number } | null {
  const m = /\s(\w{3}) (\w{3})\s+(\d+) (\d\d):(\d\d):(\d\d) (-?\d+) UT = .* gmtoff=(-?\d+)/.exec(line);
  if (!m) return null;
  const month = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'].indexOf(m[2]) + 1;
  const hours = Number(m[4]) + Number(m[5]) / 60 + Number(m[6]) / 3600;
  // zdump prints proleptic Gregorian dates; our calendar code turns them into a Julian Day.
  return { jdUT: jd('gregorian', Number(m[7]), month, Number(m[3]), hours), minutes: Number(m[8]) / 60 };
}

const ZDUMP = ['/usr/bin/zdump', '/usr/sbin/zdump'].find((p) => existsSync(p));

describe.skipIf(ZDUMP === undefined)('agrees with zdump -v of the machine\'s tz database (with backzone) at every transition 1850-1969', () => {
  it.each(['Europe/Amsterdam', 'Europe/Brussels', 'Europe/Berlin', 'Europe/Zurich', 'Europe/Paris', 'Europe/Dublin', 'Europe/Oslo', 'Europe/Rome', 'America/New_York', 'Asia/Kolkata', 'Africa/Nairobi', 'Australia/Sydney'])('%s', (zone) => {
    const out = spawnSync(ZDUMP as string, ['-v', '-c', '1850,1970', zone], { encoding: 'utf8' }).stdout;
    let checked = 0;
    for (const line of out.split('\n')) {
      const z = zdumpLine(line);
      if (z === null || z.jdUT >= 2440587.5) continue;
      // zdump prints each transition as the last second before and the first second after: both must match.
      expectClose(zoneOffsetMinutes(zone, z.jdUT + 1e-7), z.minutes, 1e-9, `${zone} at JD ${z.jdUT}`);
      checked += 1;
    }
    expect(checked).toBeGreaterThan(1);
  });
});
