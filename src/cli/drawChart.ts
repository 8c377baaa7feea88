/**
 * One chart of a solved scene as SVG markup (src/charts), for `heliochron chart`, `heliochron
 * report` and the desk's page (no file access here).
 */
import type { Scene } from '../scene/types.js';
import type { DateAnswer } from '../solver/types.js';
import { dateHourMapData } from '../charts/dateHourMapData.js';
import { renderDateHourMap } from '../charts/dateHourMap.js';
import { skyChartData } from '../charts/skyChartData.js';
import { renderSkyChart } from '../charts/skyChart.js';
import { residualChartData, renderResidualChart } from '../charts/residualChart.js';
import type { ChartKind } from './chartSpec.js';

/** One chart of a solved scene as SVG markup; `onProgress` follows the date-and-hour map's grid. */
export function drawChart(kind: ChartKind, scene: Scene, answer: DateAnswer, onProgress?: (done: number, total: number) => void, idPrefix?: string): string {
  switch (kind) {
    case 'map':
      return renderDateHourMap(dateHourMapData(scene, answer, { onProgress }), idPrefix);
    case 'sky':
      // the moon's path and phase when the scene holds evidence of the moon (answer.moon)
      return renderSkyChart(skyChartData(scene, answer, { moon: answer.moon !== undefined }), idPrefix);
    case 'residuals':
      return renderResidualChart(residualChartData(answer, scene), idPrefix);
  }
}
