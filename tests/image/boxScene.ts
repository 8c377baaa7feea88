/**
 * Test helper: boxes of buildings on a site, with vertical edges, horizontal
 * courses along two walls square to each other, and poles and figures whose
 * shadows fall on steps and uneven ground under a known sun, photographed by
 * a random pinhole camera (H&Z 2nd ed. sec. 6.1, eq. (6.8); camera built in
 * syntheticCamera.ts, not by the code under test). Shadow points by explicit
 * ray-plane intersection.
 */
import { createRandom, type RandomSource } from '../../src/math/random.js';
import type { CameraInput, LineFamily } from '../../src/image/cameraModel.js';
import type { ShadowPairInput } from '../../src/image/cameraSun.js';
import type { Scene } from '../../src/scene/types.js';
import { add, clicker, cross, horizontal, project, randomCamera, scale, sunVector, sub, type Camera, type Vec3 } from './syntheticCamera.js';

const uniform = (rng: RandomSource, a: number, b: number): number => a + (b - a) * rng.uniform();

export interface ShadowPair {
  readonly object: Vec3;
  readonly shadow: Vec3;
}

export interface BoxPicture {
  readonly camera: Camera;
  readonly widthPx: number;
  readonly heightPx: number;
  /** Outward normal azimuths of the two walls seen. */
  readonly wallAzimuthsDeg: readonly [number, number];
  readonly sun: { readonly azimuthDeg: number; readonly altitudeDeg: number };
  /** Edges in 3-D: each a list of points along one straight edge. */
  readonly vertical: readonly (readonly Vec3[])[];
  readonly wallA: readonly (readonly Vec3[])[];
  readonly wallB: readonly (readonly Vec3[])[];
  readonly pairs: readonly ShadowPair[];
}

export interface BoxOptions {
  readonly widthPx?: number;
  readonly heightPx?: number;
  /** Smallest |tilt| of the camera, degrees, so that the vertical vanishing point is finite. */
  readonly minTiltDeg?: number;
  readonly pairs?: number;
  /** Put the principal point exactly at the picture's centre. */
  readonly centredPrincipal?: boolean;
  /** A level camera (no tilt): vertical lines parallel in the picture. */
  readonly level?: boolean;
  /** The sun to light the scene (else a random one in front of the building). */
  readonly sun?: { readonly azimuthDeg: number; readonly altitudeDeg: number };
}

/** Points along the segment a -> b, `count` of them, spread between 5% and 95% of it. */
function along(rng: RandomSource, a: Vec3, b: Vec3, count: number): Vec3[] {
  const ts = Array.from({ length: count }, (_, i) => 0.05 + (0.9 * (i + uniform(rng, 0.1, 0.9))) / count);
  return ts.map((t) => add(a, scale(sub(b, a), t)));
}

/** A random box of buildings, sun and camera; null when the camera does not see everything. */
export function randomBoxPicture(rng: RandomSource, options: BoxOptions = {}): BoxPicture | null {
  const widthPx = options.widthPx ?? 3200;
  const heightPx = options.heightPx ?? 2400;
  const azA = uniform(rng, 0, 360);
  const azB = azA + 90;
  const e1 = horizontal(azA);
  const e2 = horizontal(azB);
  const up: Vec3 = [0, 0, 1];
  const d1 = uniform(rng, 4, 8);
  const d2 = uniform(rng, 4, 8);
  const h = uniform(rng, 8, 16);
  const at = (a: number, b: number, z: number): Vec3 => add(add(scale(e1, a), scale(e2, b)), scale(up, z));
  const n = (a: number, b: number): number => Math.round(uniform(rng, a, b + 0.999) - 0.5);
  // vertical edges: the corner, the far ends of both faces, window jambs
  const verticalFeet: Vec3[] = [at(d1, d2, 0), at(d1, -d2, 0), at(-d1, d2, 0)];
  for (let i = 0; i < 2; i++) verticalFeet.push(at(d1, uniform(rng, -d2 * 0.8, d2 * 0.8), 0), at(uniform(rng, -d1 * 0.8, d1 * 0.8), d2, 0));
  const vertical = verticalFeet.map((f) => along(rng, f, add(f, scale(up, h)), n(2, 4)));
  // courses on face A (normal azA, at e1 d1, running along e2) and face B (normal azB, at e2 d2, along e1)
  const levelsA = Array.from({ length: n(4, 6) }, () => uniform(rng, 0.3, h - 0.3));
  const levelsB = Array.from({ length: n(4, 6) }, () => uniform(rng, 0.3, h - 0.3));
  const wallA = levelsA.map((z) => along(rng, at(d1, -d2, z), at(d1, d2, z), n(2, 4)));
  const wallB = levelsB.map((z) => along(rng, at(-d1, d2, z), at(d1, d2, z), n(2, 4)));
  // the sun in front of at least one face, above the horizon
  const sunAz = options.sun ? options.sun.azimuthDeg : azA + 45 + uniform(rng, -100, 100);
  const sunAlt = options.sun ? options.sun.altitudeDeg : uniform(rng, 12, 60);
  const s = sunVector(sunAz, sunAlt);
  // poles and figures in front of the building; shadows on steps and uneven paving (level patches at random heights)
  const camDir = uniform(rng, 22, 68); // degrees from e1 towards e2
  const dist = uniform(rng, 18, 45);
  const base = at(d1, d2, 0);
  const pairs: ShadowPair[] = [];
  for (let i = 0; i < (options.pairs ?? 5); i++) {
    const foot = add(base, add(scale(horizontal(azA + camDir + uniform(rng, -25, 25)), uniform(rng, 4, dist * 0.5)), [0, 0, uniform(rng, 0, 0.6)]));
    const object = add(foot, [0, 0, uniform(rng, 1.5, 4)]);
    const surfaceZ = foot[2] + uniform(rng, -0.3, 0.45); // a step up or down, or a dip in the paving
    const t = (object[2] - surfaceZ) / s[2];
    pairs.push({ object, shadow: sub(object, scale(s, t)) });
  }
  const centre = add(base, add(scale(horizontal(azA + camDir), dist), [0, 0, uniform(rng, 1.5, 12)]));
  let target: Vec3 = add(base, [uniform(rng, -3, 3), uniform(rng, -3, 3), uniform(rng, -4, h + 4)]);
  const minTilt = options.minTiltDeg ?? 15;
  const look = sub(target, centre);
  const tiltDeg = (Math.atan2(look[2], Math.hypot(look[0], look[1])) * 180) / Math.PI;
  if (options.level) target = [target[0], target[1], centre[2]];
  else if (Math.abs(tiltDeg) < minTilt) target = add(target, [0, 0, (tiltDeg >= 0 ? 1 : -1) * Math.tan(((minTilt + 2) * Math.PI) / 180) * Math.hypot(look[0], look[1])]);
  const mustSee = [...vertical.flat(), ...wallA.flat(), ...wallB.flat(), ...pairs.flatMap((p) => [p.object, p.shadow])];
  let camera = randomCamera(rng, centre, target, mustSee, widthPx, heightPx);
  if (!camera) return null;
  if (options.centredPrincipal) camera = { ...camera, principal: [widthPx / 2, heightPx / 2] };
  for (const p of mustSee) {
    const q = project(camera, p);
    if (!q || q[0] < 0 || q[0] > widthPx || q[1] < 0 || q[1] > heightPx) return null;
  }
  // no shadow running straight towards or away from the camera (its great circle through the zenith)
  for (const p of pairs) {
    const m = cross(sub(p.object, centre), sub(p.shadow, centre));
    if (Math.abs(m[2]) < Math.sin((8 * Math.PI) / 180) * Math.hypot(...m)) return null;
  }
  return { camera, widthPx, heightPx, wallAzimuthsDeg: [azA % 360, azB % 360], sun: { azimuthDeg: ((sunAz % 360) + 360) % 360, altitudeDeg: sunAlt }, vertical, wallA, wallB, pairs };
}

/** `count` random box pictures that `accept` takes, drawn from one generator seeded with `seed`, and that generator after them. */
export function boxPictures(seed: number, count: number, accept: (pic: BoxPicture) => boolean, options: BoxOptions = {}): { pics: BoxPicture[]; rng: RandomSource } {
  const rng = createRandom(seed);
  const pics: BoxPicture[] = [];
  while (pics.length < count) {
    const pic = randomBoxPicture(rng, options);
    if (pic && accept(pic)) pics.push(pic);
  }
  return { pics, rng };
}

/** The camera input a user would click on the picture, with clicking noise `noisePx` and stated sigma `sigmaPx`. */
export function cameraInputOf(pic: BoxPicture, rng: RandomSource, noisePx: number, sigmaPx: number, focalLengthPx?: number): CameraInput {
  const click = clicker(pic.camera, rng, noisePx, false, pic.widthPx);
  const family = (field: string, direction: LineFamily['direction'], edges: readonly (readonly Vec3[])[]): LineFamily => ({
    field, direction, lines: edges.map((edge) => ({ pointsPx: edge.map(click), sigmaPx })),
  });
  return {
    field: 'camera', widthPx: pic.widthPx, heightPx: pic.heightPx,
    families: [
      family('camera.verticalLines', { kind: 'vertical' }, pic.vertical),
      family('camera.wallLines[0].lines', { kind: 'wall', wallId: 'a', wallAzimuthDeg: pic.wallAzimuthsDeg[0] }, pic.wallA),
      family('camera.wallLines[1].lines', { kind: 'wall', wallId: 'b', wallAzimuthDeg: pic.wallAzimuthsDeg[1] }, pic.wallB),
    ],
    ...(focalLengthPx !== undefined ? { focalLengthPx } : {}),
  };
}

/** The true site-to-camera rotation of a synthetic camera (rows: right, down, forward). */
export function trueRotation(cam: Camera): [[number, number, number], [number, number, number], [number, number, number]] {
  return [[...cam.right], [...cam.down], [...cam.forward]];
}

/** The object-shadow pairs a user would click, as shadow-pair inputs. */
export function pairInputsOf(pic: BoxPicture, rng: RandomSource, noisePx: number, sigmaPx: number): ShadowPairInput[] {
  const click = clicker(pic.camera, rng, noisePx, false, pic.widthPx);
  return pic.pairs.map((p, k) => ({ field: `observations[${k}]`, objectPx: click(p.object), shadowPx: click(p.shadow), sigmaPx }));
}

/** A scene file's content for a box picture: walls a and b, the camera block and object-shadow pairs (ids fig0, fig1, ...). */
export function sceneOfPicture(pic: BoxPicture, rng: RandomSource, noisePx: number, sigmaPx: number, base: Omit<Scene, 'walls' | 'observations' | 'image' | 'camera'>, group?: (k: number) => string | undefined): Scene {
  const click = clicker(pic.camera, rng, noisePx, false, pic.widthPx);
  const lines = (edges: readonly (readonly Vec3[])[]) => edges.map((e) => e.map(click));
  return {
    ...base,
    image: { widthPx: pic.widthPx, heightPx: pic.heightPx, mirrored: false, pixelSigmaPx: sigmaPx },
    walls: [
      { id: 'a', azimuthDeg: pic.wallAzimuthsDeg[0], azimuthSigmaDeg: 0, azimuthSource: 'synthetic' },
      { id: 'b', azimuthDeg: pic.wallAzimuthsDeg[1], azimuthSigmaDeg: 0, azimuthSource: 'synthetic' },
    ],
    camera: { verticalLines: lines(pic.vertical), wallLines: [{ wallId: 'a', lines: lines(pic.wallA) }, { wallId: 'b', lines: lines(pic.wallB) }] },
    observations: pic.pairs.map((p, k) => {
      const g = group?.(k);
      return { id: `fig${k}`, kind: 'object-shadow' as const, objectPx: click(p.object), shadowPx: click(p.shadow), ...(g ? { group: g } : {}) };
    }),
  };
}
