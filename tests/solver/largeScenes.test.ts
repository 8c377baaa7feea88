/**
 * Large scenes: the leave-one-out test of a scene with many observations is estimated from the
 * full fit (downdated normal equations and one Gauss-Newton step, src/solver/consistency.ts) and
 * the whole search is rerun only for the observations the estimate names (src/solver/largeScenes.ts).
 * Checked here against the exact refits they replace (the solver's own full refits, run beside
 * them), and the small linear solver against a worked elimination example.
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import type { Scene } from '../../src/scene/types.js';
import { solveDates, solveModel } from '../../src/solver/solveDates.js';
import { buildEvidenceModel } from '../../src/solver/evidenceModel.js';
import { dayWindowOf } from '../../src/solver/window.js';
import { assumedKind } from '../../src/solver/candidates.js';
import { downdatedLeaveOneOut, EXACT_LEAVE_ONE_OUT_MAX_OBSERVATIONS, localLeaveOneOut, rowsRemovedWith } from '../../src/solver/consistency.js';
import { solveSmallSystem } from '../../src/math/leastSquares.js';
import { expectClose } from '../helpers/expectClose.js';

const SALT_HOUSE = readSceneFile(fileURLToPath(new URL('../../examples/salt-house-sketch.yaml', import.meta.url)));

/** The Salt House scene with its observations copied until there are n (the figure left out when asked). */
function copies(n: number, withFigure: boolean): Scene {
  const pool = SALT_HOUSE.observations.filter((o) => withFigure || o.id !== 'figure-shadow');
  const observations = Array.from({ length: n }, (_, i) => ({ ...pool[i % pool.length], id: `${pool[i % pool.length].id}-${Math.floor(i / pool.length) + 1}` }));
  return { ...SALT_HOUSE, observations };
}

describe('the small linear solver', () => {
  it('solves the worked elimination example 2u + v + w = 5, 4u - 6v = -2, -2u + 7v + 2w = 9 to (1, 1, 2)', () => {
    // Strang, Linear Algebra and Its Applications, sec. 1.3, the elimination example (from memory).
    const x = solveSmallSystem([[2, 1, 1], [4, -6, 0], [-2, 7, 2]], [5, -2, 9]);
    expect(x).not.toBeNull();
    [1, 1, 2].forEach((v, i) => expectClose((x as number[])[i], v, 1e-12, `x[${i}]`));
  });
  it('needs a row exchange when the first pivot is zero, and says null for a singular matrix', () => {
    const x = solveSmallSystem([[0, 1], [1, 0]], [3, 4]) as number[];
    expectClose(x[0], 4, 0, 'x[0]');
    expectClose(x[1], 3, 0, 'x[1]');
    expect(solveSmallSystem([[1, 2], [2, 4]], [1, 2])).toBeNull();
  });
});

describe('the leave-one-out estimate of a large scene', () => {
  it.each([4, 16])('agrees with the exact local refits of a scene small enough to refit (%i consistent observations)', (n) => {
    const scene = copies(n, false);
    expect(scene.observations.length).toBeLessThanOrEqual(EXACT_LEAVE_ONE_OUT_MAX_OBSERVATIONS);
    const model = buildEvidenceModel(scene);
    const win = dayWindowOf(scene);
    const s = solveModel(model, win, 50);
    const best = s.kept[0];
    const assumed = assumedKind(s.search.assumptions[best.assumptionIndex]);
    const exact = localLeaveOneOut(scene, model, best, assumed, win);
    const estimated = downdatedLeaveOneOut(model, { point: best.point, assumed }, rowsRemovedWith(model));
    expect(exact.length).toBe(n);
    expect(Math.max(...exact.map((e) => best.objective - e.objectiveWithout))).toBeGreaterThan(0.02); // a fall to estimate
    for (const e of exact) {
      const est = estimated.get(e.observationId);
      expect(est, e.observationId).toBeDefined();
      // The fall of chi-square, exact against estimated: within 2e-4 (the falls here are 0.0001-0.036).
      expectClose(best.objective - (est?.objective ?? NaN), best.objective - e.objectiveWithout, 2e-4, `fall without ${e.observationId}`);
    }
  });

  it('agrees with the whole search rerun without an observation when nothing fits (25 observations)', () => {
    const scene = copies(25, true);
    const answer = solveDates(scene);
    expect(answer.status).toBe('nothing-fits');
    const estimatedEntries = answer.consistency.entries.filter((e) => e.note.includes('estimated from the full fit'));
    const rerunEntries = answer.consistency.entries.filter((e) => !e.note.includes('estimated from the full fit'));
    expect(estimatedEntries.length).toBeGreaterThan(0);
    expect(rerunEntries.length).toBeGreaterThan(0);
    expect(rerunEntries.length).toBeLessThanOrEqual(3);
    const win = dayWindowOf(scene);
    for (const id of ['lamp-bracket-1', 'door-hood-1', 'well-sweep-post-1', 'pilaster-2']) {
      const entry = answer.consistency.entries.find((e) => e.observationId === id);
      expect(entry?.note).toContain('estimated from the full fit');
      const rerun = solveModel(buildEvidenceModel(scene, new Set([id])), win, 50).kept[0];
      const fallExact = entry!.chiSquareAll - rerun.chiSquare;
      // Within 15% of the exact fall (or 1 unit of chi-square), and 0.1% of chi-square itself.
      expectClose(entry!.improvement, fallExact, Math.max(1, 0.15 * Math.abs(fallExact)), `fall without ${id}`);
      expectClose(entry!.chiSquareWithout, rerun.chiSquare, 1e-3 * rerun.chiSquare, `chi-square without ${id}`);
    }
  });

  it('names figures as the observations in conflict in a 100-observation scene, and the named ones are refitted', () => {
    const scene = copies(100, true);
    const calls: [number, number][] = [];
    const answer = solveDates(scene, { onProgress: (done, total) => calls.push([done, total]) });
    expect(answer.status).toBe('nothing-fits');
    expect(answer.conflictingIds.length).toBeGreaterThan(0);
    for (const id of answer.conflictingIds) {
      expect(id.startsWith('figure-shadow')).toBe(true);
      expect(answer.consistency.entries.find((e) => e.observationId === id)?.bestWithout).toBeDefined();
    }
    expect(answer.consistency.entries.length).toBe(100);
    expect(answer.consistency.rule).toContain('estimated from the full fit');
    expect(calls.length).toBeGreaterThan(1);
    calls.forEach(([done, total], i) => {
      expect(done).toBeLessThanOrEqual(total);
      if (i > 0) expect(done / total).toBeGreaterThanOrEqual(calls[i - 1][0] / calls[i - 1][1]);
    });
  });
});
