/**
 * A wall of stated azimuth, and the level ground, put into the picture by the
 * camera alone (no figure of known size), on synthetic pinhole cameras
 * looking at boxes of buildings (tests/image/boxScene.ts builds the scene and
 * projects it, H&Z 2nd ed. sec. 6.1, not by the code under test). The check
 * outside the code: the same rod slope and pole-shadow azimuth measured
 * through a figure of known size (planePointsM taken from the synthetic 3-D
 * points, rectified by the normalised DLT, H&Z Algorithm 4.2), and the
 * Monte Carlo spread of the same clicks for the sigma.
 */
import { describe, expect, test } from 'vitest';
import { InvalidInputError } from '../../src/errors.js';
import { solveCamera } from '../../src/image/camera.js';
import { planeFromCamera } from '../../src/image/planeFromCamera.js';
import { rectifyPlane, type RectifiedPlane } from '../../src/image/planeInImage.js';
import { measurePixelObservation, monteCarloPixelObservation } from '../../src/image/pixelObservations.js';
import { createRandom, type RandomSource } from '../../src/math/random.js';
import type { ImageInfo, PoleShadowObservation, RodShadowObservation } from '../../src/scene/types.js';
import { boxPictures, cameraInputOf, sceneOfPicture, type BoxPicture } from './boxScene.js';
import { resolvePixelObservations } from '../../src/image/resolvePixels.js';
import { readSceneText } from '../../src/scene/readScene.js';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { add, clicker, dot, horizontal, project, scale, type Vec3 } from './syntheticCamera.js';

const CASES = 200;
const MC_SAMPLES = 300;

/** Rod segment on wall a, a ground figure and a pole segment, all inside the picture; null otherwise. */
function measuredScene(pic: BoxPicture): { wallPoints: Vec3[]; rod: [Vec3, Vec3]; groundPoints: Vec3[]; pole: [Vec3, Vec3] } | null {
  const eu = horizontal(pic.wallAzimuthsDeg[0] - 90); // wall u axis (docs/conventions.md)
  const wallPoints = pic.wallA.flat();
  const root = pic.wallA[0][0];
  const rod: [Vec3, Vec3] = [root, add(root, add(scale(eu, 0.9), [0, 0, -1.3]))];
  const groundPoints = [...pic.vertical.map((e) => [e[0][0], e[0][1], 0] as Vec3), ...pic.pairs.map((p) => [p.object[0], p.object[1], 0] as Vec3)];
  const foot: Vec3 = [pic.pairs[0].object[0], pic.pairs[0].object[1], 0];
  const pole: [Vec3, Vec3] = [foot, add(foot, scale(horizontal(pic.sun.azimuthDeg + 180), 2))];
  for (const p of [...rod, ...pole, ...groundPoints]) {
    const q = project(pic.camera, p);
    if (!q || q[0] < 0 || q[0] > pic.widthPx || q[1] < 0 || q[1] > pic.heightPx) return null;
  }
  // figures of 5 or more points, none within 20 px of another in the picture
  const apart = (points: Vec3[]): Vec3[] => {
    const kept: Vec3[] = [];
    for (const p of points) {
      const q = project(pic.camera, p)!;
      if (kept.every((k) => { const r = project(pic.camera, k)!; return Math.hypot(q[0] - r[0], q[1] - r[1]) > 20; })) kept.push(p);
    }
    return kept;
  };
  const wall = apart(wallPoints);
  const ground = apart(groundPoints);
  if (wall.length < 5 || ground.length < 5) return null;
  return { wallPoints: wall, rod, groundPoints: ground, pole };
}

function pictures(seed: number, count: number): { pics: BoxPicture[]; rng: RandomSource } {
  return boxPictures(seed, count, (pic) => measuredScene(pic) !== null, { pairs: 3 });
}

interface Case {
  readonly camWall: RectifiedPlane;
  readonly camGround: RectifiedPlane;
  readonly figWall: RectifiedPlane;
  readonly figGround: RectifiedPlane;
  readonly rod: RodShadowObservation;
  readonly pole: PoleShadowObservation;
}

function caseOf(pic: BoxPicture, rng: RandomSource, noisePx: number): Case {
  const m = measuredScene(pic)!;
  const image: ImageInfo = { widthPx: pic.widthPx, heightPx: pic.heightPx, mirrored: false, pixelSigmaPx: 1 };
  const click = clicker(pic.camera, rng, noisePx, false, pic.widthPx);
  const camera = solveCamera(cameraInputOf(pic, rng, noisePx, 1));
  const eu = horizontal(pic.wallAzimuthsDeg[0] - 90);
  const figWall = rectifyPlane(
    { pointsPx: m.wallPoints.map((p) => project(pic.camera, p)!), planePointsM: m.wallPoints.map((p) => [dot(p, eu), p[2]] as [number, number]) },
    image, 'wall', 'walls[0].imagePlane',
  );
  const figGround = rectifyPlane(
    { pointsPx: m.groundPoints.map((p) => project(pic.camera, p)!), planePointsM: m.groundPoints.map((p) => [p[0], p[1]] as [number, number]) },
    image, 'ground', 'groundPlane',
  );
  return {
    camWall: planeFromCamera(camera, 'wall', image, 'walls[0].imagePlane', { id: 'a', azimuthDeg: pic.wallAzimuthsDeg[0] }),
    camGround: planeFromCamera(camera, 'ground', image, 'groundPlane'),
    figWall,
    figGround,
    rod: { id: 'rod', kind: 'rod-shadow', wallId: 'a', pixels: { fromPx: click(m.rod[0]), toPx: click(m.rod[1]), sigmaPx: 1 } },
    pole: { id: 'pole', kind: 'pole-shadow', pixels: { fromPx: click(m.pole[0]), toPx: click(m.pole[1]), sigmaPx: 1 } },
  };
}

describe('a plane from the camera, no clicking noise: the same values as through a figure of known size', () => {
  test('rod slope and pole-shadow azimuth in 50 pictures agree within 1e-6 deg', () => {
    const { pics, rng } = pictures(7, 50);
    let worstRod = 0;
    let worstPole = 0;
    for (const pic of pics) {
      const c = caseOf(pic, rng, 0);
      const rodCam = measurePixelObservation(c.rod, c.camWall, 'observations[0]');
      const rodFig = measurePixelObservation(c.rod, c.figWall, 'observations[0]');
      const poleCam = measurePixelObservation(c.pole, c.camGround, 'observations[1]');
      const poleFig = measurePixelObservation(c.pole, c.figGround, 'observations[1]');
      if (rodCam.kind !== 'rod-shadow' || rodFig.kind !== 'rod-shadow' || poleCam.kind !== 'pole-shadow' || poleFig.kind !== 'pole-shadow') throw new Error('wrong kind');
      worstRod = Math.max(worstRod, Math.abs(rodCam.slopeDeg.value - rodFig.slopeDeg.value));
      worstPole = Math.max(worstPole, Math.abs(((poleCam.shadowAzimuthDeg.value - poleFig.shadowAzimuthDeg.value + 540) % 360) - 180));
      expect(rodCam.side).toBe(rodFig.side);
      // the truth: the rod segment was built 1.3 m down over 0.9 m along u
      expect(Math.abs(rodCam.slopeDeg.value - (Math.atan2(1.3, 0.9) * 180) / Math.PI)).toBeLessThan(1e-6);
    }
    console.log(`plane from the camera vs figure of known size, 50 pictures, no noise: worst rod slope difference ${worstRod.toExponential(2)} deg, worst pole azimuth difference ${worstPole.toExponential(2)} deg`);
    expect(worstRod).toBeLessThan(1e-6);
    expect(worstPole).toBeLessThan(1e-6);
  });
});

describe('a plane from the camera, 1 px clicking noise: first-order sigma against the Monte Carlo spread', () => {
  // 300 samples: the MC sigma itself scatters by about 1/sqrt(2 * 300) = 4.1% (common practice).
  test(`rod slope and pole-shadow azimuth in ${CASES} pictures`, () => {
    const { pics, rng } = pictures(2027, CASES);
    const ratios: Record<string, number[]> = { 'rod slope': [], 'pole-shadow azimuth': [] };
    let flagged = 0;
    let sumRod = 0;
    let sumPole = 0;
    for (const pic of pics) {
      const c = caseOf(pic, rng, 1);
      const rod = measurePixelObservation(c.rod, c.camWall, 'observations[0]');
      const pole = measurePixelObservation(c.pole, c.camGround, 'observations[1]');
      if (rod.kind !== 'rod-shadow' || pole.kind !== 'pole-shadow') throw new Error('wrong kind');
      const mcRod = monteCarloPixelObservation(c.rod, c.camWall, 'observations[0]', rng, MC_SAMPLES);
      const mcPole = monteCarloPixelObservation(c.pole, c.camGround, 'observations[1]', rng, MC_SAMPLES);
      ratios['rod slope'].push(rod.slopeDeg.sigma / mcRod.sigmas[0]);
      ratios['pole-shadow azimuth'].push(pole.shadowAzimuthDeg.sigma / mcPole.sigmas[0]);
      if (!rod.slopeDeg.firstOrderReliable || !pole.shadowAzimuthDeg.firstOrderReliable) flagged++;
      sumRod += rod.slopeDeg.sigma;
      sumPole += pole.shadowAzimuthDeg.sigma;
      expect(rod.slopeDeg.sigmaFromPlane).toBeGreaterThan(0); // the camera's clicks are carried
    }
    console.log(`mean sigma through the camera (1 px clicks): rod slope ${(sumRod / CASES).toFixed(3)} deg, pole-shadow azimuth ${(sumPole / CASES).toFixed(3)} deg; ${flagged} cases flagged not first-order reliable`);
    for (const [name, list] of Object.entries(ratios)) {
      const dev = list.map((r) => (Number.isFinite(r) ? Math.abs(r - 1) : Infinity)).sort((a, b) => a - b);
      const within = dev.filter((d) => d <= 0.15).length / dev.length;
      console.log(`${name}: ${list.length} cases (${list.filter((r) => !Number.isFinite(r)).length} without a finite ratio), median |propagated/MC - 1| ${dev[Math.floor(dev.length / 2)].toFixed(3)}, within 15%: ${(100 * within).toFixed(1)}%`);
      expect(within, name).toBeGreaterThanOrEqual(0.95);
    }
  }, 900_000); // a generous watchdog, not a timing assertion
});

describe('a scene with a camera block and no figure on the wall', () => {
  test('a rod shadow in pixels on a wall without imagePlane is measured through the camera', () => {
    const { pics, rng } = pictures(13, 1);
    const pic = pics[0];
    const c = caseOf(pic, rng, 0);
    const base = { formatVersion: 1 as const, title: 'box', site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410, latitudeSigmaDeg: 0, longitudeSigmaDeg: 0 }, calendar: { kind: 'gregorian' as const }, yearStart: 'jan1' as const, window: { fromYear: 1850, toYear: 1850 }, mapNorthCorrectionDeg: 0, seed: 1 };
    const scene = sceneOfPicture(pic, rng, 0, 1, base as never);
    const resolved = resolvePixelObservations({ ...scene, observations: [c.rod] });
    const fig = measurePixelObservation(c.rod, c.figWall, 'observations[0]');
    const rod = resolved.scene.observations[0];
    if (rod.kind !== 'rod-shadow' || fig.kind !== 'rod-shadow') throw new Error('wrong kind');
    expect(Math.abs(rod.slopeDeg! - fig.slopeDeg.value)).toBeLessThan(1e-6);
    expect(resolved.planes.get('walls[0].imagePlane')?.definition).toBe('camera');
  });
});

describe('edge cases', () => {
  const KORNPLATZ = readFileSync(fileURLToPath(new URL('../../examples/kornplatz-figures/kornplatz-figures.yaml', import.meta.url)), 'utf8');
  const withObservation = (line: string): string => KORNPLATZ.replace(/\nseed:/, `\n  ${line}\nseed:`);
  test('the reader accepts a rod shadow in pixels on a wall without imagePlane when the scene has a camera', () => {
    const scene = readSceneText(withObservation('- { id: bracket, kind: rod-shadow, wall: kornhaus-front, pixels: { fromPx: [1000, 700], toPx: [1060, 790] } }'), 'k.yaml');
    expect(scene.observations.some((o) => o.id === 'bracket')).toBe(true);
  });
  test('the reader refuses an overhang in pixels on a wall known only through the camera, naming the field', () => {
    expect(() => readSceneText(withObservation('- { id: hood, kind: overhang-shadow, wall: kornhaus-front, pixels: { fromPx: [1000, 700], toPx: [1000, 790], projectionM: 0.5, projectionSigmaM: 0.02 } }'), 'k.yaml'))
      .toThrow(/observations\[\d+\]\.pixels.*imagePlane" of known size/);
  });
  test('the reader refuses a pole height when the ground comes from the camera alone', () => {
    expect(() => readSceneText(withObservation('- { id: post, kind: pole-shadow, pixels: { fromPx: [1292, 1200], toPx: [1500, 1260], heightM: 3, heightSigmaM: 0.1 } }'), 'k.yaml'))
      .toThrow(/observations\[\d+\]\.pixels\.heightM/);
  });
  test('a ratio to a length in metres is refused on a plane from the camera, naming the field', () => {
    const { pics, rng } = pictures(11, 1);
    const c = caseOf(pics[0], rng, 0);
    const pole: PoleShadowObservation = { ...c.pole, pixels: { ...c.pole.pixels!, heightM: 2, heightSigmaM: 0.05 } };
    expect(() => measurePixelObservation(pole, c.camGround, 'observations[1]')).toThrow(InvalidInputError);
    expect(() => measurePixelObservation(pole, c.camGround, 'observations[1]')).toThrow(/observations\[1\]\.pixels.*up to scale/);
  });
  test('a point above the wall\'s horizon line is refused', () => {
    const { pics, rng } = pictures(12, 1);
    const c = caseOf(pics[0], rng, 0);
    // the wall seen from its back: the same points on a wall turned round are not on its visible side
    const image: ImageInfo = { widthPx: pics[0].widthPx, heightPx: pics[0].heightPx, mirrored: false, pixelSigmaPx: 1 };
    const camera = c.camWall.fromCamera!.camera;
    let refused = false;
    try {
      const back = planeFromCamera(camera, 'wall', image, 'walls[0].imagePlane', { id: 'a', azimuthDeg: (pics[0].wallAzimuthsDeg[0] + 180) % 360 });
      measurePixelObservation(c.rod, back, 'observations[0]');
    } catch (e) {
      refused = e instanceof InvalidInputError && /observations\[0\]|walls\[0\]/.test((e as Error).message);
    }
    expect(refused).toBe(true);
  });
});
