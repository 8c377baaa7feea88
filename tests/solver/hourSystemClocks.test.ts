/**
 * A clock in Italian hours in a picture: stated, and tried when its keeping is unknown.
 * Invented scene (Velmar, 47.62 N 9.35 E, 410 m): the sun direction and the clock reading were
 * computed by the project's own sun command for 15 June 1700 (Gregorian), 16:00 local apparent time:
 * azimuth 264.833, altitude 37.050; Italian hours 20:01 (heliochron sun --date 1700-06-15 --time 16:00
 * --clock apparent, the line "Italian hours").
 */
import { describe, expect, it } from 'vitest';
import { readSceneText } from '../../src/scene/readScene.js';
import { solveDates } from '../../src/solver/solveDates.js';

const scene = (kept: string): string => `heliochron: 1
title: Test scene, a 24-hour tower clock in Italian hours (invented data)
site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 }
calendar: gregorian
window: { fromYear: 1700, toYear: 1700, months: [5, 6, 7] }
observations:
  - { id: sun, kind: sun-direction, azimuthDeg: 264.833, azimuthSigmaDeg: 0.3, altitudeDeg: 37.050, altitudeSigmaDeg: 0.3 }
  - { id: tower, kind: clock, reading: "20:01", precisionMinutes: 3, hourHandTrusted: true, dialHours: 24${kept} }
`;

describe('clocks in Italian hours', () => {
  it('stated: 15 June 1700 at 16:00 apparent time fits (with its mirror across the solstice, 27 June)', () => {
    const answer = solveDates(readSceneText(scene(', kept: italian'), 'tower.yaml'));
    const truth = answer.candidates.find((c) => c.civilDate.month === 6 && c.civilDate.day === 15);
    expect(truth).toBeDefined();
    expect(truth!.clockAssumption.kind).toBe('italian');
    expect(Math.abs(truth!.times.localApparentMinutes - 960)).toBeLessThan(5);
    expect(truth!.chiSquare).toBeLessThan(2);
  }, 120000);
  it('read as local apparent time instead, the same reading does not fit', () => {
    const answer = solveDates(readSceneText(scene(', kept: apparent'), 'tower.yaml'));
    expect(answer.candidates.every((c) => c.chiSquare > 20)).toBe(true);
  }, 120000);
  it('unknown keeping on a 24-hour dial: Italian hours are tried and fit best', () => {
    const answer = solveDates(readSceneText(scene(''), 'tower.yaml'));
    const kinds = answer.clockAssumptions.map((a) => a.kind);
    expect(kinds).toEqual(expect.arrayContaining(['apparent', 'mean', 'italian', 'babylonian', 'unequal']));
    expect(answer.candidates[0].clockAssumption.kind).toBe('italian');
    expect(answer.candidates[0].clockAssumptionLabel).toMatch(/Italian hours/);
  }, 120000);
});
