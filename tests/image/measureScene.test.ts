/** Measuring every pixel observation of a scene, with scene paths in errors (demo data: the fictional town of Velmar). */
import { describe, expect, test } from 'vitest';
import { expectClose } from '../helpers/expectClose.js';
import { measureScenePixels } from '../../src/image/measureScene.js';
import type { Scene } from '../../src/scene/types.js';

// "The Marktgasse view, anonymous print" of Velmar (invented demo): the Tanners' Hall seen head-on,
// a 4 m x 4 m stretch of wall at 100 px per metre: (u, v) -> (100 + 100 u, 900 - 100 v)
const SCENE: Scene = {
  formatVersion: 1,
  title: 'The Marktgasse view, anonymous print',
  site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410, latitudeSigmaDeg: 0, longitudeSigmaDeg: 0 },
  calendar: { kind: 'gregorian' },
  yearStart: 'jan1',
  window: { fromYear: 1700, toYear: 1800 },
  mapNorthCorrectionDeg: 0,
  image: { widthPx: 1000, heightPx: 1000, mirrored: false, pixelSigmaPx: 1 },
  walls: [
    { id: 'granary', azimuthDeg: 90, azimuthSigmaDeg: 0, azimuthSource: 'stated' },
    {
      id: 'tanners-hall', azimuthDeg: 180, azimuthSigmaDeg: 1, azimuthSource: 'from two map points',
      imagePlane: { pointsPx: [[100, 500], [500, 500], [500, 900], [100, 900]], widthM: 4, heightM: 4 },
    },
  ],
  observations: [
    { id: 'clock-face', kind: 'sun-up' },
    { id: 'bracket', kind: 'rod-shadow', wallId: 'tanners-hall', pixels: { fromPx: [300, 400], toPx: [200, 500] } },
    { id: 'cornice', kind: 'overhang-shadow', wallId: 'tanners-hall', pixels: { fromPx: [250, 200], toPx: [320, 350], projectionM: 0.75, projectionSigmaM: 0.03 } },
  ],
  seed: 1,
};

describe('measureScenePixels', () => {
  test('measures each pixel observation once its wall is rectified, keeping scene paths', () => {
    const out = measureScenePixels(SCENE);
    expect(out.measurements.map((m) => m.field)).toEqual(['observations[1]', 'observations[2]']);
    expect([...out.planes.keys()]).toEqual(['walls[1].imagePlane']);
    const rod = out.measurements[0].measurement;
    if (rod.kind !== 'rod-shadow') throw new Error('kind');
    expectClose(rod.slopeDeg.value, 45, 1e-9, 'slope'); // by hand: 1 m left, 1 m down
  });
  test('a wall without imagePlane and an unknown wall id are named by path', () => {
    const noPlane: Scene = { ...SCENE, observations: [{ id: 'b', kind: 'rod-shadow', wallId: 'granary', pixels: { fromPx: [1, 2], toPx: [3, 4] } }] };
    expect(() => measureScenePixels(noPlane)).toThrow(/^walls\[0\]\.imagePlane is missing; /);
    const unknown: Scene = { ...SCENE, observations: [{ id: 'b', kind: 'rod-shadow', wallId: 'chapel', pixels: { fromPx: [1, 2], toPx: [3, 4] } }] };
    expect(() => measureScenePixels(unknown)).toThrow(/^observations\[0\]\.wallId: "chapel"/);
  });
});
