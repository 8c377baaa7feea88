/**
 * Axes: tick marks, tick labels, optional grid lines and the axis label (with its unit),
 * for the bottom and left edges of a plot area. Returns SVG markup.
 */
import { el, text } from './svg.js';
import type { LinearScale } from './scale.js';

/** A plot area in drawing coordinates (y down). */
export interface PlotArea {
  readonly left: number;
  readonly top: number;
  readonly width: number;
  readonly height: number;
}

export interface Tick {
  readonly value: number;
  readonly label: string;
}

export interface AxisSpec {
  readonly scale: LinearScale;
  readonly ticks: readonly Tick[];
  /** The axis title with its unit: "local apparent time (hours)". */
  readonly label: string;
  /** Grid lines across the plot at each tick. */
  readonly grid?: boolean;
  /** Labels placed between ticks (centred on value + halfSpan) rather than at them, e.g. month names. */
  readonly labelOffset?: number;
  /** Second row of labels below / beside the first (e.g. compass letters). */
  readonly secondary?: readonly Tick[];
}

const TICK_LENGTH = 4;

/** The bottom (x) axis of a plot area. */
export function bottomAxis(area: PlotArea, axis: AxisSpec): string {
  const y = area.top + area.height;
  const parts: string[] = [];
  for (const t of axis.ticks) {
    const x = axis.scale(t.value);
    if (axis.grid) parts.push(el('line', { class: 'hc-grid', x1: x, y1: area.top, x2: x, y2: y }));
    parts.push(el('line', { class: 'hc-tickmark', x1: x, y1: y, x2: x, y2: y + TICK_LENGTH }));
    if (t.label !== '') {
      const lx = axis.labelOffset === undefined ? x : axis.scale(t.value + axis.labelOffset);
      parts.push(text(lx, y + TICK_LENGTH + 11, t.label, { class: 'hc-tick', 'text-anchor': 'middle' }));
    }
  }
  for (const t of axis.secondary ?? []) {
    parts.push(text(axis.scale(t.value), y + TICK_LENGTH + 23, t.label, { class: 'hc-secondary', 'text-anchor': 'middle' }));
  }
  const labelY = y + TICK_LENGTH + (axis.secondary ? 38 : 27);
  parts.push(text(area.left + area.width / 2, labelY, axis.label, { class: 'hc-axis-label', 'text-anchor': 'middle' }));
  return el('g', { class: 'hc-axis hc-axis-x' }, parts.join(''));
}

/** The left (y) axis of a plot area. */
export function leftAxis(area: PlotArea, axis: AxisSpec): string {
  const x = area.left;
  const parts: string[] = [];
  for (const t of axis.ticks) {
    const y = axis.scale(t.value);
    if (axis.grid) parts.push(el('line', { class: 'hc-grid', x1: x, y1: y, x2: x + area.width, y2: y }));
    parts.push(el('line', { class: 'hc-tickmark', x1: x - TICK_LENGTH, y1: y, x2: x, y2: y }));
    if (t.label !== '') parts.push(text(x - TICK_LENGTH - 3, y + 3.5, t.label, { class: 'hc-tick', 'text-anchor': 'end' }));
  }
  const cx = area.left - 40;
  const cy = area.top + area.height / 2;
  parts.push(text(cx, cy, axis.label, { class: 'hc-axis-label', 'text-anchor': 'middle', transform: `rotate(-90 ${Math.round(cx * 10) / 10} ${Math.round(cy * 10) / 10})` }));
  return el('g', { class: 'hc-axis hc-axis-y' }, parts.join(''));
}

/** The frame around a plot area. */
export function plotFrame(area: PlotArea): string {
  return el('rect', { class: 'hc-frame', x: area.left, y: area.top, width: area.width, height: area.height });
}

/** The chart's title and one-line caption above the plot. */
export function titleBlock(x: number, title: string, caption: string): string {
  return [text(x, 22, title, { class: 'hc-title' }), text(x, 39, caption, { class: 'hc-caption' })].join('\n');
}

/** A clip path for a plot area, referenced as url(#id). */
export function clipPathFor(id: string, area: PlotArea): string {
  return el('clipPath', { id }, el('rect', { x: area.left, y: area.top, width: area.width, height: area.height }));
}
