/**
 * One chart of a solved scene as SVG markup (src/charts), for `heliochron chart`, `heliochron
 * report` and the desk's page (no file access here).
 */
import type { Scene } from '../scene/types.js';
import type { DateAnswer } from '../solver/types.js';
import { buildEvidenceModel, type EvidenceModel } from '../solver/evidenceModel.js';
import { resolvePixelObservations } from '../image/resolvePixels.js';
import { dateHourMapData } from '../charts/dateHourMapData.js';
import { renderDateHourMap } from '../charts/dateHourMap.js';
import { skyChartData } from '../charts/skyChartData.js';
import { renderSkyChart } from '../charts/skyChart.js';
import { residualChartData, renderResidualChart } from '../charts/residualChart.js';
import { chartLightOfModel } from '../charts/chartLight.js';
import type { ChartKind } from './chartSpec.js';

/**
 * The evidence model the charts draw: the scene's observations in numeric form (pixel forms
 * measured first, as the solver takes them; src/image/resolvePixels.ts). Made once and passed to
 * each chart of the same scene, so that the pictures' clicks are not measured again per chart.
 */
export function chartModel(scene: Scene): EvidenceModel {
  return buildEvidenceModel(resolvePixelObservations(scene).scene);
}

/**
 * One chart of a solved scene as SVG markup; `onProgress` follows the date-and-hour map's grid.
 * @param model the scene's chartModel, when the caller draws several charts (default: made here)
 */
export function drawChart(kind: ChartKind, scene: Scene, answer: DateAnswer, onProgress?: (done: number, total: number) => void, idPrefix?: string, model?: EvidenceModel): string {
  switch (kind) {
    case 'map':
      return renderDateHourMap(dateHourMapData(scene, answer, { onProgress, model: model ?? chartModel(scene) }), idPrefix);
    case 'sky':
      // the moon's path and phase when the scene holds evidence of the moon (answer.moon)
      return renderSkyChart(skyChartData(scene, answer, { moon: answer.moon !== undefined, model: model ?? chartModel(scene) }), idPrefix);
    case 'residuals':
      return renderResidualChart(residualChartData(answer, scene), idPrefix);
  }
}

/**
 * The three charts of the HTML report (`heliochron report` and the desk), on one evidence model, and the light they
 * are drawn for ('moon' for a scene lit by the moon alone: src/charts/chartLight.ts).
 */
export function drawReportCharts(scene: Scene, answer: DateAnswer, onProgress?: (done: number, total: number) => void): { map: string; sky: string; residuals: string; light: 'sun' | 'moon' } {
  const model = chartModel(scene);
  return {
    light: chartLightOfModel(model),
    map: drawChart('map', scene, answer, onProgress, 'hc-map', model),
    sky: drawChart('sky', scene, answer, undefined, 'hc-sky', model),
    residuals: drawChart('residuals', scene, answer, undefined, 'hc-residuals', model),
  };
}
