/**
 * The sky chart: azimuth (degrees clockwise from true north, compass letters below) across,
 * apparent altitude up. Each measured observation is drawn as its band of sun directions within
 * 1 sigma (filled lightly and outlined in its own colour and line style); the sun's daily paths
 * on the candidates' days carry a mark at every whole hour of local apparent time; the
 * candidates' suns are drawn with their 68% and 95% sky ellipses. With the moon layer (skyChartData's
 * `moon` option): the moon's path on the best day (grey, dash-dot, open circles at the whole hours) and
 * a small phase symbol at the best candidate's instant, its lit part white and turned as the observer
 * sees it, labelled and described in words under the chart.
 * A scene lit by the moon alone (data.light 'moon') is drawn for the moon throughout: its bands are moon
 * directions, the paths are the moon's on the candidates' days, and the candidates are marked by the moon's phase
 * symbol at their instants; title, legend and notes say "moon", and nothing of the sun is drawn.
 */
import { cosDeg, normalizeDeg360, sinDeg } from '../math/angles.js';
import { bottomAxis, clipPathFor, leftAxis, plotFrame, titleBlock, type PlotArea, type Tick } from './axes.js';
import { isolineSegments, runsAtOrBelow } from './contour.js';
import { CHART_STYLE, DASHES, INK, OKABE_ITO, seriesStyle } from './palette.js';
import { linearScale, niceTicks, type LinearScale } from './scale.js';
import type { SkyBand, SkyChartData, SkyMoon } from './skyChartData.js';
import { el, group, num, pathData, svgDocument, text } from './svg.js';
import { placeLabels, placedLabelMarks, textWidth } from './labels.js';

const WIDTH = 820;
/** Baseline of the first note under the plot; the chart's height follows the number of notes. */
const NOTES_TOP = 476;
const AREA: PlotArea = { left: 62, top: 60, width: 540, height: 340 };
const PATH_DASHES = [DASHES.solid, DASHES.dashed, DASHES.dotted] as const;
const COMPASS = ['N', 'NE', 'E', 'SE', 'S', 'SW', 'W', 'NW'] as const;

/** Radius of the moon's phase symbol, drawing units. */
const MOON_RADIUS = 8;
/** The moon's path: grey ink and a dash-dot line, unlike the sun paths (black, solid, dashed, dotted). */
const MOON_PATH = { stroke: INK.muted, dash: DASHES.dashDot } as const;

/**
 * The moon's phase symbol: a dark disc with its lit part in white, turned as the observer sees it.
 * The lit part lies between the lit limb (a half circle) and the terminator, a half ellipse whose
 * half-width is r |1 - 2k| across the line to the lit side, k the lit fraction of the disc's area
 * (Meeus 1998 ch. 48; the terminator is a great circle seen in projection, common practice).
 * @param tiltDeg the lit side's direction from straight up, positive towards the left (docs/conventions.md)
 */
export function moonSymbol(cx: number, cy: number, r: number, illuminatedFraction: number, tiltDeg: number): string {
  // Unit vector towards the lit side on the page (y down): up is (0, -1), left is (-1, 0).
  const u = [-sinDeg(tiltDeg), -cosDeg(tiltDeg)] as const;
  const w = [cosDeg(tiltDeg), -sinDeg(tiltDeg)] as const;
  const at = (a: number, b: number): [number, number] => [cx + a * u[0] + b * w[0], cy + a * u[1] + b * w[1]];
  const steps = 24;
  const lit: [number, number][] = [];
  for (let i = 0; i <= steps; i += 1) {
    const t = -90 + (180 * i) / steps; // along the lit limb, from one horn to the other
    lit.push(at(r * cosDeg(t), r * sinDeg(t)));
  }
  for (let i = steps; i >= 0; i -= 1) {
    const t = -90 + (180 * i) / steps; // back along the terminator
    lit.push(at(r * (1 - 2 * illuminatedFraction) * cosDeg(t), r * sinDeg(t)));
  }
  return group({ class: 'hc-moon-symbol' }, [
    el('circle', { cx, cy, r, fill: INK.muted, stroke: 'none' }),
    el('path', { d: pathData(lit, true), fill: INK.paper, stroke: 'none' }),
    el('circle', { cx, cy, r, fill: 'none', stroke: INK.ink, 'stroke-width': 1.1 }),
  ]);
}

/** Dashes of the moon's paths on the candidates' days in a scene lit by the moon alone: the first as the moon layer's, then dashed and dotted. */
const MOON_PATH_DASHES = [DASHES.dashDot, DASHES.dashed, DASHES.dotted] as const;

/**
 * The moon's path on the best day, with open circles at the whole hours of local apparent time.
 * @param dash the path's dashes (the moon layer's dash-dot by default)
 * @param hourLabels whether the hours are written beside the circles
 */
function moonPathMarks(moon: SkyMoon, x: LinearScale, y: LinearScale, dash: string | undefined = MOON_PATH.dash, hourLabels = false): string {
  return group({ class: 'hc-moon-path' }, [
    ...moon.segments.map((seg) => el('path', { d: pathData(seg.map(([az, alt]) => [x(az), y(alt)])), fill: 'none', stroke: MOON_PATH.stroke, 'stroke-width': 1.3, 'stroke-dasharray': dash })),
    ...moon.hourMarks.map((h) => el('circle', { cx: x(h.azimuthDeg), cy: y(h.altitudeDeg), r: 2.2, fill: INK.paper, stroke: MOON_PATH.stroke, 'stroke-width': 1 })),
    ...(hourLabels ? moon.hourMarks.map((h) => text(x(h.azimuthDeg), y(h.altitudeDeg) - 6, h.label, { class: 'hc-note', 'text-anchor': 'middle' })) : []),
  ]);
}

/** Two lines under the chart: the moon at the candidate in words, and how its path is drawn (paths: a scene lit by the moon alone). */
function moonNotes(moon: SkyMoon, paths?: readonly SkyMoon[]): string[] {
  const a = moon.at;
  const where = a.altitudeDeg < 0 ? `below the horizon (altitude ${num(a.altitudeDeg, 1)} deg), so not drawn` : `azimuth ${num(normalizeDeg360(a.azimuthDeg), 1)}, altitude ${num(a.altitudeDeg, 1)} deg`;
  if (paths === undefined) return [`Moon at ${a.candidateLabel}: ${a.words}; ${where}.`, `Moon path on ${moon.label}: grey dash-dot line, open circles at the whole hours of local apparent time.`];
  const how = paths.length > 1
    ? `Moon paths on ${paths.map((p) => p.label).join(', ')}: grey lines (dash-dot, dashed, dotted),`
    : `Moon path on ${moon.label}: grey dash-dot line,`;
  return [`Moon at ${a.candidateLabel}: ${a.words}; ${where}.`, how, "each from 12 hours before its candidate's instant to 12 hours after; open circles at the whole hours of local apparent time."];
}

/** A band whose region is smaller than this across, in drawing units, could hide under a sun's mark: it gets a ring. */
const SPOT_SIZE = 14;

interface BandMarks {
  readonly under: string;
  readonly over: string;
  /** How the band is shown beyond its fill and outline: a ring around a spot, or nothing drawn at all. */
  readonly shown: 'band' | 'ring' | 'not drawn';
}

function bandMarks(band: SkyBand, index: number, x: LinearScale, y: LinearScale): BandMarks {
  const style = seriesStyle(index);
  const da = band.azimuths.length > 1 ? band.azimuths[1] - band.azimuths[0] : 1;
  const dh = band.altitudes.length > 1 ? band.altitudes[1] - band.altitudes[0] : 1;
  const runs = runsAtOrBelow(band.values, 1); // the cells within 1 sigma
  const fill = runs
    .map((r) => {
      const x0 = x(band.azimuths[r.i0] - da / 2);
      const x1 = x(band.azimuths[r.i1 - 1] + da / 2);
      const y0 = y(band.altitudes[r.j] + dh / 2);
      const y1 = y(band.altitudes[r.j] - dh / 2);
      return `M${num(x0)} ${num(y0)}H${num(x1)}V${num(y1)}H${num(x0)}Z`;
    })
    .join('');
  const outline = isolineSegments({ xs: band.azimuths, ys: band.altitudes, values: band.values }, 1)
    .map(([p, q]) => `M${num(x(p[0]))} ${num(y(p[1]))}L${num(x(q[0]))} ${num(y(q[1]))}`)
    .join('');
  // A region only a few units across (a pole's shadow with both its direction and its length,
  // say) would vanish under the sun's mark drawn on it: a ring in the band's colour and line
  // style, larger than the mark, shows where it lies.
  let ring = '';
  if (runs.length > 0) {
    // The runs' extent on the page, in loops (a spread of thousands of numbers makes as many heap numbers).
    let xLo = Infinity;
    let xHi = -Infinity;
    let yLo = Infinity;
    let yHi = -Infinity;
    for (const r of runs) {
      for (const v of [x(band.azimuths[r.i0] - da / 2), x(band.azimuths[r.i1 - 1] + da / 2)]) {
        xLo = Math.min(xLo, v);
        xHi = Math.max(xHi, v);
      }
      for (const v of [y(band.altitudes[r.j] + dh / 2), y(band.altitudes[r.j] - dh / 2)]) {
        yLo = Math.min(yLo, v);
        yHi = Math.max(yHi, v);
      }
    }
    const w = xHi - xLo;
    const h = yHi - yLo;
    if (w < SPOT_SIZE && h < SPOT_SIZE) {
      const cx = (xHi + xLo) / 2;
      const cy = (yHi + yLo) / 2;
      ring = el('circle', { cx, cy, r: Math.max(10, Math.hypot(w, h) / 2 + 6), fill: 'none', stroke: style.color, 'stroke-width': 1.8, 'stroke-dasharray': style.dash, class: 'hc-sky-band-spot', 'data-observation': band.observationId });
    }
  }
  return {
    shown: runs.length === 0 ? 'not drawn' : ring !== '' ? 'ring' : 'band',
    under: group({ class: 'hc-sky-band', 'data-observation': band.observationId }, [
      fill === '' ? '' : el('path', { d: fill, fill: style.color, 'fill-opacity': 0.16, stroke: 'none' }),
      outline === '' ? '' : el('path', { d: outline, fill: 'none', stroke: style.color, 'stroke-width': 1.6, 'stroke-dasharray': style.dash }),
    ]),
    // The outline once more, thin, above the sun paths and the candidates' suns: a band that
    // passes under the markers stays visible there.
    over:
      (outline === '' ? '' : el('path', { d: outline, fill: 'none', stroke: style.color, 'stroke-width': 0.9, 'stroke-dasharray': style.dash, class: 'hc-sky-band-over', 'data-observation': band.observationId })) + ring,
  };
}

function azimuthTicks(range: readonly [number, number]): { ticks: Tick[]; compass: Tick[] } {
  const span = range[1] - range[0];
  const step = span > 200 ? 30 : span > 100 ? 20 : 10;
  const ticks = niceTicks(range[0], range[1], 10, step).map((v) => ({ value: v, label: `${num(normalizeDeg360(v), 0)}` }));
  const compass = niceTicks(range[0], range[1], 8, 45).map((v) => ({ value: v, label: COMPASS[Math.round(normalizeDeg360(v) / 45) % 8] }));
  return { ticks, compass };
}

/** "shadow 300 deg, sun 120 deg" (or "moon 120 deg" for a shadow cast by moonlight). */
function oppositeWords(o: NonNullable<SkyBand['opposite']>, light: 'sun' | 'moon' = 'sun'): string {
  return `shadow ${num(o.shadowAzimuthDeg, 1)} deg, ${light} ${num(o.sunAzimuthDeg, 1)} deg`;
}

/** The legend's entry of each band (with where its light stood, for a shadow drawn opposite); returns the next line's y. */
function bandLegendEntries(data: SkyChartData, parts: string[], left: number, top: number, light: 'sun' | 'moon'): number {
  let y = top;
  data.bands.forEach((b, i) => {
    const s = seriesStyle(i);
    parts.push(el('rect', { x: left, y: y - 9, width: 22, height: 10, fill: s.color, 'fill-opacity': 0.16, stroke: s.color, 'stroke-width': 1.6, 'stroke-dasharray': s.dash }));
    parts.push(text(left + 28, y, b.observationId, { class: 'hc-legend' }));
    y += 15;
    if (b.opposite) {
      parts.push(text(left + 28, y - 2, `drawn where the ${light} stood,`, { class: 'hc-note' }));
      parts.push(text(left + 28, y + 10, 'opposite the shadow:', { class: 'hc-note' }));
      parts.push(text(left + 28, y + 22, oppositeWords(b.opposite, light), { class: 'hc-note' }));
      y += 38;
    }
  });
  return y;
}

/** The legend of a scene lit by the moon alone: its bands, the moon's paths and the moon at the candidates. */
function moonLegend(data: SkyChartData): { svg: string; bottom: number } {
  const left = AREA.left + AREA.width + 18;
  let y = AREA.top + 4;
  const parts: string[] = [text(left, y, 'Moon directions within', { class: 'hc-legend', 'font-weight': 'bold' })];
  y += 14;
  parts.push(text(left, y, '1 sigma of', { class: 'hc-legend', 'font-weight': 'bold' }));
  y += 16;
  y = bandLegendEntries(data, parts, left, y, 'moon');
  y += 8;
  parts.push(text(left, y, 'Moon path on', { class: 'hc-legend', 'font-weight': 'bold' }));
  y += 16;
  (data.moonPaths ?? []).forEach((p, i) => {
    parts.push(el('path', { d: `M${left} ${y - 4}h22`, stroke: MOON_PATH.stroke, 'stroke-width': 1.3, 'stroke-dasharray': MOON_PATH_DASHES[i % 3], fill: 'none' }));
    parts.push(text(left + 28, y, p.label, { class: 'hc-legend' }));
    y += 15;
  });
  parts.push(el('circle', { cx: left + 11, cy: y - 4, r: 2.2, fill: INK.paper, stroke: MOON_PATH.stroke, 'stroke-width': 1 }));
  parts.push(text(left + 28, y, 'whole hour, local apparent time', { class: 'hc-legend' }));
  y += 23;
  parts.push(moonSymbol(left + 11, y - 4, 7, 0.3, 60));
  parts.push(text(left + 28, y, 'the moon at F1, F2, ...,', { class: 'hc-legend' }));
  y += 13;
  parts.push(text(left + 28, y, 'lit part white, as seen', { class: 'hc-legend' }));
  return { svg: group({ class: 'hc-legend-block' }, parts), bottom: y };
}

function legend(data: SkyChartData): { svg: string; bottom: number } {
  const left = AREA.left + AREA.width + 18;
  let y = AREA.top + 4;
  const parts: string[] = [text(left, y, 'Within 1 sigma of', { class: 'hc-legend', 'font-weight': 'bold' })];
  y += 16;
  y = bandLegendEntries(data, parts, left, y, 'sun');
  y += 8;
  parts.push(text(left, y, 'Sun path on', { class: 'hc-legend', 'font-weight': 'bold' }));
  y += 16;
  data.paths.forEach((p, i) => {
    parts.push(el('path', { d: `M${left} ${y - 4}h22`, stroke: INK.ink, 'stroke-width': 1.3, 'stroke-dasharray': PATH_DASHES[i % 3], fill: 'none' }));
    parts.push(text(left + 28, y, p.label, { class: 'hc-legend' }));
    y += 15;
  });
  parts.push(el('circle', { cx: left + 11, cy: y - 4, r: 2, fill: INK.ink }));
  parts.push(text(left + 28, y, 'whole hour, local apparent time', { class: 'hc-legend' }));
  y += 23;
  parts.push(el('circle', { cx: left + 11, cy: y - 4, r: 4, fill: OKABE_ITO.yellow, stroke: INK.ink, 'stroke-width': 1.2 }));
  parts.push(text(left + 28, y, 'the sun at F1, F2, ...', { class: 'hc-legend' }));
  y += 15;
  parts.push(el('path', { d: `M${left} ${y - 4}h22`, stroke: INK.ink, 'stroke-width': 1.1, fill: 'none' }));
  parts.push(text(left + 28, y, '68% sky ellipse', { class: 'hc-legend' }));
  y += 15;
  parts.push(el('path', { d: `M${left} ${y - 4}h22`, stroke: INK.ink, 'stroke-width': 1.1, 'stroke-dasharray': '4 2.5', fill: 'none' }));
  parts.push(text(left + 28, y, '95% sky ellipse', { class: 'hc-legend' }));
  if (data.moon) {
    y += 23;
    parts.push(el('path', { d: `M${left} ${y - 4}h22`, stroke: MOON_PATH.stroke, 'stroke-width': 1.3, 'stroke-dasharray': MOON_PATH.dash, fill: 'none' }));
    parts.push(text(left + 28, y, `moon path, ${data.moon.at.candidateLabel}'s day`, { class: 'hc-legend' }));
    y += 19;
    parts.push(moonSymbol(left + 11, y - 4, 7, 0.3, 60));
    parts.push(text(left + 28, y, `the moon at ${data.moon.at.candidateLabel},`, { class: 'hc-legend' }));
    y += 13;
    parts.push(text(left + 28, y, 'lit part white, as seen', { class: 'hc-legend' }));
  }
  return { svg: group({ class: 'hc-legend-block' }, parts), bottom: y };
}

/**
 * The sky chart as a standalone SVG document.
 * @param idPrefix prefix of the ids inside (several charts can share one HTML page)
 */
export function renderSkyChart(data: SkyChartData, idPrefix = 'hc-sky'): string {
  const x = linearScale(data.azimuthRange, [AREA.left, AREA.left + AREA.width]);
  const y = linearScale(data.altitudeRange, [AREA.top + AREA.height, AREA.top]);
  const clip = `${idPrefix}-clip`;
  const { ticks, compass } = azimuthTicks(data.azimuthRange);
  const paths = data.paths.map((p, i) =>
    group({ class: 'hc-sun-path' }, [
      el('path', { d: pathData(p.points.map(([az, alt]) => [x(az), y(alt)])), fill: 'none', stroke: INK.ink, 'stroke-width': 1.3, 'stroke-dasharray': PATH_DASHES[i % 3] }),
      ...p.hourMarks.map((h) => el('circle', { cx: x(h.azimuthDeg), cy: y(h.altitudeDeg), r: 2, fill: INK.ink })),
      ...(i === 0 ? p.hourMarks.map((h) => text(x(h.azimuthDeg), y(h.altitudeDeg) - 6, h.label, { class: 'hc-note', 'text-anchor': 'middle' })) : []),
    ]),
  );
  const suns = data.suns.map((s, k) =>
    group({ class: 'hc-candidate-sun' }, [
      ...s.ellipses.map((e) => el('path', { d: pathData(e.points.map(([az, alt]) => [x(az), y(alt)]), true), fill: 'none', stroke: INK.ink, 'stroke-width': 1.1, 'stroke-dasharray': e.probability > 0.9 ? '4 2.5' : undefined })),
      el('circle', { cx: x(s.azimuthDeg), cy: y(s.altitudeDeg), r: k === 0 ? 4.5 : 3.5, fill: OKABE_ITO.yellow, stroke: INK.ink, 'stroke-width': 1.2 }),
    ]),
  );
  // The suns' labels, clear of each other, of the suns and of the hour labels of the first path.
  const hourLabels = data.paths[0]?.hourMarks ?? data.moonPaths?.[0]?.hourMarks ?? [];
  const hourBoxes = hourLabels.map((h) => {
    const w = textWidth(h.label, 10);
    return { x: x(h.azimuthDeg) - w / 2, y: y(h.altitudeDeg) - 6 - 8, width: w, height: 10 };
  });
  // ... and clear of the suns' 95% ellipses, so that crowded suns get their labels outside the
  // crowd, each with a leader line to its own sun.
  const ellipseBoxes = data.suns.flatMap((s) =>
    s.ellipses
      .filter((e) => e.probability > 0.9)
      .map((e) => {
        const xs = e.points.map(([az]) => x(az));
        const ys = e.points.map(([, alt]) => y(alt));
        return { x: Math.min(...xs), y: Math.min(...ys), width: Math.max(...xs) - Math.min(...xs), height: Math.max(...ys) - Math.min(...ys) };
      }),
  );
  const bounds = { x: AREA.left, y: AREA.top, width: AREA.width, height: AREA.height };
  const byMoon = data.light === 'moon';
  // A scene lit by the moon alone: the moon at each candidate is drawn in place of the suns (below), so the layer's symbol is not drawn twice.
  const moonUp = !byMoon && data.moon !== undefined && data.moon.at.altitudeDeg >= 0 ? data.moon : undefined;
  const candidateMoons = (data.moons ?? []).filter((m) => m.altitudeDeg >= 0);
  const moonRadius = (k: number): number => (k === 0 ? MOON_RADIUS : MOON_RADIUS - 2);
  const placement = placeLabels(
    [
      ...data.suns.map((s, k) => ({ anchor: [x(s.azimuthDeg), y(s.altitudeDeg)] as const, text: s.label, fontSize: 10.5, markRadius: k === 0 ? 5 : 4 })),
      ...candidateMoons.map((m, k) => ({ anchor: [x(m.azimuthDeg), y(m.altitudeDeg)] as const, text: m.label, fontSize: 10.5, markRadius: moonRadius(k) + 1 })),
      ...(moonUp ? [{ anchor: [x(moonUp.at.azimuthDeg), y(moonUp.at.altitudeDeg)] as const, text: `moon ${moonUp.at.candidateLabel}`, fontSize: 10.5, markRadius: MOON_RADIUS + 1 }] : []),
    ],
    [...hourBoxes, ...ellipseBoxes],
    bounds,
  );
  const body = byMoon ? 'moon' : 'sun';
  const title = byMoon ? 'Where the moon must have stood (the light is the moon\u2019s)' : 'Where the sun must have stood';
  const caption = byMoon
    ? 'Coloured bands: the moon directions within 1 sigma of each shadow cast by moonlight; grey lines: the moon\u2019s path on the best days.'
    : 'Coloured bands: the sun directions within 1 sigma of each measured shadow; black lines: the sun\u2019s path on the best days.';
  const noteLines = data.bands
    .filter((b) => b.opposite)
    .map((b) => `${b.observationId}: a pole's shadow points away from the ${body}, so its band lies at the ${body}'s azimuth, opposite the shadow (${oppositeWords(b.opposite!, body)}).`);
  const bandParts = data.bands.map((b, i) => bandMarks(b, i, x, y));
  const ringed = data.bands.filter((_, i) => bandParts[i].shown === 'ring').map((b) => b.observationId);
  if (ringed.length > 0) noteLines.push(`${ringed.join(', ')}: smaller than a ${body}'s mark, so ${ringed.length === 1 ? 'a ring in its colour shows where it lies' : 'rings in their colours show where they lie'}.`);
  const thin = data.bands.filter((_, i) => bandParts[i].shown === 'not drawn').map((b) => b.observationId);
  if (thin.length > 0) noteLines.push(`Not drawn: ${thin.join(', ')} (narrower than the chart's grid of ${body} directions, or nowhere in the sky shown).`);
  if (data.moon) noteLines.push(...moonNotes(data.moon, byMoon ? data.moonPaths : undefined));
  const below = (data.moons ?? []).filter((m) => m.altitudeDeg < 0).map((m) => m.label);
  if (below.length > 0) noteLines.push(`The moon at ${below.join(', ')} is below the horizon, so not drawn.`);
  if (data.notes.length > 0) noteLines.push(`Not drawn: ${data.notes.join('; ')}.`);
  for (const line of data.calendarNote ?? []) noteLines.push(`${line[0].toUpperCase()}${line.slice(1)}.`);
  if (placement.unplaced.length > 0) noteLines.push(`Too crowded to label: ${placement.unplaced.map((u) => u.text).join(', ')}.`);
  const key = byMoon ? moonLegend(data) : legend(data);
  const notesTop = Math.max(NOTES_TOP, key.bottom + 24);
  const height = notesTop + 14 * noteLines.length + 8;
  const notes = noteLines.map((line, k) => text(AREA.left, notesTop + 14 * k, line, { class: 'hc-note' }));
  return svgDocument({
    width: WIDTH,
    height,
    title,
    description: caption,
    style: CHART_STYLE,
    idPrefix,
    body: [
      el('rect', { width: WIDTH, height, fill: INK.paper }),
      el('defs', {}, clipPathFor(clip, AREA)),
      titleBlock(AREA.left, title, caption),
      group({ 'clip-path': `url(#${clip})` }, [
        ...bandParts.map((b) => b.under),
        ...paths,
        ...(data.moon && !byMoon ? [moonPathMarks(data.moon, x, y)] : []),
        ...(data.moonPaths ?? []).map((p, i) => moonPathMarks(p, x, y, MOON_PATH_DASHES[i % 3], i === 0)),
        ...suns,
        ...candidateMoons.map((m, k) => moonSymbol(x(m.azimuthDeg), y(m.altitudeDeg), moonRadius(k), m.illuminatedFraction, m.brightLimbTiltFromVerticalDeg)),
        ...(moonUp ? [moonSymbol(x(moonUp.at.azimuthDeg), y(moonUp.at.altitudeDeg), MOON_RADIUS, moonUp.at.illuminatedFraction, moonUp.at.brightLimbTiltFromVerticalDeg)] : []),
        ...bandParts.map((b) => b.over),
        ...placedLabelMarks(placement.placed),
      ]),
      bottomAxis(AREA, { scale: x, ticks, label: 'azimuth (degrees clockwise from true north)', grid: true, secondary: compass }),
      leftAxis(AREA, { scale: y, ticks: niceTicks(data.altitudeRange[0], data.altitudeRange[1], 6).map((v) => ({ value: v, label: num(v, 0) })), label: 'altitude above the horizon (degrees)', grid: true }),
      plotFrame(AREA),
      key.svg,
      ...notes,
    ],
  });
}
