/**
 * examples/kornmarkt-moonlight.yaml: a winter night on the Kornmarkt of the fictional town of Velmar,
 * lit by a gibbous moon, dated from moonlit shadows, the moon in the sky and the Weighhouse clock
 * (examples/README.md, example (e)). Its truth is invented demo data; the file's numbers are checked
 * against heliochron's own forward models at the true instant (src/ephemeris/sunPosition.ts,
 * moonPosition.ts, src/geometry/), which are checked against published values in tests/ephemeris and
 * tests/geometry. The search of a moon-only scene scans every allowed night (docs/moon-evidence.md):
 * here 27 years of five winter months, about a second.
 */
import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';
import { predictRodShadow } from '../../src/geometry/wallShadows.js';
import { predictPoleShadow } from '../../src/geometry/groundShadows.js';
import { renderDateText } from '../../src/report/text.js';
import type { Observation } from '../../src/scene/types.js';
import { expectClose } from '../helpers/expectClose.js';
import { observationOf, truthJdUT as exampleTruthJdUT } from './exampleTruth.js';

const FILE = fileURLToPath(new URL('../../examples/kornmarkt-moonlight.yaml', import.meta.url));
const scene = readSceneFile(FILE);
/** The true instant: 14 January 1821 (Gregorian), 22:30 local apparent time. */
const TRUTH = { year: 1821, month: 1, day: 14, apparentMinutes: 22 * 60 + 30 };

const truthJdUT = (): number => exampleTruthJdUT(scene, TRUTH);
const obs = <K extends Observation['kind']>(id: string, kind: K): Extract<Observation, { kind: K }> => observationOf(scene, id, kind);

describe('kornmarkt-moonlight.yaml: the numbers are the forward models at the true instant, rounded', () => {
  const jd = truthJdUT();
  const sun = sunPosition(jd, scene.site, scene.air);
  const moon = moonPosition(jd, scene.site, scene.air);
  it('is a night view: the sun far below the horizon, the moon high', () => {
    expect(sun.altitudeDeg).toBeLessThan(-18);
    expect(moon.altitudeDeg).toBeGreaterThan(55);
  });
  it('holds the shadows cast by the moon at 22:30 local apparent time, 14 January 1821', () => {
    const pole = obs('lamp-post', 'pole-shadow');
    const rod = obs('weighhouse-bracket', 'rod-shadow');
    expect(pole.light).toBe('moon');
    expect(rod.light).toBe('moon');
    // Slopes and azimuths rounded to the degree, the ratio to 0.02.
    expectClose(pole.shadowAzimuthDeg ?? NaN, predictPoleShadow(moon).shadowAzimuthDeg, 0.5, 'shadow azimuth, deg');
    expectClose(pole.lengthRatio ?? NaN, predictPoleShadow(moon).lengthRatio, 0.01, 'length ratio');
    const predictedRod = predictRodShadow(moon, 262);
    expectClose(rod.slopeDeg ?? NaN, predictedRod.slopeDeg, 0.5, 'rod slope, deg');
    expect(rod.side).toBe(predictedRod.side);
  });
  it('holds the moon of that instant: its place, its lit fraction and the side it is lit on', () => {
    expectClose(obs('moon-place', 'moon-direction').azimuthDeg ?? NaN, moon.azimuthDeg, 0.5, 'moon azimuth, deg');
    expectClose(obs('moon-place', 'moon-direction').altitudeDeg ?? NaN, moon.altitudeDeg, 0.5, 'moon altitude, deg');
    expectClose(obs('moon-phase', 'moon-phase').illuminatedFraction ?? NaN, moon.illuminatedFraction, 0.01, 'lit fraction');
    expectClose(obs('moon-lit-side', 'moon-lit-side').litSideDeg, moon.brightLimbTiltFromVerticalDeg, 2.5, 'lit side, deg');
  });
  it('holds the clock: local mean time, rounded to the minute on a 12-hour dial', () => {
    // Local mean time = local apparent time - equation of time (Meeus 1998 ch. 28).
    const meanMinutes = TRUTH.apparentMinutes - sun.equationOfTimeMinutes;
    const clock = obs('weighhouse-clock', 'clock');
    expect(clock.kept).toEqual({ kind: 'mean' });
    expect(clock.dialHours).toBe(12);
    expectClose(clock.readingMinutes + 12 * 60, meanMinutes, 0.5, 'clock, minutes');
  });
});

describe('kornmarkt-moonlight.yaml: moonlight names a short list of nights, the true one first', () => {
  const answer = solveDates(scene);
  it('ranks 14 January 1821, 22:30 local apparent time, first', () => {
    expect(answer.status).toBe('fits');
    const best = answer.candidates[0];
    expect(best.civilDate).toEqual({ calendar: 'gregorian', year: 1821, month: 1, day: 14 });
    expectClose(best.times.localApparentMinutes, TRUTH.apparentMinutes, 5, 'local apparent time, minutes');
    expectClose(best.chiSquare, 0.14, 0.05, 'best chi-square');
    expect(answer.consistency.flaggedIds).toEqual([]);
  });
  it('leaves four nights of four years alike, each a single night, and says so', () => {
    expect(answer.moon?.years).toEqual([1821, 1822, 1836, 1837]);
    const nights = answer.moon?.alike.map((a) => [a.civilDate.year, a.civilDate.month, a.civilDate.day]);
    expect(nights).toEqual([[1821, 1, 14], [1822, 2, 2], [1836, 1, 29], [1837, 1, 17]]);
    expect(answer.moon?.alike.every((a) => a.deltaChiSquare < 3.841)).toBe(true);
    // The figures quoted in examples/README.md, example (e).
    const delta = (y: number) => answer.moon?.alike.find((a) => a.year === y)?.deltaChiSquare ?? NaN;
    expectClose(delta(1822), 1.0, 0.2, 'Delta chi-square of 1822');
    expectClose(delta(1836), 1.9, 0.2, 'Delta chi-square of 1836');
    expectClose(delta(1837), 2.2, 0.2, 'Delta chi-square of 1837');
    expect(answer.families[0].yearsTold.singledOut).toBe(false);
    // The family's days and hours are those of the four nights (examples/README.md, example (e)), not of the 22 years kept.
    const family = answer.families[0];
    expect(family.summary.startsWith('1821, 1822, 1836 and 1837 (the years that fit alike; 18 other years of this light fit worse')).toBe(true);
    expect([family.fromMonthDay, family.toMonthDay]).toEqual([{ month: 1, day: 14 }, { month: 2, day: 2 }]);
    expect(family.toLocalApparentMinutes - family.fromLocalApparentMinutes).toBeLessThan(10);
    expect(family.yearsTold.alikeSpreadChiSquare).toBeLessThan(3.841);
    // The near-repeats 8 and 11 years after and before; 1813 and 1832 fit far worse.
    expect(answer.moon?.nearRepeats.map((n) => n.year).sort()).toEqual([1813, 1829, 1832]);
    for (const y of [1813, 1832]) {
      const r = answer.moon?.nearRepeats.find((n) => n.year === y);
      expect(r?.fitsAlike).toBe(false);
      expect(r?.deltaChiSquare ?? 0).toBeGreaterThan(3.841);
    }
    expectClose(answer.moon?.nearRepeats.find((n) => n.year === 1813)?.deltaChiSquare ?? NaN, 51.5, 1, 'Delta chi-square of 1813');
    expectClose(answer.moon?.nearRepeats.find((n) => n.year === 1832)?.deltaChiSquare ?? NaN, 40.4, 1, 'Delta chi-square of 1832');
    expect(answer.moon?.nearRepeats.find((n) => n.year === 1829)?.deltaChiSquare).toBeNull();
    const text = renderDateText(answer, scene);
    expect(text).toContain('1821, 1822, 1836 and 1837 (the light and the moon together cannot tell these years apart)');
    expect(text).toContain('A painted moon may be a convention');
  });
  it('puts each of the nights alike among the candidates, with the hour near 22:30', () => {
    for (const a of answer.moon?.alike ?? []) {
      const c = answer.candidates.find((x) => x.civilDate.year === a.civilDate.year && x.civilDate.month === a.civilDate.month && x.civilDate.day === a.civilDate.day);
      expect(c, `${a.year}`).toBeDefined();
      expectClose(c?.times.localApparentMinutes ?? NaN, TRUTH.apparentMinutes, 10, `local apparent time in ${a.year}, minutes`);
    }
  });
});
