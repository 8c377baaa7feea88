/**
 * Stage A's grid is evaluated once per solve and its residual rows kept; the reruns without an
 * observation (when nothing fits) sum the rows they still have. The contract: the summed grid gives
 * exactly the stage-A minima that evaluating the grid afresh gives (same numbers, bit for bit), for
 * shadows, clocks of known and unknown kind, and facts whose implicit carrier is the observation left out.
 * The reference is the solver's own fresh evaluation (an internal consistency check; the answers
 * themselves are checked against outside sources in tests/examples and tests/golden).
 */
import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import { buildEvidenceModel, rowSourcesIn } from '../../src/solver/evidenceModel.js';
import { searchCandidates } from '../../src/solver/search.js';
import { stageA } from '../../src/solver/stageA.js';
import { zoneOffsetsAt } from '../../src/solver/fitting.js';
import { lowPrecisionSun } from '../../src/solver/seasons.js';
import { dayWindowOf } from '../../src/solver/window.js';
import { solveDates } from '../../src/solver/solveDates.js';
import type { ClockKind, Scene } from '../../src/scene/types.js';
import { baseScene } from './syntheticScene.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

/** Two rod shadows on one wall that cannot both hold, a clock of unknown kind and a fact: nothing fits. */
const CONFLICT: Scene = baseScene(
  [
    { id: 'bracket-left', kind: 'rod-shadow', wallId: 'tanners-hall', slopeDeg: 30, side: 'right', sigmaDeg: 0.5 },
    { id: 'bracket-right', kind: 'rod-shadow', wallId: 'tanners-hall', slopeDeg: 50, side: 'right', sigmaDeg: 0.5 },
    { id: 'church-clock', kind: 'clock', readingMinutes: 600, precisionMinutes: 5, hourHandTrusted: true, dialHours: 24, kept: { kind: 'unknown' } },
    { id: 'gate-lit', kind: 'wall-lit', wallId: 'gate-tower' },
  ],
  [
    { id: 'tanners-hall', azimuthDeg: 160, azimuthSigmaDeg: 2, azimuthSource: 'stated' },
    { id: 'gate-tower', azimuthDeg: 100, azimuthSigmaDeg: 0, azimuthSource: 'stated' },
  ],
  1700,
  1720,
);

const scenes: [string, Scene][] = [
  ['conflicting brackets, a clock of unknown kind and a lit wall', CONFLICT],
  ['examples/marktgasse-print.yaml', readSceneFile(`${ROOT}examples/marktgasse-print.yaml`)],
  ['tests/solver/scenes/orlau-square.yaml', readSceneFile(`${ROOT}tests/solver/scenes/orlau-square.yaml`)],
];

describe('stage A reruns sum the kept grid', () => {
  it.each(scenes)('%s: without each observation, the summed grid gives exactly the minima of a fresh one', (_name, scene) => {
    const full = buildEvidenceModel(scene);
    const win = dayWindowOf(scene);
    const kept = searchCandidates(full, win).stageAGrids;
    const obliquityDeg = lowPrecisionSun(0.5 * (win.firstDayJd0 + win.lastDayJd0)).obliquityDeg;
    let summedRuns = 0;
    for (const o of scene.observations) {
      const reduced = buildEvidenceModel(scene, new Set([o.id]));
      const sources = rowSourcesIn(reduced, full);
      expect(sources, `rows of the model without ${o.id}`).not.toBeNull();
      for (const [key, grid] of kept.byAssumption) {
        const kind = JSON.parse(key) as ClockKind | null; // the key is the assumed kind written as JSON (null: no clock)
        const zoneOffset = zoneOffsetsAt(reduced, kind, 0.5 * (win.firstDayJd0 + win.lastDayJd0));
        const fresh = stageA(reduced, kind, zoneOffset, obliquityDeg);
        const summed = stageA(reduced, kind, zoneOffset, obliquityDeg, { grid, sources: sources! });
        expect(summed.gridSummed).toBe(true);
        expect(fresh.gridSummed).toBe(false);
        expect(summed.minima).toEqual(fresh.minima);
        summedRuns += 1;
      }
    }
    expect(summedRuns).toBeGreaterThanOrEqual(scene.observations.length);
  });

  it('the answer when nothing fits names the same conflict with the grid reused', () => {
    const a = solveDates(CONFLICT);
    expect(a.status).toBe('nothing-fits');
    // Two parallel shadows on one wall (same sun, same wall) cannot have slopes 30 and 50 deg: one of them is named.
    expect(a.conflictingIds.some((id) => id.startsWith('bracket-'))).toBe(true);
  });
});
