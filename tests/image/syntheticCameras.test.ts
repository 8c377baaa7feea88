/**
 * Measuring on synthetic pictures: a known 3-D wall and ground, rods, an
 * overhang, a fin and a pole with their shadows for a known sun direction
 * (shadow points found by explicit 3-D ray-plane intersection here, not by
 * the code under test), photographed by random pinhole cameras
 * (H&Z 2nd ed. sec. 6.1). Without noise the measurements must equal the 3-D
 * truth; with 1 px clicking noise the first-order sigma (Criminisi, Reid and
 * Zisserman, BMVC 1997) must match the Monte Carlo spread of the same clicks.
 */
import { describe, expect, test } from 'vitest';
import { createRandom, type RandomSource } from '../../src/math/random.js';
import { angleDiffDeg } from '../../src/math/angles.js';
import type {
  FinShadowObservation,
  ImageInfo,
  OverhangShadowObservation,
  PixelPoint,
  PlaneInImage,
  PoleShadowObservation,
  RodShadowObservation,
} from '../../src/scene/types.js';
import { rectifyPlane } from '../../src/image/planeInImage.js';
import { measurePixelObservation, monteCarloPixelObservation } from '../../src/image/pixelObservations.js';
import { add, clicker, dot, horizontal, randomCamera, scale, shadowOnPlane, sub, sunVector, type Vec3 } from './syntheticCamera.js';

const WIDTH = 1600;
const HEIGHT = 1200;
const CASES = 200;
const MC_SAMPLES = 150;

const uniform = (rng: RandomSource, a: number, b: number): number => a + (b - a) * rng.uniform();

interface WallCase {
  readonly image: ImageInfo;
  readonly plane: PlaneInImage;
  readonly rod: RodShadowObservation;
  readonly overhang: OverhangShadowObservation;
  readonly fin: FinShadowObservation;
  readonly truth: { slopeDeg: number; rodSide: string; depthRatio: number; widthRatio: number; finSide: string };
}

/** A wall scene photographed by one random camera; null when the camera does not see everything. */
function wallCase(rng: RandomSource, index: number, noisePx: number): WallCase | null {
  const normalAz = uniform(rng, 0, 360);
  const n = horizontal(normalAz);
  const eu = horizontal(normalAz - 90); // u points to azimuth normal - 90 (docs/conventions.md)
  const ev: Vec3 = [0, 0, 1];
  const origin: Vec3 = [uniform(rng, -50, 50), uniform(rng, -50, 50), 0];
  const wall = (u: number, v: number): Vec3 => add(origin, add(scale(eu, u), scale(ev, v)));
  const hsa = (rng.uniform() < 0.5 ? -1 : 1) * uniform(rng, 20, 65);
  const s = sunVector(normalAz + hsa, uniform(rng, 15, 55));
  // window of known size
  const [u0, v0, ww, wh] = [1, 2, uniform(rng, 1.2, 2.5), uniform(rng, 1.5, 3)];
  const windowWall: [number, number][] = [[u0, v0 + wh], [u0 + ww, v0 + wh], [u0 + ww, v0], [u0, v0]];
  const doorWall: [number, number][] = [[4.2, 0.2], [5.4, 2.4]];
  // rod straight out of the wall and its shadow
  const rodRoot = wall(uniform(rng, 3.5, 5), uniform(rng, 5, 6));
  const rodTip = add(rodRoot, scale(n, uniform(rng, 0.4, 1)));
  const rodShadow = shadowOnPlane(rodTip, s, origin, n);
  // overhang edge at v = 7.5 projecting by p, and the shadow of one of its edge points
  const ve = 7.5;
  const projection = uniform(rng, 0.4, 1.2);
  const overRoot = wall(uniform(rng, 0.5, 3), ve);
  const overShadow = shadowOnPlane(add(wall(uniform(rng, 1, 2.5), ve), scale(n, projection)), s, origin, n);
  // vertical fin at u = 6 and the shadow of its outer edge
  const uf = 6;
  const finDepth = uniform(rng, 0.3, 0.8);
  const finRoot = wall(uf, uniform(rng, 1, 3));
  const finShadow = shadowOnPlane(add(wall(uf, uniform(rng, 1.5, 3)), scale(n, finDepth)), s, origin, n);
  const toWall = (p: Vec3): [number, number] => [dot(sub(p, origin), eu), dot(sub(p, origin), ev)];
  const planeNames = [...windowWall, ...doorWall];
  const planeSites = planeNames.map(([u, v]) => wall(u, v));
  const mustSee = [...planeSites, rodRoot, rodShadow, overRoot, overShadow, finRoot, finShadow];
  const dist = uniform(rng, 6, 25);
  const centre = add(wall(3, 0), add(scale(n, dist), add(scale(eu, uniform(rng, -0.8, 0.8) * dist), [0, 0, 1.5 + uniform(rng, 0, 0.5) * dist])));
  const target = wall(3.5 + uniform(rng, -1, 1), 4.5 + uniform(rng, -1, 1));
  const cam = randomCamera(rng, centre, target, mustSee, WIDTH, HEIGHT);
  if (!cam) return null;
  const mirrored = index % 5 === 0;
  const click: (p: Vec3) => PixelPoint = clicker(cam, rng, noisePx, mirrored, WIDTH);
  const image: ImageInfo = { widthPx: WIDTH, heightPx: HEIGHT, mirrored, pixelSigmaPx: 1 };
  const explicit = index % 2 === 1; // odd cases: 6 explicit plane points, least squares
  const plane: PlaneInImage = explicit
    ? { pointsPx: planeSites.map(click), planePointsM: planeNames }
    : { pointsPx: planeSites.slice(0, 4).map(click), widthM: ww, heightM: wh };
  const rs = toWall(rodShadow);
  const rr = toWall(rodRoot);
  const os = toWall(overShadow);
  const fs = toWall(finShadow);
  return {
    image,
    plane,
    rod: { id: 'rod', kind: 'rod-shadow', wallId: 'w', pixels: { fromPx: click(rodRoot), toPx: click(rodShadow) } },
    overhang: {
      id: 'overhang', kind: 'overhang-shadow', wallId: 'w',
      pixels: { fromPx: click(overRoot), toPx: click(overShadow), projectionM: projection, projectionSigmaM: 0.01 },
    },
    fin: {
      id: 'fin', kind: 'fin-shadow', wallId: 'w',
      pixels: { fromPx: click(finRoot), toPx: click(finShadow), projectionM: finDepth, projectionSigmaM: 0 },
    },
    truth: {
      slopeDeg: (Math.atan2(rr[1] - rs[1], Math.abs(rs[0] - rr[0])) * 180) / Math.PI,
      rodSide: rs[0] < rr[0] ? 'left' : 'right',
      depthRatio: (ve - os[1]) / projection,
      widthRatio: Math.abs(fs[0] - uf) / finDepth,
      finSide: fs[0] < uf ? 'left' : 'right',
    },
  };
}

interface GroundCase {
  readonly image: ImageInfo;
  readonly plane: PlaneInImage;
  readonly pole: PoleShadowObservation;
  readonly truth: { azimuthDeg: number; lengthRatio: number };
}

/** A paving rectangle, a pole and its shadow on level ground, seen from above by one random camera. */
function groundCase(rng: RandomSource, index: number, noisePx: number): GroundCase | null {
  const edgeAz = uniform(rng, 0, 360);
  const [a, b] = [uniform(rng, 2, 4), uniform(rng, 2, 4)];
  // first edge along edgeAz, the next along edgeAz + 90 (clockwise seen from above)
  const c1 = scale(horizontal(edgeAz), a);
  const c3 = scale(horizontal(edgeAz + 90), b);
  const corners: Vec3[] = [[0, 0, 0], c1, add(c1, c3), c3];
  const sunAz = uniform(rng, 0, 360);
  const sunAlt = uniform(rng, 20, 60);
  const s = sunVector(sunAz, sunAlt);
  const foot: Vec3 = [uniform(rng, -3, 3), uniform(rng, -3, 3), 0];
  const height = uniform(rng, 2, 5);
  const tip = shadowOnPlane(add(foot, [0, 0, height]), s, [0, 0, 0], [0, 0, 1]);
  const mid = scale(add(add(corners[2], foot), tip), 1 / 3);
  const centre = add(mid, add(scale(horizontal(uniform(rng, 0, 360)), uniform(rng, 8, 25)), [0, 0, uniform(rng, 3, 15)]));
  const cam = randomCamera(rng, centre, add(mid, [uniform(rng, -1, 1), uniform(rng, -1, 1), 0]), [...corners, foot, tip], WIDTH, HEIGHT);
  if (!cam) return null;
  const mirrored = index % 7 === 0;
  const click: (p: Vec3) => PixelPoint = clicker(cam, rng, noisePx, mirrored, WIDTH);
  return {
    image: { widthPx: WIDTH, heightPx: HEIGHT, mirrored, pixelSigmaPx: 1 },
    plane: { pointsPx: corners.map(click), widthM: a, heightM: b, firstEdgeAzimuthDeg: edgeAz },
    pole: { id: 'pole', kind: 'pole-shadow', pixels: { fromPx: click(foot), toPx: click(tip), heightM: height, heightSigmaM: 0.02 } },
    truth: { azimuthDeg: (sunAz + 180) % 360, lengthRatio: 1 / Math.tan((sunAlt * Math.PI) / 180) },
  };
}

function generate<T>(rng: RandomSource, make: (rng: RandomSource, i: number) => T | null): T[] {
  const out: T[] = [];
  for (let attempt = 0; out.length < CASES && attempt < 50 * CASES; attempt++) {
    const c = make(rng, out.length);
    if (c) out.push(c);
  }
  return out;
}

function summary(name: string, ratios: number[]): { median: number; within: number } {
  const dev = ratios.map((r) => Math.abs(r - 1)).sort((x, y) => x - y);
  const sorted = [...ratios].sort((x, y) => x - y);
  const median = dev[Math.floor(dev.length / 2)];
  const within = dev.filter((d) => d <= 0.15).length / dev.length;
  const worst = Math.abs(sorted[0] - 1) > Math.abs(sorted[sorted.length - 1] - 1) ? sorted[0] : sorted[sorted.length - 1];
  console.log(
    `${name}: ${ratios.length} cases, propagated/MC sigma ratio median ${sorted[Math.floor(sorted.length / 2)].toFixed(3)}, ` +
      `median |ratio-1| ${median.toFixed(3)}, within 15%: ${(100 * within).toFixed(1)}%, worst ratio ${worst.toFixed(3)}`,
  );
  return { median, within };
}

describe('synthetic cameras, no noise: measurements equal the 3-D truth', () => {
  test('rod slope within 0.01 deg, overhang and fin ratios within 1e-4 relative, sides right (200 walls)', () => {
    // truth by explicit 3-D ray-wall intersection (common practice: a shadow point is where the sun ray through the caster meets the plane)
    const cases = generate(createRandom(11), (rng, i) => wallCase(rng, i, 0));
    expect(cases.length).toBe(CASES);
    let worstSlope = 0;
    let worstRatio = 0;
    for (const c of cases) {
      const plane = rectifyPlane(c.plane, c.image, 'wall', 'walls[0].imagePlane');
      const rod = measurePixelObservation(c.rod, plane, 'observations[0]');
      const over = measurePixelObservation(c.overhang, plane, 'observations[1]');
      const fin = measurePixelObservation(c.fin, plane, 'observations[2]');
      if (rod.kind !== 'rod-shadow' || over.kind !== 'overhang-shadow' || fin.kind !== 'fin-shadow') throw new Error('kind');
      expect(rod.side).toBe(c.truth.rodSide);
      expect(fin.side).toBe(c.truth.finSide);
      worstSlope = Math.max(worstSlope, Math.abs(rod.slopeDeg.value - c.truth.slopeDeg));
      worstRatio = Math.max(
        worstRatio,
        Math.abs(over.depthRatio.value / c.truth.depthRatio - 1),
        Math.abs(fin.widthRatio.value / c.truth.widthRatio - 1),
      );
      expect(plane.fit.rms).toBeLessThan(1e-6);
    }
    console.log(`noise-free walls: worst rod slope error ${worstSlope.toExponential(2)} deg, worst relative ratio error ${worstRatio.toExponential(2)}`);
    expect(worstSlope).toBeLessThan(0.01);
    expect(worstRatio).toBeLessThan(1e-4);
  });

  test('pole shadow azimuth within 0.01 deg and length ratio within 1e-4 relative (200 grounds)', () => {
    // truth: a vertical pole's shadow points away from the sun (azimuth + 180) and has length h / tan(altitude) (common practice)
    const cases = generate(createRandom(12), (rng, i) => groundCase(rng, i, 0));
    expect(cases.length).toBe(CASES);
    let worstAz = 0;
    let worstRatio = 0;
    for (const c of cases) {
      const plane = rectifyPlane(c.plane, c.image, 'ground', 'groundPlane');
      const m = measurePixelObservation(c.pole, plane, 'observations[0]');
      if (m.kind !== 'pole-shadow' || !m.lengthRatio) throw new Error('kind');
      worstAz = Math.max(worstAz, Math.abs(angleDiffDeg(m.shadowAzimuthDeg.value, c.truth.azimuthDeg)));
      worstRatio = Math.max(worstRatio, Math.abs(m.lengthRatio.value / c.truth.lengthRatio - 1));
    }
    console.log(`noise-free grounds: worst azimuth error ${worstAz.toExponential(2)} deg, worst relative length-ratio error ${worstRatio.toExponential(2)}`);
    expect(worstAz).toBeLessThan(0.01);
    expect(worstRatio).toBeLessThan(1e-4);
  });
});

describe('synthetic cameras, 1 px clicking noise: first-order sigma matches the Monte Carlo spread', () => {
  // Judged over the cases: median |propagated / MC - 1| below 0.06 and at least 95% of cases within 15%.
  // With 150 samples the MC sigma itself scatters by about 1/sqrt(2 * 150) = 5.8% (common practice), so even an
  // exact first-order sigma shows a median |ratio - 1| of about 0.6745 * 0.058 = 0.039 (median of a half-normal).
  test('rod slope, overhang ratio (walls), pole azimuth and length ratio (grounds)', () => {
    const rng = createRandom(2024);
    const walls = generate(rng, (r, i) => wallCase(r, i, 1));
    const grounds = generate(rng, (r, i) => groundCase(r, i, 1));
    // (the fin ratio is the overhang's computation turned sideways; it is checked without noise above)
    const names = ['rod slope', 'overhang ratio', 'pole azimuth', 'pole length ratio'];
    const ratios: Record<string, number[]> = Object.fromEntries(names.map((k) => [k, []]));
    const flagged: Record<string, boolean[]> = Object.fromEntries(names.map((k) => [k, []]));
    for (const c of walls) {
      const plane = rectifyPlane(c.plane, c.image, 'wall', 'walls[0].imagePlane');
      for (const [name, obs] of [['rod slope', c.rod], ['overhang ratio', c.overhang]] as const) {
        const fo = measurePixelObservation(obs, plane, 'observations[0]');
        const q = fo.kind === 'rod-shadow' ? fo.slopeDeg : fo.kind === 'overhang-shadow' ? fo.depthRatio : fo.kind === 'fin-shadow' ? fo.widthRatio : undefined;
        if (!q) throw new Error('kind');
        const sigma = q.sigma;
        const mc = monteCarloPixelObservation(obs, plane, 'observations[0]', rng, MC_SAMPLES);
        ratios[name].push(sigma / mc.sigmas[0]);
        flagged[name].push(!q.firstOrderReliable);
      }
    }
    for (const c of grounds) {
      const plane = rectifyPlane(c.plane, c.image, 'ground', 'groundPlane');
      const fo = measurePixelObservation(c.pole, plane, 'observations[0]');
      if (fo.kind !== 'pole-shadow' || !fo.lengthRatio) throw new Error('kind');
      const mc = monteCarloPixelObservation(c.pole, plane, 'observations[0]', rng, MC_SAMPLES);
      ratios['pole azimuth'].push(fo.shadowAzimuthDeg.sigma / mc.sigmas[0]);
      ratios['pole length ratio'].push(fo.lengthRatio.sigma / mc.sigmas[1]);
      flagged['pole azimuth'].push(!fo.shadowAzimuthDeg.firstOrderReliable);
      flagged['pole length ratio'].push(!fo.lengthRatio.firstOrderReliable);
    }
    for (const [name, r] of Object.entries(ratios)) {
      expect(r.length).toBe(CASES);
      const { median, within } = summary(name, r);
      // the linearity flag should mark the cases where the first-order sigma is far off
      const off = r.map((x, i) => ({ x, flag: flagged[name][i] }));
      const missed = off.filter((o) => !o.flag && Math.abs(o.x - 1) > 0.3).length;
      console.log(`  ${name}: ${off.filter((o) => o.flag).length} cases flagged as not first-order reliable; ${missed} unflagged cases off by more than 30%`);
      expect(missed).toBe(0);
      expect(median).toBeLessThan(0.06);
      expect(within).toBeGreaterThanOrEqual(0.95);
    }
  });
});
