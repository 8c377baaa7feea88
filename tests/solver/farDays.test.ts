/**
 * Years whose best day lies outside the allowed months are mapped across years from the
 * representative years' fits on their far days (src/solver/stageB.ts), not refitted one by one.
 * Checked against the solver's own full refit on the same day (run beside it), on the bundled
 * Upper Gate drawing (months March-May, its autumn branch always outside) over 500 years.
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import { buildEvidenceModel, splitChiSquare } from '../../src/solver/evidenceModel.js';
import { solveModel } from '../../src/solver/solveDates.js';
import { dayWindowOf } from '../../src/solver/window.js';
import { newDatedContext, refineOnDay } from '../../src/solver/fitting.js';
import { exactPoint } from '../../src/solver/stageB.js';
import { expectClose } from '../helpers/expectClose.js';

const base = readSceneFile(fileURLToPath(new URL('../../examples/upper-gate-drawing.yaml', import.meta.url)));
const scene = { ...base, window: { ...base.window, fromYear: 1400, toYear: 1899 } };

describe('out-of-month years over a 500-year window', () => {
  const model = buildEvidenceModel(scene);
  const s = solveModel(model, dayWindowOf(scene), 50);
  const far = s.search.candidates.filter((c) => c.atWindowEdge && c.mapped);

  it('are mapped, with one full-ephemeris evaluation each, the search staying within 1.5 times the floor', () => {
    expect(far.length).toBeGreaterThan(400);
    const floor = s.search.candidates.length + s.search.fullRefinements;
    expect(s.search.sunEvaluations).toBeLessThanOrEqual(1.5 * floor);
  });

  it('fit as well as a full refit on the same day (within 0.01 + 0.1% of chi-square)', () => {
    const site = { latitudeDeg: scene.site.latitudeDeg, longitudeDeg: scene.site.longitudeDeg, elevationM: scene.site.elevationM };
    for (const c of far.filter((_, i) => i % 25 === 0)) {
      const ctx = newDatedContext(model, null, c.point.jdUT);
      const onDay = refineOnDay(ctx, c.dayJd0, [c.apparentMinutes, ...c.nuisances]);
      const ex = exactPoint(model, null, site, c.dayJd0, onDay.x[1], onDay.x.slice(2), onDay.point.state.equationOfTimeMinutes);
      const refit = splitChiSquare(model, ex.point.residuals);
      expectClose(c.objective, refit.chiSquare + refit.penalty, 0.01 + 1e-3 * c.objective, `chi-square on ${c.dayJd0}`);
    }
  });
});
