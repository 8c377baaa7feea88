/**
 * Each object-shadow pair as a great circle of the sky, each shadow wedge as a lune, through a camera found
 * from the picture's lines (src/image/sunConstraints.ts, src/geometry/skyPlanes.ts).
 *
 * Synthetic pinhole cameras (H&Z 2nd ed. sec. 6.1, eq. (6.8); tests/image/syntheticCamera.ts) look at boxes of
 * buildings with figures and posts whose shadows fall on steps and uneven paving under a known sun
 * (tests/image/boxScene.ts; shadow points by explicit ray-plane intersection, not by the code under test).
 * The Monte Carlo below recomputes each circle's normal from the refitted camera with its own few lines,
 * n = R^T (K^-1 o x K^-1 s) (H&Z sec. 8.6: the plane through the centre and an image line), not through
 * the code under test.
 */
import { describe, expect, test } from 'vitest';
import { createRandom } from '../../src/math/random.js';
import { solveCamera } from '../../src/image/camera.js';
import { cameraFromParameters, cameraParameters } from '../../src/image/cameraModel.js';
import { cameraErrorComponents, pairConstraint, wedgeConstraint } from '../../src/image/sunConstraints.js';
import { planeCameraSigmaDeg, planeClickSigmaDeg, planeDistanceDeg, sideViolation, sunCircleResidual } from '../../src/geometry/skyPlanes.js';
import { cameraInputOf, pairInputsOf, randomBoxPicture, type BoxPicture } from './boxScene.js';
import { cross, normalise, sunVector, type Vec3 } from './syntheticCamera.js';

const CASES = Number(process.env.PERSP_CASES ?? 200);
const MC_SAMPLES = 300;

function pictures(seed: number, count: number, pairs = 5): { pic: BoxPicture; rng: ReturnType<typeof createRandom> }[] {
  const rng = createRandom(seed);
  const out: { pic: BoxPicture; rng: ReturnType<typeof createRandom> }[] = [];
  for (let tries = 0; out.length < count && tries < count * 50; tries++) {
    const pic = randomBoxPicture(rng, { pairs });
    if (pic) out.push({ pic, rng });
  }
  expect(out.length).toBe(count);
  return out;
}

/** The normal of the plane through the camera centre and two image points, site frame (independent of the code under test). */
function circleNormal(core: { focalLengthPx: number; principalPointPx: readonly [number, number]; rotation: readonly (readonly number[])[] }, o: readonly number[], s: readonly number[]): Vec3 {
  const ray = (p: readonly number[]): Vec3 => [(p[0] - core.principalPointPx[0]) / core.focalLengthPx, (p[1] - core.principalPointPx[1]) / core.focalLengthPx, 1];
  const m = cross(ray(o), ray(s));
  const r = core.rotation;
  return normalise([r[0][0] * m[0] + r[1][0] * m[1] + r[2][0] * m[2], r[0][1] * m[0] + r[1][1] * m[1] + r[2][1] * m[2], r[0][2] * m[0] + r[1][2] * m[1] + r[2][2] * m[2]]);
}

describe('a single object-shadow pair: its great circle through the camera', () => {
  test('without clicking noise the true sun lies on every great circle (residual below 1e-9) and on the pair\'s arc', () => {
    let worst = 0;
    for (const { pic, rng } of pictures(11, 50)) {
      const camera = solveCamera(cameraInputOf(pic, rng, 0, 1));
      const errors = cameraErrorComponents(camera);
      const s = sunVector(pic.sun.azimuthDeg, pic.sun.altitudeDeg);
      for (const pair of pairInputsOf(pic, rng, 0, 1)) {
        const c = pairConstraint(camera, errors, pair);
        const r = sunCircleResidual({ circle: c.circle }, pic.sun).residuals[0];
        worst = Math.max(worst, Math.abs(r), Math.abs(planeDistanceDeg(c.circle.normal, s)));
        expect(sideViolation(c.sides, s).sigmas).toBe(0);
        // the anti-sun lies on the same circle but not on the arc
        expect(sideViolation(c.sides, [-s[0], -s[1], -s[2]]).sigmas).toBeGreaterThan(0);
      }
    }
    console.log(`  worst |residual| of the true sun on a pair's great circle, no noise: ${worst.toExponential(2)}`);
    expect(worst).toBeLessThan(1e-9);
  });

  test(`with 1 px clicks the sigma of the sun's distance from a circle (clicks and camera) matches the Monte Carlo within 15% in 95% of ${CASES} pictures`, () => {
    const ratios: number[] = [];
    for (const { pic, rng } of pictures(12, CASES)) {
      const input = cameraInputOf(pic, rng, 1, 1);
      const camera = solveCamera(input);
      const errors = cameraErrorComponents(camera);
      const pair = pairInputsOf(pic, rng, 1, 1)[0];
      const c = pairConstraint(camera, errors, pair);
      const s = sunVector(pic.sun.azimuthDeg, pic.sun.altitudeDeg);
      const sigma = Math.hypot(planeClickSigmaDeg(c.circle, s), planeCameraSigmaDeg(c.circle, s));
      // Monte Carlo: every click of the camera's lines and of the pair, the camera refitted
      const { p0, sigmas } = cameraParameters(input);
      const orient = camera.vanishingPoints.map((v) => v.homogeneous);
      const n0 = circleNormal(camera.core, pair.objectPx, pair.shadowPx);
      let sum = 0;
      let sumSq = 0;
      for (let k = 0; k < MC_SAMPLES; k++) {
        const q = p0.map((p, i) => p + sigmas[i] * rng.normal());
        const core = cameraFromParameters(input, camera.method, q, orient);
        const o = [pair.objectPx[0] + rng.normal(), pair.objectPx[1] + rng.normal()];
        const sh = [pair.shadowPx[0] + rng.normal(), pair.shadowPx[1] + rng.normal()];
        let n = circleNormal(core, o, sh);
        if (n[0] * n0[0] + n[1] * n0[1] + n[2] * n0[2] < 0) n = [-n[0], -n[1], -n[2]];
        const d = planeDistanceDeg(n, s);
        sum += d;
        sumSq += d * d;
      }
      const mc = Math.sqrt((sumSq - (sum * sum) / MC_SAMPLES) / (MC_SAMPLES - 1));
      ratios.push(sigma / mc);
    }
    // a sampled camera with no real focal length (f^2 < 0) gives no finite spread: counted as a miss
    const noSpread = ratios.filter((r) => !Number.isFinite(r)).length;
    const off = ratios.map((r) => (Number.isFinite(r) ? Math.abs(r - 1) : Infinity)).sort((a, b) => a - b);
    const within = off.filter((x) => x <= 0.15).length / off.length;
    const finite = off.filter(Number.isFinite);
    console.log(
      `  great-circle distance: first-order sigma / Monte Carlo spread, median |ratio - 1| ${off[Math.floor(off.length / 2)].toFixed(3)}, within 15% in ${(100 * within).toFixed(1)}% of ${CASES} pictures ` +
        `(${noSpread} with no finite Monte Carlo spread, counted as misses), worst finite ${finite[finite.length - 1].toFixed(2)}`,
    );
    expect(within).toBeGreaterThanOrEqual(0.95);
  });
});

describe('a shadow wedge: the object point known only within an angular range', () => {
  test('the true sun always lies inside the wedge of a shadow whose object point lies in it: exactly without noise, within 3 sigma (clicks and camera) with 1 px clicks (200 wedges each)', () => {
    for (const noisePx of [0, 1]) {
      let checked = 0;
      let worstDeg = 0;
      let worstSigmas = 0;
      for (const { pic, rng } of pictures(13, 40)) {
        const camera = solveCamera(cameraInputOf(pic, rng, noisePx, 1));
        const errors = cameraErrorComponents(camera);
        const s = sunVector(pic.sun.azimuthDeg, pic.sun.altitudeDeg);
        for (const pair of pairInputsOf(pic, rng, noisePx, 1)) {
          // bounding points on either side of the direction to the object point, at random angles of 3 to 40 deg
          const dx = pair.objectPx[0] - pair.shadowPx[0];
          const dy = pair.objectPx[1] - pair.shadowPx[1];
          const turn = (deg: number, len: number): [number, number] => {
            const a = (deg * Math.PI) / 180;
            return [pair.shadowPx[0] + len * (Math.cos(a) * dx - Math.sin(a) * dy), pair.shadowPx[1] + len * (Math.sin(a) * dx + Math.cos(a) * dy)];
          };
          const w = wedgeConstraint(camera, errors, { field: 'observations[0]', shadowPx: pair.shadowPx, edgesPx: [turn(3 + 37 * rng.uniform(), 0.3 + rng.uniform()), turn(-3 - 37 * rng.uniform(), 0.3 + rng.uniform())], sigmaPx: 1 });
          for (const edge of w.edges) {
            const outside = Math.max(0, -planeDistanceDeg(edge.normal, s));
            worstDeg = Math.max(worstDeg, outside);
            worstSigmas = Math.max(worstSigmas, outside / Math.hypot(planeClickSigmaDeg(edge, s), planeCameraSigmaDeg(edge, s)));
          }
          checked++;
        }
      }
      console.log(`  ${checked} wedges, ${noisePx} px clicks: the true sun at most ${worstDeg.toExponential(2)} deg outside, ${worstSigmas.toFixed(2)} sigma (clicks and camera)`);
      expect(checked).toBe(200);
      if (noisePx === 0) expect(worstDeg).toBeLessThan(1e-9);
      else expect(worstSigmas).toBeLessThan(3);
    }
  });

  test('a wedge rules out a sun on the wrong side: the sun of the shadow mirrored about the wedge', () => {
    const [{ pic, rng }] = pictures(14, 1);
    const camera = solveCamera(cameraInputOf(pic, rng, 0, 1));
    const errors = cameraErrorComponents(camera);
    const pair = pairInputsOf(pic, rng, 0, 1)[0];
    const dx = pair.objectPx[0] - pair.shadowPx[0];
    const dy = pair.objectPx[1] - pair.shadowPx[1];
    // a wedge of +/-10 deg about the true direction, and the same wedge turned by 90 deg (a wrong reading)
    const at = (deg: number): [number, number] => {
      const a = (deg * Math.PI) / 180;
      return [pair.shadowPx[0] + Math.cos(a) * dx - Math.sin(a) * dy, pair.shadowPx[1] + Math.sin(a) * dx + Math.cos(a) * dy];
    };
    const s = sunVector(pic.sun.azimuthDeg, pic.sun.altitudeDeg);
    const right = wedgeConstraint(camera, errors, { field: 'observations[0]', shadowPx: pair.shadowPx, edgesPx: [at(-10), at(10)], sigmaPx: 1 });
    const wrong = wedgeConstraint(camera, errors, { field: 'observations[0]', shadowPx: pair.shadowPx, edgesPx: [at(80), at(100)], sigmaPx: 1 });
    expect(sideViolation(right.edges, s).sigmas).toBe(0);
    const v = sideViolation(wrong.edges, s);
    console.log(`  the true sun against a wedge turned by 90 deg: ${v.degrees.toFixed(1)} deg outside, ${v.sigmas.toFixed(0)} sigma`);
    expect(v.degrees).toBeGreaterThan(5);
    expect(v.sigmas).toBeGreaterThan(10);
  });
});

describe('edge cases', () => {
  test('a wedge narrower than 1 deg or wider than 170 deg, or an edge point on the shadow point, is refused naming the field', () => {
    const [{ pic, rng }] = pictures(15, 1);
    const camera = solveCamera(cameraInputOf(pic, rng, 0, 1));
    const errors = cameraErrorComponents(camera);
    const s: [number, number] = [1000, 1000];
    const wedge = (a: [number, number], b: [number, number]) => () => wedgeConstraint(camera, errors, { field: 'observations[2]', shadowPx: s, edgesPx: [a, b], sigmaPx: 1 });
    expect(wedge([1100, 1000], [1200, 1000.5])).toThrow(/observations\[2\]\.edgesPx.*at least 1 deg apart/);
    expect(wedge([1100, 1000], [900, 1001])).toThrow(/observations\[2\]\.edgesPx.*at most 170 deg apart/);
    expect(wedge([1001, 1000], [1000, 1100])).toThrow(/observations\[2\]\.edgesPx\[0\]/);
  });

  test('a pair whose line runs through the vertical vanishing point is refused as before, naming its shadow point', () => {
    const [{ pic, rng }] = pictures(16, 1);
    const camera = solveCamera(cameraInputOf(pic, rng, 0, 1));
    const errors = cameraErrorComponents(camera);
    const v = camera.vanishingPoints.find((r) => r.direction.kind === 'vertical')!.pointPx!;
    const o: [number, number] = [1600, 1200];
    const towards: [number, number] = [o[0] + 0.2 * (v[0] - o[0]), o[1] + 0.2 * (v[1] - o[1])];
    expect(() => pairConstraint(camera, errors, { field: 'observations[4]', objectPx: o, shadowPx: towards, sigmaPx: 1 })).toThrow(/observations\[4\]\.shadowPx.*vertical/);
  });
});
