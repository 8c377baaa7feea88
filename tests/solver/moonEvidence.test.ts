/**
 * The moon's residual terms (src/solver/moonEvidence.ts): angles compared on the circle, named phases
 * by phase longitude (0 new, 90 first quarter, 180 full, 270 last quarter: Meeus, Astronomical
 * Algorithms, 2nd ed. 1998, ch. 49), "crescent" and "gibbous" folded, a reversed print flipped.
 */
import { describe, expect, it } from 'vitest';
import type { MoonPosition } from '../../src/ephemeris/moonPosition.js';
import { moonFactViolationDeg, moonResiduals, moonTermsOf } from '../../src/solver/moonEvidence.js';
import { baseScene } from './syntheticScene.js';

function moonAt(fields: Partial<MoonPosition>): MoonPosition {
  return {
    jdUT: 0, jdTT: 0, azimuthDeg: 180, altitudeDeg: 20, geometricAltitudeDeg: 20, rightAscensionDeg: 0, declinationDeg: 0, hourAngleDeg: 0,
    distanceKm: 384400, phaseAngleDeg: 90, illuminatedFraction: 0.5, elongationDeg: 90, phaseLongitudeDeg: 90, waxing: true,
    brightLimbPositionAngleDeg: 270, parallacticAngleDeg: 0, brightLimbTiltFromVerticalDeg: -90, ...fields,
  };
}

describe('the moon as residuals', () => {
  it('takes the azimuth, a named phase and the lit side on the circle', () => {
    expect(moonResiduals({ kind: 'moon-direction', azimuthDeg: 359, azimuthSigmaDeg: 1, altitudeDeg: 20, altitudeSigmaDeg: 1 }, moonAt({ azimuthDeg: 1 }))[0]).toBeCloseTo(2, 9);
    expect(moonResiduals({ kind: 'moon-named-phase', phase: 'new', phaseLongitudeDeg: 0, folded: false, sigmaDeg: 10 }, moonAt({ phaseLongitudeDeg: 358 }))[0]).toBeCloseTo(-0.2, 9);
    expect(moonResiduals({ kind: 'moon-lit-side', tiltDeg: 179, drawnDeg: 179, mirrored: false, sigmaDeg: 1 }, moonAt({ brightLimbTiltFromVerticalDeg: -179 }))[0]).toBeCloseTo(2, 9);
  });
  it('compares "crescent" with the folded phase longitude: a waning crescent at 315 deg is 45 deg from new', () => {
    expect(moonResiduals({ kind: 'moon-named-phase', phase: 'crescent', phaseLongitudeDeg: 45, folded: true, sigmaDeg: 22.5 }, moonAt({ phaseLongitudeDeg: 315 }))[0]).toBeCloseTo(0, 9);
  });
  it('flips the drawn lit side of a reversed print', () => {
    const scene = baseScene([{ id: 'lit', kind: 'moon-lit-side', litSideDeg: 100, sigmaDeg: 5 }], [], 1800, 1810, { image: { widthPx: 100, heightPx: 100, mirrored: true, pixelSigmaPx: 1 } });
    const { terms, facts } = moonTermsOf(scene, new Set());
    expect(terms[0].evidence.kind === 'moon-lit-side' ? terms[0].evidence.tiltDeg : NaN).toBe(-100);
    expect(facts).toEqual([{ observationId: 'lit', fact: 'moon-up', implicit: true }]);
  });
  describe('edge cases', () => {
    it('costs nothing when the facts hold, and the altitude below or above the horizon when they do not', () => {
      expect(moonFactViolationDeg('moon-up', moonAt({ altitudeDeg: 3 }))).toBe(0);
      expect(moonFactViolationDeg('moon-up', moonAt({ altitudeDeg: -2 }))).toBe(2);
      expect(moonFactViolationDeg('moon-not-up', moonAt({ altitudeDeg: 4 }))).toBe(4);
    });
  });
});
