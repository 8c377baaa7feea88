/**
 * The moon's direction from its clicked centre (src/image/moonPixels.ts): through the camera found from
 * the picture's lines, and through a wall's or the ground's figure whose homography gives the focal
 * length and rotation (Zhang, IEEE Trans. PAMI 22(11), 2000, sec. 2.3; Hartley and Zisserman, Multiple
 * View Geometry, 2nd ed. 2003, sec. 8.8.1). Synthetic truth: pinhole cameras built by the test helpers
 * (H&Z sec. 6.1, eq. (6.8)), not by the code under test, render a known moon direction; noise-free
 * clicks must give it back to rounding. The first-order sigma is checked against a Monte Carlo that
 * repeats the whole chain on perturbed clicks (H&Z ch. 5: forward propagation of covariance and its
 * Monte Carlo estimate).
 */
import { describe, expect, it } from 'vitest';
import { createRandom, type RandomSource } from '../../src/math/random.js';
import { solveCamera } from '../../src/image/camera.js';
import { rectifyPlane } from '../../src/image/planeInImage.js';
import { moonThroughCamera, moonThroughPlane, vectorToAzimuthAltitude } from '../../src/image/moonPixels.js';
import { monteCarloSpread } from '../../src/image/propagation.js';
import { resolvePixelObservations } from '../../src/image/resolvePixels.js';
import { InvalidInputError } from '../../src/errors.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';
import { predictPoleShadow } from '../../src/geometry/groundShadows.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';
import { angleDiffDeg } from '../../src/math/angles.js';
import type { ImageInfo, Scene } from '../../src/scene/types.js';
import { boxPictures, cameraInputOf, sceneOfPicture } from './boxScene.js';
import { add, horizontal, normalise, project, randomCamera, scale, sunVector, type Camera, type Vec3 } from './syntheticCamera.js';

const W = 3200;
const H = 2400;
const IMAGE: ImageInfo = { widthPx: W, heightPx: H, mirrored: false, pixelSigmaPx: 1 };

/** The site direction (az, alt) a synthetic camera sees at a pixel: the ray right (x - px)/f + down (y - py)/f + forward. */
function trueDirection(cam: Camera, p: readonly [number, number]): [number, number] {
  const d = normalise(add(add(scale(cam.right, (p[0] - cam.principal[0]) / cam.focalPx), scale(cam.down, (p[1] - cam.principal[1]) / cam.focalPx)), cam.forward));
  return vectorToAzimuthAltitude(d);
}

interface MoonPicture {
  readonly cam: Camera;
  readonly moonPx: [number, number];
  readonly moon: { azimuthDeg: number; altitudeDeg: number };
  /** A wall seen at a slant (outward normal azimuth) with points on it, and points on the ground. */
  readonly wallAzimuthDeg: number;
  readonly wallPoints: readonly Vec3[];
  readonly groundPoints: readonly Vec3[];
}

/** A camera 1.6 m above the ground looking towards a moon low in the sky, a wall at a slant before it, the ground below. */
function moonPicture(rng: RandomSource, moonAzimuthDeg: number, moonAltitudeDeg: number): MoonPicture | null {
  const centre: Vec3 = [0, 0, 1.6];
  const moonDir = sunVector(moonAzimuthDeg, moonAltitudeDeg);
  const far = add(centre, scale(moonDir, 1e4));
  // A wall 25 m away, turned 35-60 deg from facing the camera, 12 m high.
  const turn = (rng.uniform() < 0.5 ? -1 : 1) * (35 + 25 * rng.uniform());
  const wallAzimuthDeg = (((moonAzimuthDeg + 180 + turn) % 360) + 360) % 360;
  const wallCentre = add(centre, scale(horizontal(moonAzimuthDeg + 10 * (rng.uniform() - 0.5)), 25));
  const u = horizontal(wallAzimuthDeg - 90);
  const wallPoints: Vec3[] = [];
  for (const a of [-4, -1, 2, 4.5]) for (const z of [1, 5, 9.5]) wallPoints.push(add(add(wallCentre, scale(u, a + rng.uniform() - 0.5)), [0, 0, z - 1.6]));
  const groundPoints: Vec3[] = [];
  for (const dist of [8, 14, 20]) for (const side of [-4, 0, 5]) groundPoints.push(add(add([0, 0, 0], scale(horizontal(moonAzimuthDeg), dist)), scale(horizontal(moonAzimuthDeg + 90), side + rng.uniform())));
  const target = add(centre, scale(sunVector(moonAzimuthDeg, moonAltitudeDeg / 2 - 5), 30));
  let cam = randomCamera(rng, centre, target, [far, ...wallPoints, ...groundPoints], W, H);
  if (!cam) return null;
  cam = { ...cam, principal: [W / 2, H / 2] }; // a plane gives the camera with the principal point at the centre
  for (const p of [far, ...wallPoints, ...groundPoints]) {
    const q = project(cam, p);
    if (!q || q[0] < 0 || q[0] > W || q[1] < 0 || q[1] > H) return null;
  }
  const moonPx = project(cam, far)!;
  const [azimuthDeg, altitudeDeg] = trueDirection(cam, moonPx);
  return { cam, moonPx, moon: { azimuthDeg, altitudeDeg }, wallAzimuthDeg, wallPoints, groundPoints };
}

function pictures(seed: number, count: number): MoonPicture[] {
  const rng = createRandom(seed);
  const out: MoonPicture[] = [];
  while (out.length < count) {
    const pic = moonPicture(rng, 360 * rng.uniform(), 8 + 30 * rng.uniform());
    if (pic) out.push(pic);
  }
  return out;
}

/** Clicks of the wall's points, with noise, and their plane coordinates (u along the wall, v up). */
function wallPlane(pic: MoonPicture, rng: RandomSource | null, noisePx: number) {
  const u = horizontal(pic.wallAzimuthDeg - 90);
  const click = (p: Vec3): [number, number] => {
    const q = project(pic.cam, p)!;
    return rng ? [q[0] + noisePx * rng.normal(), q[1] + noisePx * rng.normal()] : q;
  };
  return rectifyPlane({ pointsPx: pic.wallPoints.map(click), planePointsM: pic.wallPoints.map((p) => [p[0] * u[0] + p[1] * u[1], p[2]] as const) }, IMAGE, 'wall', 'walls[0].imagePlane');
}

function groundPlane(pic: MoonPicture, rng: RandomSource | null, noisePx: number) {
  const click = (p: Vec3): [number, number] => {
    const q = project(pic.cam, p)!;
    return rng ? [q[0] + noisePx * rng.normal(), q[1] + noisePx * rng.normal()] : q;
  };
  return rectifyPlane({ pointsPx: pic.groundPoints.map(click), planePointsM: pic.groundPoints.map((p) => [p[0], p[1]] as const) }, IMAGE, 'ground', 'groundPlane');
}

describe("the moon's direction from its clicked centre", () => {
  it('gives back the direction a known camera renders, through the camera found from vertical edges and wall courses (noise-free, to 1e-8 deg)', () => {
    const { pics, rng } = boxPictures(1301, 6, () => true);
    let worst = 0;
    for (const pic of pics) {
      const camera = solveCamera(cameraInputOf(pic, rng, 0, 1));
      const px: [number, number] = [W * (0.1 + 0.8 * rng.uniform()), H * (0.1 + 0.8 * rng.uniform())];
      const [az, alt] = trueDirection(pic.camera, px);
      const m = moonThroughCamera(camera, px, 1);
      worst = Math.max(worst, Math.abs(angleDiffDeg(m.azimuthDeg, az)), Math.abs(m.altitudeDeg - alt));
    }
    expect(worst).toBeLessThan(1e-8);
  });

  it('gives back the direction through a wall seen at a slant and through the ground, the focal length from the plane alone (noise-free, to 1e-8 deg)', () => {
    let worst = 0;
    let worstFocal = 0;
    for (const pic of pictures(1302, 8)) {
      for (const [plane, az] of [[wallPlane(pic, null, 0), pic.wallAzimuthDeg], [groundPlane(pic, null, 0), undefined]] as const) {
        const m = moonThroughPlane(plane, az, 0, pic.moonPx, 1, 'observations[0].pixels');
        worst = Math.max(worst, Math.abs(angleDiffDeg(m.azimuthDeg, pic.moon.azimuthDeg)), Math.abs(m.altitudeDeg - pic.moon.altitudeDeg));
        worstFocal = Math.max(worstFocal, Math.abs(m.focalLengthPx / pic.cam.focalPx - 1));
      }
    }
    expect(worst).toBeLessThan(1e-8);
    expect(worstFocal).toBeLessThan(1e-9);
  });

  it('has a first-order sigma that agrees with a Monte Carlo of the whole chain (clicks of the plane and of the moon, sigma 1 px) within 15%', () => {
    const pic = pictures(1303, 1)[0];
    const rng = createRandom(7);
    const nominal = moonThroughPlane(wallPlane(pic, null, 0), pic.wallAzimuthDeg, 0, pic.moonPx, 1, 'observations[0].pixels');
    const n = 250;
    let s0 = 0;
    let s1 = 0;
    for (let k = 0; k < n; k += 1) {
      const moonPx: [number, number] = [pic.moonPx[0] + rng.normal(), pic.moonPx[1] + rng.normal()];
      const m = moonThroughPlane(wallPlane(pic, rng, 1), pic.wallAzimuthDeg, 0, moonPx, 1, 'observations[0].pixels');
      s0 += angleDiffDeg(m.azimuthDeg, nominal.azimuthDeg) ** 2;
      s1 += (m.altitudeDeg - nominal.altitudeDeg) ** 2;
    }
    const mc = [Math.sqrt(s0 / n), Math.sqrt(s1 / n)];
    console.log(`moon through a wall: first-order / Monte Carlo sigma, azimuth ${(nominal.azimuthSigmaDeg / mc[0]).toFixed(3)}, altitude ${(nominal.altitudeSigmaDeg / mc[1]).toFixed(3)} (first-order ${nominal.azimuthSigmaDeg.toFixed(3)}, ${nominal.altitudeSigmaDeg.toFixed(3)} deg)`);
    // 250 draws: the sample sigma is good to about 1/sqrt(2 n) = 4.5% (common practice).
    expect(nominal.azimuthSigmaDeg / mc[0]).toBeGreaterThan(0.85);
    expect(nominal.azimuthSigmaDeg / mc[0]).toBeLessThan(1.15);
    expect(nominal.altitudeSigmaDeg / mc[1]).toBeGreaterThan(0.85);
    expect(nominal.altitudeSigmaDeg / mc[1]).toBeLessThan(1.15);
    expect(nominal.firstOrderReliable).toBe(true);
  });

  it('has a first-order sigma through the camera that agrees with a Monte Carlo of the camera refitted on perturbed lines within 15%', () => {
    const { pics, rng } = boxPictures(1304, 1, () => true);
    const pic = pics[0];
    const nominal = moonThroughCamera(solveCamera(cameraInputOf(pic, rng, 0, 1)), [W * 0.6, H * 0.2], 1);
    // The chain as one function of every click (the camera refitted from the perturbed lines inside), sampled.
    const mc = monteCarloSpread(nominal.f, nominal.p0, nominal.sigmas, [true, false], createRandom(8), 1000);
    console.log(`moon through the camera: first-order / Monte Carlo sigma, azimuth ${(nominal.azimuthSigmaDeg / mc.sigmas[0]).toFixed(3)}, altitude ${(nominal.altitudeSigmaDeg / mc.sigmas[1]).toFixed(3)}`);
    expect(nominal.azimuthSigmaDeg / mc.sigmas[0]).toBeGreaterThan(0.85);
    expect(nominal.azimuthSigmaDeg / mc.sigmas[0]).toBeLessThan(1.15);
    expect(nominal.altitudeSigmaDeg / mc.sigmas[1]).toBeGreaterThan(0.85);
    expect(nominal.altitudeSigmaDeg / mc.sigmas[1]).toBeLessThan(1.15);
  });

  it('dates a scene with the moon in pixels as the same scene with the measured azimuth and altitude typed in', () => {
    // Velmar (fictional town), the first day from 1 August 1802 with the sun and the moon both well up at 16:00 local mean
    // time: the sun's shadow and the moon of that instant (synthetic truth).
    const site = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410, latitudeSigmaDeg: 0, longitudeSigmaDeg: 0 };
    const first = calendarDateToJd({ calendar: 'gregorian', year: 1802, month: 8, day: 1 }) + (960 - 4 * site.longitudeDeg) / 1440;
    let jdUT = first;
    while (!(sunPosition(jdUT, site).altitudeDeg > 10 && moonPosition(jdUT, site).altitudeDeg > 10 && moonPosition(jdUT, site).elongationDeg > 40)) jdUT += 1;
    expect(jdUT - first).toBeLessThan(30);
    const sun = sunPosition(jdUT, site);
    const moon = moonPosition(jdUT, site);
    const rng = createRandom(1307);
    let pic: MoonPicture | null = null;
    while (!pic) pic = moonPicture(rng, moon.azimuthDeg, moon.altitudeDeg);
    const pole = predictPoleShadow(sun);
    const base: Scene = {
      formatVersion: 1, title: 'Velmar, the harbour at dawn (synthetic)', site, calendar: { kind: 'gregorian' }, yearStart: 'jan1',
      window: { fromYear: 1795, toYear: 1809 }, mapNorthCorrectionDeg: 0, seed: 1, image: IMAGE, walls: [],
      groundPlane: { pointsPx: pic.groundPoints.map((p) => project(pic!.cam, p)!), planePointsM: pic.groundPoints.map((p) => [p[0], p[1]] as const) },
      observations: [
        { id: 'post', kind: 'pole-shadow', shadowAzimuthDeg: pole.shadowAzimuthDeg, shadowAzimuthSigmaDeg: 1, lengthRatio: pole.lengthRatio, lengthRatioSigma: 0.03 },
        { id: 'moon', kind: 'moon-direction', pixels: { centrePx: pic.moonPx, sigmaPx: 2 } },
        { id: 'phase', kind: 'moon-phase', illuminatedFraction: moon.illuminatedFraction, sigma: 0.05 },
      ],
    };
    const measured = resolvePixelObservations(base).scene.observations[1];
    if (measured.kind !== 'moon-direction' || measured.azimuthDeg === undefined) throw new Error('the moon was not measured');
    expect(angleDiffDeg(measured.azimuthDeg, moon.azimuthDeg)).toBeCloseTo(0, 8);
    const typed: Scene = { ...base, observations: base.observations.map((o) => (o.id === 'moon' ? measured : o)) };
    const a = solveDates(base, { consistency: false, maxCandidates: 3 });
    const b = solveDates(typed, { consistency: false, maxCandidates: 3 });
    expect(a.candidates[0].civilDate).toEqual({ ...b.candidates[0].civilDate });
    expect(a.candidates[0].civilDate.year).toBe(1802);
    expect(a.candidates.map((c) => c.jdUT)).toEqual(b.candidates.map((c) => c.jdUT));
    expect(a.candidates.map((c) => c.chiSquare)).toEqual(b.candidates.map((c) => c.chiSquare));
    expect(a.candidates[0].uncertainty.covariance).toEqual(b.candidates[0].uncertainty.covariance);
  });

  describe('edge cases', () => {
    it('refuses a wall seen face-on: every focal length fits it alike', () => {
      // A camera square to a wall facing south, 20 m away: the wall's lines stay parallel in the picture.
      const cam: Camera = { centre: [0, -20, 1.6], right: [1, 0, 0], down: [0, 0, -1], forward: [0, 1, 0], focalPx: 1500, principal: [W / 2, H / 2] };
      const pts: Vec3[] = [[-4, 0, 1], [4, 0, 1], [4, 0, 8], [-4, 0, 8], [0, 0, 4]];
      // Wall facing south (normal azimuth 180): u along it is azimuth 90, east.
      const plane = rectifyPlane({ pointsPx: pts.map((p) => project(cam, p)!), planePointsM: pts.map((p) => [p[0], p[2]] as const) }, IMAGE, 'wall', 'walls[0].imagePlane');
      expect(() => moonThroughPlane(plane, 180, 0, [W / 2, 300], 1, 'observations[2].pixels')).toThrowError(InvalidInputError);
      expect(() => moonThroughPlane(plane, 180, 0, [W / 2, 300], 1, 'observations[2].pixels')).toThrowError(/face-on/);
    });
    it('refuses a wall seen almost face-on, where the clicks leave the focal length loose', () => {
      const cam: Camera = { centre: [0, -20, 1.6], right: [Math.cos(0.02), Math.sin(0.02), 0], down: [0, 0, -1], forward: [-Math.sin(0.02), Math.cos(0.02), 0], focalPx: 1500, principal: [W / 2, H / 2] };
      const pts: Vec3[] = [[-4, 0, 1], [4, 0, 1], [4, 0, 8], [-4, 0, 8], [0, 0, 4]];
      const plane = rectifyPlane({ pointsPx: pts.map((p) => project(cam, p)!), planePointsM: pts.map((p) => [p[0], p[2]] as const) }, IMAGE, 'wall', 'walls[0].imagePlane');
      expect(() => moonThroughPlane(plane, 180, 0, [W / 2, 300], 1, 'observations[2].pixels')).toThrowError(/observations\[2\]\.pixels\.wall.*(face-on|focal length)/s);
    });
    it('turns a reversed print back before measuring: the same moon clicked on the mirrored picture gives the same direction', () => {
      const pic = pictures(1305, 1)[0];
      const u = horizontal(pic.wallAzimuthDeg - 90);
      const flip = (q: readonly [number, number]): [number, number] => [W - q[0], q[1]];
      const base = (mirrored: boolean): Scene => ({
        formatVersion: 1, title: 'Velmar by night (synthetic)', site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410, latitudeSigmaDeg: 0, longitudeSigmaDeg: 0 },
        calendar: { kind: 'gregorian' }, yearStart: 'jan1', window: { fromYear: 1800, toYear: 1810 }, mapNorthCorrectionDeg: 0, seed: 1,
        image: { ...IMAGE, mirrored },
        walls: [{ id: 'w', azimuthDeg: pic.wallAzimuthDeg, azimuthSigmaDeg: 0, azimuthSource: 'synthetic', imagePlane: {
          pointsPx: pic.wallPoints.map((p) => (mirrored ? flip(project(pic.cam, p)!) : project(pic.cam, p)!)), planePointsM: pic.wallPoints.map((p) => [p[0] * u[0] + p[1] * u[1], p[2]] as const),
        } }],
        observations: [{ id: 'moon', kind: 'moon-direction', pixels: { centrePx: mirrored ? flip(pic.moonPx) : pic.moonPx, wallId: 'w' } }],
      });
      for (const mirrored of [false, true]) {
        const o = resolvePixelObservations(base(mirrored)).scene.observations[0];
        expect(o.kind === 'moon-direction' ? angleDiffDeg(o.azimuthDeg!, pic.moon.azimuthDeg) : NaN).toBeCloseTo(0, 8);
        expect(o.kind === 'moon-direction' ? o.altitudeDeg! - pic.moon.altitudeDeg : NaN).toBeCloseTo(0, 8);
      }
    });
    it('resolves the pixel form through the scene camera when no wall is named', () => {
      const { pics, rng } = boxPictures(1306, 1, () => true);
      const pic = pics[0];
      const scene = sceneOfPicture(pic, rng, 0, 1, {
        formatVersion: 1, title: 'box (synthetic)', site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410, latitudeSigmaDeg: 0, longitudeSigmaDeg: 0 },
        calendar: { kind: 'gregorian' }, yearStart: 'jan1', window: { fromYear: 1800, toYear: 1810 }, mapNorthCorrectionDeg: 0, seed: 1,
      });
      const px: [number, number] = [W * 0.3, H * 0.15];
      const withMoon: Scene = { ...scene, observations: [...scene.observations, { id: 'moon', kind: 'moon-direction', pixels: { centrePx: px, sigmaPx: 2 } }] };
      const r = resolvePixelObservations(withMoon);
      const o = r.scene.observations[r.scene.observations.length - 1];
      const [az, alt] = trueDirection(pic.camera, px);
      expect(o.kind === 'moon-direction' ? angleDiffDeg(o.azimuthDeg!, az) : NaN).toBeCloseTo(0, 8);
      expect(o.kind === 'moon-direction' ? o.altitudeDeg! - alt : NaN).toBeCloseTo(0, 8);
      expect(r.moonDirections?.[0].measured.through).toBe('camera');
      expect(r.moonDirections?.[0].sigmasDeg[0]).toBeGreaterThan(0);
    });
  });
});
