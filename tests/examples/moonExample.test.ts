/**
 * examples/fischertor-crescent.yaml: an evening view in the fictional town of Velmar with a young
 * crescent over the roofs, dated to its year by the moon (examples/README.md, example (d)). Its truth
 * is invented demo data; the file's numbers are checked against heliochron's own forward models at the
 * true instant (src/ephemeris/sunPosition.ts, moonPosition.ts, src/geometry/), which are checked
 * against published values in tests/ephemeris and tests/geometry.
 */
import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { sunPosition } from '../../src/ephemeris/sunPosition.js';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';
import { predictRodShadow } from '../../src/geometry/wallShadows.js';
import { predictPoleShadow } from '../../src/geometry/groundShadows.js';
import { renderDateText } from '../../src/report/text.js';
import type { Observation, Scene } from '../../src/scene/types.js';
import { expectClose } from '../helpers/expectClose.js';
import { observationOf, truthJdUT as exampleTruthJdUT } from './exampleTruth.js';

const FILE = fileURLToPath(new URL('../../examples/fischertor-crescent.yaml', import.meta.url));
const scene = readSceneFile(FILE);
/** The true instant: 16 August 1817 (Gregorian), 18:30 local apparent time. */
const TRUTH = { year: 1817, month: 8, day: 16, apparentMinutes: 18 * 60 + 30 };

const truthJdUT = (): number => exampleTruthJdUT(scene, TRUTH);
const obs = <K extends Observation['kind']>(id: string, kind: K): Extract<Observation, { kind: K }> => observationOf(scene, id, kind);

describe('fischertor-crescent.yaml: the numbers are the forward models at the true instant, rounded', () => {
  const jd = truthJdUT();
  const sun = sunPosition(jd, scene.site, scene.air);
  const moon = moonPosition(jd, scene.site, scene.air);
  it('holds the shadows of the sun at 18:30 local apparent time, 16 August 1817', () => {
    expectClose(obs('lantern-arm', 'rod-shadow').slopeDeg ?? NaN, predictRodShadow(sun, 262).slopeDeg, 0.5, 'rod slope, deg');
    expectClose(obs('mooring-post', 'pole-shadow').shadowAzimuthDeg ?? NaN, predictPoleShadow(sun).shadowAzimuthDeg, 0.5, 'shadow azimuth, deg');
    expectClose(obs('mooring-post', 'pole-shadow').lengthRatio ?? NaN, predictPoleShadow(sun).lengthRatio, 0.05, 'length ratio');
  });
  it('holds the moon of that instant: its place, its lit fraction and the side it is lit on', () => {
    expectClose(obs('crescent-place', 'moon-direction').azimuthDeg ?? NaN, moon.azimuthDeg, 0.25, 'moon azimuth, deg');
    expectClose(obs('crescent-place', 'moon-direction').altitudeDeg ?? NaN, moon.altitudeDeg, 0.5, 'moon altitude, deg');
    expectClose(obs('crescent-phase', 'moon-phase').illuminatedFraction ?? NaN, moon.illuminatedFraction, 0.025, 'lit fraction');
    expectClose(obs('crescent-lit-side', 'moon-lit-side').litSideDeg, moon.brightLimbTiltFromVerticalDeg, 2.5, 'lit side, deg');
  });
});

describe('fischertor-crescent.yaml: the moon names the year', () => {
  const answer = solveDates(scene);
  it('ranks 16 August 1817, 18:30 local apparent time, first', () => {
    expect(answer.status).toBe('fits');
    const best = answer.candidates[0];
    expect(best.civilDate).toEqual({ calendar: 'gregorian', year: 1817, month: 8, day: 16 });
    expectClose(best.times.localApparentMinutes, TRUTH.apparentMinutes, 5, 'local apparent time, minutes');
  });
  it('names 1817 alone, singled out by the moon, and lists its near-repeats in the window as fitting worse', () => {
    expect(answer.moon?.years).toEqual([1817]);
    expect(answer.families[0].yearsTold.singledOut).toBe(true);
    expect(answer.families[0].headline).toContain('singled out by the moon');
    expect(answer.moon?.nearRepeats.map((n) => n.year).sort()).toEqual([1806, 1809, 1825, 1828]);
    expect(answer.moon?.nearRepeats.every((n) => !n.fitsAlike && (n.deltaChiSquare ?? 0) > 3.841)).toBe(true);
    const r1809 = answer.moon?.nearRepeats.find((n) => n.year === 1809);
    expect(r1809?.refined).toBe(true);
    expectClose(r1809?.deltaChiSquare ?? NaN, 21.4, 0.5, 'Delta chi-square of 1809');
    expect(answer.verdict).toContain('The moon names 1817');
    expect(answer.consistency.flaggedIds).toEqual([]);
  });
  it('says so in the text report, with the caution', () => {
    const text = renderDateText(answer, scene);
    expect(text).toContain('Years that fit: 1817 alone');
    expect(text).toContain('A painted moon may be a convention');
  });
  it('says that each candidate\'s ellipse is its own fit with the moon, and nothing of shared or sun-only ellipses', () => {
    // The ellipses include the moon (src/solver/candidateUncertainty.ts; calibrated in tests/solver/moonEllipse.test.ts).
    expect(answer.notes).toContain("Each candidate's error ellipse and day interval come from its own fit with the moon's evidence, in its own year; none is shared with another year.");
    expect(answer.notes.some((n) => n.includes('Mapped years share the ellipse') || n.includes("sun's evidence alone"))).toBe(false);
  });
  it('without the moon, leaves the years open', () => {
    const sunOnly: Scene = { ...scene, observations: scene.observations.filter((o) => !o.kind.startsWith('moon')) };
    const a = solveDates(sunOnly, { consistency: false });
    expect(a.families[0].yearsTold.singledOut).toBe(false);
    expect(a.families[0].yearsTold.alikeYears.length).toBeGreaterThan(20);
    expect(a.notes).toContain('Mapped years share the ellipse of the nearest representative year that was refined in full.');
  });
});

describe('edge cases of the moon as evidence', () => {
  it('reads a reversed print with its lit side flipped: the same answer', () => {
    const mirrored: Scene = {
      ...scene,
      image: { widthPx: 1200, heightPx: 900, mirrored: true, pixelSigmaPx: 1 },
      observations: scene.observations.map((o) => (o.kind === 'moon-lit-side' ? { ...o, litSideDeg: -o.litSideDeg } : o)),
    };
    const a = solveDates(mirrored, { consistency: false });
    expect(a.candidates[0].civilDate.year).toBe(1817);
    const lit = a.candidates[0].residuals.find((r) => r.component === 'lit-side-tilt');
    expect(Math.abs(lit?.normalised ?? 99)).toBeLessThan(1);
  });
  it('names a crescent lit away from the sun as a moon that cannot be, and the consistency test names it', () => {
    const wrong: Scene = {
      ...scene,
      observations: scene.observations.map((o) => (o.kind === 'moon-lit-side' ? { ...o, litSideDeg: 75 } : o)),
    };
    const a = solveDates(wrong);
    expect(a.status).toBe('nothing-fits');
    expect(a.verdict).toContain('lit on the wrong side');
    expect(a.conflictingIds).toContain('crescent-lit-side');
  }, 120_000);
});
