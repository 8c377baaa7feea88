/**
 * A picture with no sizes in metres, dated from its perspective: the scene's camera block and object-shadow
 * pairs, resolved at the solver's entry (src/image/resolvePixels.ts, sceneSun.ts) into a sun direction per
 * group. Synthetic truth: the sun of a known instant at Velmar (src/ephemeris/sunPosition.ts), a box of
 * buildings photographed by a random pinhole camera (tests/image/boxScene.ts).
 */
import { describe, expect, test } from 'vitest';
import { createRandom } from '../../src/math/random.js';
import { angleDiffDeg } from '../../src/math/angles.js';
import { calendarDateToJd } from '../../src/calendar/julianDay.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { resolvePixelObservations } from '../../src/image/resolvePixels.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { checkProposal } from '../../src/solver/checkDate.js';
import { readSceneText } from '../../src/scene/readScene.js';
import { InvalidInputError } from '../../src/errors.js';
import type { Scene } from '../../src/scene/types.js';
import { randomBoxPicture, sceneOfPicture, type BoxPicture } from './boxScene.js';
import { VELMAR } from '../solver/syntheticScene.js';

// 1862 June 3, 15:10 UT at Velmar (a made-up instant of the fictional town)
const TRUTH_JD = calendarDateToJd({ calendar: 'gregorian', year: 1862, month: 6, day: 3 }) + (15 + 10 / 60) / 24;
const SUN = sunPosition(TRUTH_JD, VELMAR);

const BASE = {
  formatVersion: 1 as const,
  title: 'Velmar, figures in the Kornplatz (synthetic)',
  site: VELMAR,
  calendar: { kind: 'gregorian' as const },
  yearStart: 'jan1' as const,
  window: { fromYear: 1862, toYear: 1862 },
  mapNorthCorrectionDeg: 0,
  seed: 7,
};

function picture(seed: number): BoxPicture {
  const rng = createRandom(seed);
  for (;;) {
    const pic = randomBoxPicture(rng, { sun: { azimuthDeg: SUN.azimuthDeg, altitudeDeg: SUN.altitudeDeg }, pairs: 6 });
    if (pic) return pic;
  }
}

describe('object-shadow pairs through the camera: the sun per group', () => {
  test("without noise the group's sun is the true one within 0.01 deg, and every pair keeps its own great circle for the dating", () => {
    const pic = picture(1);
    const scene = sceneOfPicture(pic, createRandom(2), 0, 1, BASE);
    const r = resolvePixelObservations(scene);
    expect(r.scene.observations.map((o) => o.kind)).toEqual(['object-shadow', 'object-shadow', 'object-shadow', 'object-shadow', 'object-shadow', 'object-shadow']);
    for (const o of r.scene.observations) {
      if (o.kind !== 'object-shadow' || !o.circle || !o.sides) throw new Error('a pair without its circle');
      expect(o.circle.cameraSensitivity).toHaveLength(6); // focal length, principal point and rotation measured
    }
    expect(r.sceneSun?.groups).toHaveLength(1);
    expect(r.sceneSun?.camera.method.kind).toBe('orthocentre');
    const g = r.sceneSun!.groups[0];
    expect(Math.abs(angleDiffDeg(g.sun.azimuthDeg, SUN.azimuthDeg))).toBeLessThan(0.01);
    expect(Math.abs(g.sun.altitudeDeg - SUN.altitudeDeg)).toBeLessThan(0.01);
    // the reported sigmas are the first-order ones, widened by nothing
    expectCloseRatio(g.azimuthSigmaDeg / g.sun.azimuthSigmaDeg, 1);
  });

  test('groups are resolved separately; a group of one pair has no sun of its own but is kept for the dating', () => {
    const pic = picture(3);
    const scene = sceneOfPicture(pic, createRandom(4), 0, 1, BASE, (k) => (k < 3 ? 'buildings' : 'figures'));
    const r = resolvePixelObservations(scene);
    expect(r.sceneSun?.groups.map((g) => [g.group, g.ids.length])).toEqual([['buildings', 3], ['figures', 3]]);
    expect(r.scene.observations.map((o) => o.id)).toEqual(['fig0', 'fig1', 'fig2', 'fig3', 'fig4', 'fig5']);
    const lonely = resolvePixelObservations(sceneOfPicture(pic, createRandom(4), 0, 1, BASE, (k) => (k === 5 ? 'boat' : undefined)));
    expect(lonely.sceneSun?.singlePairs).toEqual([{ group: 'boat', id: 'fig5', field: 'observations[5]' }]);
    const boat = lonely.scene.observations[5];
    expect(boat.kind === 'object-shadow' && boat.circle !== undefined).toBe(true);
  });

  test('the group test: figures under the same sun agree with the buildings; figures under another sun are named (p < 0.01)', () => {
    const pic = picture(8);
    const same = resolvePixelObservations(sceneOfPicture(pic, createRandom(9), 1, 1, BASE, (k) => (k < 3 ? 'buildings' : 'figures')));
    const figuresSame = same.sceneSun!.groups.find((g) => g.group === 'figures')!;
    // another sun for the figures: 2 hours later that day (a figure painted in on another sitting)
    const other = sunPosition(TRUTH_JD + 2 / 24, VELMAR);
    const s2 = [Math.sin((other.azimuthDeg * Math.PI) / 180) * Math.cos((other.altitudeDeg * Math.PI) / 180), Math.cos((other.azimuthDeg * Math.PI) / 180) * Math.cos((other.altitudeDeg * Math.PI) / 180), Math.sin((other.altitudeDeg * Math.PI) / 180)] as const;
    const relit: BoxPicture = {
      ...pic,
      pairs: pic.pairs.map((p, k) => {
        if (k < 3) return p;
        const t = (p.object[2] - p.shadow[2]) / s2[2]; // same surface height under the shadow
        return { object: p.object, shadow: [p.object[0] - t * s2[0], p.object[1] - t * s2[1], p.shadow[2]] as const };
      }),
    };
    const mixed = resolvePixelObservations(sceneOfPicture(relit, createRandom(9), 1, 1, BASE, (k) => (k < 3 ? 'buildings' : 'figures')));
    const figuresOther = mixed.sceneSun!.groups.find((g) => g.group === 'figures')!;
    console.log(`group test: same sun ${figuresSame.againstRest!.sentence}; another sun ${figuresOther.againstRest!.sentence}`);
    expect(figuresSame.againstRest!.pValue).toBeGreaterThan(0.01);
    expect(figuresOther.againstRest!.pValue).toBeLessThan(0.01);
    expect(figuresOther.againstRest!.sentence).toMatch(/^the shadows of group "figures" do not share the light of the other pairs: p (=|<) /);
  });

  test('a picture with no sizes in metres is dated: the answer fits, and the true day and hour are consistent with it (1 px clicks)', () => {
    const pic = picture(5);
    const scene = sceneOfPicture(pic, createRandom(6), 1, 1, BASE);
    const answer = solveDates(scene, { consistency: false, perYear: true, maxFamilies: 6, maxCandidates: 6, profileScans: false });
    const r = resolvePixelObservations(scene);
    const g = r.sceneSun!.groups[0];
    const best = answer.candidates[0];
    const minutes = 15 * 60 + 10;
    const check = checkProposal(scene, { kind: 'day', day: { year: 1862, month: 6, day: 3 }, timeMinutes: minutes, timeClock: { kind: 'ut' } });
    console.log(
      `dated from the perspective alone: sun ${g.sun.azimuthDeg.toFixed(2)} +/- ${g.azimuthSigmaDeg.toFixed(2)} deg azimuth, ` +
        `${g.sun.altitudeDeg.toFixed(2)} +/- ${g.altitudeSigmaDeg.toFixed(2)} deg altitude (truth ${SUN.azimuthDeg.toFixed(2)}, ${SUN.altitudeDeg.toFixed(2)}); ` +
        `status ${answer.status}, best ${best.civilDate.year}-${best.civilDate.month}-${best.civilDate.day} sun ${best.sun.azimuthDeg.toFixed(2)}/${best.sun.altitudeDeg.toFixed(2)}; ` +
        `the true instant: ${check.verdict}, chi-square ${check.chiSquare?.toFixed(2)}`,
    );
    expect(answer.status).not.toBe('nothing-fits');
    // the best candidate, fitted to the pairs one by one, puts the sun where the pairs' combined vanishing point does,
    // within a fraction of its sigma (the two agree to first order; tests/solver/cameraEvidence.test.ts)
    expect(Math.abs(angleDiffDeg(best.sun.azimuthDeg, g.sun.azimuthDeg))).toBeLessThan(0.5 * g.azimuthSigmaDeg);
    expect(Math.abs(best.sun.altitudeDeg - g.sun.altitudeDeg)).toBeLessThan(0.5 * g.altitudeSigmaDeg);
    // the truth within the 99% region of 2 degrees of freedom (Delta chi2 9.21, NIST/SEMATECH chi-square table)
    expect(check.chiSquare!).toBeLessThan(9.21);
    expect(Math.abs(angleDiffDeg(g.sun.azimuthDeg, SUN.azimuthDeg))).toBeLessThan(3 * g.azimuthSigmaDeg);
    expect(Math.abs(g.sun.altitudeDeg - SUN.altitudeDeg)).toBeLessThan(3 * g.altitudeSigmaDeg);
  });
});

describe('a single pair is evidence of its own', () => {
  test('one object-shadow pair and a clock keeping local apparent time date a picture: the true day and hour are consistent, a day two months off is not', () => {
    const pic = picture(5);
    const scene = sceneOfPicture(pic, createRandom(6), 1, 1, BASE);
    // the true local apparent time at Velmar, from the ephemeris's hour angle (Meeus 1998 ch. 13: apparent time = hour angle + 12 h)
    const apparent = ((SUN.hourAngleDeg / 15 + 12) * 60 + 1440) % 1440;
    const reading = `${Math.floor(apparent / 60)}:${String(Math.round(apparent % 60)).padStart(2, '0')}`;
    const one: Scene = {
      ...scene,
      observations: [
        scene.observations[0],
        { id: 'town-clock', kind: 'clock', readingMinutes: Math.round(apparent), precisionMinutes: 2, hourHandTrusted: true, dialHours: 24, kept: { kind: 'apparent' } },
      ],
    };
    const answer = solveDates(one, { consistency: false, perYear: true, maxFamilies: 6, maxCandidates: 6, profileScans: false });
    const truth = checkProposal(one, { kind: 'day', day: { year: 1862, month: 6, day: 3 }, timeMinutes: 15 * 60 + 10, timeClock: { kind: 'ut' } });
    const wrong = checkProposal(one, { kind: 'day', day: { year: 1862, month: 4, day: 3 } });
    console.log(`one pair and a clock reading ${reading}: status ${answer.status}; the true instant ${truth.verdict} (chi-square ${truth.chiSquare?.toFixed(2)}); 3 April: ${wrong.verdict}; best ${answer.candidates.slice(0, 2).map((c) => `${c.civilDate.month}-${c.civilDate.day}`).join(', ')}`);
    expect(answer.status).not.toBe('nothing-fits');
    expect(truth.chiSquare!).toBeLessThan(9.21); // 99% of 2 degrees of freedom (NIST/SEMATECH chi-square table)
    expect(wrong.verdict).not.toBe(truth.verdict);
  });
});

function expectCloseRatio(a: number, b: number): void {
  expect(Math.abs(a / b - 1)).toBeLessThan(1e-9);
}

describe('edge cases: the scene file', () => {
  const yaml = (extra: string, obs: string): string => `heliochron: 1
title: Velmar, a print of the Kornplatz
site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 }
calendar: gregorian
window: { fromYear: 1850, toYear: 1870 }
image: { widthPx: 1600, heightPx: 1200, pixelSigmaPx: 1.5 }
walls:
  - { id: guildhall-front, azimuthDeg: 150, azimuthSigmaDeg: 0 }
  - { id: guildhall-side, azimuthDeg: 240, azimuthSigmaDeg: 0 }
${extra}
observations:
${obs}
`;
  const camera = `camera:
  verticalLines:
    - [[400, 100], [402, 900]]
    - [[800, 80], [801, 950]]
  wallLines:
    - wall: guildhall-front
      lines:
        - [[100, 300], [700, 350]]
        - [[100, 600], [700, 580]]
  focalLengthPx: 1800`;
  const pair = `  - { id: fig1, kind: object-shadow, objectPx: [500, 700], shadowPx: [560, 980], group: figures }`;

  test('the camera block and an object-shadow pair are read', () => {
    const s: Scene = readSceneText(yaml(camera, pair), 'k.yaml');
    expect(s.camera?.verticalLines).toHaveLength(2);
    expect(s.camera?.wallLines[0].wallId).toBe('guildhall-front');
    expect(s.camera?.focalLengthPx).toBe(1800);
    expect(s.observations[0]).toEqual({ id: 'fig1', kind: 'object-shadow', objectPx: [500, 700], shadowPx: [560, 980], group: 'figures' });
  });

  const refused = (text: string): InvalidInputError => {
    try {
      readSceneText(text, 'k.yaml');
    } catch (e) {
      if (e instanceof InvalidInputError) return e;
      throw e;
    }
    throw new Error('expected a refusal');
  };

  test('an object-shadow pair without a camera block is refused', () => {
    const e = refused(yaml('', pair));
    expect(e.field).toBe('observations[0].kind');
    expect(e.message).toContain('"camera" block');
  });

  test('an unknown wall, a line of one point, a single vertical line are refused by field', () => {
    expect(refused(yaml(camera.replace('wall: guildhall-front', 'wall: guildhal-front'), pair)).message).toContain('Did you mean "guildhall-front"');
    expect(refused(yaml(camera.replace('- [[100, 600], [700, 580]]', '- [[100, 600]]'), pair)).field).toBe('camera.wallLines[0].lines[1]');
    expect(refused(yaml(camera.replace('    - [[800, 80], [801, 950]]\n', ''), pair)).field).toBe('camera.verticalLines');
    expect(refused(yaml(camera, pair.replace('[560, 980]', '[560, 1980]'))).field).toBe('observations[0].shadowPx[1]');
  });
});
