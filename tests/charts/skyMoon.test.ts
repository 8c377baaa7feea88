/**
 * The sky chart's moon layer: off by default (the chart of a scene without moon evidence is unchanged),
 * and when on, the moon's path and a phase symbol whose lit area and direction follow the moon's
 * illuminated fraction and the tilt of its lit side (Meeus 1998 ch. 48; conventions in docs/conventions.md).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import type { Scene } from '../../src/scene/types.js';
import type { DateAnswer } from '../../src/solver/types.js';
import { solveDates } from '../../src/solver/solveDates.js';
import { skyChartData, type SkyChartData } from '../../src/charts/skyChartData.js';
import { moonSymbol, renderSkyChart } from '../../src/charts/skyChart.js';
import { moonPosition } from '../../src/ephemeris/moonPosition.js';
import { angleDiffDeg, atan2Deg } from '../../src/math/angles.js';
import { expectClose } from '../helpers/expectClose.js';

let scene: Scene;
let answer: DateAnswer;
beforeAll(() => {
  scene = readSceneFile('examples/marktgasse-print.yaml');
  answer = solveDates(scene);
});

/** The lit part's outline points from a moon symbol's SVG. */
function litPolygon(svg: string): [number, number][] {
  const d = /<path d="([^"]+)" fill="#FFFFFF"/.exec(svg)![1];
  const nums = d.match(/-?\d+(\.\d+)?/g)!.map(Number);
  const pts: [number, number][] = [];
  for (let i = 0; i + 1 < nums.length; i += 2) pts.push([nums[i], nums[i + 1]]);
  return pts;
}

/** Shoelace area and centroid of a closed polygon (common practice). */
function areaAndCentroid(pts: readonly [number, number][]): { area: number; cx: number; cy: number } {
  let a = 0;
  let cx = 0;
  let cy = 0;
  for (let i = 0; i < pts.length; i += 1) {
    const [x0, y0] = pts[i];
    const [x1, y1] = pts[(i + 1) % pts.length];
    const cross = x0 * y1 - x1 * y0;
    a += cross;
    cx += (x0 + x1) * cross;
    cy += (y0 + y1) * cross;
  }
  return { area: Math.abs(a / 2), cx: cx / (3 * a), cy: cy / (3 * a) };
}

describe('sky chart: the moon layer', () => {
  it('is off by default: no moon in the data and nothing of the moon in the drawing', () => {
    const data = skyChartData(scene, answer, { columns: 61, rows: 31 });
    expect('moon' in data).toBe(false);
    const svg = renderSkyChart(data);
    expect(svg).not.toContain('hc-moon');
    expect(svg).not.toMatch(/moon/i);
  });
  it("draws the moon's path on the best day at the moon's own places, and names the moon's look at the best candidate", () => {
    const data = skyChartData(scene, answer, { columns: 61, rows: 31, moon: true });
    const moon = data.moon!;
    expect(moon.label).toContain('(F1)');
    expect(moon.segments.length).toBeGreaterThan(0);
    for (const seg of moon.segments) for (const [, alt] of seg) expect(alt).toBeGreaterThanOrEqual(-1);
    const best = answer.families[0].best;
    const site = { latitudeDeg: scene.site.latitudeDeg, longitudeDeg: scene.site.longitudeDeg, elevationM: scene.site.elevationM };
    const truth = moonPosition(best.jdUT, site, scene.air);
    expectClose(moon.at.altitudeDeg, truth.altitudeDeg, 1e-9, 'moon altitude at F1');
    expectClose(moon.at.illuminatedFraction, truth.illuminatedFraction, 1e-9, 'lit fraction at F1');
    expect(moon.at.words).toMatch(/(crescent|gibbous|quarter|new moon|full moon), \d+% lit, lit side (on|towards|at) /);
    const svg = renderSkyChart(data);
    expect(svg).toContain('hc-moon-path');
    expect(svg).toContain('Moon at F1:');
    // At the example's best candidate (a July morning) the moon is below the horizon: said in words, no symbol.
    expect(moon.at.altitudeDeg).toBeLessThan(0);
    expect(svg).toContain('below the horizon');
    expect(svg.match(/hc-moon-symbol/g)!.length).toBe(1); // the legend's only
  });
  it('draws the phase symbol at the moon when it is up, labelled "moon F1"', () => {
    const data = skyChartData(scene, answer, { columns: 61, rows: 31, moon: true });
    const [az, alt] = data.moon!.segments[0][Math.floor(data.moon!.segments[0].length / 2)];
    const up: SkyChartData = { ...data, moon: { ...data.moon!, at: { ...data.moon!.at, azimuthDeg: az, altitudeDeg: Math.max(alt, 5) } } };
    const svg = renderSkyChart(up);
    expect(svg.match(/hc-moon-symbol/g)!.length).toBe(2); // the one on the sky and the one in the legend
    expect(svg).toContain('moon F1');
  });
});

describe('moonSymbol', () => {
  for (const k of [0.1, 0.3, 0.5, 0.75, 0.95]) {
    for (const tilt of [0, 60, -120, 180]) {
      it(`lights ${Math.round(k * 100)}% of the disc on the side tilted ${tilt} deg from straight up (positive to the left)`, () => {
        const r = 20;
        const { area, cx, cy } = areaAndCentroid(litPolygon(moonSymbol(100, 100, r, k, tilt)));
        // Lit area k pi r^2 (k is the lit fraction of the disc's area; Meeus 1998 eq. 48.1), within the polygon's 2%.
        expect(Math.abs(area / (Math.PI * r * r) - k)).toBeLessThan(0.02);
        // The lit part's centroid lies towards the lit side: page y down, so up is -y and left is -x.
        const seenTilt = atan2Deg(-(cx - 100), -(cy - 100));
        if (k < 0.99) expect(Math.abs(angleDiffDeg(seenTilt, tilt))).toBeLessThan(1);
      });
    }
  }
});
