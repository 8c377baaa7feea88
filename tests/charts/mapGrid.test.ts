import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import { readSceneText } from '../../src/scene/readScene.js';
import type { Scene } from '../../src/scene/types.js';
import { resolvePixelObservations } from '../../src/image/resolvePixels.js';
import { buildEvidenceModel, type EvidenceModel } from '../../src/solver/evidenceModel.js';
import { chiSquareOnDayMinuteGrid, nuisancesOfCandidate, type DayMinuteGridSpec } from '../../src/solver/chiSquareGrid.js';
import { isLitByMoonAlone } from '../../src/solver/moonSearch.js';
import { civilDateToJd, resolveCalendarRule } from '../../src/calendar/regions.js';
import { daylightMinuteRange, nightMinuteRange } from '../../src/charts/dateHourMapData.js';
import { mapGrid } from '../../src/charts/mapGrid.js';
import { FIT_BANDS } from '../../src/charts/palette.js';

/** Every example scene of the repository (examples/*.yaml and examples/*\/*.yaml). */
const EXAMPLES = [
  'examples/fischertor-crescent.yaml',
  'examples/kornmarkt-moonlight.yaml',
  'examples/kornplatz-figures/kornplatz-figures-variant.yaml',
  'examples/kornplatz-figures/kornplatz-figures.yaml',
  'examples/marktgasse-print.yaml',
  'examples/salt-house-sketch.yaml',
  'examples/tanners-hall-photo/tanners-hall-photo.yaml',
  'examples/upper-gate-drawing.yaml',
];

const PALEST = FIT_BANDS[FIT_BANDS.length - 1].maxDeltaChiSquare;

/**
 * The skipping grid against the exhaustive one, point by point: every point the skipping grid
 * leaves unfinished is above the ceiling in the exhaustive grid, every other point carries the
 * exhaustive value to the last bit, and the tracks are the same. Returns how many were left.
 */
function compareWithExhaustive(model: EvidenceModel, spec: DayMinuteGridSpec, ceilingAboveMinimum: number): { left: number; points: number } {
  const full = chiSquareOnDayMinuteGrid(model, spec);
  const ceiling = full.minimum + ceilingAboveMinimum;
  // The contours up to the 95% bound (dateHourMap.ts), from a reference as the map takes it.
  const level = FIT_BANDS[1].maxDeltaChiSquare;
  const quick = mapGrid(model, { ...spec, ceiling }, { referenceBound: full.minimum, level });
  let left = 0;
  const differing: string[] = []; // collected, so that a grid of thousands of points costs one expect
  full.values.forEach((row, j) =>
    row.forEach((v, i) => {
      const q = quick.values[j][i];
      if (q === Infinity && !(v === Infinity)) {
        left += 1;
        if (!(v > ceiling)) differing.push(`point (${j}, ${i}) left unfinished with the value ${v}, under the ceiling ${ceiling}`);
      } else if (!Object.is(q, v)) {
        differing.push(`point (${j}, ${i}): ${q}, exhaustive ${v}`); // the same number, to the last bit
      }
    }),
  );
  // Every corner of a square with a corner at or under the contour level carries its exact value
  // (when the ceiling lies above that level, as the map's does: the palest band is beyond it).
  for (let j = 0; ceilingAboveMinimum >= level && j + 1 < full.values.length; j += 1) {
    for (let i = 0; i + 1 < full.values[j].length; i += 1) {
      const corners = [[j, i], [j, i + 1], [j + 1, i + 1], [j + 1, i]] as const;
      if (!corners.some(([b, a]) => full.values[b][a] - full.minimum <= level)) continue;
      for (const [b, a] of corners) if (!Object.is(quick.values[b][a], full.values[b][a])) differing.push(`corner (${b}, ${a}) of a square a contour may cross: ${quick.values[b][a]}, exhaustive ${full.values[b][a]}`);
    }
  }
  expect(differing).toEqual([]);
  expect(quick.left).toBe(left);
  expect(quick.evaluations).toBe(full.evaluations);
  expect(quick.tracks).toEqual(full.tracks);
  // The smallest finished value, as far as the map reads it (the smaller of it and a reference under the ceiling).
  expect(Math.min(quick.minimum, ceiling)).toBe(Math.min(full.minimum, ceiling));
  return { left, points: full.evaluations };
}

function exampleModel(path: string): { scene: Scene; model: EvidenceModel } {
  const scene = resolvePixelObservations(readSceneFile(path)).scene;
  return { scene, model: buildEvidenceModel(scene) };
}

describe('the map grid leaves blocks beyond the palest band unfinished (mapGrid.ts)', () => {
  it.each(EXAMPLES)('gives the exhaustive grid at every point it computes, and leaves only points above the ceiling: %s', (path) => {
    const { scene, model } = exampleModel(path);
    const byMoon = isLitByMoonAlone(model);
    const rule = resolveCalendarRule(scene.calendar);
    const year = Math.round((scene.window.fromYear + scene.window.toYear) / 2);
    const jan1 = civilDateToJd(rule, { year, month: 1, day: 1 });
    // The whole year every third day at 10 minutes (the moon's scenes: 40 nights, their moon evaluated at every point).
    const [from, to] = byMoon ? nightMinuteRange(scene.site.latitudeDeg) : daylightMinuteRange(scene.site.latitudeDeg);
    const days = byMoon ? 40 : 122;
    const spec: DayMinuteGridSpec = {
      dayJd0s: Array.from({ length: days }, (_, i) => jan1 + (byMoon ? 150 + i : 3 * i)),
      minutes: Array.from({ length: Math.floor((to - from) / 10) + 1 }, (_, j) => from + 10 * j),
      assumedClock: null,
      nuisances: nuisancesOfCandidate(model, undefined),
    };
    const { left, points } = compareWithExhaustive(model, spec, PALEST + 1e-6);
    expect(left).toBeGreaterThan(0);
    expect(left).toBeLessThan(points);
  }, 120_000);

  it('does so on random scenes: latitude, walls, facts, shadows, days, hours and ceiling drawn at random (property test)', () => {
    const sceneArb = fc.record({
      latitudeDeg: fc.double({ min: -66, max: 66, noNaN: true }),
      wallADeg: fc.integer({ min: 0, max: 359 }),
      wallBDeg: fc.integer({ min: 0, max: 359 }),
      shaded: fc.boolean(),
      right: fc.boolean(),
      stated: fc.boolean(),
      wallShadows: fc.boolean(),
      slopeDeg: fc.integer({ min: 5, max: 85 }),
      poleAzimuthDeg: fc.integer({ min: 0, max: 359 }),
      lengthRatio: fc.double({ min: 0.3, max: 4, noNaN: true }),
      year: fc.integer({ min: 1000, max: 2000 }),
      firstDay: fc.integer({ min: 0, max: 340 }),
      dayStep: fc.integer({ min: 1, max: 4 }),
      minuteStep: fc.constantFrom(5, 10, 20),
      above: fc.double({ min: 0, max: 80, noNaN: true }),
      air: fc.boolean(),
    });
    fc.assert(
      fc.property(sceneArb, (s) => {
        const scene = readSceneText(
          [
            'heliochron: 1',
            'title: Random scene (invented)',
            `site: { latitudeDeg: ${s.latitudeDeg}, longitudeDeg: 9.35, elevationM: 410 }`,
            'calendar: gregorian',
            'yearStart: jan1',
            `window: { fromYear: ${s.year}, toYear: ${s.year} }`,
            ...(s.air ? ['air: { pressureHPa: 1040, temperatureC: -20 }'] : []),
            'walls:',
            `  - { id: a, azimuthDeg: ${s.wallADeg}, azimuthSigmaDeg: 1 }`,
            `  - { id: b, azimuthDeg: ${s.wallBDeg}, azimuthSigmaDeg: 1 }`,
            'observations:',
            `  - { id: rod, kind: rod-shadow, wall: a, slopeDeg: ${s.slopeDeg}, side: ${s.right ? 'right' : 'left'}, sigmaDeg: 2 }`,
            `  - { id: post, kind: pole-shadow, shadowAzimuthDeg: ${s.poleAzimuthDeg}, shadowAzimuthSigmaDeg: 3, lengthRatio: ${s.lengthRatio}, lengthRatioSigma: 0.1 }`,
            `  - { id: side, kind: ${s.shaded ? 'wall-shaded' : 'wall-lit'}, wall: b }`,
            ...(s.wallShadows ? [`  - { id: cornice, kind: overhang-shadow, wall: a, depthRatio: ${s.lengthRatio / 2}, sigma: 0.05 }`, `  - { id: pier, kind: fin-shadow, wall: b, widthRatio: ${s.lengthRatio / 3}, side: ${s.right ? 'left' : 'right'}, sigma: 0.05 }`] : []),
            ...(s.stated ? [`  - { id: stated, kind: sun-direction, azimuthDeg: ${s.poleAzimuthDeg}, azimuthSigmaDeg: 4, altitudeDeg: ${s.slopeDeg / 2}, altitudeSigmaDeg: 3 }`] : []),
          ].join('\n'),
          'random.yaml',
        );
        const model = buildEvidenceModel(scene);
        const jan1 = civilDateToJd(resolveCalendarRule(scene.calendar), { year: s.year, month: 1, day: 1 });
        const spec: DayMinuteGridSpec = {
          dayJd0s: Array.from({ length: 24 }, (_, i) => jan1 + s.firstDay + s.dayStep * i),
          minutes: Array.from({ length: Math.floor(1440 / s.minuteStep) + 1 }, (_, j) => s.minuteStep * j),
          assumedClock: null,
          nuisances: nuisancesOfCandidate(model, undefined),
        };
        compareWithExhaustive(model, spec, s.above);
      }),
      { numRuns: 150 },
    );
  }, 120_000);
});
