/** Pixel-form observations resolved into numeric ones for the solver (demo data: the fictional town of Velmar). */
import { describe, expect, test } from 'vitest';
import { expectClose } from '../helpers/expectClose.js';
import { hasPixelObservations, resolvePixelObservations } from '../../src/image/resolvePixels.js';
import type { Observation, Scene } from '../../src/scene/types.js';
import { cross, horizontal, normalise, project, shadowOnPlane, sunVector, add, scale, type Camera, type Vec3 } from './syntheticCamera.js';

// The Tanners' Hall seen head-on (invented demo): a 4 m x 4 m stretch of wall at 100 px per metre,
// (u, v) -> (100 + 100 u, 900 - 100 v), so every value below can be worked out by hand.
const FRONTAL: Scene = {
  formatVersion: 1,
  title: "The Tanners' Hall, head-on sketch",
  site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410, latitudeSigmaDeg: 0, longitudeSigmaDeg: 0 },
  calendar: { kind: 'gregorian' },
  yearStart: 'jan1',
  window: { fromYear: 1880, toYear: 1900 },
  mapNorthCorrectionDeg: 0,
  image: { widthPx: 1000, heightPx: 1000, mirrored: false, pixelSigmaPx: 1 },
  walls: [
    {
      id: 'hall-west', azimuthDeg: 270, azimuthSigmaDeg: 1, azimuthSource: 'stated',
      imagePlane: { pointsPx: [[100, 500], [500, 500], [500, 900], [100, 900]], widthM: 4, heightM: 4 },
    },
  ],
  observations: [
    { id: 'hall-lit', kind: 'wall-lit', wallId: 'hall-west' },
    // 1 m left and 1.732 m down: slope atan(1.732) = 60 deg, to the left
    { id: 'bracket', kind: 'rod-shadow', wallId: 'hall-west', pixels: { fromPx: [300, 400], toPx: [200, 573.2] } },
    // shadow 1.5 m below the root line, cornice 0.75 m deep: ratio 2
    { id: 'cornice', kind: 'overhang-shadow', wallId: 'hall-west', pixels: { fromPx: [250, 200], toPx: [320, 350], projectionM: 0.75, projectionSigmaM: 0.03 } },
    // 0.3 m to the right of a 0.6 m pilaster: ratio 0.5, right
    { id: 'pilaster', kind: 'fin-shadow', wallId: 'hall-west', pixels: { fromPx: [600, 700], toPx: [630, 760], projectionM: 0.6, projectionSigmaM: 0 } },
    { id: 'numeric-rod', kind: 'rod-shadow', wallId: 'hall-west', slopeDeg: 40, side: 'left', sigmaDeg: 2 },
  ],
  seed: 5,
};

function obsById(scene: Scene, id: string): Observation {
  return scene.observations.find((o) => o.id === id)!;
}

describe('resolvePixelObservations', () => {
  test('every pixel-form observation gets its numeric value and sigma, worked out by hand on a frontal view', () => {
    const { scene, measurements } = resolvePixelObservations(FRONTAL);
    expect(measurements.map((m) => m.field)).toEqual(['observations[1]', 'observations[2]', 'observations[3]']);
    const rod = obsById(scene, 'bracket');
    if (rod.kind !== 'rod-shadow') throw new Error('kind');
    expectClose(rod.slopeDeg!, 60, 0.01, 'rod slope'); // by hand: atan(1.732 / 1) = 60.0 deg
    expect(rod.side).toBe('left');
    expect(rod.sigmaDeg!).toBeGreaterThan(0);
    expect(rod.pixels).toBeUndefined();
    const cornice = obsById(scene, 'cornice');
    if (cornice.kind !== 'overhang-shadow') throw new Error('kind');
    expectClose(cornice.depthRatio!, 2, 1e-9, 'depth ratio'); // by hand: 1.5 m / 0.75 m
    // the projection's 0.03 m sigma alone gives 2 * 0.03 / 0.75 = 0.08; the clicks add to it
    expect(cornice.sigma!).toBeGreaterThanOrEqual(0.08);
    const fin = obsById(scene, 'pilaster');
    if (fin.kind !== 'fin-shadow') throw new Error('kind');
    expectClose(fin.widthRatio!, 0.5, 1e-9, 'fin ratio'); // by hand: 0.3 m / 0.6 m
    expect(fin.side).toBe('right');
  });

  test('observations already numeric and facts are kept as they are, and the result has no pixel forms left', () => {
    const { scene } = resolvePixelObservations(FRONTAL);
    expect(obsById(scene, 'numeric-rod')).toBe(FRONTAL.observations[4]);
    expect(obsById(scene, 'hall-lit')).toBe(FRONTAL.observations[0]);
    expect(hasPixelObservations(FRONTAL)).toBe(true);
    expect(hasPixelObservations(scene)).toBe(false);
    expect(scene.observations.map((o) => o.id)).toEqual(FRONTAL.observations.map((o) => o.id));
  });

  test('resolving twice changes nothing (idempotent), and a scene without pixel forms is returned unchanged', () => {
    const once = resolvePixelObservations(FRONTAL).scene;
    const twice = resolvePixelObservations(once);
    expect(twice.scene).toBe(once);
    expect(twice.measurements).toEqual([]);
  });

  test('the sigma written is the first-order one when it is reliable, with its source stated', () => {
    const { measurements } = resolvePixelObservations(FRONTAL);
    for (const m of measurements) {
      for (const v of m.values) {
        expect(v.sigmaSource).toBe('first-order');
        expect(v.sigma).toBe(v.firstOrderSigma);
      }
      expect(m.monteCarlo).toBeUndefined();
    }
  });

  test('a degenerate plane is refused with the path in the scene file', () => {
    const collinear: Scene = {
      ...FRONTAL,
      walls: [{ ...FRONTAL.walls[0], imagePlane: { pointsPx: [[100, 500], [300, 500], [500, 500], [100, 900]], widthM: 4, heightM: 4 } }],
    };
    expect(() => resolvePixelObservations(collinear)).toThrow(/^walls\[0\]\.imagePlane\.pointsPx\[\d\]: .*no three lie on one line/);
  });
});

// A perspective view (pinhole camera, Hartley and Zisserman 2003, sec. 6.1) of a west wall with a rod,
// the rod's shadow found by intersecting the sun ray with the wall plane (elementary ray-plane geometry),
// compared with the closed form tan(slope) = tan(altitude) / |sin HSA| (ASHRAE Handbook - Fundamentals,
// Fenestration: vertical shadow angle tan VSA = tan a / cos HSA; the rod slope is VSA over HSA on the wall).
describe('resolvePixelObservations on a perspective picture', () => {
  const wallAz = 270; // facing west
  const normal = horizontal(wallAz);
  const eu = horizontal(wallAz - 90); // u points to azimuth normal - 90 (docs/conventions.md)
  const up: Vec3 = [0, 0, 1];
  const wallPoint = (u: number, v: number): Vec3 => add(scale(eu, u), scale(up, v));
  const sun = { azimuthDeg: 250, altitudeDeg: 35 }; // HSA = -20: the shadow runs down to the left
  const s = sunVector(sun.azimuthDeg, sun.altitudeDeg);
  const rodRoot = wallPoint(2, 3);
  const rodTip = add(rodRoot, scale(normal, 0.8));
  const shadowTip = shadowOnPlane(rodTip, s, [0, 0, 0], normal);
  const centre: Vec3 = add(add(scale(normal, 9), scale(eu, -1.5)), [0, 0, 1.6]);
  const forward = normalise([wallPoint(2, 2.5)[0] - centre[0], wallPoint(2, 2.5)[1] - centre[1], 2.5 - centre[2]]);
  const right = normalise(cross(forward, up));
  const cam: Camera = { centre, right, down: cross(forward, right), forward, focalPx: 900, principal: [600, 450] };
  const px = (p: Vec3): [number, number] => project(cam, p)!;
  const scene: Scene = {
    ...FRONTAL,
    image: { widthPx: 1200, heightPx: 900, mirrored: false, pixelSigmaPx: 0.5 },
    walls: [{ id: 'hall-west', azimuthDeg: wallAz, azimuthSigmaDeg: 0, azimuthSource: 'stated', imagePlane: { pointsPx: [px(wallPoint(1, 4)), px(wallPoint(3, 4)), px(wallPoint(3, 1)), px(wallPoint(1, 1))], widthM: 2, heightM: 3 } }],
    observations: [{ id: 'bracket', kind: 'rod-shadow', wallId: 'hall-west', pixels: { fromPx: px(rodRoot), toPx: px(shadowTip) } }],
  };

  test('the slope measured through the perspective agrees with the closed form of the shadow angles', () => {
    const hsaRad = ((sun.azimuthDeg - wallAz) * Math.PI) / 180;
    const expected = (Math.atan(Math.tan((sun.altitudeDeg * Math.PI) / 180) / Math.abs(Math.sin(hsaRad))) * 180) / Math.PI;
    const rod = resolvePixelObservations(scene).scene.observations[0];
    if (rod.kind !== 'rod-shadow') throw new Error('kind');
    expectClose(rod.slopeDeg!, expected, 1e-6, 'slope through the camera');
    expect(rod.side).toBe('left');
    expect(rod.sigmaDeg!).toBeGreaterThan(0);
    expect(rod.sigmaDeg!).toBeLessThan(2);
  });

  test('a shadow far outside a tiny clicked figure is not reliable to first order and gets the larger Monte Carlo sigma', () => {
    // a 0.1 m x 0.1 m tile (about 10 px) clicked at 2 px, the shadow measured metres away: strongly extrapolated
    const tile = [px(wallPoint(1.95, 3.1)), px(wallPoint(2.05, 3.1)), px(wallPoint(2.05, 3.0)), px(wallPoint(1.95, 3.0))];
    const far: Scene = {
      ...scene,
      image: { ...scene.image!, pixelSigmaPx: 2 },
      walls: [{ ...scene.walls[0], imagePlane: { pointsPx: tile, widthM: 0.1, heightM: 0.1 } }],
    };
    const { measurements, scene: out } = resolvePixelObservations(far);
    const v = measurements[0].values[0];
    if (v.monteCarloSigma === undefined) {
      // the case must actually exercise the unreliable branch; if the geometry changes, this says so
      throw new Error(`first order was judged reliable (nonlinearity ${measurements[0].measurement.kind === 'rod-shadow' ? measurements[0].measurement.slopeDeg.nonlinearity : '?'})`);
    }
    expect(measurements[0].monteCarlo).toEqual({ seed: far.seed + 0, samples: 1000 });
    expect(v.sigma).toBe(Math.max(v.firstOrderSigma, v.monteCarloSigma));
    const rod = out.observations[0];
    if (rod.kind !== 'rod-shadow') throw new Error('kind');
    expect(rod.sigmaDeg).toBe(v.sigma);
    // repeatable: the same seed gives the same spread
    expect(resolvePixelObservations(far).measurements[0].values[0].monteCarloSigma).toBe(v.monteCarloSigma);
  });
});
