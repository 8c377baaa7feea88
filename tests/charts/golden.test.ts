import { beforeAll, describe, expect, it } from 'vitest';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import type { Scene } from '../../src/scene/types.js';
import type { DateAnswer } from '../../src/solver/types.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { dateHourMapData } from '../../src/charts/dateHourMapData.js';
import { renderDateHourMap } from '../../src/charts/dateHourMap.js';
import { skyChartData } from '../../src/charts/skyChartData.js';
import { renderSkyChart } from '../../src/charts/skyChart.js';
import { residualChartData, renderResidualChart } from '../../src/charts/residualChart.js';
import { checkGolden, goldenDifference } from './goldenCompare.js';

// Golden files of the three charts for the bundled example. They are rewritten only when
// HELIOCHRON_UPDATE_GOLDEN=1 is set (never in CI); a missing golden file fails.
const EXAMPLE = 'examples/marktgasse-print.yaml';
const GOLDEN = 'tests/golden';

let scene: Scene;
let answer: DateAnswer;
beforeAll(() => {
  scene = readSceneFile(EXAMPLE);
  answer = solveDates(scene);
});

describe('golden charts of the bundled example', () => {
  it('the date-and-hour map matches tests/golden/marktgasse-print-map.svg', () => {
    expect(checkGolden(`${GOLDEN}/marktgasse-print-map.svg`, renderDateHourMap(dateHourMapData(scene, answer)))).toBeNull();
  });
  it('the sky chart matches tests/golden/marktgasse-print-sky.svg', () => {
    expect(checkGolden(`${GOLDEN}/marktgasse-print-sky.svg`, renderSkyChart(skyChartData(scene, answer)))).toBeNull();
  });
  it('the residuals chart matches tests/golden/marktgasse-print-residuals.svg', () => {
    expect(checkGolden(`${GOLDEN}/marktgasse-print-residuals.svg`, renderResidualChart(residualChartData(answer)))).toBeNull();
  });
});

describe('golden comparison', () => {
  it('accepts a last-digit rounding flip and refuses a changed word or a moved point', () => {
    expect(goldenDifference('<rect x="10.2" y="3"/>', '<rect x="10.3" y="3"/>')).toBeNull();
    expect(goldenDifference('<rect x="10.2" y="3"/>', '<rect x="10.5" y="3"/>')).toMatch(/number 0 differs/);
    expect(goldenDifference('<text>May</text>', '<text>June</text>')).toMatch(/text differs/);
    expect(goldenDifference('<g/><g/>', '<g/>')).not.toBeNull();
  });
});
