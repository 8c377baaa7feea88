/**
 * The charts of the invented town square (tests/report/scenes/four-family-square.yaml, and its
 * twin four-family-switch.yaml, whose four families crowd the map in pairs):
 * labels that never overprint, a band the markers do not hide, a pole's band that says the sun
 * stands opposite its shadow, a residual chart sized to its rows, "poor fit" and "does not fit"
 * told apart without colour, and captions that name the colours as drawn.
 */
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import type { Scene } from '../../src/scene/types.js';
import type { DateAnswer } from '../../src/solver/types.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { dateHourMapData } from '../../src/charts/dateHourMapData.js';
import { renderDateHourMap } from '../../src/charts/dateHourMap.js';
import { skyChartData, type SkyChartData } from '../../src/charts/skyChartData.js';
import { renderSkyChart } from '../../src/charts/skyChart.js';
import { renderResidualChart, type ResidualChartData } from '../../src/charts/residualChart.js';
import { boxesOverlap, textWidth, type Box } from '../../src/charts/labels.js';
import { FIT_BANDS, INK, OKABE_ITO, OUTSIDE_BANDS_LABEL } from '../../src/charts/palette.js';

const SQUARE = 'tests/report/scenes/four-family-square.yaml';
const SWITCH = 'tests/report/scenes/four-family-switch.yaml';

let scene: Scene;
let answer: DateAnswer;
let map: string;
let sky: SkyChartData;
let skySvg: string;
let crowdedMap: string;
let crowdedSky: string;
let crowdedAnswer: DateAnswer;

beforeAll(() => {
  scene = readSceneFile(SQUARE);
  answer = solveDates(scene);
  map = renderDateHourMap(dateHourMapData(scene, answer, { dayStep: 2, minuteStep: 10 }));
  sky = skyChartData(scene, answer, { columns: 181, rows: 91 });
  skySvg = renderSkyChart(sky);
  const crowded = readSceneFile(SWITCH);
  crowdedAnswer = solveDates(crowded);
  crowdedMap = renderDateHourMap(dateHourMapData(crowded, crowdedAnswer, { dayStep: 2, minuteStep: 10 }));
  crowdedSky = renderSkyChart(skyChartData(crowded, crowdedAnswer, { columns: 181, rows: 91 }));
});

/** The boxes of the family labels in a piece of SVG (their size as the placement reserved it). */
function labelBoxes(svg: string): { text: string; box: Box }[] {
  return [...svg.matchAll(/<text x="([\d.]+)" y="([\d.]+)" class="hc-mark-label">([^<]+)<\/text>/g)].map((m) => {
    const size = 10.5;
    return { text: m[3], box: { x: Number(m[1]), y: Number(m[2]) - 0.75 * size, width: textWidth(m[3], size), height: 0.95 * size } };
  });
}

function noneOverlap(labels: { text: string; box: Box }[]): string | null {
  for (let i = 0; i < labels.length; i += 1) {
    for (let j = i + 1; j < labels.length; j += 1) if (boxesOverlap(labels[i].box, labels[j].box)) return `${labels[i].text} and ${labels[j].text}`;
  }
  return null;
}

function panel(svg: string, name: string): string {
  const at = svg.indexOf(`<g class="hc-panel ${name}">`);
  expect(at, name).toBeGreaterThan(0);
  const next = svg.indexOf('<g class="hc-panel', at + 10);
  return svg.slice(at, next > 0 ? next : undefined);
}

/** WCAG 2.1 relative luminance of an sRGB colour "#RRGGBB" (W3C, Web Content Accessibility Guidelines 2.1, definition "relative luminance"). */
function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => {
    const c = parseInt(hex.slice(i, i + 2), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** WCAG 2.1 contrast ratio (L1 + 0.05) / (L2 + 0.05). */
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

describe('family labels never overprint', () => {
  it('has four families whose best dates pile up in pairs (the case that overprinted)', () => {
    // each season named in the Julian and the Gregorian calendar: pairs eleven days apart
    expect(crowdedAnswer.families).toHaveLength(4);
    expect(new Set(crowdedAnswer.families.map((f) => f.calendar))).toEqual(new Set(['julian', 'gregorian']));
  });
  it('in the whole-year map, in its close-up and in the sky chart', () => {
    for (const [where, svg] of [['whole year', panel(crowdedMap, 'hc-overview')], ['close-up', panel(crowdedMap, 'hc-closeup')], ['sky chart', crowdedSky], ['sky chart of the square', skySvg]] as const) {
      const labels = labelBoxes(svg);
      expect(labels.length, where).toBeGreaterThanOrEqual(where === 'close-up' ? 1 : 2);
      expect(noneOverlap(labels), `${where}: overprinted labels`).toBeNull();
    }
    expect(labelBoxes(panel(crowdedMap, 'hc-overview')).map((l) => l.text).sort()).toEqual(['F1', 'F2', 'F3', 'F4']);
    expect(labelBoxes(crowdedSky).map((l) => l.text).sort()).toEqual(['F1', 'F2', 'F3', 'F4']);
    // the pairs really are crowded: their marks lie within a label's width of each other
    const dots = [...panel(crowdedMap, 'hc-overview').matchAll(/<circle cx="([\d.]+)" cy="([\d.]+)"[^>]*class="hc-candidate/g)].map((m) => [Number(m[1]), Number(m[2])]);
    const close = dots.some((a, i) => dots.some((b, j) => j > i && Math.hypot(a[0] - b[0], a[1] - b[1]) < textWidth('F1', 10.5)));
    expect(close).toBe(true);
  });
  it('labels in the sky chart stand off the pile of suns, with leader lines where set away', () => {
    const suns = [...crowdedSky.matchAll(/<g class="hc-candidate-sun">[\s\S]*?<circle cx="([\d.]+)" cy="([\d.]+)" r="([\d.]+)"/g)].map((m) => {
      const [cx, cy, r] = m.slice(1).map(Number);
      return { x: cx - r, y: cy - r, width: 2 * r, height: 2 * r };
    });
    expect(suns).toHaveLength(4);
    for (const l of labelBoxes(crowdedSky)) for (const sun of suns) expect(boxesOverlap(l.box, sun), `${l.text} on a sun`).toBe(false);
    expect([...crowdedSky.matchAll(/class="hc-leader"/g)].length).toBeGreaterThanOrEqual(1);
  });
});

describe('a band under the markers stays visible', () => {
  it('the whole-year map keeps its labels off the best-fitting cells and draws only the thin 95% ellipse there', () => {
    const overview = panel(map, 'hc-overview');
    const best = /<path d="([^"]+)" fill="[^"]+"[^>]*class="hc-band hc-band-0"/.exec(overview);
    expect(best).not.toBeNull();
    const cells = [...best![1].matchAll(/M([\d.]+) ([\d.]+)H([\d.]+)V([\d.]+)/g)].map((m) => {
      const [x0, y0, x1, y1] = m.slice(1).map(Number);
      return { x: Math.min(x0, x1), y: Math.min(y0, y1), width: Math.abs(x1 - x0), height: Math.abs(y1 - y0) };
    });
    expect(cells.length).toBeGreaterThan(0);
    for (const l of labelBoxes(overview)) for (const c of cells) expect(boxesOverlap(l.box, c), `${l.text} covers the best fit`).toBe(false);
    const ellipses = [...overview.matchAll(/class="hc-ellipse"/g)].length;
    const dashed = [...overview.matchAll(/stroke-width="0.8" stroke-dasharray="4 2.5" class="hc-ellipse"/g)].length;
    expect(ellipses).toBeGreaterThan(0);
    expect(dashed).toBe(ellipses);
  });
  it('the sky chart draws every band\u2019s outline once more above the suns and their ellipses', () => {
    const lastSun = skySvg.lastIndexOf('class="hc-candidate-sun"');
    for (const b of sky.bands) {
      const over = skySvg.indexOf(`class="hc-sky-band-over" data-observation="${b.observationId}"`);
      expect(over, b.observationId).toBeGreaterThan(lastSun);
    }
  });
});

describe('a scene measured in pixels (examples/tanners-hall-photo, invented)', () => {
  it('gets its map and sky chart, and the lamp-post\u2019s small patch of sky, hidden under the sun\u2019s mark, is ringed', () => {
    const photo = readSceneFile('examples/tanners-hall-photo/tanners-hall-photo.yaml');
    const photoAnswer = solveDates(photo);
    // the charts take the pixel forms as the solver does (they used to stop at "slopeDeg: nothing is not allowed")
    expect(renderDateHourMap(dateHourMapData(photo, photoAnswer, { dayStep: 5, minuteStep: 20 }))).toContain('class="hc-band hc-band-0"');
    const svg = renderSkyChart(skyChartData(photo, photoAnswer, { columns: 241, rows: 121 }));
    expect(svg).toMatch(/<circle [^>]*class="hc-sky-band-spot" data-observation="lamp-post"/);
    expect(svg).toContain('lamp-post: smaller than a sun&#39;s mark, so a ring in its colour shows where it lies.');
    const ring = /<circle cx="([\d.]+)" cy="([\d.]+)" r="([\d.]+)"[^>]*class="hc-sky-band-spot"/.exec(svg)!;
    const sun = /<g class="hc-candidate-sun">[\s\S]*?<circle cx="([\d.]+)" cy="([\d.]+)" r="([\d.]+)"/.exec(svg)!;
    // the ring is larger than the sun's mark and drawn after it
    expect(Number(ring[3])).toBeGreaterThan(Number(sun[3]) + 3);
    expect(svg.indexOf('hc-sky-band-spot')).toBeGreaterThan(svg.lastIndexOf('hc-candidate-sun'));
  });
});

describe('a pole\u2019s band says the sun stands opposite its shadow', () => {
  it('lies at the sun\u2019s azimuth 120 deg for the flagpole shadow entered at 300 deg, and says so', () => {
    const pole = sky.bands.find((b) => b.observationId === 'flagpole')!;
    expect(pole.opposite).toEqual({ shadowAzimuthDeg: 300, sunAzimuthDeg: 120 });
    // the band's cells within 1 sigma (3 deg) straddle azimuth 120 (a pole's shadow points away from the sun: common practice)
    const inside = pole.azimuths.filter((_, i) => pole.values.some((row) => row[i] <= 1));
    expect(Math.min(...inside)).toBeGreaterThan(115);
    expect(Math.max(...inside)).toBeLessThan(125);
    expect(skySvg).toContain('opposite the shadow:');
    expect(skySvg).toContain('shadow 300 deg, sun 120 deg');
    expect(skySvg).toContain('flagpole: a pole&#39;s shadow points away from the sun, so its band lies at the sun&#39;s azimuth, opposite the shadow (shadow 300 deg, sun 120 deg).');
  });
});

describe('the residual chart is sized to its rows', () => {
  const rows = (n: number, label = 'wall-a: slope'): ResidualChartData => ({
    candidateLabel: 'candidate 1, 4 April 1770',
    rows: Array.from({ length: n }, (_, k) => ({ observationId: `o${k}`, label, normalised: k % 2 ? 0.5 : -1.2, detail: '', flagged: false })),
    facts: [],
    flaggedIds: [],
  });
  const size = (svg: string): [number, number] => {
    const m = /viewBox="0 0 ([\d.]+) ([\d.]+)"/.exec(svg)!;
    return [Number(m[1]), Number(m[2])];
  };
  it('grows by one row height per row and not otherwise', () => {
    const [w3, h3] = size(renderResidualChart(rows(3)));
    const [w9, h9] = size(renderResidualChart(rows(9)));
    expect(w9).toBe(w3);
    expect(h9 - h3).toBe(6 * 24);
    expect(h3).toBeLessThan(260);
  });
  it('widens its label column for a long observation id instead of writing past the left edge', () => {
    const long = 'the-iron-bracket-of-the-tanners-sign-on-the-west-front: slope';
    const svg = renderResidualChart(rows(2, long));
    const label = new RegExp(`<text x="([\\d.]+)" y="[\\d.]+" class="hc-legend" text-anchor="end">${long}</text>`).exec(svg);
    expect(label).not.toBeNull();
    expect(Number(label![1]) - long.length * 0.5 * 10.5).toBeGreaterThanOrEqual(0);
    expect(size(svg)[0]).toBeGreaterThan(size(renderResidualChart(rows(2)))[0]);
  });
});

describe('"poor fit" and "does not fit" differ without colour', () => {
  it('the poor-fit cells and their key are stippled; "does not fit" is left white', () => {
    expect(map).toMatch(/class="hc-band hc-band-3"/);
    expect(map).toMatch(/fill="url\(#hc-map-stipple\)" stroke="none" class="hc-band-stipple"/);
    expect(map).toMatch(/<rect [^>]*fill="url\(#hc-map-stipple\)"/); // the key's swatch
    expect(FIT_BANDS[3].label).toContain('dotted');
    expect(OUTSIDE_BANDS_LABEL).toContain('white');
  });
  it('the stipple stands out from white paper by the 3:1 contrast of WCAG 2.1 (SC 1.4.11), the tint alone does not', () => {
    const dot = /<pattern id="hc-map-stipple"[^>]*><circle [^>]*fill="(#[0-9A-F]{6})"/.exec(map)![1];
    expect(contrast(dot, INK.paper)).toBeGreaterThanOrEqual(3);
    expect(contrast(FIT_BANDS[3].fill, INK.paper)).toBeLessThan(1.5);
  });
});

describe('captions name the colours as drawn', () => {
  it('the map says vermilion, and its marks are Okabe-Ito vermilion', () => {
    expect(map).toContain('vermilion: the best dates and hours');
    expect(map).toContain(`fill="${OKABE_ITO.vermillion}"`);
    for (const svg of [map, skySvg]) expect(/<desc[^>]*>([^<]*)<\/desc>/.exec(svg)![1]).not.toMatch(/\bred\b/);
  });
  it('docs/pictures.md names no colour that is not drawn', () => {
    const doc = readFileSync('docs/pictures.md', 'utf8');
    expect(doc).not.toMatch(/\bred\b/i);
    expect(doc).toContain('vermilion');
  });
});
