/**
 * Degenerate corners: the sun straight in front of the wall (HSA = 0), grazing the
 * wall (HSA = +/-90), at the zenith, below the horizon, behind the wall. Every model
 * returns finite numbers there (no NaN) and says `defined: false` where the
 * evidence cannot exist. Limits by hand from the closed forms (docs/observations.md).
 */
import { describe, expect, it } from 'vitest';
import { evidenceLocus, evidenceResiduals, predictEvidence, type ShadowEvidence } from '../../src/geometry/observationModels.js';
import { predictEaveShadow, predictPoleShadow } from '../../src/geometry/groundShadows.js';
import { verticalShadowAngleDeg } from '../../src/geometry/shadowAngles.js';
import { predictFinShadow, predictOverhangShadow, predictRodShadow } from '../../src/geometry/wallShadows.js';
import { expectClose } from '../helpers/expectClose.js';

const ALL: readonly ShadowEvidence[] = [
  { kind: 'rod-shadow', slopeDeg: 60, side: 'left', sigmaDeg: 1 },
  { kind: 'rod-shadow', slopeDeg: 60, sigmaDeg: 1 },
  { kind: 'overhang-shadow', depthRatio: 0, sigma: 0.05 },
  { kind: 'overhang-shadow', depthRatio: 2, sigma: 0.05 },
  { kind: 'fin-shadow', widthRatio: 0, side: 'right', sigma: 0.05 },
  { kind: 'fin-shadow', widthRatio: 3, sigma: 0.05 },
  { kind: 'pole-shadow', shadowAzimuthDeg: 0, shadowAzimuthSigmaDeg: 1, lengthRatio: 0, lengthRatioSigma: 0.02 },
  { kind: 'eave-shadow', distanceRatio: 0.1, sigma: 0.05, projectionRatio: 0.1 },
  { kind: 'shadow-points', caster: [0, 0, 5], shadow: [0, 0, 0], sigmaM: 0.05 },
  { kind: 'sun-direction', azimuthDeg: 0, azimuthSigmaDeg: 1, altitudeDeg: 90, altitudeSigmaDeg: 1 },
  { kind: 'wall-lit' },
  { kind: 'wall-shaded' },
  { kind: 'sun-up' },
];

const CORNERS: readonly [string, number, number][] = [
  ['HSA exactly 0', 180, 40],
  ['HSA 1e-12', 180 + 1e-12, 40],
  ['HSA +90', 270, 40],
  ['HSA -90', 90, 40],
  ['HSA 180 (sun behind)', 0, 40],
  ['zenith', 123, 90],
  ['on the horizon in front', 180, 0],
  ['on the horizon in the wall plane', 90, 0],
  ['below the horizon', 200, -10],
  ['nadir', 0, -90],
];

describe('no NaN at the corners', () => {
  for (const [name, az, alt] of CORNERS) {
    it(`every model gives finite residuals and partials with the sun ${name} (wall facing 180)`, () => {
      for (const evidence of ALL) {
        const r = evidenceResiduals(evidence, { azimuthDeg: az, altitudeDeg: alt }, 180);
        for (const x of r.residuals) expect(Number.isFinite(x), `${evidence.kind} residual`).toBe(true);
        for (const row of r.partials) for (const x of row) expect(Number.isFinite(x), `${evidence.kind} partial`).toBe(true);
        const p = predictEvidence(evidence, { azimuthDeg: az, altitudeDeg: alt }, 180);
        for (const v of Object.values(p)) if (typeof v === 'number') expect(Number.isNaN(v), `${evidence.kind} prediction`).toBe(false);
        expect(evidenceLocus(evidence, 180).kind).toBeTypeOf('string');
      }
    });
  }
});

describe('limits of the rod shadow', () => {
  it('runs straight down with no side when HSA = 0 (tan slope = tan alt / sin 0 -> infinity)', () => {
    const p = predictRodShadow({ azimuthDeg: 180, altitudeDeg: 40 }, 180);
    expect(p.slopeDeg).toBe(90);
    expect(p.side).toBeNull();
    expectClose(p.directionDeg, -90, 1e-12);
    expect(p.defined).toBe(true);
  });
  it('tends to the altitude as |HSA| -> 90, and is not defined at 90 (wall grazed)', () => {
    expectClose(predictRodShadow({ azimuthDeg: 269.999, altitudeDeg: 25 }, 180).slopeDeg, 25, 1e-5);
    const at90 = predictRodShadow({ azimuthDeg: 270, altitudeDeg: 25 }, 180);
    expectClose(at90.slopeDeg, 25, 1e-9);
    expect(at90.defined).toBe(false);
  });
  it('is 90 deg at the zenith and not defined below the horizon or with the sun behind the wall', () => {
    expectClose(predictRodShadow({ azimuthDeg: 200, altitudeDeg: 90 }, 180).slopeDeg, 90, 1e-12);
    expect(predictRodShadow({ azimuthDeg: 200, altitudeDeg: -5 }, 180).defined).toBe(false);
    expect(predictRodShadow({ azimuthDeg: 10, altitudeDeg: 30 }, 180).defined).toBe(false);
  });
  it('is not defined with the sun on the horizon straight out from the wall (no direction)', () => {
    const r = evidenceResiduals({ kind: 'rod-shadow', slopeDeg: 60, side: 'left', sigmaDeg: 1 }, { azimuthDeg: 180, altitudeDeg: 0 }, 180);
    expect(r.defined).toBe(false);
    expect(r.partials[0].map(Math.abs)).toEqual([0, 0, 0]);
  });
});

describe('limits of the other models', () => {
  it('overhang: depth ratio -> infinity as |HSA| -> 90, profile angle 90 at the zenith', () => {
    expect(predictOverhangShadow({ azimuthDeg: 269.9999, altitudeDeg: 30 }, 180).depthRatio).toBeGreaterThan(1e5);
    expect(predictOverhangShadow({ azimuthDeg: 200, altitudeDeg: 90 }, 180).depthRatio).toBe(Infinity);
    expect(verticalShadowAngleDeg(90, 37)).toBe(90);
    // Sun up behind the wall: profile angle in (90, 180), as atan2 of (sin 30, cos 30 cos 180) = 150.
    expectClose(verticalShadowAngleDeg(30, 180), 150, 1e-12);
    expect(predictOverhangShadow({ azimuthDeg: 0, altitudeDeg: 30 }, 180).defined).toBe(false);
  });
  it('fin: zero width at HSA 0 with no side; not defined at |HSA| = 90', () => {
    expect(predictFinShadow({ azimuthDeg: 180, altitudeDeg: 30 }, 180)).toEqual({ widthRatio: 0, side: null, defined: true });
    const at90 = predictFinShadow({ azimuthDeg: 90, altitudeDeg: 30 }, 180);
    expect(at90.widthRatio).toBe(Infinity);
    expect(at90.defined).toBe(false);
  });
  it('pole: zero length at the zenith, infinite on the horizon, not defined below it', () => {
    expectClose(predictPoleShadow({ azimuthDeg: 0, altitudeDeg: 90 }).lengthRatio, 0, 1e-15);
    expect(predictPoleShadow({ azimuthDeg: 0, altitudeDeg: 0 }).lengthRatio).toBe(Infinity);
    expect(predictPoleShadow({ azimuthDeg: 0, altitudeDeg: -3 }).defined).toBe(false);
  });
  it('eave: the line is right below the edge at the zenith; on a lit wall with a shallow eave it is on the wall', () => {
    expectClose(predictEaveShadow({ azimuthDeg: 0, altitudeDeg: 90 }, 180, 0.25).distanceRatio, 0.25, 1e-15);
    // Lit south wall, sun due south at 45 deg, p/h = 0.2: d/h = 0.2 - 1 = -0.8 (shadow on the wall).
    const lit = predictEaveShadow({ azimuthDeg: 180, altitudeDeg: 45 }, 180, 0.2);
    expectClose(lit.distanceRatio, -0.8, 1e-12);
    expect(lit.defined).toBe(false);
    // Sun due north behind it at 45 deg: d/h = 0.2 + 1 = 1.2 (the brief form p/h + 1/tan(VSA') with VSA' = 45).
    expectClose(predictEaveShadow({ azimuthDeg: 0, altitudeDeg: 45 }, 180, 0.2).distanceRatio, 1.2, 1e-12);
    expect(predictEaveShadow({ azimuthDeg: 0, altitudeDeg: 0 }, 180, 0.2).distanceRatio).toBe(Infinity);
  });
  it('eave: a line right under the edge puts the sun in the wall plane (vertical loci at normal +/- 90)', () => {
    expect(evidenceLocus({ kind: 'eave-shadow', distanceRatio: 0.1, sigma: 0.05, projectionRatio: 0.1 }, 180)).toMatchObject({
      kind: 'vertical',
      azimuthsDeg: [90, 270],
    });
  });
});
