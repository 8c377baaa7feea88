/**
 * The light a scene's charts are drawn for: the moon for a scene lit by the moon alone (evidence of the moon and
 * no shadow cast by sunlight, dated by the moon's own search: src/solver/moonSearch.ts), else the sun. The sky
 * chart and the date-and-hour map decide the same way (skyChartData.ts, dateHourMapData.ts); the report's and the
 * desk's captions follow it.
 */
import type { Scene } from '../scene/types.js';
import { resolvePixelObservations } from '../image/resolvePixels.js';
import { buildEvidenceModel, type EvidenceModel } from '../solver/evidenceModel.js';
import { isLitByMoonAlone } from '../solver/moonSearch.js';

/**
 * 'moon' when the scene is lit by the moon alone, else 'sun'.
 * @example chartLightOf(nightScene) // 'moon'
 */
export function chartLightOf(scene: Scene): 'sun' | 'moon' {
  // Observations measured in pixels become numbers first, as the solver takes them (src/image/resolvePixels.ts).
  return chartLightOfModel(buildEvidenceModel(resolvePixelObservations(scene).scene));
}

/** The same from the scene's evidence model, when the caller has it (src/cli/drawChart.ts chartModel). */
export function chartLightOfModel(model: EvidenceModel): 'sun' | 'moon' {
  return isLitByMoonAlone(model) ? 'moon' : 'sun';
}
