/**
 * The group test of the date answer: each labelled part of a picture against the rest, one sun
 * for all or a sun of its own. Scenes of the fictional town of Velmar, forward-computed from known
 * instants with the full ephemeris (src/ephemeris/sunPosition.ts) and the geometry forward models
 * (tests/solver/syntheticScene.ts): the buildings' rod and overhang shadows at one instant, a
 * pole's shadow (the "figures") at the same instant or three hours earlier.
 */
import { describe, expect, it } from 'vitest';
import { solveDates } from '../../src/solver/solveDates.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { civilDateToJd } from '../../src/calendar/regions.js';
import { createRandom } from '../../src/math/random.js';
import type { Observation } from '../../src/scene/types.js';
import { baseScene, syntheticObservations, VELMAR } from './syntheticScene.js';

const WALLS = [
  { id: 'hall-front', azimuthDeg: 215, sigmaDeg: 0 },
  { id: 'hall-side', azimuthDeg: 265, sigmaDeg: 0 },
];
// 1850-06-10 (Gregorian) at 0h UT, then 14:30 and 11:30 UT (about 15:07 and 12:07 local mean time at 9.35 E)
const DAY = civilDateToJd({ kind: 'gregorian' }, { year: 1850, month: 6, day: 10 });
const AFTERNOON = DAY + 14.5 / 24;
const MIDDAY = DAY + 11.5 / 24;

function sceneOf(figuresJdUT: number, seed: number | null) {
  const rng = seed === null ? undefined : createRandom(seed);
  const buildings = syntheticObservations({
    jdUT: AFTERNOON, walls: WALLS, rods: [{ wallId: 'hall-front', sigmaDeg: 0.5 }, { wallId: 'hall-side', sigmaDeg: 0.5 }],
    overhangs: [{ wallId: 'hall-front', sigma: 0.02 }], ...(rng ? { rng } : {}),
  });
  const figures = syntheticObservations({ jdUT: figuresJdUT, walls: WALLS, pole: { azimuthSigmaDeg: 0.5, lengthSigma: 0.02 }, ...(rng ? { rng } : {}) });
  if (!buildings || !figures) throw new Error('the synthetic walls are not lit at the chosen instants');
  const observations: Observation[] = [
    ...buildings.observations.map((o) => ({ ...o, group: 'architecture' })),
    ...figures.observations.map((o) => ({ ...o, id: 'figure-pole', group: 'figures' })),
  ];
  return baseScene(observations, buildings.walls, 1850, 1850);
}

describe('the group test in the date answer', () => {
  it('finds that figures lit by the same sun share the buildings\' light', () => {
    const a = solveDates(sceneOf(AFTERNOON, null));
    const tests = a.groupTests ?? [];
    expect(tests.map((g) => g.group)).toEqual(['architecture', 'figures']);
    for (const g of tests) {
      expect(g.differs, g.sentence).toBe(false);
      expect(g.deltaChiSquare).toBeLessThan(1e-3); // noise-free: one sun fits all exactly
      expect(g.degreesOfFreedom).toBe(2);
    }
    const figures = tests.find((g) => g.group === 'figures')!;
    expect(figures.sentence).toMatch(/^the shadows of "figures" agree with the light of "architecture"/);
    // the figures' own sun is the true sun of the instant (forward ephemeris)
    const sun = sunPosition(AFTERNOON, VELMAR);
    expect(Math.abs(figures.ownSun.azimuthDeg - sun.azimuthDeg)).toBeLessThan(0.01);
    expect(Math.abs(figures.ownSun.altitudeDeg - sun.altitudeDeg)).toBeLessThan(0.01);
  });

  it('names figures lit three hours earlier, with their own sun, and renders the sentence', () => {
    const a = solveDates(sceneOf(MIDDAY, 5));
    const figures = (a.groupTests ?? []).find((g) => g.group === 'figures');
    expect(figures).toBeDefined();
    expect(figures!.differs).toBe(true);
    expect(figures!.pValue).toBeLessThan(0.001);
    expect(figures!.observationIds).toEqual(['figure-pole']);
    expect(figures!.sentence).toMatch(/^the shadows of "figures" do not share the light of "architecture": Delta chi-square [0-9.]+ for 2 degrees of freedom, p < 0.000001; on their own they point to a sun at azimuth /);
    const sun = sunPosition(MIDDAY, VELMAR);
    // the pole alone fixes its sun; with 0.5 deg and 0.02 noise the own sun lies within a few degrees of the truth
    expect(Math.abs(figures!.ownSun.azimuthDeg - sun.azimuthDeg)).toBeLessThan(3);
    expect(Math.abs(figures!.ownSun.altitudeDeg - sun.altitudeDeg)).toBeLessThan(3);
    console.log(figures!.sentence);
  });

  it('with noise at the stated sigmas and one sun, calls a difference rarely (20 seeds)', () => {
    let calls = 0;
    const ps: number[] = [];
    for (let seed = 100; seed < 120; seed++) {
      const a = solveDates(sceneOf(AFTERNOON, seed), { maxCandidates: 3, maxFamilies: 2 });
      const g = (a.groupTests ?? []).find((t) => t.group === 'figures');
      expect(g).toBeDefined();
      ps.push(g!.pValue);
      if (g!.pValue < 0.05) calls++;
    }
    console.log(`group test under one sun, 20 noisy scenes: ${calls} called different at p < 0.05; p-values ${ps.map((p) => p.toFixed(2)).join(' ')}`);
    // about 1 in 20 expected at p < 0.05; 5 or more of 20 has probability below 0.3% (binomial, common practice)
    expect(calls).toBeLessThan(5);
  }, 900_000);
});

describe('edge cases', () => {
  it('gives no group test when no observation carries a group label', () => {
    const scene = sceneOf(AFTERNOON, null);
    const a = solveDates({ ...scene, observations: scene.observations.map(({ group: _g, ...o }) => o as Observation) });
    expect(a.groupTests).toBeUndefined();
  });
  it('skips a group that is the whole picture (no rest to test against)', () => {
    const scene = sceneOf(AFTERNOON, null);
    const a = solveDates({ ...scene, observations: scene.observations.map((o) => ({ ...o, group: 'all' })) });
    expect(a.groupTests).toBeUndefined();
  });
});
