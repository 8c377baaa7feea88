/**
 * The night's bound of the moon's screening (src/solver/moonNightBound.ts): never above the moon's rows
 * that the screening (src/solver/moonSearch.ts) takes at any instant of that night, so that passing over
 * a night whose bound is past the limit leaves the days kept as they are.
 * Random scenes (seeded): sites from 60 S to 65 N, a drawn direction of the moon, a pole's shadow by
 * moonlight, a phase as a fraction or named (folded or not), with small sigmas; nights from -1100 to 2000.
 * The rows are computed here as the screening computes them: the quick moon (src/ephemeris/moonQuick.ts)
 * and the quick phase (src/ephemeris/moonPhaseApprox.ts) at the night's three nodes, interpolated by the
 * parabola through them (Meeus 1998, eq. 3.3); the residual values of src/geometry/observationModels.ts.
 */
import { describe, expect, it } from 'vitest';
import type { NamedMoonPhase, Observation, Scene } from '../../src/scene/types.js';
import { baseScene } from './syntheticScene.js';
import { buildEvidenceModel } from '../../src/solver/evidenceModel.js';
import { moonNightBound, parabolaRange } from '../../src/solver/moonNightBound.js';
import { quickPhaseChiSquare } from '../../src/solver/moonYears.js';
import { quickMoonEquatorial, quickMoonHorizontal, QUICK_MOON_ALLOWANCE_DEG } from '../../src/ephemeris/moonQuick.js';
import { moonPhaseLongitudeApproxDeg } from '../../src/ephemeris/moonPhaseApprox.js';
import { evidenceResidualValues } from '../../src/geometry/observationModels.js';
import { normalizeDeg180 } from '../../src/math/angles.js';
import { createRandom, type RandomSource } from '../../src/math/random.js';
import { deltaTSeconds } from '../../src/time/deltaT.js';
import { jdToDecimalYear } from '../../src/time/timeScales.js';

const PHASES: NamedMoonPhase[] = ['new', 'waxing crescent', 'first quarter', 'waxing gibbous', 'full', 'waning gibbous', 'last quarter', 'waning crescent', 'crescent', 'gibbous'];

/** One random scene lit by the moon (only the rows the bound takes, and a rod that it leaves at 0). */
function drawScene(rng: RandomSource): Scene {
  const site = { latitudeDeg: -60 + 125 * rng.uniform(), longitudeDeg: -180 + 360 * rng.uniform(), elevationM: 0, latitudeSigmaDeg: 0, longitudeSigmaDeg: 0 };
  const azimuthDeg = 360 * rng.uniform();
  const altitudeDeg = 5 + 80 * rng.uniform();
  const phase: Observation = rng.uniform() < 0.5
    ? { id: 'phase', kind: 'moon-phase', illuminatedFraction: rng.uniform(), sigma: 0.02 + 0.05 * rng.uniform() }
    : { id: 'phase', kind: 'moon-phase', phase: PHASES[Math.floor(PHASES.length * rng.uniform())], sigmaDeg: 5 + 20 * rng.uniform() };
  const observations: Observation[] = [
    { id: 'moon', kind: 'moon-direction', azimuthDeg, azimuthSigmaDeg: 0.5 + 2 * rng.uniform(), altitudeDeg, altitudeSigmaDeg: 0.5 + 2 * rng.uniform() },
    phase,
    { id: 'pole', kind: 'pole-shadow', light: 'moon', shadowAzimuthDeg: (azimuthDeg + 180 + 10 * rng.normal() + 360) % 360, shadowAzimuthSigmaDeg: 1 + 2 * rng.uniform(), lengthRatio: 1 / Math.tan(((altitudeDeg + 3 * rng.normal()) * Math.PI) / 180), lengthRatioSigma: 0.05 },
  ];
  const air = rng.uniform() < 0.5 ? undefined : { pressureHPa: 900 + 150 * rng.uniform(), temperatureC: -30 + 60 * rng.uniform() };
  return baseScene(observations, [], 1800, 1801, { site, ...(air ? { air } : {}) });
}

describe('moonNightBound', () => {
  it('is never above the moon rows the screening takes at any instant of the night (random scenes and nights, -1100 to 2000)', () => {
    const rng = createRandom(14);
    let compared = 0;
    let boundedAbove = 0;
    let least = Infinity; // the least of (rows - bound) over every instant compared
    for (let s = 0; s < 60; s += 1) {
      const scene = drawScene(rng);
      const model = buildEvidenceModel(scene);
      const bound = moonNightBound(model, scene.air);
      const site = scene.site;
      const moonShadows = model.shadows.filter((t) => t.light === 'moon');
      const values = new Float64Array(8);
      for (let n = 0; n < 40; n += 1) {
        const day = Math.floor(1319000 + 1412000 * rng.uniform()) + 0.5; // -1100 to 2000
        const dt = deltaTSeconds(jdToDecimalYear(day), scene.deltaT);
        const j0 = day - site.longitudeDeg / 360;
        // The night's nodes as moonSearch.ts screenDays takes them (angles made continuous).
        const nodes = [0, 0.5, 1].map((f) => quickMoonEquatorial(j0 + f, dt));
        const unwrap = (v: number[]): number[] => [v[0], v[0] + normalizeDeg180(v[1] - v[0]), v[0] + normalizeDeg180(v[1] - v[0]) + normalizeDeg180(v[2] - v[1])];
        const ra = unwrap(nodes.map((x) => x.rightAscensionDeg));
        const dec = nodes.map((x) => x.declinationDeg);
        const par = nodes.map((x) => x.parallaxDeg);
        const phase = unwrap([0, 0.5, 1].map((f) => moonPhaseLongitudeApproxDeg(j0 + f)));
        const b = bound({ declinationDeg: dec, parallaxDeg: par, phaseLongitudeDeg: phase });
        const p3 = (v: readonly number[], u: number): number => v[1] + (u / 2) * (v[1] - v[0] + v[2] - v[1] + u * (v[2] - 2 * v[1] + v[0]));
        for (let k = 0; k <= 96; k += 1) {
          const u = k === 96 ? 2 * rng.uniform() - 1 : -1 + k / 48;
          const place = { rightAscensionDeg: p3(ra, u), declinationDeg: p3(dec, u), parallaxDeg: p3(par, u) };
          const moon = quickMoonHorizontal(place, j0 + (u + 1) / 2, site.latitudeDeg, site.longitudeDeg, scene.air);
          let chi = 0;
          for (const t of moonShadows) {
            const m = evidenceResidualValues(t.evidence, moon, 0, values, 0);
            for (let i = 0; i < m; i += 1) chi += values[i] ** 2;
          }
          for (const t of model.moons) {
            const e = t.evidence;
            if (e.kind !== 'moon-direction') continue;
            chi += (normalizeDeg180(moon.azimuthDeg - e.azimuthDeg) / Math.hypot(e.azimuthSigmaDeg, QUICK_MOON_ALLOWANCE_DEG)) ** 2;
            chi += ((moon.altitudeDeg - e.altitudeDeg) / Math.hypot(e.altitudeSigmaDeg, QUICK_MOON_ALLOWANCE_DEG)) ** 2;
          }
          chi += quickPhaseChiSquare(model.moons, ((p3(phase, u) % 360) + 360) % 360);
          if (moon.altitudeDeg < -2) continue; // the screening takes no rows of a moon below -2 deg (it is out)
          compared += 1;
          least = Math.min(least, chi - b);
        }
        if (b > 60) boundedAbove += 1;
      }
    }
    expect(least).toBeGreaterThanOrEqual(0);
    expect(compared).toBeGreaterThan(100000);
    // Not empty: the bound passes over a good part of the nights (the screening's limit is the best + 60).
    expect(boundedAbove).toBeGreaterThan(600);
  });

  it('holds the parabola through three points within its range over the night (Meeus 1998, eq. 3.3)', () => {
    const rng = createRandom(3);
    let outside = 0; // the most a value lies outside the range
    for (let i = 0; i < 2000; i += 1) {
      const v = [10 * rng.normal(), 10 * rng.normal(), 10 * rng.normal()];
      const [lo, hi] = parabolaRange(v);
      for (let k = 0; k <= 100; k += 1) {
        const u = -1 + k / 50;
        const p = v[1] + (u / 2) * (v[1] - v[0] + v[2] - v[1] + u * (v[2] - 2 * v[1] + v[0]));
        outside = Math.max(outside, lo - p, p - hi);
      }
    }
    expect(outside).toBeLessThanOrEqual(1e-9);
  });

  describe('edge cases', () => {
    it('is 0 for a model with nothing it can bound (a rod by moonlight alone)', () => {
      const scene = baseScene([{ id: 'rod', kind: 'rod-shadow', light: 'moon', wallId: 'w', slopeDeg: 30, side: 'left', sigmaDeg: 1 }], [{ id: 'w', azimuthDeg: 180, azimuthSigmaDeg: 1, azimuthSource: 'stated' }], 1800, 1801);
      const b = moonNightBound(buildEvidenceModel(scene), undefined);
      expect(b({ declinationDeg: [20, 21, 22], parallaxDeg: [0.95, 0.95, 0.95], phaseLongitudeDeg: [10, 16, 22] })).toBe(0);
    });
  });
});
