/**
 * A scene with every pixel-form observation turned into its numeric form, so
 * that the solver needs to know nothing of pixels.
 *
 * Each wall's imagePlane and the groundPlane are rectified once and every
 * observation given in pixels is measured (measureScene.ts); the observation
 * is then replaced by its numeric form (slopeDeg and side with sigmaDeg,
 * depthRatio with sigma, widthRatio and side with sigma, shadowAzimuthDeg and
 * lengthRatio with their sigmas, distanceRatio with sigma and projectionRatio,
 * caster and shadow with sigmaM), its `pixels` left out. Observations already
 * numeric, walls, planes and everything else are kept as they are, so the
 * function is idempotent.
 *
 * Object-shadow pairs and shadow wedges (sceneSun.ts) are given, through the scene's camera, their
 * planes of the sky (sunConstraints.ts): a pair's great circle and side planes, a wedge's two edges.
 *
 * Sigma: the first-order sigma of the clicks (src/image/propagation.ts,
 * after Criminisi, Reid and Zisserman 1997). When the measurement bends within
 * the clicking error (`firstOrderReliable` false), the first-order sigma may be
 * several times too small; then the Monte Carlo spread of the same clicks,
 * seeded from the scene's seed, is computed and the larger of the two is used
 * (common practice: never let a linearisation make a measurement look better
 * than its sampled spread). Which one was used is reported per value.
 */
import { createRandom } from '../math/random.js';
import { InvalidInputError } from '../errors.js';
import type { Observation, Scene } from '../scene/types.js';
import { isPixelObservation, measureContextOf, measureScenePixels } from './measureScene.js';
import { shadowPointsSigmaM } from './pointPixels.js';
import { monteCarloPixelObservation, type MeasuredQuantity, type PixelMeasurement, type PixelObservation } from './pixelObservations.js';
import type { RectifiedPlane } from './planeInImage.js';
import { cameraInputOf, hasObjectShadows, resolveSceneSun, type SceneSun } from './sceneSun.js';
import { monteCarloSpread } from './propagation.js';
import { rectifyPlane } from './planeInImage.js';
import { solveCamera } from './camera.js';
import { moonCentreInWorkingFrame, moonThroughCamera, moonThroughPlane, type MoonFromPixels, type ResolvedMoonDirection } from './moonPixels.js';
import { rectifySceneGround } from './measureScene.js';

/** Monte Carlo samples drawn for a measurement whose first-order sigma is not reliable. */
export const RESOLVE_MONTE_CARLO_SAMPLES = 1000;

/** One value written into the scene, with where its sigma came from. */
export interface ResolvedValue {
  /**
   * Field name in the numeric form: 'slopeDeg', 'depthRatio', 'widthRatio', 'shadowAzimuthDeg', 'lengthRatio', 'distanceRatio';
   * for a point pair the direction it gives, 'sunAzimuthDeg' and 'sunAltitudeDeg' (written as caster, shadow and sigmaM).
   */
  readonly name: string;
  readonly value: number;
  /** The sigma written into the scene. */
  readonly sigma: number;
  readonly firstOrderSigma: number;
  /** Monte Carlo spread, present when the first-order sigma is not reliable. */
  readonly monteCarloSigma?: number;
  readonly sigmaSource: 'first-order' | 'monte-carlo';
}

export interface ResolvedMeasurement {
  /** Path of the observation in the scene file, e.g. `observations[3]`. */
  readonly field: string;
  readonly measurement: PixelMeasurement;
  readonly values: readonly ResolvedValue[];
  /** Seed and samples of the Monte Carlo run, when one was made. */
  readonly monteCarlo?: { readonly seed: number; readonly samples: number };
}

export interface ResolvedScene {
  /** The scene with every pixel-form observation in numeric form. */
  readonly scene: Scene;
  /** Rectified planes by scene path (`walls[0].imagePlane`, `groundPlane`), only those used. */
  readonly planes: ReadonlyMap<string, RectifiedPlane>;
  /** One per pixel-form observation, in scene order. */
  readonly measurements: readonly ResolvedMeasurement[];
  /** The picture's camera and the sun of each group of object-shadow pairs, when the scene has such pairs (sceneSun.ts). */
  readonly sceneSun?: SceneSun;
  /** The moon's direction of each moon-direction observation given in pixels, in scene order (moonPixels.ts). */
  readonly moonDirections?: readonly ResolvedMoonDirection[];
}

/** The measured quantities of a measurement in the order of its numeric fields. */
export function measuredQuantities(m: PixelMeasurement): readonly { readonly name: string; readonly quantity: MeasuredQuantity }[] {
  switch (m.kind) {
    case 'rod-shadow':
      return [{ name: 'slopeDeg', quantity: m.slopeDeg }];
    case 'overhang-shadow':
      return [{ name: 'depthRatio', quantity: m.depthRatio }];
    case 'fin-shadow':
      return [{ name: 'widthRatio', quantity: m.widthRatio }];
    case 'pole-shadow':
      return m.lengthRatio
        ? [{ name: 'shadowAzimuthDeg', quantity: m.shadowAzimuthDeg }, { name: 'lengthRatio', quantity: m.lengthRatio }]
        : [{ name: 'shadowAzimuthDeg', quantity: m.shadowAzimuthDeg }];
    case 'eave-shadow':
      return [{ name: 'distanceRatio', quantity: m.distanceRatio }];
    case 'shadow-points':
      return [{ name: 'sunAzimuthDeg', quantity: m.sunAzimuthDeg }, { name: 'sunAltitudeDeg', quantity: m.sunAltitudeDeg }];
  }
}

/** The numeric observation with the sigmas actually used. */
function numericObservation(m: PixelMeasurement, values: readonly ResolvedValue[]): Observation {
  const sigma = (name: string): number => values.find((v) => v.name === name)!.sigma;
  switch (m.kind) {
    case 'rod-shadow':
      return { ...m.observation, sigmaDeg: sigma('slopeDeg') };
    case 'overhang-shadow':
      return { ...m.observation, sigma: sigma('depthRatio') };
    case 'fin-shadow':
      return { ...m.observation, sigma: sigma('widthRatio') };
    case 'pole-shadow':
      return m.lengthRatio
        ? { ...m.observation, shadowAzimuthSigmaDeg: sigma('shadowAzimuthDeg'), lengthRatioSigma: sigma('lengthRatio') }
        : { ...m.observation, shadowAzimuthSigmaDeg: sigma('shadowAzimuthDeg') };
    case 'eave-shadow':
      return { ...m.observation, sigma: sigma('distanceRatio') };
    case 'shadow-points': {
      const [c, s] = [m.caster, m.shadow];
      const distance = Math.hypot(c[0] - s[0], c[1] - s[1], c[2] - s[2]);
      return { ...m.observation, sigmaM: shadowPointsSigmaM(distance, sigma('sunAzimuthDeg'), sigma('sunAltitudeDeg'), m.sunAltitudeDeg.value) };
    }
  }
}

/**
 * Resolve every pixel-form observation of a scene into its numeric form.
 * Throws InvalidInputError naming the path in the scene file for degenerate clicks
 * (three collinear corners, crossing edges, points outside the picture, a missing plane).
 * @example resolvePixelObservations(scene).scene.observations[1] // { kind: 'rod-shadow', slopeDeg: 41.2, side: 'left', sigmaDeg: 0.9, ... }
 */
export function resolvePixelObservations(scene: Scene): ResolvedScene {
  const moons = resolveMoonPixels(scene);
  if (moons) scene = moons.scene;
  const withMoons = moons ? { moonDirections: moons.resolved } : {};
  const { planes, measurements } = measureScenePixels(scene);
  const sceneSun = hasObjectShadows(scene) ? resolveSceneSun(scene) : undefined;
  if (sceneSun) scene = { ...scene, observations: sceneSun.observations };
  if (measurements.length === 0) return { scene, planes, measurements: [], ...(sceneSun ? { sceneSun } : {}), ...withMoons };
  const resolved: ResolvedMeasurement[] = measurements.map(({ field, measurement }) => {
    const quantities = measuredQuantities(measurement);
    const reliable = quantities.every((q) => q.quantity.firstOrderReliable);
    if (reliable) {
      const values = quantities.map(({ name, quantity }): ResolvedValue => ({
        name, value: quantity.value, sigma: quantity.sigma, firstOrderSigma: quantity.sigma, sigmaSource: 'first-order',
      }));
      return { field, measurement, values };
    }
    const index = Number(/\[(\d+)\]/.exec(field)![1]);
    const seed = (scene.seed + index) >>> 0; // one stream per observation, repeatable from the scene's seed
    const plane = planes.get(measurement.rectification.field)!;
    const obs = scene.observations[index] as PixelObservation;
    const mc = monteCarloPixelObservation(obs, plane, field, createRandom(seed), RESOLVE_MONTE_CARLO_SAMPLES, measureContextOf(scene, obs));
    const values = quantities.map(({ name, quantity }, k): ResolvedValue => {
      const mcSigma = mc.sigmas[k];
      const useMc = mcSigma > quantity.sigma;
      return {
        name, value: quantity.value, sigma: useMc ? mcSigma : quantity.sigma, firstOrderSigma: quantity.sigma,
        monteCarloSigma: mcSigma, sigmaSource: useMc ? 'monte-carlo' : 'first-order',
      };
    });
    return { field, measurement, values, monteCarlo: { seed, samples: RESOLVE_MONTE_CARLO_SAMPLES } };
  });
  const byField = new Map(resolved.map((r) => [r.field, r]));
  const observations = scene.observations.map((obs, k) => {
    const r = byField.get(`observations[${k}]`);
    return r ? numericObservation(r.measurement, r.values) : obs;
  });
  return { scene: { ...scene, observations }, planes, measurements: resolved, ...(sceneSun ? { sceneSun } : {}), ...withMoons };
}

/** The direction of one moon given in pixels: through its wall's figure, else the camera, else the ground's figure. */
function moonDirectionOf(scene: Scene, centrePx: readonly [number, number], sigmaPx: number | undefined, wallId: string | undefined, field: string): MoonFromPixels {
  const image = scene.image!;
  const centre = moonCentreInWorkingFrame(centrePx, image, `${field}.pixels.centrePx`);
  const sigma = sigmaPx ?? image.pixelSigmaPx;
  if (wallId !== undefined) {
    const index = scene.walls.findIndex((w) => w.id === wallId);
    const wall = scene.walls[index];
    if (!wall?.imagePlane) throw new InvalidInputError(`${field}.pixels.wall`, wallId, 'a wall of this scene with an imagePlane');
    const plane = rectifyPlane(wall.imagePlane, image, 'wall', `walls[${index}].imagePlane`);
    return moonThroughPlane(plane, wall.azimuthDeg, wall.azimuthSigmaDeg, centre, sigma, `${field}.pixels`);
  }
  if (scene.camera) return moonThroughCamera(solveCamera(cameraInputOf(scene)), centre, sigma);
  if (!scene.groundPlane) throw new InvalidInputError(`${field}.pixels`, centrePx, 'the moon clicked in a picture with a camera block, a groundPlane, or a wall named with "wall" that has an imagePlane');
  return moonThroughPlane(rectifySceneGround(scene, image, new Map()), undefined, 0, centre, sigma, `${field}.pixels`);
}

/**
 * Every moon-direction observation given in pixels turned into azimuth and altitude with their sigmas (the larger of
 * the first-order and the Monte Carlo spread when the first-order check fails, as for the planes' measurements).
 * The correlation of azimuth and altitude is not carried into the scene (each keeps its own sigma). Null when there is none.
 */
function resolveMoonPixels(scene: Scene): { scene: Scene; resolved: ResolvedMoonDirection[] } | null {
  if (!scene.observations.some((o) => o.kind === 'moon-direction' && o.pixels !== undefined)) return null;
  const resolved: ResolvedMoonDirection[] = [];
  const observations = scene.observations.map((o, k): Observation => {
    if (o.kind !== 'moon-direction' || o.pixels === undefined) return o;
    const field = `observations[${k}]`;
    if (!scene.image) throw new InvalidInputError('image', undefined, 'a picture description (widthPx, heightPx, mirrored, pixelSigmaPx) when the moon is given in pixels', `${field} is given in pixels`);
    const m = moonDirectionOf(scene, o.pixels.centrePx, o.pixels.sigmaPx, o.pixels.wallId, field);
    let sigmas: [number, number] = [m.azimuthSigmaDeg, m.altitudeSigmaDeg];
    let mcSigmas: [number, number] | undefined;
    if (!m.firstOrderReliable) {
      const mc = monteCarloSpread(m.f, m.p0, m.sigmas, [true, false], createRandom((scene.seed + k) >>> 0), RESOLVE_MONTE_CARLO_SAMPLES);
      mcSigmas = [mc.sigmas[0], mc.sigmas[1]];
      sigmas = [Math.max(sigmas[0], mcSigmas[0]), Math.max(sigmas[1], mcSigmas[1])];
    }
    resolved.push({
      field, observationId: o.id, measured: m, sigmasDeg: sigmas, ...(mcSigmas ? { monteCarloSigmasDeg: mcSigmas } : {}),
      sigmaSource: mcSigmas && (mcSigmas[0] > m.azimuthSigmaDeg || mcSigmas[1] > m.altitudeSigmaDeg) ? 'monte-carlo' : 'first-order',
    });
    const { pixels: _pixels, ...rest } = o;
    return { ...rest, azimuthDeg: m.azimuthDeg, azimuthSigmaDeg: sigmas[0], altitudeDeg: m.altitudeDeg, altitudeSigmaDeg: sigmas[1] };
  });
  return { scene: { ...scene, observations }, resolved };
}

/** True when a scene has at least one observation given in pixels. */
export function hasPixelObservations(scene: Scene): boolean {
  return scene.observations.some((o) => isPixelObservation(o) || o.kind === 'object-shadow' || o.kind === 'shadow-wedge');
}
