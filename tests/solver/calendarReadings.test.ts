/**
 * A scene whose window touches a disputed switch is solved under every reading; the answer names
 * the day under each and says which reading fits. The test scene is invented: a sun direction
 * computed by the project's own sun model for Julian 25 December 1582, 11:00 local apparent time, at
 * 47.62 N 9.35 E (heliochron sun --date 1582-12-25 --calendar julian --time 11:00 --clock apparent:
 * azimuth 165.444, altitude 18.350), in a town reckoning by Holland's calendar, with a documentary
 * bound "not before 1 December 1582" and the year 1582 (both in the town's own reckoning).
 */
import { describe, expect, it } from 'vitest';
import { readSceneText } from '../../src/scene/readScene.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { calendarReadings, calendarReadingsLines } from '../../src/solver/calendarReadings.js';

const SCENE = `heliochron: 1
title: Test scene, a winter view reckoned by Holland's calendar (invented data)
site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 }
calendar: holland
window: { fromYear: 1582, toYear: 1582, notBefore: 1582-12-01 }
observations:
  - { id: sun, kind: sun-direction, azimuthDeg: 165.444, azimuthSigmaDeg: 0.1, altitudeDeg: 18.350, altitudeSigmaDeg: 0.05 }
`;

describe('calendarReadings', () => {
  it('solves under both readings of Holland\'s switch: the Plakaet reading fits, and the day is named under each', () => {
    const scene = readSceneText(SCENE, 'holland.yaml');
    const main = solveDates(scene);
    const r = calendarReadings(scene, main, (s) => solveDates(s));
    expect(r).not.toBeNull();
    expect(r!.outcomes.map((o) => o.ruleText)).toEqual(['holland', 'holland@placaet']);
    const [grotefend, placaet] = r!.outcomes;
    // Under the Plakaet reading the true day, 25 December 1582, is still December 1582 in the town: it fits.
    expect(placaet.best?.civilDate).toEqual({ calendar: 'julian', year: 1582, month: 12, day: 25 });
    expect(placaet.best!.chiSquare).toBeLessThan(0.5);
    // Under Grotefend's reading that day was called 4 January 1583, outside the window: the best left fits badly.
    expect(grotefend.best!.chiSquare).toBeGreaterThan(10);
    expect(r!.fitting).toEqual(['placaet']);
    expect(r!.verdict).toMatch(/sources disagree/);
    const text = calendarReadingsLines(r!).join('\n');
    expect(text).toContain('25 December 1582 (Julian)');
    expect(text).toContain('holland@placaet');
    expect(text).toContain('Grotefend');
    expect(text).toContain('sizes.com');
  }, 120000);
  it('names the same instant twice when the window allows both names: only the name depends on the reading', () => {
    const scene = readSceneText(SCENE.replace('toYear: 1582, notBefore: 1582-12-01', 'toYear: 1583, notBefore: 1582-12-15, notAfter: 1583-01-20'), 'holland.yaml');
    const main = solveDates(scene);
    const r = calendarReadings(scene, main, (s) => solveDates(s))!;
    const [grotefend, placaet] = r.outcomes;
    expect(grotefend.best?.civilDate).toEqual({ calendar: 'gregorian', year: 1583, month: 1, day: 4 });
    expect(placaet.best?.civilDate).toEqual({ calendar: 'julian', year: 1582, month: 12, day: 25 });
    expect(r.sameInstant).toBe(true);
    expect(r.fitting).toEqual(['grotefend1941', 'placaet']);
    expect(r.verdict).toMatch(/only the name of the day depends on the reading/);
  }, 120000);
  it('is null when the window does not touch a disputed switch', () => {
    const scene = readSceneText(SCENE.replace('fromYear: 1582, toYear: 1582, notBefore: 1582-12-01', 'fromYear: 1650, toYear: 1651'), 'holland.yaml');
    expect(calendarReadings(scene, solveDates(scene), (s) => solveDates(s))).toBeNull();
  }, 120000);
});
