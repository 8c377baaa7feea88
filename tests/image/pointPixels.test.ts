/**
 * Pixel forms of an eave's shadow line and of a caster-shadow point pair, on synthetic pinhole cameras looking
 * at boxes of buildings (tests/image/boxScene.ts and syntheticCamera.ts project known 3-D points, H&Z 2nd ed.
 * sec. 6.1, not the code under test). The checks outside the code: the 3-D truth the clicks were projected
 * from (the sun direction, the eave line's distance built by explicit ray-plane intersection), the eave model
 * of groundShadows.ts for the same sun, and the Monte Carlo spread of the same clicks for the sigma.
 */
import { describe, expect, test } from 'vitest';
import { InvalidInputError } from '../../src/errors.js';
import { predictEaveShadow } from '../../src/geometry/groundShadows.js';
import { solveCamera } from '../../src/image/camera.js';
import { measurePixelObservation, monteCarloPixelObservation } from '../../src/image/pixelObservations.js';
import { planeFromCamera } from '../../src/image/planeFromCamera.js';
import { rectifyPlane, type RectifiedPlane } from '../../src/image/planeInImage.js';
import { resolvePixelObservations } from '../../src/image/resolvePixels.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import type { RandomSource } from '../../src/math/random.js';
import { readSceneText } from '../../src/scene/readScene.js';
import { solveDates } from '../../src/solver/solveDates.js';
import type { EaveShadowObservation, ImageInfo, Observation, Scene, ShadowPointsObservation } from '../../src/scene/types.js';
import { boxPictures, cameraInputOf, type BoxPicture } from './boxScene.js';
import { add, clicker, dot, horizontal, project, scale, shadowOnPlane, sunVector, sub, type Vec3 } from './syntheticCamera.js';
import { VELMAR } from '../solver/syntheticScene.js';

// 1862 June 3, 15:10 UT at Velmar (a made-up instant of the fictional town)
const TRUTH_JD = calendarDateToJd({ calendar: 'gregorian', year: 1862, month: 6, day: 3 }) + (15 + 10 / 60) / 24;
const SUN = sunPosition(TRUTH_JD, VELMAR);

const EAVE_HEIGHT_M = 6;
const EAVE_PROJECTION_M = 2.5;
const CASTER_HEIGHT_M = 2.5;
const CASTER_OUT_M = 0.8;

/** The 3-D points of one picture's measurements; null when a point falls outside the picture or the light does not fit. */
interface Points3 {
  readonly groundFigure: Vec3[];
  readonly wallFigure: Vec3[];
  readonly eave: { foot: Vec3; along: Vec3; shadow: Vec3; truthRatio: number };
  readonly groundPair: { foot: Vec3; caster: Vec3; shadow: Vec3 };
  readonly wallPair: { foot: Vec3; caster: Vec3; shadow: Vec3 };
}

function points3(pic: BoxPicture): Points3 | null {
  const s = sunVector(pic.sun.azimuthDeg, pic.sun.altitudeDeg);
  const azA = pic.wallAzimuthsDeg[0];
  const n = horizontal(azA);
  const eu = horizontal(azA - 90);
  const up: Vec3 = [0, 0, 1];
  if (!(dot(s, n) > 0.15)) return null; // wall a in sun, for the pair on it
  // the eave of wall a: foot line at ground level below a wall point, the edge EAVE_PROJECTION_M out and EAVE_HEIGHT_M up
  const root = pic.wallA[0][0];
  const foot: Vec3 = [root[0], root[1], 0];
  const along = add(foot, scale(eu, 2));
  const edge = add(add(foot, scale(n, EAVE_PROJECTION_M)), scale(up, EAVE_HEIGHT_M));
  const eaveShadow = add(shadowOnPlane(edge, s, [0, 0, 0], up), scale(eu, 0.7));
  const distance = dot(sub(eaveShadow, foot), n);
  if (!(distance > 0.3)) return null;
  // a post on the ground in front of the building, and a bracket end standing out of wall a
  const groundFoot: Vec3 = [pic.pairs[0].object[0], pic.pairs[0].object[1], 0];
  const groundCaster = add(groundFoot, scale(up, CASTER_HEIGHT_M));
  const groundShadow = shadowOnPlane(groundCaster, s, [0, 0, 0], up);
  const wallFoot = pic.wallA[1][0];
  const wallCaster = add(wallFoot, scale(n, CASTER_OUT_M));
  const wallShadow = shadowOnPlane(wallCaster, s, wallFoot, n);
  // figures of 5 or more points, none within 20 px of another in the picture
  const apart = (points: Vec3[]): Vec3[] => {
    const kept: Vec3[] = [];
    for (const p of points) {
      const q = project(pic.camera, p);
      if (q && kept.every((k) => { const r = project(pic.camera, k)!; return Math.hypot(q[0] - r[0], q[1] - r[1]) > 20; })) kept.push(p);
    }
    return kept;
  };
  const groundFigure = apart(pic.vertical.map((e) => [e[0][0], e[0][1], 0] as Vec3));
  const wallFigure = apart(pic.wallA.flat());
  if (groundFigure.length < 5 || wallFigure.length < 5) return null;
  const all = [foot, along, eaveShadow, groundFoot, groundCaster, groundShadow, wallFoot, wallCaster, wallShadow, ...groundFigure, ...wallFigure];
  for (const p of all) {
    const q = project(pic.camera, p);
    if (!q || q[0] < 0 || q[0] > pic.widthPx || q[1] < 0 || q[1] > pic.heightPx) return null;
  }
  return {
    groundFigure, wallFigure,
    eave: { foot, along, shadow: eaveShadow, truthRatio: distance / EAVE_HEIGHT_M },
    groundPair: { foot: groundFoot, caster: groundCaster, shadow: groundShadow },
    wallPair: { foot: wallFoot, caster: wallCaster, shadow: wallShadow },
  };
}

function pictures(seed: number, count: number, sun?: { azimuthDeg: number; altitudeDeg: number }): { pics: BoxPicture[]; rng: RandomSource } {
  return boxPictures(seed, count, (pic) => points3(pic) !== null, { pairs: 2, ...(sun ? { sun } : {}) });
}

interface Case {
  readonly image: ImageInfo;
  readonly ground: RectifiedPlane;
  readonly wall: RectifiedPlane;
  readonly camGround: RectifiedPlane;
  readonly camWall: RectifiedPlane;
  readonly eave: EaveShadowObservation;
  readonly groundPair: ShadowPointsObservation;
  readonly wallPair: ShadowPointsObservation;
  readonly camGroundPair: ShadowPointsObservation;
  readonly camWallPair: ShadowPointsObservation;
  readonly points: Points3;
}

function caseOf(pic: BoxPicture, rng: RandomSource, noisePx: number, sigmaPx: number): Case {
  const p = points3(pic)!;
  const image: ImageInfo = { widthPx: pic.widthPx, heightPx: pic.heightPx, mirrored: false, pixelSigmaPx: sigmaPx };
  const click = clicker(pic.camera, rng, noisePx, false, pic.widthPx);
  const eu = horizontal(pic.wallAzimuthsDeg[0] - 90);
  const ground = rectifyPlane(
    { pointsPx: p.groundFigure.map(click), planePointsM: p.groundFigure.map((q) => [q[0], q[1]] as [number, number]) },
    image, 'ground', 'groundPlane',
  );
  const wall = rectifyPlane(
    { pointsPx: p.wallFigure.map(click), planePointsM: p.wallFigure.map((q) => [dot(q, eu), q[2]] as [number, number]) },
    image, 'wall', 'walls[0].imagePlane',
  );
  const camera = solveCamera(cameraInputOf(pic, rng, noisePx, sigmaPx));
  const pair = (id: string, q: Points3['groundPair'], extra: object): ShadowPointsObservation => ({
    id, kind: 'shadow-points', pixels: { fromPx: click(q.foot), toPx: click(q.shadow), sigmaPx, ...extra },
  });
  return {
    image, ground, wall, points: p,
    camGround: planeFromCamera(camera, 'ground', image, 'groundPlane'),
    camWall: planeFromCamera(camera, 'wall', image, 'walls[0].imagePlane', { id: 'a', azimuthDeg: pic.wallAzimuthsDeg[0] }),
    eave: {
      id: 'eave', kind: 'eave-shadow', wallId: 'a',
      pixels: {
        fromPx: click(p.eave.foot), toPx: click(p.eave.shadow), alongPx: click(p.eave.along), sigmaPx,
        heightM: EAVE_HEIGHT_M, heightSigmaM: 0, projectionM: EAVE_PROJECTION_M, projectionSigmaM: 0,
      },
    },
    groundPair: pair('post', p.groundPair, { heightM: CASTER_HEIGHT_M, heightSigmaM: 0 }),
    wallPair: pair('bracket', p.wallPair, { wallId: 'a', heightM: CASTER_OUT_M, heightSigmaM: 0 }),
    camGroundPair: pair('post', p.groundPair, { objectPx: click(p.groundPair.caster) }),
    camWallPair: pair('bracket', p.wallPair, { wallId: 'a', objectPx: click(p.wallPair.caster) }),
  };
}

const angleDiff = (a: number, b: number): number => Math.abs(((a - b + 540) % 360) - 180);

function sunOf(m: ReturnType<typeof measurePixelObservation>): { az: number; alt: number; azSigma: number; altSigma: number } {
  if (m.kind !== 'shadow-points') throw new Error(`wrong kind ${m.kind}`);
  return { az: m.sunAzimuthDeg.value, alt: m.sunAltitudeDeg.value, azSigma: m.sunAzimuthDeg.sigma, altSigma: m.sunAltitudeDeg.sigma };
}

describe('no clicking noise: the values the 3-D truth was built with', () => {
  test('through a figure of known size: eave distance ratio and the sun direction of point pairs on the ground and on a wall within 1e-9', () => {
    const { pics, rng } = pictures(31, 40);
    let worst = 0;
    for (const pic of pics) {
      const c = caseOf(pic, rng, 0, 1);
      const eave = measurePixelObservation(c.eave, c.ground, 'observations[0]');
      if (eave.kind !== 'eave-shadow') throw new Error('wrong kind');
      worst = Math.max(worst, Math.abs(eave.distanceRatio.value - c.points.eave.truthRatio));
      expect(eave.projectionRatio).toBeCloseTo(EAVE_PROJECTION_M / EAVE_HEIGHT_M, 12);
      // the eave model of groundShadows.ts for the same sun puts the line at the same distance (the shadow point was
      // moved only along the foot line, which does not change its distance)
      const model = predictEaveShadow(pic.sun, pic.wallAzimuthsDeg[0], EAVE_PROJECTION_M / EAVE_HEIGHT_M);
      expect(Math.abs(model.distanceRatio - eave.distanceRatio.value)).toBeLessThan(1e-9);
      const context = { wallAzimuthDeg: pic.wallAzimuthsDeg[0], wallAzimuthSigmaDeg: 0 };
      for (const m of [measurePixelObservation(c.groundPair, c.ground, 'observations[1]'), measurePixelObservation(c.wallPair, c.wall, 'observations[2]', context)]) {
        const s = sunOf(m);
        worst = Math.max(worst, angleDiff(s.az, pic.sun.azimuthDeg), Math.abs(s.alt - pic.sun.altitudeDeg));
      }
    }
    console.log(`figure of known size, 40 pictures, no noise: worst difference from the truth ${worst.toExponential(2)} (ratio or deg)`);
    expect(worst).toBeLessThan(1e-9);
  });

  test('through the camera (planes from camera lines, caster clicked): the sun direction within 1e-9 deg', () => {
    const { pics, rng } = pictures(32, 30);
    let worst = 0;
    for (const pic of pics) {
      const c = caseOf(pic, rng, 0, 1);
      for (const [obs, plane] of [[c.camGroundPair, c.camGround], [c.camWallPair, c.camWall]] as const) {
        const s = sunOf(measurePixelObservation(obs, plane, 'observations[0]'));
        worst = Math.max(worst, angleDiff(s.az, pic.sun.azimuthDeg), Math.abs(s.alt - pic.sun.altitudeDeg));
      }
    }
    console.log(`plane from the camera, 30 pictures, no noise: worst sun-direction difference ${worst.toExponential(2)} deg`);
    expect(worst).toBeLessThan(1e-9);
  });
});

describe('0.5 px clicking noise: first-order sigma against the Monte Carlo spread of the same clicks', () => {
  // 400 samples: the MC sigma itself scatters by about 1/sqrt(2 * 400) = 3.5% (common practice).
  test('eave ratio, ground pair and wall pair (figure of known size), ground pair (camera), 60 pictures', () => {
    const { pics, rng } = pictures(2031, 60);
    const ratios: Record<string, number[]> = { eave: [], 'ground pair altitude': [], 'wall pair altitude': [], 'wall pair azimuth': [], 'camera pair altitude': [] };
    for (const pic of pics) {
      const c = caseOf(pic, rng, 0.5, 0.5);
      const context = { wallAzimuthDeg: pic.wallAzimuthsDeg[0], wallAzimuthSigmaDeg: 0.5 };
      const eave = measurePixelObservation(c.eave, c.ground, 'observations[0]');
      if (eave.kind !== 'eave-shadow') throw new Error('wrong kind');
      ratios.eave.push(eave.distanceRatio.sigma / monteCarloPixelObservation(c.eave, c.ground, 'observations[0]', rng, 400).sigmas[0]);
      const g = sunOf(measurePixelObservation(c.groundPair, c.ground, 'observations[1]'));
      ratios['ground pair altitude'].push(g.altSigma / monteCarloPixelObservation(c.groundPair, c.ground, 'observations[1]', rng, 400).sigmas[1]);
      const w = sunOf(measurePixelObservation(c.wallPair, c.wall, 'observations[2]', context));
      const mcW = monteCarloPixelObservation(c.wallPair, c.wall, 'observations[2]', rng, 400, context);
      ratios['wall pair altitude'].push(w.altSigma / mcW.sigmas[1]);
      ratios['wall pair azimuth'].push(w.azSigma / mcW.sigmas[0]);
      const k = sunOf(measurePixelObservation(c.camGroundPair, c.camGround, 'observations[3]'));
      ratios['camera pair altitude'].push(k.altSigma / monteCarloPixelObservation(c.camGroundPair, c.camGround, 'observations[3]', rng, 400).sigmas[1]);
    }
    for (const [name, list] of Object.entries(ratios)) {
      const dev = list.map((r) => Math.abs(r - 1)).sort((a, b) => a - b);
      const within = list.filter((r) => Math.abs(r - 1) <= 0.2).length / list.length;
      console.log(`${name}: ${list.length} cases, median |first-order/MC - 1| ${dev[Math.floor(dev.length / 2)].toFixed(3)}, within 20%: ${(100 * within).toFixed(1)}%`);
      expect(dev[Math.floor(dev.length / 2)], name).toBeLessThan(0.08);
      expect(within, name).toBeGreaterThanOrEqual(0.9);
    }
  }, 900_000); // a generous watchdog, not a timing assertion
});

describe('a scene with these pixel forms dates as the same scene with the derived values typed in', () => {
  test('the first candidate and its chi-square agree', () => {
    const sun = { azimuthDeg: SUN.azimuthDeg, altitudeDeg: SUN.altitudeDeg };
    const { pics, rng } = pictures(77, 1, sun);
    const pic = pics[0];
    const c = caseOf(pic, rng, 0.3, 0.5);
    const eu = horizontal(pic.wallAzimuthsDeg[0] - 90);
    const scene: Scene = {
      formatVersion: 1, title: 'Velmar, the arcade of the Kornhaus (synthetic)', site: VELMAR, calendar: { kind: 'gregorian' }, yearStart: 'jan1',
      window: { fromYear: 1862, toYear: 1862 }, mapNorthCorrectionDeg: 0, seed: 5,
      image: c.image,
      groundPlane: { pointsPx: c.ground.pixelPoints.map((q) => [q[0], q[1]] as const), planePointsM: c.points.groundFigure.map((q) => [q[0], q[1]] as const) },
      walls: [{
        id: 'a', azimuthDeg: pic.wallAzimuthsDeg[0], azimuthSigmaDeg: 0, azimuthSource: 'synthetic',
        imagePlane: { pointsPx: c.wall.pixelPoints.map((q) => [q[0], q[1]] as const), planePointsM: c.points.wallFigure.map((q) => [dot(q, eu), q[2]] as const) },
      }],
      observations: [c.eave, c.groundPair, c.wallPair],
    };
    const resolved = resolvePixelObservations(scene);
    const typed: Observation[] = resolved.scene.observations.map((o) => {
      // the derived values as a user would type them from `heliochron measure --json` (6 decimals)
      const r6 = (v: number): number => Number(v.toFixed(6));
      if (o.kind === 'eave-shadow') return { id: o.id, kind: o.kind, wallId: o.wallId, distanceRatio: r6(o.distanceRatio!), sigma: r6(o.sigma!), projectionRatio: r6(o.projectionRatio!) };
      if (o.kind === 'shadow-points') return { id: o.id, kind: o.kind, caster: o.caster!.map(r6) as unknown as [number, number, number], shadow: o.shadow!.map(r6) as unknown as [number, number, number], sigmaM: r6(o.sigmaM!) };
      throw new Error(`unexpected ${o.kind}`);
    });
    const a = solveDates(scene);
    const b = solveDates({ ...scene, observations: typed });
    const ca = a.candidates[0];
    const cb = b.candidates[0];
    expect(ca.civilDate).toEqual(cb.civilDate);
    expect(Math.abs(ca.times.localApparentMinutes - cb.times.localApparentMinutes)).toBeLessThan(0.05);
    expect(Math.abs(ca.chiSquare - cb.chiSquare)).toBeLessThan(1e-3 * Math.max(1, ca.chiSquare));
    // and the answer is the made-up instant the picture was built for (noise 0.3 px moves it little)
    expect(ca.civilDate).toMatchObject({ year: 1862, month: 6 });
  }, 300_000);
});

describe('edge cases', () => {
  const { pics, rng } = pictures(41, 1);
  const c = caseOf(pics[0], rng, 0, 1);
  test('an eave on an aspect-only or camera ground is refused, naming the field', () => {
    expect(() => measurePixelObservation(c.eave, c.camGround, 'observations[0]')).toThrow(/observations\[0\]\.pixels.*up to scale/);
  });
  test('a point pair with a stated height on a camera plane, or a clicked caster on a figure of known size, is refused', () => {
    expect(() => measurePixelObservation(c.groundPair, c.camGround, 'observations[1]')).toThrow(/observations\[1\]\.pixels\.objectPx/);
    expect(() => measurePixelObservation(c.camGroundPair, c.ground, 'observations[1]')).toThrow(/observations\[1\]\.pixels\.objectPx/);
  });
  test('a shadow point above its caster is refused', () => {
    const wallAbove: ShadowPointsObservation = {
      ...c.wallPair, pixels: { ...c.wallPair.pixels!, fromPx: c.wallPair.pixels!.toPx, toPx: c.wallPair.pixels!.fromPx },
    };
    // swapping the foot and the shadow on a sunlit wall puts the shadow above the caster
    expect(() => measurePixelObservation(wallAbove, c.wall, 'observations[2]', { wallAzimuthDeg: pics[0].wallAzimuthsDeg[0] })).toThrow(/observations\[2\]\.pixels\.toPx.*below its caster/);
  });
  test('the reader takes both pixel forms and refuses a mix with the numeric form', () => {
    const yaml = (obs: string): string => `heliochron: 1
title: t
site: { latitudeDeg: 47.6, longitudeDeg: 9.3 }
calendar: gregorian
window: { fromYear: 1862, toYear: 1862 }
image: { widthPx: 3200, heightPx: 2400 }
groundPlane: { pointsPx: [[100, 2000], [3000, 2000], [2600, 1400], [500, 1400]], widthM: 10, heightM: 8, firstEdgeAzimuthDeg: 90 }
walls:
  - { id: a, azimuthDeg: 180, azimuthSigmaDeg: 1, imagePlane: { pointsPx: [[500, 400], [2600, 400], [2600, 1400], [500, 1400]], widthM: 10, heightM: 5 } }
observations:
  - ${obs}
`;
    const eave = readSceneText(yaml('{ id: e, kind: eave-shadow, wall: a, pixels: { fromPx: [600, 1400], alongPx: [2000, 1400], toPx: [900, 1700], heightM: 5, heightSigmaM: 0.1 } }'), 's.yaml');
    expect(eave.observations[0]).toMatchObject({ kind: 'eave-shadow', pixels: { projectionM: 0, heightM: 5 } });
    const pair = readSceneText(yaml('{ id: p, kind: shadow-points, pixels: { wall: a, fromPx: [1000, 800], toPx: [1200, 1000], heightM: 0.5, heightSigmaM: 0.02 } }'), 's.yaml');
    expect(pair.observations[0]).toMatchObject({ kind: 'shadow-points', pixels: { wallId: 'a', heightM: 0.5 } });
    expect(() => readSceneText(yaml('{ id: e, kind: eave-shadow, wall: a, distanceRatio: 1, pixels: { fromPx: [600, 1400], alongPx: [2000, 1400], toPx: [900, 1700], heightM: 5, heightSigmaM: 0.1 } }'), 's.yaml'))
      .toThrow(/observations\[0\]\.distanceRatio/);
    expect(() => readSceneText(yaml('{ id: p, kind: shadow-points, pixels: { fromPx: [1000, 1800], toPx: [1200, 1900], objectPx: [1000, 1500] } }'), 's.yaml'))
      .toThrow(/observations\[0\]\.pixels\.objectPx/);
    expect(() => readSceneText(yaml('{ id: e, kind: eave-shadow, wall: a, pixels: { fromPx: [600, 1400], toPx: [900, 1700], heightM: 5, heightSigmaM: 0.1 } }'), 's.yaml'))
      .toThrow(/observations\[0\]\.pixels\.alongPx/);
  });
});
