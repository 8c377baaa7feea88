/**
 * The residuals chart: every measured number's normalised residual (measured minus predicted,
 * over its sigma) at the best candidate, one horizontal bar each, with guides at +/-1 and
 * +/-2 sigma, so that an outlier stands out; observations flagged by the leave-one-out test
 * are marked. The facts without numbers follow as "holds" / "fails" rows.
 */
import { signedFixed } from '../textUnits.js';
import { calendarReadingShort } from './calendarReadingLabel.js';
import type { Scene } from '../scene/types.js';
import type { DateAnswer } from '../solver/types.js';
import { bottomAxis, plotFrame, titleBlock, type PlotArea } from './axes.js';
import { CHART_STYLE, DASHES, INK, OKABE_ITO } from './palette.js';
import { linearScale, niceTicks } from './scale.js';
import { el, escapeXml, group, num, svgDocument, text } from './svg.js';
import { formatCalendarDate } from '../calendar/format.js';

export interface ResidualRow {
  readonly observationId: string;
  readonly label: string;
  readonly normalised: number;
  readonly detail: string;
  readonly flagged: boolean;
}

export interface ResidualChartData {
  readonly candidateLabel: string;
  readonly rows: readonly ResidualRow[];
  readonly facts: readonly { readonly label: string; readonly satisfied: boolean }[];
  readonly flaggedIds: readonly string[];
}

const WORDS: Record<string, string> = { deg: 'deg', ratio: '', min: 'min', m: 'm' };

function valueText(value: number, unit: string): string {
  const digits = unit === 'ratio' ? 3 : unit === 'min' ? 1 : 2;
  const w = WORDS[unit] ?? unit;
  return `${value.toFixed(digits)}${w ? ` ${w}` : ''}`;
}

/**
 * The rows of the residuals chart from the solver's answer (best candidate, rank 1); with the scene,
 * the candidate's date also says which reading of a disputed calendar switch names it.
 */
export function residualChartData(answer: DateAnswer, scene?: Scene): ResidualChartData {
  const best = answer.candidates[0] ?? answer.families[0]?.best;
  const flagged = new Set(answer.consistency.flaggedIds);
  if (!best) return { candidateLabel: 'no candidate', rows: [], facts: [], flaggedIds: [...flagged] };
  const rows = best.residuals.map((r) => ({
    observationId: r.observationId,
    label: `${r.observationId}: ${r.component}`,
    normalised: r.normalised,
    detail: `measured ${valueText(r.measured, r.unit)}, predicted ${valueText(r.predicted, r.unit)}, sigma ${valueText(r.sigma, r.unit)}`,
    flagged: flagged.has(r.observationId),
  }));
  const facts = best.facts.map((f) => ({ label: `${f.observationId}: ${f.note}`, satisfied: f.satisfied }));
  const d = best.civilDate;
  const reading = scene === undefined ? null : calendarReadingShort(scene);
  return { candidateLabel: `candidate ${best.rank}, ${formatCalendarDate(d)}${reading === null ? '' : ` (${reading})`}`, rows, facts, flaggedIds: [...flagged] };
}

const ROW_HEIGHT = 24;
const PLOT_WIDTH = 330;
/** Mean width of a character of running text in the charts' sans-serif, in em (mixed case; common practice). */
const PROSE_EM = 0.5;

function proseWidth(words: string, fontSize: number): number {
  return words.length * PROSE_EM * fontSize;
}

function barColour(r: number): string {
  const a = Math.abs(r);
  return a <= 1 ? OKABE_ITO.blue : a <= 2 ? OKABE_ITO.orange : OKABE_ITO.vermillion;
}

const TITLE = 'How well each measurement fits the best candidate';

function captionOf(data: ResidualChartData): string {
  return `Each bar: (measured - predicted) / sigma at ${data.candidateLabel}; beyond 2 sigma (dotted) it disagrees.`;
}

/**
 * The residuals chart as a standalone SVG document.
 * @param idPrefix prefix of the ids inside (several charts can share one HTML page)
 */
export function renderResidualChart(data: ResidualChartData, idPrefix = 'hc-residuals'): string {
  // Sized to its content: the label column to the longest label, the height to the rows and facts.
  const labelWidth = Math.max(100, ...data.rows.map((r) => proseWidth(r.label, 10.5)));
  const area: PlotArea = { left: 24 + labelWidth + 8, top: 62, width: PLOT_WIDTH, height: Math.max(1, data.rows.length) * ROW_HEIGHT };
  const factTop = area.top + area.height + 62;
  const height = factTop + data.facts.length * 16 + (data.flaggedIds.length > 0 ? 22 : 0) + 16;
  const valueWidth = Math.max(...data.rows.map((r) => proseWidth(`+0.00 sigma${r.flagged ? '  FLAGGED (leave-one-out)' : ''}`, 10.5)), 0);
  const flaggedLine = `Flagged by the leave-one-out test (outlined bars): ${data.flaggedIds.join(', ')}.`;
  const width = Math.ceil(
    Math.max(
      area.left + area.width + 8 + valueWidth + 16,
      24 + proseWidth(TITLE, 15) + 16,
      24 + proseWidth(captionOf(data), 11.5) + 16,
      ...data.facts.map((f) => 70 + proseWidth(f.label, 10.5) + 16),
      data.flaggedIds.length > 0 ? 24 + proseWidth(flaggedLine, 10) + 16 : 0,
    ),
  );
  const largest = data.rows.reduce((m, r) => Math.max(m, Math.abs(r.normalised)), 0);
  const limit = Math.min(6, Math.max(3, Math.ceil(largest + 0.25)));
  const x = linearScale([-limit, limit], [area.left, area.left + area.width]);
  const parts: string[] = [];
  // Guides: zero solid, +/-1 dashed, +/-2 dotted.
  parts.push(el('line', { x1: x(0), y1: area.top, x2: x(0), y2: area.top + area.height, stroke: INK.ink, 'stroke-width': 1 }));
  for (const g of [1, 2]) {
    for (const s of [-1, 1]) {
      parts.push(el('line', { x1: x(s * g), y1: area.top, x2: x(s * g), y2: area.top + area.height, stroke: INK.muted, 'stroke-width': 0.9, 'stroke-dasharray': g === 1 ? DASHES.dashed : DASHES.dotted, class: 'hc-guide' }));
    }
  }
  data.rows.forEach((r, k) => {
    const yc = area.top + k * ROW_HEIGHT + ROW_HEIGHT / 2;
    const clipped = Math.max(-limit, Math.min(limit, r.normalised));
    const x0 = Math.min(x(0), x(clipped));
    const w = Math.abs(x(clipped) - x(0));
    const rowParts = [
      text(area.left - 8, yc + 3.5, r.label, { class: 'hc-legend', 'text-anchor': 'end', 'font-weight': r.flagged ? 'bold' : undefined }),
      el('rect', { x: x0, y: yc - 7, width: Math.max(w, 0.8), height: 14, fill: barColour(r.normalised), stroke: r.flagged ? INK.ink : 'none', 'stroke-width': r.flagged ? 1.6 : undefined }),
      text(area.left + area.width + 8, yc + 3.5, `${signedFixed(r.normalised, 2)} sigma${r.flagged ? '  FLAGGED (leave-one-out)' : ''}`, { class: 'hc-legend', 'font-weight': r.flagged ? 'bold' : undefined }),
      el('title', {}, escapeXml(`${r.label}: ${r.detail}`)),
    ];
    if (Math.abs(r.normalised) > limit) {
      const tip = x(clipped);
      const s = Math.sign(r.normalised);
      rowParts.push(el('path', { d: `M${num(tip)} ${num(yc - 7)}l${num(s * 7)} 7l${num(-s * 7)} 7Z`, fill: INK.ink }));
    }
    parts.push(group({ class: 'hc-residual-row', 'data-observation': r.observationId }, rowParts));
  });
  const ticks = niceTicks(-limit, limit, 2 * limit, 1).map((v) => ({ value: v, label: `${v > 0 ? '+' : ''}${num(v, 0)}` }));
  parts.push(bottomAxis(area, { scale: x, ticks, label: 'normalised residual: (measured - predicted) / sigma' }));
  parts.push(plotFrame(area));
  const factParts: string[] = [];
  if (data.facts.length > 0) factParts.push(text(24, factTop - 6, 'Facts without numbers', { class: 'hc-legend', 'font-weight': 'bold' }));
  data.facts.forEach((f, k) => {
    const y = factTop + 10 + k * 16;
    factParts.push(text(24, y, f.satisfied ? 'holds' : 'FAILS', { class: 'hc-legend', 'font-weight': 'bold', fill: f.satisfied ? INK.ink : OKABE_ITO.vermillion }));
    factParts.push(text(70, y, f.label, { class: 'hc-legend' }));
  });
  if (data.flaggedIds.length > 0) {
    factParts.push(text(24, height - 14, flaggedLine, { class: 'hc-note' }));
  }
  return svgDocument({
    width,
    height,
    title: TITLE,
    description: captionOf(data),
    style: CHART_STYLE,
    idPrefix,
    body: [el('rect', { width, height, fill: INK.paper }), titleBlock(24, TITLE, captionOf(data)), ...parts, ...factParts],
  });
}
