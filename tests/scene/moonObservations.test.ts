/**
 * The scene reader on the moon's observations (docs/scene-file.md, docs/moon-evidence.md): what it
 * reads, its default sigma for a named phase, and its one-line refusals naming field, value and what
 * is allowed. Contracts of the file format (common practice of the reader's other kinds).
 */
import { describe, expect, it } from 'vitest';
import { readSceneText } from '../../src/scene/readScene.js';
import { MOON_PHASE_DEFAULT_SIGMA_DEG } from '../../src/scene/readObservation.js';

const scene = (observations: string): string => `heliochron: 1
title: Velmar test
site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 }
calendar: gregorian
window: { fromYear: 1800, toYear: 1839 }
walls:
  - { id: gate-west, azimuthDeg: 262, azimuthSigmaDeg: 1 }
observations:
${observations}
`;

describe('the moon in a scene file', () => {
  it('reads the moon\'s direction, phase by fraction or by name, lit side and facts', () => {
    const s = readSceneText(scene(`  - { id: m, kind: moon-direction, azimuthDeg: 235, azimuthSigmaDeg: 1, altitudeDeg: 23, altitudeSigmaDeg: 1 }
  - { id: k, kind: moon-phase, illuminatedFraction: 0.2, sigma: 0.05 }
  - { id: n, kind: moon-phase, phase: waxing crescent }
  - { id: t, kind: moon-lit-side, litSideDeg: -105, sigmaDeg: 10 }
  - { id: u, kind: moon-up }
  - { id: v, kind: moon-not-up }
  - { id: r, kind: rod-shadow, wall: gate-west, slopeDeg: 13, side: right, sigmaDeg: 1, light: sun }`), 'velmar.yaml');
    expect(s.observations.map((o) => o.kind)).toEqual(['moon-direction', 'moon-phase', 'moon-phase', 'moon-lit-side', 'moon-up', 'moon-not-up', 'rod-shadow']);
    const named = s.observations[2];
    expect(named.kind === 'moon-phase' && named.phase === 'waxing crescent' ? named.sigmaDeg : NaN).toBe(MOON_PHASE_DEFAULT_SIGMA_DEG);
  });

  describe('edge cases', () => {
    const refusal = (obs: string): string => {
      try {
        readSceneText(scene(obs), 'velmar.yaml');
      } catch (e) {
        return (e as Error).message;
      }
      return 'no refusal';
    };
    it('refuses a phase given both as a fraction and by name', () => {
      expect(refusal('  - { id: k, kind: moon-phase, illuminatedFraction: 0.2, sigma: 0.05, phase: full }')).toMatch(/observations\[0\]\.phase.*either "illuminatedFraction"/);
    });
    it('refuses an unknown phase name with a suggestion', () => {
      expect(refusal('  - { id: k, kind: moon-phase, phase: waxing cresent }')).toMatch(/Did you mean "waxing crescent"/);
    });
    it('refuses a fraction outside 0..1 and a fraction without its sigma', () => {
      expect(refusal('  - { id: k, kind: moon-phase, illuminatedFraction: 1.2, sigma: 0.05 }')).toMatch(/illuminatedFraction/);
      expect(refusal('  - { id: k, kind: moon-phase, illuminatedFraction: 0.2 }')).toMatch(/sigma/);
    });
    it('reads shadows cast by moonlight on every shadow kind, and keeps the sun as the default', () => {
      const s = readSceneText(scene([
        '  - { id: r, kind: rod-shadow, wall: gate-west, slopeDeg: 13, side: right, sigmaDeg: 1, light: moon }',
        '  - { id: o, kind: overhang-shadow, wall: gate-west, depthRatio: 0.4, sigma: 0.05, light: moon }',
        '  - { id: f, kind: fin-shadow, wall: gate-west, widthRatio: 0.4, side: left, sigma: 0.05, light: moon }',
        '  - { id: p, kind: pole-shadow, shadowAzimuthDeg: 20, shadowAzimuthSigmaDeg: 1, light: moon }',
        '  - { id: e, kind: eave-shadow, wall: gate-west, distanceRatio: 0.5, sigma: 0.05, light: moon }',
        '  - { id: s, kind: shadow-points, caster: [0, 0, 2], shadow: [1, 1, 0], sigmaM: 0.05, light: moon }',
        '  - { id: q, kind: pole-shadow, lengthRatio: 1.2, lengthRatioSigma: 0.05, light: sun }',
        '  - { id: z, kind: sun-not-up }',
      ].join('\n')), 'velmar.yaml');
      // The sun, the default, is not written out: no "light" on a sunlit shadow.
      expect(s.observations.map((o) => (o as { light?: string }).light ?? 'sun')).toEqual(['moon', 'moon', 'moon', 'moon', 'moon', 'moon', 'sun', 'sun']);
      expect(s.observations[7].kind).toBe('sun-not-up');
    });
    it('refuses a light other than the sun or the moon, naming the field and what is allowed', () => {
      expect(refusal('  - { id: r, kind: rod-shadow, wall: gate-west, slopeDeg: 13, side: right, sigmaDeg: 1, light: lamp }')).toMatch(/observations\[0\]\.light.*"sun" or "moon"/);
    });
    it('refuses a light on an observation that is not a shadow', () => {
      expect(refusal('  - { id: d, kind: moon-phase, illuminatedFraction: 0.5, sigma: 0.05, light: moon }')).toMatch(/observations\[0\]\.light/);
    });
    it('refuses a moonlit point shadow above its caster, with the moon in the message', () => {
      expect(refusal('  - { id: s, kind: shadow-points, caster: [0, 0, 1], shadow: [1, 1, 2], sigmaM: 0.05, light: moon }')).toMatch(/moon above the horizon/);
    });
    it('refuses the moon\'s direction in pixels in a scene without a picture, naming the pixel form', () => {
      expect(refusal('  - { id: m, kind: moon-direction, pixels: { centrePx: [1, 2] } }')).toMatch(/observations\[0\]\.pixels.*image/);
    });
    it('refuses a lit side of -180 (written as 180)', () => {
      expect(refusal('  - { id: t, kind: moon-lit-side, litSideDeg: -180, sigmaDeg: 10 }')).toMatch(/litSideDeg/);
    });
  });

  describe('the moon in pixels', () => {
    const pictured = (walls: string, observations: string): string => scene(observations)
      .replace('walls:\n  - { id: gate-west, azimuthDeg: 262, azimuthSigmaDeg: 1 }', `image: { widthPx: 1600, heightPx: 1200 }\nwalls:\n${walls}`);
    const figure = '  - { id: gate-west, azimuthDeg: 262, azimuthSigmaDeg: 1, imagePlane: { pointsPx: [[400, 500], [900, 560], [880, 1000], [420, 980]], widthM: 6, heightM: 4 } }';
    const bare = '  - { id: gate-west, azimuthDeg: 262, azimuthSigmaDeg: 1 }';
    const refusal = (walls: string, obs: string): string => {
      try {
        readSceneText(pictured(walls, obs), 'velmar.yaml');
      } catch (e) {
        return (e as Error).message;
      }
      return 'no refusal';
    };
    it('reads the clicked centre, its sigma and the wall it is measured through', () => {
      const s = readSceneText(pictured(figure, '  - { id: m, kind: moon-direction, pixels: { centrePx: [1210, 180], sigmaPx: 2, wall: gate-west } }'), 'velmar.yaml');
      expect(s.observations[0]).toEqual({ id: 'm', kind: 'moon-direction', pixels: { centrePx: [1210, 180], sigmaPx: 2, wallId: 'gate-west' } });
    });
    it('refuses numbers beside the pixel form', () => {
      expect(refusal(figure, '  - { id: m, kind: moon-direction, azimuthDeg: 200, pixels: { centrePx: [1210, 180], wall: gate-west } }')).toMatch(/observations\[0\]\.azimuthDeg.*either the moon's direction as numbers .* or "pixels"/);
    });
    it('refuses a centre outside the picture, naming it', () => {
      expect(refusal(figure, '  - { id: m, kind: moon-direction, pixels: { centrePx: [1700, 180], wall: gate-west } }')).toMatch(/observations\[0\]\.pixels\.centrePx/);
    });
    it('refuses a wall without its clicked figure', () => {
      expect(refusal(bare, '  - { id: m, kind: moon-direction, pixels: { centrePx: [1210, 180], wall: gate-west } }')).toMatch(/observations\[0\]\.pixels\.wall.*"gate-west".*imagePlane/);
    });
    it('refuses a moon in pixels with neither a camera block, a ground plane nor a wall\'s figure, saying why', () => {
      expect(refusal(bare, '  - { id: m, kind: moon-direction, pixels: { centrePx: [1210, 180] } }')).toMatch(/observations\[0\]\.pixels.*camera.*groundPlane.*lies on no plane/s);
    });
    it('refuses an unknown key of the pixel form with a suggestion', () => {
      expect(refusal(figure, '  - { id: m, kind: moon-direction, pixels: { centerPx: [1210, 180], wall: gate-west } }')).toMatch(/centrePx/);
    });
  });
});
