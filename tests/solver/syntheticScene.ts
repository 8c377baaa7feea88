/**
 * Synthetic truth for the solver tests: scenes whose observations are forward-computed from
 * a known instant with the full ephemeris (src/ephemeris/sunPosition.ts) and the geometry
 * forward models (src/geometry/), optionally with Gaussian noise at the stated sigmas
 * (seeded generator, src/math/random.ts). Site and buildings are the fictional town of Velmar.
 */
import type { Observation, Scene, Wall } from '../../src/scene/types.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { predictRodShadow, predictOverhangShadow } from '../../src/geometry/wallShadows.js';
import { predictPoleShadow } from '../../src/geometry/groundShadows.js';
import { isWallSunlit } from '../../src/geometry/shadowAngles.js';
import type { RandomSource } from '../../src/math/random.js';

export const VELMAR = { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410, latitudeSigmaDeg: 0, longitudeSigmaDeg: 0 };

export function baseScene(observations: Observation[], walls: Wall[], fromYear: number, toYear: number, extra: Partial<Scene> = {}): Scene {
  return {
    formatVersion: 1,
    title: 'Velmar, the Marktgasse view (synthetic)',
    site: VELMAR,
    calendar: { kind: 'gregorian' },
    yearStart: 'jan1',
    window: { fromYear, toYear },
    mapNorthCorrectionDeg: 0,
    walls,
    observations,
    seed: 1,
    ...extra,
  };
}

export interface SyntheticSpec {
  readonly jdUT: number;
  readonly site?: typeof VELMAR;
  /** Walls with true azimuths; the scene states azimuth + noise * sigma. */
  readonly walls: readonly { id: string; azimuthDeg: number; sigmaDeg: number }[];
  readonly rods?: readonly { wallId: string; sigmaDeg: number }[];
  readonly overhangs?: readonly { wallId: string; sigma: number }[];
  readonly pole?: { azimuthSigmaDeg: number; lengthSigma: number };
  readonly rng?: RandomSource;
}

/** Observations of the sun at spec.jdUT; null when a requested wall is not sunlit. */
export function syntheticObservations(spec: SyntheticSpec): { walls: Wall[]; observations: Observation[] } | null {
  const site = spec.site ?? VELMAR;
  const sun = sunPosition(spec.jdUT, site);
  const noise = (): number => (spec.rng ? spec.rng.normal() : 0);
  const walls: Wall[] = spec.walls.map((w) => ({
    id: w.id,
    azimuthDeg: (((w.azimuthDeg + noise() * w.sigmaDeg) % 360) + 360) % 360,
    azimuthSigmaDeg: w.sigmaDeg,
    azimuthSource: 'synthetic',
  }));
  const observations: Observation[] = [];
  const trueAz = new Map(spec.walls.map((w) => [w.id, w.azimuthDeg]));
  for (const [i, r] of (spec.rods ?? []).entries()) {
    const az = trueAz.get(r.wallId)!;
    if (!isWallSunlit(sun, az)) return null;
    const p = predictRodShadow(sun, az);
    if (!p.side || p.slopeDeg < 3 || p.slopeDeg > 87) return null;
    observations.push({ id: `rod${i + 1}`, kind: 'rod-shadow', wallId: r.wallId, slopeDeg: p.slopeDeg + noise() * r.sigmaDeg, side: p.side, sigmaDeg: r.sigmaDeg });
  }
  for (const [i, o] of (spec.overhangs ?? []).entries()) {
    const az = trueAz.get(o.wallId)!;
    if (!isWallSunlit(sun, az)) return null;
    const p = predictOverhangShadow(sun, az);
    if (!(p.depthRatio > 0.05 && p.depthRatio < 6)) return null;
    observations.push({ id: `overhang${i + 1}`, kind: 'overhang-shadow', wallId: o.wallId, depthRatio: p.depthRatio + noise() * o.sigma, sigma: o.sigma });
  }
  if (spec.pole) {
    if (!(sun.altitudeDeg > 5)) return null;
    const p = predictPoleShadow(sun);
    observations.push({
      id: 'pole',
      kind: 'pole-shadow',
      shadowAzimuthDeg: (((p.shadowAzimuthDeg + noise() * spec.pole.azimuthSigmaDeg) % 360) + 360) % 360,
      shadowAzimuthSigmaDeg: spec.pole.azimuthSigmaDeg,
      lengthRatio: p.lengthRatio * (1 + 0) + noise() * spec.pole.lengthSigma,
      lengthRatioSigma: spec.pole.lengthSigma,
    });
  }
  return { walls, observations };
}
