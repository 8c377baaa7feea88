/**
 * Pixel forms -> numeric observations on a frontal picture, where the plane
 * is a pure scaling of the picture and every value follows by hand
 * (common practice: a fronto-parallel view is a similarity, H&Z 2nd ed.
 * sec. 2.4.2), and the refusals of measurements a plane cannot give.
 */
import { describe, expect, test } from 'vitest';
import { expectClose } from '../helpers/expectClose.js';
import { InvalidInputError } from '../../src/errors.js';
import { createRandom } from '../../src/math/random.js';
import { rectifyPlane } from '../../src/image/planeInImage.js';
import { measurePixelObservation, monteCarloPixelObservation } from '../../src/image/pixelObservations.js';
import type { ImageInfo, PlaneInImage } from '../../src/scene/types.js';

const IMAGE: ImageInfo = { widthPx: 1000, heightPx: 1000, mirrored: false, pixelSigmaPx: 1 };
// frontal view, 100 px per metre: wall (u, v) -> pixel (100 + 100 u, 900 - 100 v)
const FRONTAL: PlaneInImage = { pointsPx: [[100, 500], [500, 500], [500, 900], [100, 900]], widthM: 4, heightM: 4 };
const f = 'observations[0]';

describe('pixel observations on a frontal wall', () => {
  const wall = rectifyPlane(FRONTAL, IMAGE, 'wall', 'walls[0].imagePlane');

  test('rod slope: shadow 1 m left and 1 m down is 45 deg down to the left', () => {
    const m = measurePixelObservation({ id: 'r', kind: 'rod-shadow', wallId: 'w', pixels: { fromPx: [300, 400], toPx: [200, 500] } }, wall, f);
    if (m.kind !== 'rod-shadow') throw new Error('kind');
    expectClose(m.slopeDeg.value, 45, 1e-9, 'slope'); // atan(1 / 1) = 45 deg
    expect(m.side).toBe('left');
    expect(m.observation.slopeDeg).toBe(m.slopeDeg.value);
    expect(m.note).toContain('45.00 deg');
    expect(m.rectification.exactlyDetermined).toBe(true);
    // first-order sigma of the two end points alone, by hand: the angle error of a segment of length L px
    // with independent 1 px errors at both ends is sqrt(2) / L rad (common practice)
    const lengthPx = Math.hypot(100, 100);
    expectClose(m.slopeDeg.sigmaFromPoints, (Math.SQRT2 / lengthPx) * (180 / Math.PI), 1e-6, 'sigma from points');
    expect(m.slopeDeg.sigma).toBeGreaterThan(m.slopeDeg.sigmaFromPoints);
  });

  test('overhang ratio: 1.5 m of shadow under a 0.75 m projection is 2, with the projection sigma in the sigma', () => {
    const m = measurePixelObservation(
      { id: 'o', kind: 'overhang-shadow', wallId: 'w', pixels: { fromPx: [250, 200], toPx: [320, 350], projectionM: 0.75, projectionSigmaM: 0.03 } },
      wall, f,
    );
    if (m.kind !== 'overhang-shadow') throw new Error('kind');
    expectClose(m.depthRatio.value, 2, 1e-9, 'ratio'); // 1.5 / 0.75
    expectClose(m.depthRatio.sigmaFromLength, 2 * (0.03 / 0.75), 1e-6, 'sigma from projection'); // r * sigmaP / P
  });

  test('fin ratio and side', () => {
    const m = measurePixelObservation(
      { id: 'fi', kind: 'fin-shadow', wallId: 'w', pixels: { fromPx: [300, 600], toPx: [360, 640], projectionM: 0.5, projectionSigmaM: 0 } },
      wall, f,
    );
    if (m.kind !== 'fin-shadow') throw new Error('kind');
    expectClose(m.widthRatio.value, 1.2, 1e-9, 'ratio'); // 0.6 / 0.5
    expect(m.side).toBe('right');
  });

  test('the Monte Carlo spread of a seeded run is reproducible', () => {
    const obs = { id: 'r', kind: 'rod-shadow', wallId: 'w', pixels: { fromPx: [300, 400], toPx: [200, 500] } } as const;
    const a = monteCarloPixelObservation(obs, wall, f, createRandom(9), 200);
    const b = monteCarloPixelObservation(obs, wall, f, createRandom(9), 200);
    expect(a.sigmas).toEqual(b.sigmas);
    expect(a.sigmas[0]).toBeGreaterThan(0);
  });
});

describe('pole on a ground rectangle', () => {
  // seen straight from above, north up: east = +x, north = -y; first edge due east
  const ground = rectifyPlane({ pointsPx: [[100, 100], [900, 100], [900, 900], [100, 900]], widthM: 8, heightM: 8, firstEdgeAzimuthDeg: 90 }, IMAGE, 'ground', 'groundPlane');
  test('a shadow running south-west has azimuth 225 deg; length over height is the ratio', () => {
    const m = measurePixelObservation({ id: 'p', kind: 'pole-shadow', pixels: { fromPx: [500, 500], toPx: [400, 600], heightM: 2 } }, ground, f);
    if (m.kind !== 'pole-shadow') throw new Error('kind');
    expectClose(m.shadowAzimuthDeg.value, 225, 1e-9, 'azimuth');
    expectClose(m.lengthRatio!.value, Math.SQRT2 / 2, 1e-9, 'ratio'); // sqrt(1^2 + 1^2) m / 2 m
  });
  test('without heightM only the azimuth', () => {
    const m = measurePixelObservation({ id: 'p', kind: 'pole-shadow', pixels: { fromPx: [500, 500], toPx: [500, 400] } }, ground, f);
    if (m.kind !== 'pole-shadow') throw new Error('kind');
    expectClose(m.shadowAzimuthDeg.value, 0, 1e-9, 'azimuth north');
    expect(m.lengthRatio).toBeUndefined();
  });
});

describe('measurements a plane cannot give are refused', () => {
  const aspectWall = rectifyPlane({ pointsPx: FRONTAL.pointsPx, aspect: 1 }, IMAGE, 'wall', 'walls[0].imagePlane');
  test('an aspect-only wall gives a rod slope (angles survive scale) but no overhang ratio', () => {
    const rod = measurePixelObservation({ id: 'r', kind: 'rod-shadow', wallId: 'w', pixels: { fromPx: [300, 400], toPx: [200, 500] } }, aspectWall, f);
    if (rod.kind !== 'rod-shadow') throw new Error('kind');
    expectClose(rod.slopeDeg.value, 45, 1e-9, 'slope');
    expect(() =>
      measurePixelObservation({ id: 'o', kind: 'overhang-shadow', wallId: 'w', pixels: { fromPx: [250, 200], toPx: [320, 350], projectionM: 0.75, projectionSigmaM: 0 } }, aspectWall, f),
    ).toThrow(/walls\[0\]\.imagePlane\.aspect.*metres/);
  });
  test('a rod shadow going up, a point outside the picture, a zero projection', () => {
    const wall = rectifyPlane(FRONTAL, IMAGE, 'wall', 'walls[0].imagePlane');
    const check = (make: () => unknown, field: string): void => {
      expect(make).toThrow(InvalidInputError);
      try { make(); } catch (e) { expect((e as InvalidInputError).field).toBe(field); }
    };
    check(() => measurePixelObservation({ id: 'r', kind: 'rod-shadow', wallId: 'w', pixels: { fromPx: [300, 400], toPx: [200, 300] } }, wall, f), `${f}.pixels.toPx`);
    check(() => measurePixelObservation({ id: 'r', kind: 'rod-shadow', wallId: 'w', pixels: { fromPx: [300, 1400], toPx: [200, 300] } }, wall, f), `${f}.pixels.fromPx`);
    check(() => measurePixelObservation({ id: 'o', kind: 'overhang-shadow', wallId: 'w', pixels: { fromPx: [250, 200], toPx: [320, 350], projectionM: 0, projectionSigmaM: 0 } }, wall, f), `${f}.pixels.projectionM`);
  });
});

describe('rectification residuals', () => {
  // frontal wall at 100 px per metre, 6 plane points: (u, v) -> (100 + 100 u, 900 - 100 v)
  const planeM: [number, number][] = [[0, 4], [4, 4], [4, 0], [0, 0], [2, 1], [1, 3]];
  const exact = planeM.map(([u, v]) => [100 + 100 * u, 900 - 100 * v] as const);
  test('with more than 4 points a consistent perspective leaves a residual within the clicking precision', () => {
    const plane = rectifyPlane({ pointsPx: exact, planePointsM: planeM }, IMAGE, 'wall', 'w');
    const m = measurePixelObservation({ id: 'r', kind: 'rod-shadow', wallId: 'w', pixels: { fromPx: [300, 400], toPx: [200, 500] } }, plane, f);
    expect(m.rectification.rmsPx).toBeLessThan(1e-9);
    expect(m.rectification.note).toContain('within the clicking precision');
  });
  test('one point 15 px off (a misclick or a wrong perspective) shows as a residual of several px', () => {
    const off = exact.map((p, i) => (i === 4 ? ([p[0] + 15, p[1]] as const) : p));
    const plane = rectifyPlane({ pointsPx: off, planePointsM: planeM }, IMAGE, 'wall', 'w');
    const m = measurePixelObservation({ id: 'r', kind: 'rod-shadow', wallId: 'w', pixels: { fromPx: [300, 400], toPx: [200, 500] } }, plane, f);
    expect(m.rectification.rmsPx).toBeGreaterThan(3);
    expect(m.rectification.residualsPx.indexOf(Math.max(...m.rectification.residualsPx))).toBe(4);
    expect(m.rectification.note).toContain('does not follow one perspective');
  });
});
