/**
 * The solver's progress (SolveOptions.onProgress, src/solver/solveDates.ts and search.ts): fractions
 * of its three steps that never go back, the stage in words, and an answer that does not depend on
 * whether anyone listens. The desk shows them as a bar (src/desk/answerPanel.ts), the command line
 * as a line (src/cli/progress.ts).
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import { SOLVE_STAGE_WORDS, solveDates } from '../../src/solver/solveDates.js';
import { SEARCH_STAGE_WORDS } from '../../src/solver/search.js';
import type { Scene } from '../../src/scene/types.js';

const SALT_HOUSE = readSceneFile(fileURLToPath(new URL('../../examples/salt-house-sketch.yaml', import.meta.url)));

function listened(scene: Scene): { calls: { done: number; total: number; stage?: string }[]; json: string } {
  const calls: { done: number; total: number; stage?: string }[] = [];
  const answer = solveDates(scene, { onProgress: (done, total, stage) => calls.push({ done, total, stage }) });
  return { calls, json: JSON.stringify(answer) };
}

describe('the progress of solveDates', () => {
  it('moves forward in fractions through the search (grid rows, then the dating of each place) to the answer, in three steps', () => {
    const { calls, json } = listened(SALT_HOUSE);
    expect(json).toBe(JSON.stringify(solveDates(SALT_HOUSE)));
    expect(new Set(calls.map((c) => c.total))).toEqual(new Set([3]));
    calls.forEach((c, k) => {
      expect(c.done).toBeGreaterThanOrEqual(0);
      expect(c.done).toBeLessThanOrEqual(c.total - 1);
      if (k > 0) expect(c.done).toBeGreaterThanOrEqual(calls[k - 1].done);
    });
    const inSearch = calls.filter((c) => c.done < 1);
    expect(new Set(inSearch.map((c) => c.done)).size).toBeGreaterThan(10); // stage A's grid has more than ten declination rows
    const stages = [...new Set(calls.map((c) => c.stage?.replace(/ \(clock assumption \d+ of \d+\)$/, '')))];
    expect(stages[0]).toBe(SEARCH_STAGE_WORDS.grid);
    expect(stages).toContain(SEARCH_STAGE_WORDS.dating);
    expect(stages[stages.length - 1]).toBe(SOLVE_STAGE_WORDS.answer);
    expect(calls[calls.length - 1].done).toBe(2);
  });

  describe('edge cases', () => {
    it('shares the second step among the reruns when nothing fits, naming the observation left out', () => {
      // the well-sweep post's shadow once more, turned by 150 deg: nothing fits, and the search is rerun
      const post = SALT_HOUSE.observations.find((o) => o.id === 'well-sweep-post')!;
      const turned = { ...post, id: 'turned', shadowAzimuthDeg: (323 + 150) % 360 } as typeof post;
      const { calls } = listened({ ...SALT_HOUSE, observations: [...SALT_HOUSE.observations, turned] });
      const reruns = calls.filter((c) => c.stage?.startsWith(SOLVE_STAGE_WORDS.rerun));
      if (reruns.length === 0) throw new Error(`the test scene did not make the solver rerun: stages ${[...new Set(calls.map((c) => c.stage))].join(' | ')}`);
      expect(reruns.every((c) => c.done >= 1 && c.done <= 2)).toBe(true);
      expect(reruns.some((c) => /without turned \(\d+ of \d+\)$/.test(c.stage!))).toBe(true);
      calls.forEach((c, k) => k > 0 && expect(c.done).toBeGreaterThanOrEqual(calls[k - 1].done));
    });
  });
});
