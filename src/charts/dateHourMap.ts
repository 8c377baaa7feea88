/**
 * The date-and-hour map: the civil year on the x axis (month boundaries in the site's
 * calendar), local apparent time on the y axis, each cell shaded by how well that day and hour
 * fits the evidence (Delta chi-square above the best fit, in the bands of palette.ts), the
 * candidates marked with their 68% and 95% error ellipses (or the profile-scan interval as a
 * bar when the ellipse does not hold), and a close-up around the best candidate.
 * A scene lit by the moon alone (data.light 'moon') gets the moon's map: one year (the best candidate's), the hours
 * of the night (from the evening's day on); title, caption, axes and notes say that the light is the moon's.
 */
import { formatMinutes } from '../time/clock.js';
import { bottomAxis, clipPathFor, leftAxis, plotFrame, titleBlock, type PlotArea, type Tick } from './axes.js';
import { cellRunsByClass, isolineSegments, rowMinimum } from './contour.js';
import type { DateHourMapData, MapMarker } from './dateHourMapData.js';
import { CHART_STYLE, FIT_BANDS, INK, OKABE_ITO, OUTSIDE_BANDS_LABEL, fitBandIndex } from './palette.js';
import { linearScale, niceTicks, type LinearScale } from './scale.js';
import { el, group, num, pathData, svgDocument, text } from './svg.js';
import { placeLabels, placedLabelMarks } from './labels.js';

const WIDTH = 820;
const HEIGHT = 590;
const OVERVIEW: PlotArea = { left: 66, top: 60, width: 440, height: 360 };
const CLOSE_UP: PlotArea = { left: 580, top: 60, width: 220, height: 360 };
const MARK = OKABE_ITO.vermillion;
/** Index in FIT_BANDS of "poor fit (3 to 5 sigma)", drawn stippled. */
const POOR_FIT_BAND = 3;

/** "07:00" for minutes of the day (whole hours and minutes); past midnight (the moon's map) the next day's hour. */
function hourLabel(minutes: number): string {
  return formatMinutes(minutes >= 1440 ? minutes - 1440 : minutes).slice(0, 5);
}

/** The hour axis's label: the moon's map runs from the evening to the next morning. */
function hourAxisLabel(data: DateHourMapData): string {
  return data.light === 'moon' ? 'local apparent time (hours, evening to morning)' : 'local apparent time (hours)';
}

interface GridPart {
  readonly dayOffsets: readonly number[];
  readonly minutes: readonly number[];
  readonly deltaChiSquare: readonly (readonly number[])[];
  readonly dayStep: number;
  readonly minuteStep: number;
}

/** Filled cells, one rectangle per horizontal run of cells in the same band. */
function bandCells(part: GridPart, x: LinearScale, y: LinearScale, prefix: string): string[] {
  const out: string[] = [];
  const palest = FIT_BANDS[FIT_BANDS.length - 1].maxDeltaChiSquare;
  const runsByBand = cellRunsByClass(
    part.minutes.length,
    part.dayOffsets.length,
    (j, i) => fitBandIndex(part.deltaChiSquare[j][i]),
    (j) => rowMinimum(part.deltaChiSquare[j]) > palest, // every cell of the row beyond the palest band
  );
  FIT_BANDS.forEach((band, b) => {
    const d = (runsByBand[b] ?? [])
      .map((r) => {
        const x0 = x(part.dayOffsets[r.i0] - part.dayStep / 2);
        const x1 = x(part.dayOffsets[r.i1 - 1] + part.dayStep / 2);
        const y0 = y(part.minutes[r.j] + part.minuteStep / 2);
        const y1 = y(part.minutes[r.j] - part.minuteStep / 2);
        return `M${num(x0)} ${num(y0)}H${num(x1)}V${num(y1)}H${num(x0)}Z`;
      })
      .join('');
    if (d !== '') out.push(el('path', { d, fill: band.fill, stroke: band.fill, 'stroke-width': 0.3, class: `hc-band hc-band-${b}` }));
    // The palest band is also stippled, so that "poor fit" differs from "does not fit" (white)
    // in a grey print and for every reader of colour, not by a faint tint alone.
    if (d !== '' && b === POOR_FIT_BAND) out.push(el('path', { d, fill: `url(#${prefix}-stipple)`, stroke: 'none', class: 'hc-band-stipple' }));
  });
  return out;
}

/** Contour lines at the 68% and 95% bounds. */
function bandOutlines(part: GridPart, x: LinearScale, y: LinearScale): string[] {
  const field = { xs: part.dayOffsets, ys: part.minutes, values: part.deltaChiSquare };
  return [
    { level: FIT_BANDS[0].maxDeltaChiSquare, dash: undefined, width: 0.9 },
    { level: FIT_BANDS[1].maxDeltaChiSquare, dash: '3 2', width: 0.7 },
  ].map((c) => {
    const d = isolineSegments(field, c.level)
      .map(([p, q]) => `M${num(x(p[0]))} ${num(y(p[1]))}L${num(x(q[0]))} ${num(y(q[1]))}`)
      .join('');
    return d === '' ? '' : el('path', { d, fill: 'none', stroke: INK.ink, 'stroke-width': c.width, 'stroke-dasharray': c.dash, class: 'hc-contour' });
  });
}

const MARK_RADIUS = 3.6;
const LABEL_SIZE = 10.5;

/**
 * Ellipses and intervals of the markers. In the whole-year panel (`thin`) only the 95% ellipse is
 * drawn, with a thin line, so that the shading under it, often only a few pixels across, stays visible.
 */
function markerMarks(markers: readonly MapMarker[], x: LinearScale, y: LinearScale, thin: boolean): string[] {
  const out: string[] = [];
  for (const m of markers) {
    for (const e of m.ellipses) {
      if (thin && e.probability < 0.9) continue;
      const dash = e.probability > 0.9 ? '4 2.5' : undefined;
      out.push(el('path', { d: pathData(e.points.map(([d, min]) => [x(d), y(min)]), true), fill: 'none', stroke: MARK, 'stroke-width': thin ? 0.8 : 1.4, 'stroke-dasharray': dash, class: 'hc-ellipse' }));
    }
    if (m.interval) {
      const iv = m.interval;
      if (iv.valley.length > 1) {
        out.push(el('path', { d: pathData(iv.valley.map(([d, min]) => [x(d), y(min)])), fill: 'none', stroke: MARK, 'stroke-width': 1, 'stroke-dasharray': '1.5 2', class: 'hc-valley' }));
      }
      const yc = y(m.minutes);
      const x0 = x(iv.fromDayOffset);
      const x1 = x(iv.toDayOffset);
      out.push(el('path', { d: `M${num(x0)} ${num(yc)}H${num(x1)}M${num(x0)} ${num(yc - 5)}V${num(yc + 5)}M${num(x1)} ${num(yc - 5)}V${num(yc + 5)}`, fill: 'none', stroke: MARK, 'stroke-width': thin ? 1.2 : 2.2, class: 'hc-interval' }));
    }
  }
  // The dots last, so that no ellipse of another family hides one.
  for (const m of markers) {
    const cx = x(m.dayOffset);
    const cy = y(m.minutes);
    const r = thin ? 2.4 : m.best ? MARK_RADIUS : 3;
    out.push(
      m.inMapYear
        ? el('circle', { cx, cy, r, fill: MARK, stroke: INK.paper, 'stroke-width': thin ? 0.6 : 1, class: 'hc-candidate' })
        : el('circle', { cx, cy, r, fill: INK.paper, stroke: MARK, 'stroke-width': thin ? 1.1 : 1.5, class: 'hc-candidate hc-other-year' }),
    );
  }
  return out;
}

/** The markers' labels inside a panel, placed so that none overprints another (labels.ts). */
function markerLabels(markers: readonly MapMarker[], x: LinearScale, y: LinearScale, area: PlotArea): { marks: string[]; unplaced: string[] } {
  const bounds = { x: area.left, y: area.top, width: area.width, height: area.height };
  const shown = markers.filter((m) => {
    const cx = x(m.dayOffset);
    const cy = y(m.minutes);
    return cx >= area.left && cx <= area.left + area.width && cy >= area.top && cy <= area.top + area.height;
  });
  // Labels keep clear of what the marks enclose (the 95% ellipse or the day interval), so that they
  // never cover the shading there.
  const obstacles = shown.flatMap((m) => {
    const points: (readonly [number, number])[] = [...m.ellipses.filter((e) => e.probability > 0.9).flatMap((e) => e.points)];
    if (m.interval) points.push([m.interval.fromDayOffset, m.minutes - 1e-9], [m.interval.toDayOffset, m.minutes]);
    if (points.length === 0) return [];
    const xs = points.map(([d]) => x(d));
    const ys = points.map(([, min]) => y(min));
    const box = { x: Math.min(...xs), y: Math.min(...ys) - (m.interval ? 5 : 0), width: Math.max(...xs) - Math.min(...xs), height: Math.max(...ys) - Math.min(...ys) + (m.interval ? 10 : 0) };
    return [box];
  });
  const placement = placeLabels(
    shown.map((m) => ({ anchor: [x(m.dayOffset), y(m.minutes)] as const, text: m.label, fontSize: LABEL_SIZE, markRadius: MARK_RADIUS + 1 })),
    obstacles,
    bounds,
  );
  return { marks: placedLabelMarks(placement.placed), unplaced: placement.unplaced.map((u) => u.text) };
}

function hourTicks(range: readonly [number, number], approxCount: number): Tick[] {
  const span = range[1] - range[0];
  const step = span > 600 ? 120 : span > 240 ? 60 : span > 120 ? 30 : span > 60 ? 15 : 10;
  return niceTicks(range[0], range[1], approxCount, step).map((v) => ({ value: v, label: hourLabel(v) }));
}

function overviewPanel(data: DateHourMapData, prefix: string, unlabelled: string[]): string {
  const area = OVERVIEW;
  const x = linearScale([0, data.dayCount], [area.left, area.left + area.width]);
  const y = linearScale(data.minuteRange, [area.top + area.height, area.top]);
  const clip = `${prefix}-clip-overview`;
  const excluded = data.months
    .filter((m) => m.excluded)
    .map((m) => el('rect', { x: x(m.fromOffset), y: area.top, width: x(m.toOffset) - x(m.fromOffset), height: area.height, fill: `url(#${prefix}-hatch)`, class: 'hc-excluded' }));
  const monthTicks: Tick[] = data.months.map((m) => ({ value: m.fromOffset, label: '' }));
  monthTicks.push({ value: data.dayCount, label: '' });
  const monthLabels = data.months.map((m) => text(x((m.fromOffset + m.toOffset) / 2), area.top + area.height + 15, m.name, { class: 'hc-tick', 'text-anchor': 'middle' }));
  const labels = markerLabels(data.markers, x, y, area);
  unlabelled.push(...labels.unplaced.map((l) => `${l} (whole year)`));
  return group({ class: 'hc-panel hc-overview' }, [
    el('defs', {}, clipPathFor(clip, area)),
    group({ 'clip-path': `url(#${clip})` }, [...bandCells(data, x, y, prefix), ...bandOutlines(data, x, y), ...excluded, ...markerMarks(data.markers, x, y, true), ...labels.marks]),
    bottomAxis(area, { scale: x, ticks: monthTicks, label: `${data.yearLabel}, ${data.calendarLabel} (month boundaries${data.light === 'moon' ? '; a night under the day it begins' : ''})`, grid: true }),
    ...monthLabels,
    leftAxis(area, { scale: y, ticks: hourTicks(data.minuteRange, 9), label: hourAxisLabel(data), grid: true }),
    plotFrame(area),
    text(area.left, area.top - 6, data.light === 'moon' ? `The nights of ${data.yearLabel}` : 'The whole year', { class: 'hc-legend', 'font-weight': 'bold' }),
  ]);
}

function closeUpPanel(data: DateHourMapData, prefix: string, unlabelled: string[]): string {
  const c = data.closeUp;
  if (!c) return '';
  const area = CLOSE_UP;
  const x = linearScale(c.dayRange, [area.left, area.left + area.width]);
  const y = linearScale(c.minuteRange, [area.top + area.height, area.top]);
  const clip = `${prefix}-clip-closeup`;
  const labels = markerLabels(data.markers, x, y, area);
  unlabelled.push(...labels.unplaced.map((l) => `${l} (close-up)`));
  return group({ class: 'hc-panel hc-closeup' }, [
    el('defs', {}, clipPathFor(clip, area)),
    group({ 'clip-path': `url(#${clip})` }, [...bandCells(c, x, y, prefix), ...bandOutlines(c, x, y), ...markerMarks(data.markers, x, y, false), ...labels.marks]),
    bottomAxis(area, { scale: x, ticks: c.dayLabels.map((t) => ({ value: t.offset, label: t.label })), label: `day (${data.yearLabel})`, grid: true }),
    leftAxis(area, { scale: y, ticks: hourTicks(c.minuteRange, 8), label: hourAxisLabel(data), grid: true }),
    plotFrame(area),
    text(area.left, area.top - 6, 'Close-up of the best candidate', { class: 'hc-legend', 'font-weight': 'bold' }),
  ]);
}

function legend(data: DateHourMapData, unlabelled: readonly string[], prefix: string): string {
  const top = 470;
  const parts: string[] = [];
  const entries = [...FIT_BANDS.map((b) => ({ fill: b.fill, label: b.label })), { fill: INK.paper, label: OUTSIDE_BANDS_LABEL }];
  entries.forEach((e, k) => {
    const lx = 66 + (k % 3) * 250;
    const ly = top + Math.floor(k / 3) * 17;
    parts.push(el('rect', { x: lx, y: ly - 9, width: 14, height: 10, fill: e.fill, stroke: INK.frame, 'stroke-width': 0.6 }));
    if (k === POOR_FIT_BAND) parts.push(el('rect', { x: lx, y: ly - 9, width: 14, height: 10, fill: `url(#${prefix}-stipple)`, stroke: 'none' }));
    parts.push(text(lx + 19, ly, e.label, { class: 'hc-legend' }));
  });
  const ly = top + 40;
  parts.push(el('circle', { cx: 73, cy: ly - 4, r: 3.4, fill: MARK }));
  parts.push(text(82, ly, 'best of each family of dates (F1, F2, ...)', { class: 'hc-legend' }));
  parts.push(el('path', { d: `M316 ${ly - 4}h24`, stroke: MARK, 'stroke-width': 1.4 }));
  parts.push(text(345, ly, '68% error ellipse', { class: 'hc-legend' }));
  parts.push(el('path', { d: `M446 ${ly - 4}h24`, stroke: MARK, 'stroke-width': 1.4, 'stroke-dasharray': '4 2.5' }));
  parts.push(text(475, ly, '95% error ellipse', { class: 'hc-legend' }));
  parts.push(el('path', { d: `M576 ${ly - 4}h24M576 ${ly - 8}v8M600 ${ly - 8}v8`, stroke: MARK, 'stroke-width': 2.2, fill: 'none' }));
  parts.push(text(605, ly, '95% day interval (profile scan)', { class: 'hc-legend' }));
  const notes: string[] = [];
  if (data.months.some((m) => m.excluded)) notes.push('hatched: months outside the window stated in the scene');
  if (data.calendarReadingNote !== null) notes.push(...data.calendarReadingNote);
  if (data.fromOtherYears > 0) {
    notes.push(
      data.light === 'moon'
        ? `${data.fromOtherYears} marked candidate${data.fromOtherYears === 1 ? '' : 's'} of other years not placed: the moon's place differs every year; the report's tables give them`
        : `open circles: best of a family in another year, placed on its day of the year`,
    );
  }
  if (unlabelled.length > 0) notes.push(`marks too crowded to label: ${unlabelled.join(', ')}; the report's table of families gives their days and hours`);
  parts.push(text(66, ly + 18, `Clock: ${data.clockLabel}.`, { class: 'hc-note' }));
  notes.forEach((note, k) => parts.push(text(66, ly + 32 + 14 * k, `${note[0].toUpperCase()}${note.slice(1)}.`, { class: 'hc-note' })));
  return group({ class: 'hc-legend-block' }, parts);
}

/**
 * The date-and-hour map as a standalone SVG document.
 * @param idPrefix prefix of the ids inside (several charts can share one HTML page)
 */
export function renderDateHourMap(data: DateHourMapData, idPrefix = 'hc-map'): string {
  const unlabelled: string[] = []; // labels for which no free place was found, listed under the chart
  const stipple = el('pattern', { id: `${idPrefix}-stipple`, width: 4, height: 4, patternUnits: 'userSpaceOnUse' }, [
    el('circle', { cx: 1, cy: 1, r: 0.75, fill: FIT_BANDS[1].fill }),
    el('circle', { cx: 3, cy: 3, r: 0.75, fill: FIT_BANDS[1].fill }),
  ]);
  const hatch = el(
    'pattern',
    { id: `${idPrefix}-hatch`, width: 6, height: 6, patternUnits: 'userSpaceOnUse', patternTransform: 'rotate(45)' },
    [el('rect', { width: 6, height: 6, fill: INK.paper, 'fill-opacity': 0.35 }), el('line', { x1: 0, y1: 0, x2: 0, y2: 6, stroke: INK.frame, 'stroke-width': 1.2 })],
  );
  const title = data.light === 'moon' ? `When the moonlight fits: night and hour in ${data.titleYears} (the light is the moon\u2019s)` : `When the light fits: day and hour, ${data.titleYears}`;
  const caption =
    data.light === 'moon'
      ? `Shading: how well the moon at each night and hour of ${data.yearLabel} fits the evidence; it differs every year, so the map holds for ${data.yearLabel} alone.`
      : `Shading: how well each day and hour of ${data.yearLabel} fits the evidence; vermilion: the best dates and hours with their error ellipses.`;
  return svgDocument({
    width: WIDTH,
    height: HEIGHT,
    title,
    description: caption,
    style: CHART_STYLE,
    idPrefix,
    body: [
      el('rect', { width: WIDTH, height: HEIGHT, fill: INK.paper }),
      el('defs', {}, [hatch, stipple]),
      titleBlock(OVERVIEW.left, title, caption),
      overviewPanel(data, idPrefix, unlabelled),
      closeUpPanel(data, idPrefix, unlabelled),
      legend(data, unlabelled, idPrefix),
    ],
  });
}
