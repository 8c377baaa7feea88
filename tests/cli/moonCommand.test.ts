/**
 * The `moon` command end to end, through the compiled CLI when dist/ is built (npx tsc -p tsconfig.json).
 */
import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/runCli.js';
import { expectClose } from '../helpers/expectClose.js';
import { litSideWords } from '../../src/ephemeris/moonLook.js';

// Velmar (examples/), an April evening of 1783 with a young crescent low in the west after sunset.
const VELMAR = ['--lat', '47.62', '--lon', '9.35', '--elevation', '410'];
const EVENING = ['moon', ...VELMAR, '--date', '1783-04-04', '--time', '20:30'];

interface MoonJson {
  jd: number;
  azimuth: number;
  altitude: number;
  geometricAltitude: number;
  illuminatedFraction: number;
  phase: string;
  phaseAngle: number;
  elongation: number;
  age: number;
  waxing: boolean;
  brightLimbPositionAngle: number;
  brightLimbTiltFromVertical: number;
  litSide: string;
  events: { moonrise: string | null; transit: string | null; moonset: string | null; moonriseJd: number | null; moonsetJd: number | null; clockKind: string };
  deltaT: { modelName: string };
  times: { clock: string };
  defaults: string[];
}

describe('heliochron moon', () => {
  it('prints place, phase in words, age, the lit side in words, the moon\'s day, Delta T, the caution and the defaults', async () => {
    const r = await runCli(EVENING);
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    for (const text of ['azimuth', 'deg refracted', 'deg geometric', 'waxing crescent', '% of the disc lit', 'phase angle', 'elongation', 'days since the new moon', 'position angle', 'lit side as seen', 'towards the lower right', 'moonrise', 'transit', 'moonset', 'Delta T', 'Morrison', 'Caution: A painted or drawn moon is often a convention', 'Defaults used: --calendar gregorian', '24 March 1783 (Julian) = 4 April 1783 (Gregorian)']) {
      expect(r.out).toContain(text);
    }
  });
  it('--json gives jd, azimuth, altitude, illuminatedFraction, brightLimbPositionAngle and brightLimbTiltFromVertical at the top level', async () => {
    const r = await runCli([...EVENING, '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as MoonJson;
    for (const key of ['jd', 'azimuth', 'altitude', 'illuminatedFraction', 'brightLimbPositionAngle', 'brightLimbTiltFromVertical'] as const) expect(typeof j[key]).toBe('number');
    // An evening crescent after sunset: in the west, lit side in the lower half, towards the sun below the horizon (docs/conventions.md).
    expect(j.azimuth).toBeGreaterThan(240);
    expect(j.altitude).toBeGreaterThan(0);
    expect(j.waxing).toBe(true);
    expect(j.illuminatedFraction).toBeLessThan(0.25);
    expect(Math.abs(j.brightLimbTiltFromVertical)).toBeGreaterThan(90);
    expect(j.litSide).toBe(litSideWords(j.brightLimbTiltFromVertical));
    // Age and elongation tell the same story: a young moon, 2-4 days, 20-50 deg from the sun.
    expect(j.age).toBeGreaterThan(2);
    expect(j.age).toBeLessThan(4);
    expect(j.elongation).toBeGreaterThan(20);
    expect(j.elongation).toBeLessThan(50);
    // The moon sets after the moment asked about and is up at it.
    expect(j.events.moonsetJd as number).toBeGreaterThan(j.jd);
    expect(j.events.moonriseJd as number).toBeLessThan(j.jd);
  });
  it('reproduces Meeus Example 48.a (1992 April 12, 0h TD): illuminated fraction 0.6786 and bright-limb position angle 285.0 deg', async () => {
    // 0h TD = 23:59:01.7 UT on 11 April with Delta T 58.3 s (Morrison et al. 2021); the example's values are geocentric.
    const r = await runCli(['moon', '--lat', '0', '--lon', '0', '--date', '1992-04-11', '--time', '23:59:01.7', '--clock', 'ut', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out) as MoonJson;
    expectClose(j.illuminatedFraction, 0.6786, 0.001, 'illuminated fraction (Meeus Example 48.a)');
    expectClose(j.brightLimbPositionAngle, 285.0, 0.1, 'bright limb position angle (Meeus Example 48.a)');
    expectClose(j.phaseAngle, 69.0756, 0.02, 'phase angle (Meeus Example 48.a)');
  });
  it('gives moonrise, transit and moonset on the clock given, including the hour systems', async () => {
    const mean = JSON.parse((await runCli([...EVENING, '--clock', 'mean', '--json'])).out) as MoonJson;
    expect(mean.events.clockKind).toBe('mean');
    expect(mean.events.moonset).toMatch(/^2[12]:\d\d:\d\d$/);
    const italian = await runCli([...EVENING.slice(0, -2), '--time', '02:00', '--clock', 'italian']);
    expect(italian.code).toBe(0);
    expect(italian.out).toContain("The moon's day in Italian hours");
    const julian = await runCli(['moon', ...VELMAR, '--date', '1700-02-18', '--calendar', 'julian', '--time', '22:00', '--json']);
    expect(julian.code).toBe(0);
  });
  it('is listed in heliochron --help beside sun', async () => {
    const r = await runCli(['--help']);
    expect(r.out).toMatch(/\bsun\b[\s\S]*\bmoon\b/);
  });
});

describe('heliochron moon: bad input', () => {
  const cases: Array<[string, string[], RegExp]> = [
    ['a latitude out of range', ['--lat', '95'], /--lat.*95/],
    ['a time of day not on a 24-hour clock', ['--time', '25:10'], /--time.*25:10.*hh:mm/],
    ['an unknown clock', ['--clock', 'sundial'], /--clock.*sundial/],
    ['an unknown Delta T model', ['--delta-t', 'guess'], /--delta-t.*guess/],
    ['a date out of the years allowed', ['--date', '3500-01-01'], /--date.*3500-01-01.*-1999 to 3000/],
    ['a pressure not a number', ['--pressure', 'high'], /--pressure.*high.*100 to 1200 hPa/],
  ];
  for (const [what, change, message] of cases) {
    it(`refuses ${what} with exit 2, one line naming the option and the value, nothing on the output`, async () => {
      const args = [...EVENING];
      for (let i = 0; i < change.length; i += 2) {
        const at = args.indexOf(change[i]);
        if (at >= 0) args[at + 1] = change[i + 1];
        else args.push(change[i], change[i + 1]);
      }
      const r = await runCli(args);
      expect(r.code).toBe(2);
      expect(r.out).toBe('');
      expect(r.err).toMatch(message);
      expect(r.err.trim().split('\n')).toHaveLength(1);
    });
  }
  it('asks for --time when it is missing', async () => {
    const r = await runCli(['moon', ...VELMAR, '--date', '1783-04-04']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--time is missing.*hh:mm.*this option is required/);
  });
});
