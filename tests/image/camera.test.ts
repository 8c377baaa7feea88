/**
 * The picture's camera from vanishing lines, and the sun from object-shadow
 * pairs through it, on synthetic pinhole cameras (random pose, focal length,
 * principal point offset; H&Z 2nd ed. sec. 6.1) looking at boxes of
 * buildings with a known sun (tests/image/boxScene.ts builds the 3-D scene
 * and projects it; shadow points by explicit ray-plane intersection there,
 * not by the code under test).
 */
import { describe, expect, test } from 'vitest';
import { Matrix, SingularValueDecomposition, inverse } from 'ml-matrix';
import { createRandom } from '../../src/math/random.js';
import { angleDiffDeg } from '../../src/math/angles.js';
import { InvalidInputError } from '../../src/errors.js';
import { CAMERA_OUTPUTS, cameraOutputs, solveCamera } from '../../src/image/camera.js';
import { cameraFromParameters, cameraParameters, rotationAngleDeg, type CameraInput } from '../../src/image/cameraModel.js';
import { compareShadowSets, sunFromShadowPairs, sunFromShadowPairsFunction } from '../../src/image/cameraSun.js';
import { monteCarloSpread } from '../../src/image/propagation.js';
import { homogeneousToPixels } from '../../src/image/vanishingPoint.js';
import { expectClose } from '../helpers/expectClose.js';
import { cameraInputOf, pairInputsOf, randomBoxPicture, trueRotation, type BoxOptions, type BoxPicture } from './boxScene.js';
import { add, project, scale, type Camera, type Vec3 } from './syntheticCamera.js';

const CASES = 200;
const MC_SAMPLES = 300;

function pictures(seed: number, count: number, options: BoxOptions = {}): { pics: BoxPicture[]; rng: ReturnType<typeof createRandom> } {
  const rng = createRandom(seed);
  const pics: BoxPicture[] = [];
  while (pics.length < count) {
    const pic = randomBoxPicture(rng, options);
    if (pic) pics.push(pic);
  }
  return { pics, rng };
}

/** Only the vertical family and the first wall's. */
const withoutSecondWall = (input: CameraInput): CameraInput => ({ ...input, families: input.families.slice(0, 2) });

function sunError(sun: { azimuthDeg: number; altitudeDeg: number }, pic: BoxPicture): number {
  // angle between the two directions, degrees (common practice: spherical law of cosines in vector form)
  const v = (az: number, alt: number): number[] => {
    const a = (az * Math.PI) / 180;
    const h = (alt * Math.PI) / 180;
    return [Math.sin(a) * Math.cos(h), Math.cos(a) * Math.cos(h), Math.sin(h)];
  };
  const a = v(sun.azimuthDeg, sun.altitudeDeg);
  const b = v(pic.sun.azimuthDeg, pic.sun.altitudeDeg);
  const c = [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
  return (Math.atan2(Math.hypot(...c), a[0] * b[0] + a[1] * b[1] + a[2] * b[2]) * 180) / Math.PI;
}

describe('synthetic cameras, no clicking noise: the camera and the sun equal the truth', () => {
  test('three square directions (orthocentre): focal length within 0.1%, principal point, rotation and sun within 0.01 deg (60 pictures)', () => {
    const { pics, rng } = pictures(101, 60);
    let worst = { f: 0, p: 0, r: 0, s: 0 };
    for (const pic of pics) {
      // stated sigma 0.1 px: no vanishing point is then within two sigma of infinity
      const cam = solveCamera(cameraInputOf(pic, rng, 0, 0.1));
      expect(cam.method.kind).toBe('orthocentre');
      const sun = sunFromShadowPairs(cam, pairInputsOf(pic, rng, 0, 1));
      worst = {
        f: Math.max(worst.f, Math.abs(cam.focalLengthPx.value / pic.camera.focalPx - 1)),
        p: Math.max(worst.p, Math.hypot(cam.principalPointPx[0].value - pic.camera.principal[0], cam.principalPointPx[1].value - pic.camera.principal[1])),
        r: Math.max(worst.r, rotationAngleDeg(cam.rotation, trueRotation(pic.camera))),
        s: Math.max(worst.s, sunError(sun, pic)),
      };
      expect(cam.perspectiveConsistent).toBe(true);
    }
    console.log(
      `noise-free, orthocentre: worst focal length error ${worst.f.toExponential(2)} (relative), principal point ${worst.p.toExponential(2)} px, ` +
        `rotation ${worst.r.toExponential(2)} deg, sun direction ${worst.s.toExponential(2)} deg`,
    );
    expect(worst.f).toBeLessThan(1e-3);
    expect(worst.p).toBeLessThan(0.01);
    expect(worst.r).toBeLessThan(0.01);
    expect(worst.s).toBeLessThan(0.01);
  });

  test('two square directions with the principal point at the centre, and a given focal length: same tolerances (50 pictures each)', () => {
    const { pics, rng } = pictures(102, 50, { centredPrincipal: true });
    let worst = { f: 0, r: 0, s: 0, rGiven: 0, sGiven: 0 };
    for (const pic of pics) {
      const cam = solveCamera(withoutSecondWall(cameraInputOf(pic, rng, 0, 1)));
      expect(cam.method.kind).toBe('centre-and-pairs');
      expect(cam.principalPointAssumed).toBe(true);
      expect(cam.methodNote).toContain("ASSUMED at the picture's centre");
      const pairs = pairInputsOf(pic, rng, 0, 1);
      const given = solveCamera(withoutSecondWall(cameraInputOf(pic, rng, 0, 1, pic.camera.focalPx)));
      expect(given.method.kind).toBe('given-focal-length');
      worst = {
        f: Math.max(worst.f, Math.abs(cam.focalLengthPx.value / pic.camera.focalPx - 1)),
        r: Math.max(worst.r, rotationAngleDeg(cam.rotation, trueRotation(pic.camera))),
        s: Math.max(worst.s, sunError(sunFromShadowPairs(cam, pairs), pic)),
        rGiven: Math.max(worst.rGiven, rotationAngleDeg(given.rotation, trueRotation(pic.camera))),
        sGiven: Math.max(worst.sGiven, sunError(sunFromShadowPairs(given, pairs), pic)),
      };
    }
    console.log(
      `noise-free, centre assumed: worst focal ${worst.f.toExponential(2)}, rotation ${worst.r.toExponential(2)} deg, sun ${worst.s.toExponential(2)} deg; ` +
        `focal length given: rotation ${worst.rGiven.toExponential(2)} deg, sun ${worst.sGiven.toExponential(2)} deg`,
    );
    expect(worst.f).toBeLessThan(1e-3);
    for (const x of [worst.r, worst.s, worst.rGiven, worst.sGiven]) expect(x).toBeLessThan(0.01);
  });

  test('agrees with an independent construction: the image of the absolute conic solved linearly with ml-matrix (H&Z Algorithm 8.2)', () => {
    // Independent construction (not a published worked example: none with numbers was found): H&Z 2nd ed. sec. 8.8.1,
    // Example 8.27 / Algorithm 8.2: with zero skew and square pixels omega = [[w1, 0, w2], [0, w1, w3], [w2, w3, w4]];
    // each square pair gives v_i^T omega v_j = 0, one linear equation in (w1..w4); the null vector by ml-matrix's SVD,
    // then K from omega^-1 = K K^T. Vanishing points here are projected directly by the synthetic camera.
    const { pics } = pictures(103, 20);
    for (const pic of pics) {
      const c = pic.camera;
      const vp = (d: readonly number[]): number[] => {
        const x = [c.right, c.down, c.forward].map((axis) => axis[0] * d[0] + axis[1] * d[1] + axis[2] * d[2]);
        return [c.focalPx * x[0] + c.principal[0] * x[2], c.focalPx * x[1] + c.principal[1] * x[2], x[2]];
      };
      const a = (pic.wallAzimuthsDeg[0] - 90) * (Math.PI / 180);
      const b = (pic.wallAzimuthsDeg[1] - 90) * (Math.PI / 180);
      const vs = [vp([0, 0, 1]), vp([Math.sin(a), Math.cos(a), 0]), vp([Math.sin(b), Math.cos(b), 0])];
      const rows = [[0, 1], [0, 2], [1, 2]].map(([i, j]) => {
        const [p, q] = [vs[i], vs[j]];
        return [p[0] * q[0] + p[1] * q[1], p[0] * q[2] + p[2] * q[0], p[1] * q[2] + p[2] * q[1], p[2] * q[2]];
      });
      const svd = new SingularValueDecomposition(new Matrix([...rows, [0, 0, 0, 0]]));
      const w = svd.rightSingularVectors.getColumn(3);
      const omega = new Matrix([[w[0], 0, w[1]], [0, w[0], w[2]], [w[1], w[2], w[3]]]);
      const inv = inverse(omega); // K K^T up to scale and sign
      const s = inv.get(2, 2);
      const px = inv.get(0, 2) / s;
      const py = inv.get(1, 2) / s;
      const f = Math.sqrt(inv.get(0, 0) / s - px * px);
      // ours, from clicked lines through the same camera, noise-free
      const rng = createRandom(5);
      const cam = solveCamera(cameraInputOf(pic, rng, 0, 1));
      expectClose(cam.focalLengthPx.value, f, 1e-6 * f, 'focal length against the IAC construction');
      expectClose(cam.principalPointPx[0].value, px, 1e-4, 'principal x against the IAC construction');
      expectClose(cam.principalPointPx[1].value, py, 1e-4, 'principal y against the IAC construction');
      // and the vanishing points themselves
      cam.vanishingPoints.forEach((r, k) => {
        const mine = homogeneousToPixels(r.homogeneous, cam.core.frame)!;
        expectClose(mine[0], vs[k][0] / vs[k][2], 1e-6 * Math.abs(vs[k][0] / vs[k][2]) + 1e-6, `vanishing point ${k} x`);
        expectClose(mine[1], vs[k][1] / vs[k][2], 1e-6 * Math.abs(vs[k][1] / vs[k][2]) + 1e-6, `vanishing point ${k} y`);
      });
    }
  });
});

function summary(name: string, ratios: readonly number[], flagged: readonly boolean[]): { median: number; within: number; missed: number } {
  const dev = ratios.map((r) => (Number.isFinite(r) ? Math.abs(r - 1) : Infinity)).sort((x, y) => x - y);
  const median = dev[Math.floor(dev.length / 2)];
  const within = dev.filter((d) => d <= 0.15).length / dev.length;
  const missed = ratios.filter((r, i) => !flagged[i] && !(Math.abs(r - 1) <= 0.3)).length;
  console.log(
    `${name}: ${ratios.length} cases, median |propagated/MC - 1| ${median.toFixed(3)}, within 15%: ${(100 * within).toFixed(1)}%, ` +
      `${flagged.filter(Boolean).length} flagged not first-order reliable, ${missed} unflagged cases off by more than 30%`,
  );
  return { median, within, missed };
}

describe('synthetic cameras, 1 px clicking noise: first-order sigma against the Monte Carlo spread', () => {
  // 300 samples: the MC sigma itself scatters by about 1/sqrt(2 * 300) = 4.1% (common practice).
  test(`focal length, rotation and sun direction in ${CASES} pictures (3200 x 2400 px)`, () => {
    const { pics, rng } = pictures(2026, CASES);
    const names = ['focal length', 'rotation about east', 'rotation about north', 'rotation about up', 'sun azimuth', 'sun altitude'];
    const ratios: number[][] = names.map(() => []);
    const flags: boolean[][] = names.map(() => []);
    let meetingFailures = 0;
    let families = 0;
    let sunSigmaSum = 0;
    let focalSigmaSum = 0;
    for (const pic of pics) {
      const input = cameraInputOf(pic, rng, 1, 1);
      const cam = solveCamera(input);
      const pairs = pairInputsOf(pic, rng, 1, 1);
      const sun = sunFromShadowPairs(cam, pairs);
      const { p0, sigmas } = cameraParameters(input);
      const orient = cam.vanishingPoints.map((v) => v.homogeneous);
      const mcCam = monteCarloSpread((q) => cameraOutputs(cameraFromParameters(input, cam.method, q, orient), cam.rotation), p0, sigmas, CAMERA_OUTPUTS.map((n) => n === 'viewAzimuthDeg' || n === 'rollDeg'), rng, MC_SAMPLES);
      const chain = sunFromShadowPairsFunction(cam, pairs);
      const mcSun = monteCarloSpread(chain.f, chain.p0, chain.sigmas, [true, false], rng, MC_SAMPLES);
      const first = [cam.focalLengthPx.sigma, ...cam.rotationSigmaDeg, sun.azimuthSigmaDeg, sun.altitudeSigmaDeg];
      const mc = [mcCam.sigmas[0], mcCam.sigmas[3], mcCam.sigmas[4], mcCam.sigmas[5], mcSun.sigmas[0], mcSun.sigmas[1]];
      first.forEach((s, k) => {
        ratios[k].push(s / mc[k]);
        flags[k].push(k < 4 ? !cam.firstOrderReliable : !sun.firstOrderReliable);
      });
      for (const v of cam.vanishingPoints) {
        families++;
        if (!v.meets) meetingFailures++;
      }
      sunSigmaSum += Math.hypot(sun.azimuthSigmaDeg * Math.cos((sun.altitudeDeg * Math.PI) / 180), sun.altitudeSigmaDeg);
      focalSigmaSum += cam.focalLengthPx.sigma / cam.focalLengthPx.value;
    }
    console.log(`mean relative focal-length sigma ${((100 * focalSigmaSum) / CASES).toFixed(2)}%, mean sun-direction sigma ${(sunSigmaSum / CASES).toFixed(2)} deg (1 px clicks)`);
    names.forEach((name, k) => {
      const { median, within, missed } = summary(name, ratios[k], flags[k]);
      expect(within, name).toBeGreaterThanOrEqual(0.95);
      expect(median, name).toBeLessThan(0.06);
      expect(missed, name).toBe(0);
    });
    // lines that truly meet fail the 1% meeting test about 1% of the time (chi-square calibration of the weights)
    console.log(`meeting test: ${meetingFailures} of ${families} families flagged at p < 0.01 (expected about 1%)`);
    expect(meetingFailures / families).toBeLessThan(0.03);
  });
});

describe('edge cases: degenerate input is refused with the field named', () => {
  const { pics, rng } = pictures(301, 3);
  const pic = pics[0];

  const refusal = (f: () => unknown): InvalidInputError => {
    try {
      f();
    } catch (e) {
      if (e instanceof InvalidInputError) return e;
      throw e;
    }
    throw new Error('expected a refusal');
  };

  test('vertical lines parallel in the picture (a level camera) cannot give the focal length with one wall', () => {
    const level = pictures(302, 1, { level: true, centredPrincipal: true });
    const input = withoutSecondWall(cameraInputOf(level.pics[0], level.rng, 0.3, 1));
    const e = refusal(() => solveCamera(input));
    expect(e.field).toBe('camera.verticalLines');
    expect(e.message).toContain('parallel in the picture');
    expect(e.message).toContain('camera.focalLengthPx');
    // with the focal length given, the same lines give the camera
    const cam = solveCamera({ ...input, focalLengthPx: level.pics[0].camera.focalPx });
    expect(cam.vanishingPoints[0].atInfinity).toBe(true);
    expect(rotationAngleDeg(cam.rotation, trueRotation(level.pics[0].camera))).toBeLessThan(0.5);
  });

  test('a single vanishing direction is refused', () => {
    const input = cameraInputOf(pic, rng, 0, 1);
    const e = refusal(() => solveCamera({ ...input, families: input.families.slice(0, 1) }));
    expect(e.field).toBe('camera.wallLines');
    expect(e.message).toContain('One vanishing direction');
  });

  test('a family of one line, and lines that are one line, are refused', () => {
    const input = cameraInputOf(pic, rng, 0, 1);
    const one = { ...input, families: [input.families[0], { ...input.families[1], lines: input.families[1].lines.slice(0, 1) }, input.families[2]] };
    expect(refusal(() => solveCamera(one)).field).toBe('camera.wallLines[0].lines');
    const same = { ...input.families[1], lines: [input.families[1].lines[0], input.families[1].lines[0]] };
    const e = refusal(() => solveCamera({ ...input, families: [input.families[0], same, input.families[2]] }));
    expect(e.field).toBe('camera.wallLines[0].lines');
    expect(e.message).toContain('one line');
  });

  test('a wall azimuth that disagrees with its vanishing point is refused', () => {
    const input = cameraInputOf(pic, rng, 0, 1);
    const wrong = (delta: number): CameraInput => ({
      ...input,
      families: input.families.map((f, i) => (i === 2 && f.direction.kind === 'wall' ? { ...f, direction: { ...f.direction, wallAzimuthDeg: f.direction.wallAzimuthDeg + delta } } : f)),
    });
    for (const delta of [30, 180 - 30]) {
      const e = refusal(() => solveCamera(wrong(delta)));
      expect(e.message).toContain('agrees with the stated wall azimuths');
    }
    // swapped walls
    const swapped: CameraInput = {
      ...input,
      families: [input.families[0], { ...input.families[1], direction: input.families[2].direction }, { ...input.families[2], direction: input.families[1].direction }],
    };
    expect(refusal(() => solveCamera(swapped)).message).toContain('agrees with the stated wall azimuths');
  });

  test('a shadow point directly below its object point (through the vertical vanishing point) is refused', () => {
    const cam = solveCamera(cameraInputOf(pic, rng, 0, 1));
    const pairs = pairInputsOf(pic, rng, 0, 1);
    const foot = project(pic.camera, add(pic.pairs[1].object, [0, 0, -1.2]))!;
    const e = refusal(() => sunFromShadowPairs(cam, [pairs[0], { ...pairs[1], shadowPx: foot }, pairs[2]]));
    expect(e.field).toBe('observations[1].shadowPx');
    expect(e.message).toContain('vanishing point of the verticals');
  });

  test('a pair with object and shadow swapped is refused; one pair alone is refused', () => {
    const cam = solveCamera(cameraInputOf(pic, rng, 0, 1));
    const pairs = pairInputsOf(pic, rng, 0, 1);
    const swapped = { ...pairs[2], objectPx: pairs[2].shadowPx, shadowPx: pairs[2].objectPx };
    const e = refusal(() => sunFromShadowPairs(cam, [pairs[0], pairs[1], swapped, pairs[3]]));
    expect(e.field).toBe('observations[2]');
    expect(e.message).toContain('towards the light');
    expect(refusal(() => sunFromShadowPairs(cam, pairs.slice(0, 1))).message).toContain('great circle');
  });

  test('two lines in a family say that they give no check; three or more are tested', () => {
    const input = cameraInputOf(pic, rng, 0.5, 1);
    const two = { ...input, families: [input.families[0], { ...input.families[1], lines: input.families[1].lines.slice(0, 2) }, input.families[2]] };
    const cam = solveCamera(two);
    expect(cam.vanishingPoints[1].pValue).toBeNull();
    expect(cam.vanishingPoints[1].note).toContain('no check');
    expect(cam.vanishingPoints[0].pValue).not.toBeNull();
  });

  test('a picture built from two viewpoints: the vertical lines do not meet, and the report says so plainly', () => {
    // the second view tilted 15 deg more (another horizon for half of the verticals, as a painter might draw a splice)
    const turn = (a: Vec3, b: Vec3, deg: number): [Vec3, Vec3] => {
      const c = Math.cos((deg * Math.PI) / 180);
      const s = Math.sin((deg * Math.PI) / 180);
      return [add(scale(a, c), scale(b, s)), add(scale(b, c), scale(a, -s))];
    };
    const [down2, forward2] = turn(pic.camera.down, pic.camera.forward, 15);
    const other: Camera = { ...pic.camera, down: down2, forward: forward2 };
    const input = cameraInputOf(pic, createRandom(9), 0.5, 1);
    const otherInput = cameraInputOf({ ...pic, camera: other }, createRandom(9), 0.5, 1);
    const mixed: CameraInput = {
      ...input,
      families: [{ ...input.families[0], lines: input.families[0].lines.map((l, i) => (i % 2 === 0 ? l : otherInput.families[0].lines[i])) }, input.families[1], input.families[2]],
    };
    const cam = solveCamera(mixed);
    expect(cam.vanishingPoints[0].meets).toBe(false);
    expect(cam.perspectiveConsistent).toBe(false);
    expect(cam.notes.join(' ')).toContain('does not follow one consistent perspective');
    const clean = solveCamera(input);
    expect(clean.vanishingPoints[0].meets).toBe(true);
  });

  test('the camera attitude reads as a user expects: view azimuth and tilt of the synthetic camera', () => {
    const cam = solveCamera(cameraInputOf(pic, rng, 0, 1));
    const f = pic.camera.forward;
    const az = ((Math.atan2(f[0], f[1]) * 180) / Math.PI + 360) % 360;
    expect(Math.abs(angleDiffDeg(cam.viewAzimuthDeg.value, az))).toBeLessThan(1e-6);
    expectClose(cam.viewAltitudeDeg.value, (Math.asin(f[2]) * 180) / Math.PI, 1e-6, 'view altitude');
  });
});

describe('the group test on synthetic pictures: calibrated when one sun lights all', () => {
  test('two halves of the pairs under one sun are called different (p < 0.05) about 5% of the time (40 pictures, 1 px clicks)', () => {
    // Under the null hypothesis (one sun) the Delta chi-square with 2 degrees of freedom has P(p < 0.05) = 0.05
    // (NIST/SEMATECH chi-square table); for 40 pictures 7 or more such calls have binomial probability about 0.005.
    const { pics, rng } = pictures(404, 40, { pairs: 6 });
    let calls = 0;
    const ps: number[] = [];
    for (const pic of pics) {
      const cam = solveCamera(cameraInputOf(pic, rng, 1, 1));
      const pairs = pairInputsOf(pic, rng, 1, 1);
      const c = compareShadowSets(cam, pairs.slice(0, 3), pairs.slice(3));
      ps.push(c.pValue);
      if (c.pValue < 0.05) calls++;
    }
    console.log(`group test under one sun: ${calls} of ${pics.length} pictures called different at p < 0.05; median p ${[...ps].sort((a, b) => a - b)[20].toFixed(2)}`);
    expect(calls).toBeLessThanOrEqual(6);
    // and it is not blind: the median p under one sun is far from 0
    expect([...ps].sort((a, b) => a - b)[20]).toBeGreaterThan(0.2);
  });
});
