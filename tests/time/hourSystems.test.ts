/**
 * Italian, Babylonian and unequal hours (src/time/hourSystems.ts, hourSystemClock.ts).
 * No published table of these hours for a given site and day was found; the checks are built from
 * the sunrise and sunset the project already checks (src/ephemeris/riseSet.ts, tests/ephemeris/riseSet.test.ts)
 * by the definitions (construction stated in each test), plus the gnomonic rule of thumb that at the
 * equinoxes apparent noon is 18 Italian and 6 Babylonian hours (R. R. J. Rohr, Sundials, 1970, from memory).
 */
import { describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/expectClose.js';
import { clockToJdUT, formatClockKind, jdUTToClockMinutes, parseClockKind } from '../../src/time/clock.js';
import { sunEvents } from '../../src/ephemeris/riseSet.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';
import { dayFrameFromDeclination, hourSystemReading, hourSystemToApparentMinutes, type HourSystem } from '../../src/time/hourSystems.js';
import type { ClockKind } from '../../src/scene/types.js';

const VELMAR = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 0 };
const day = (y: number, m: number, d: number): number => calendarDateToJd({ calendar: 'gregorian', year: y, month: m, day: d });
const SYSTEMS: ClockKind[] = [
  { kind: 'italian', origin: 'sunset', offsetMinutes: 0 },
  { kind: 'italian', origin: 'sunset', offsetMinutes: 30 },
  { kind: 'italian', origin: 'civil-dusk', offsetMinutes: 0 },
  { kind: 'babylonian' },
  { kind: 'unequal' },
];

describe('hour systems on real days at Velmar', () => {
  it.each(SYSTEMS.map((s) => [formatClockKind(s), s] as const))('%s: a reading turns into an instant and back (round trip)', (_name, system) => {
    for (const d of [day(1650, 3, 20), day(1650, 6, 21), day(1650, 12, 21)]) {
      for (const reading of [30, 300, 600, 900, 1200, 1400]) {
        const jdUT = clockToJdUT(d, reading, system, VELMAR);
        const back = jdUTToClockMinutes(jdUT, system, VELMAR);
        expectClose(back.minutesOfDay, reading, 1e-4, `${formatClockKind(system)} ${reading} on JD ${d}`);
      }
    }
  });
  it('Babylonian hours at sunset read the length of the day; unequal hours read 00:00 at sunrise and 12:00 at sunset', () => {
    // Construction: sunrise and sunset from sunEvents (the project's checked rise/set); the definitions of the systems.
    const d = day(1650, 6, 21);
    const ev = sunEvents(d - VELMAR.longitudeDeg / 360, VELMAR);
    const dayLengthMinutes = (ev.sunsetJdUT! - ev.sunriseJdUT!) * 1440;
    // Apparent minutes run a little faster than UT minutes over a day (the equation of time changes by about 13 s/day in June).
    expectClose(jdUTToClockMinutes(ev.sunsetJdUT!, { kind: 'babylonian' }, VELMAR).minutesOfDay, dayLengthMinutes, 0.2, 'Babylonian at sunset');
    expectClose(jdUTToClockMinutes(ev.sunriseJdUT! + 1e-7, { kind: 'unequal' }, VELMAR).minutesOfDay, 0, 0.01, 'unequal at sunrise');
    expectClose(jdUTToClockMinutes(ev.sunsetJdUT! - 1e-7, { kind: 'unequal' }, VELMAR).minutesOfDay, 720, 0.01, 'unequal at sunset');
    // Italian hours at sunrise: the length of the night just ended.
    const before = sunEvents(d - 1 - VELMAR.longitudeDeg / 360, VELMAR);
    expectClose(jdUTToClockMinutes(ev.sunriseJdUT!, { kind: 'italian', origin: 'sunset', offsetMinutes: 0 }, VELMAR).minutesOfDay, (ev.sunriseJdUT! - before.sunsetJdUT!) * 1440, 0.2, 'Italian at sunrise');
  });
  it('at the March equinox apparent noon is about 18 Italian and 6 Babylonian hours (Rohr, from memory; the refracted sun rises some 6 min early and sets some 6 min late at 47.6 N)', () => {
    const noon = clockToJdUT(day(1650, 3, 20), 720, { kind: 'apparent' }, VELMAR);
    expectClose(jdUTToClockMinutes(noon, { kind: 'italian', origin: 'sunset', offsetMinutes: 0 }, VELMAR).minutesOfDay, 18 * 60, 8, 'Italian at noon');
    expectClose(jdUTToClockMinutes(noon, { kind: 'babylonian' }, VELMAR).minutesOfDay, 6 * 60, 8, 'Babylonian at noon');
    expectClose(jdUTToClockMinutes(noon, { kind: 'unequal' }, VELMAR).minutesOfDay, 6 * 60, 1, 'unequal at noon');
  });
  it('the evening bell (sunset + 30 min) and civil dusk move the Italian count later', () => {
    const noon = clockToJdUT(day(1650, 6, 21), 720, { kind: 'apparent' }, VELMAR);
    const plain = jdUTToClockMinutes(noon, { kind: 'italian', origin: 'sunset', offsetMinutes: 0 }, VELMAR).minutesOfDay;
    expectClose(jdUTToClockMinutes(noon, { kind: 'italian', origin: 'sunset', offsetMinutes: 30 }, VELMAR).minutesOfDay, plain - 30, 1e-6, 'bell');
    const dusk = jdUTToClockMinutes(noon, { kind: 'italian', origin: 'civil-dusk', offsetMinutes: 0 }, VELMAR).minutesOfDay;
    // Civil twilight at 47.6 N near the June solstice lasts about 40 minutes (Explanatory Supplement 1992 sec. 9.3 definition, -6 deg).
    expect(plain - dusk).toBeGreaterThan(35);
    expect(plain - dusk).toBeLessThan(50);
  });
});

describe('the solver\'s approximation from the declination', () => {
  it('agrees with the full computation within 2 minutes (its stated error)', () => {
    // At the equinox the declination is about 0 and changes 0.4 deg a day, the worst case for the previous evening.
    const system: HourSystem = { kind: 'italian', origin: 'sunset', offsetMinutes: 0 };
    const frame = dayFrameFromDeclination(system, 0.2, VELMAR.latitudeDeg, -0.8333)!;
    const noon = clockToJdUT(day(2024, 3, 20), 720, { kind: 'apparent' }, VELMAR);
    const full = jdUTToClockMinutes(noon, system, VELMAR).minutesOfDay;
    expect(Math.abs(hourSystemReading(system, 720, frame) - full)).toBeLessThan(2.5);
  });
  it('inverts its own readings on [0, 1440)', () => {
    for (const system of SYSTEMS as HourSystem[]) {
      const frame = dayFrameFromDeclination(system, 15, 47.62, -0.8333)!;
      for (const reading of [0, 100, 719, 720, 1000, 1439]) {
        const m = hourSystemToApparentMinutes(system, reading, frame);
        const wrapped = ((m % 1440) + 1440) % 1440;
        expectClose(hourSystemReading(system, wrapped, frame), reading, 1e-6, `${system.kind} ${reading}`);
      }
    }
  });
});

describe('edge cases', () => {
  it('reads and writes the clock kinds', () => {
    for (const text of ['italian', 'italian+30', 'italian-15', 'italian:dusk', 'italian:dusk+10', 'babylonian', 'unequal']) {
      expect(formatClockKind(parseClockKind(text, '--clock'))).toBe(text);
    }
    expect(() => parseClockKind('italian+300', '--clock')).toThrow(/at most 120 minutes/);
    expect(() => parseClockKind('italian:dawn', '--clock')).toThrow(/--clock/);
  });
  it('refuses a day without sunrise or sunset (polar night at 80 N in December)', () => {
    expect(() => clockToJdUT(day(1900, 12, 21), 600, { kind: 'babylonian' }, { latitudeDeg: 80, longitudeDeg: 15, elevationM: 0 })).toThrow(/without sunrise or sunset/);
  });
});
