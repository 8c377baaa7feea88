/**
 * The unit of each fitted nuisance, in the JSON and the text answer: degrees for a wall's azimuth
 * and the site's latitude and longitude; one sigma of the camera's error for each component of the
 * camera's shared error (fitted with a prior of 0 and a sigma of 1, docs/solver.md), which is not
 * an angle. The scene is the Kornplatz example (examples/kornplatz-figures, invented), given a
 * latitude sigma so that a nuisance in degrees stands beside the camera's.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import { dateAnswerJson } from '../../src/report/json.js';
import { renderDateText } from '../../src/report/text.js';
import { solveDates } from '../../src/solver/solveDates.js';
import type { Scene } from '../../src/scene/types.js';
import type { DateAnswer } from '../../src/solver/types.js';

let scene: Scene;
let answer: DateAnswer;
beforeAll(() => {
  const read = readSceneFile('examples/kornplatz-figures/kornplatz-figures.yaml');
  scene = { ...read, site: { ...read.site, latitudeSigmaDeg: 0.05 } };
  answer = solveDates(scene);
}, 120_000);

describe('the unit of the fitted nuisances', () => {
  it('the JSON gives the camera components the unit "camera sigma" and the latitude "deg"', () => {
    const nuisances = dateAnswerJson(answer, scene, 'test').candidates[0].nuisances;
    const camera = nuisances.filter((n) => n.name?.startsWith('camera:'));
    const others = nuisances.filter((n) => !n.name?.startsWith('camera:'));
    expect(camera.length).toBeGreaterThan(0);
    for (const n of camera) expect(n.unit, n.name).toBe('camera sigma');
    expect(others.map((n) => n.name)).toEqual(['site:latitude']);
    for (const n of others) expect(n.unit, n.name).toBe('deg');
  });

  it('the text answer prints the latitude in degrees and the camera error in its own sigmas, not in degrees', () => {
    const lines = renderDateText(answer, scene).split('\n');
    const latitude = lines.find((l) => l.includes('fitted site:latitude'));
    expect(latitude).toMatch(/: -?\d+\.\d deg \(stated 47\.6 \+\/- 0\.1\)/);
    const camera = lines.filter((l) => l.includes('camera'));
    const fitted = camera.find((l) => l.includes('fitted camera error'));
    expect(fitted).toMatch(/in its own sigmas: [+-]\d+\.\d\d/);
    expect(fitted).not.toMatch(/\bdeg\b/);
    expect(lines.some((l) => /fitted camera:error/.test(l))).toBe(false);
  });
});
