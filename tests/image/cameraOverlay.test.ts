/**
 * The overlay of the picture's perspective and light: every clicked line drawn and extended to its
 * vanishing point, every object-shadow line extended to where its group's lines meet, that point with
 * its 95% ellipse (Delta chi-square 5.991, NIST/SEMATECH chi-square table); mirrored prints drawn as
 * they are (x flipped back, docs/conventions.md). A group of one pair drawn as its line extended; a
 * shadow wedge as its two sides from the shadow point, extended, lightly filled and labelled.
 */
import { describe, expect, test } from 'vitest';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import type { Observation, PixelPoint, Scene } from '../../src/scene/types.js';
import { createRandom } from '../../src/math/random.js';
import { resolvePixelObservations } from '../../src/image/resolvePixels.js';
import { cameraOverlayElements, GROUP_COLOURS } from '../../src/image/cameraOverlay.js';
import { randomBoxPicture, sceneOfPicture, type BoxPicture } from './boxScene.js';
import { VELMAR } from '../solver/syntheticScene.js';

const BASE = {
  formatVersion: 1 as const, title: 'overlay', site: VELMAR, calendar: { kind: 'gregorian' as const }, yearStart: 'jan1' as const,
  window: { fromYear: 1870, toYear: 1870 }, mapNorthCorrectionDeg: 0, seed: 3,
};

function picture(): BoxPicture {
  const rng = createRandom(41);
  for (;;) {
    const p = randomBoxPicture(rng, { pairs: 4 });
    if (p) return p;
  }
}

describe('the perspective overlay', () => {
  test('draws each camera line twice (clicked, extended), each pair twice, and one ellipse per group with a finite meeting point', () => {
    const pic = picture();
    const scene = sceneOfPicture(pic, createRandom(2), 0.5, 1, BASE, (k) => (k < 2 ? 'a' : 'b'));
    const s = resolvePixelObservations(scene).sceneSun!;
    const { svg, key } = cameraOverlayElements(s, scene.image!);
    const lines = (svg.match(/<line /g) ?? []).length;
    const cameraLines = s.camera.input.families.reduce((n, f) => n + f.lines.length, 0);
    expect(lines).toBe(2 * cameraLines + 2 * 4);
    const finite = s.groups.filter((g) => g.sun.vanishingPointPx && g.sun.vanishingPointCovariancePx).length;
    expect((svg.match(/<ellipse /g) ?? []).length).toBe(finite);
    expect(svg).toContain(GROUP_COLOURS[0]);
    expect(svg).toContain(GROUP_COLOURS[1]);
    expect(key.map((k) => k.text.slice(0, 9))).toEqual(['green: li', 'group "a"', 'group "b"']);
  });

  test('a mirrored print is drawn as it is: the clicked points come back where they were clicked', () => {
    const pic = picture();
    const plain = sceneOfPicture(pic, createRandom(2), 0, 1, BASE);
    const w = plain.image!.widthPx;
    const flip = (p: readonly [number, number]): [number, number] => [w - p[0], p[1]];
    const mirrored = {
      ...plain,
      image: { ...plain.image!, mirrored: true },
      camera: { ...plain.camera!, verticalLines: plain.camera!.verticalLines.map((l) => l.map(flip)), wallLines: plain.camera!.wallLines.map((x) => ({ ...x, lines: x.lines.map((l) => l.map(flip)) })) },
      observations: plain.observations.map((o) => (o.kind === 'object-shadow' ? { ...o, objectPx: flip(o.objectPx), shadowPx: flip(o.shadowPx) } : o)),
    };
    const a = cameraOverlayElements(resolvePixelObservations(plain).sceneSun!, plain.image!).svg;
    const b = cameraOverlayElements(resolvePixelObservations(mirrored).sceneSun!, mirrored.image!).svg;
    const xs = (svg: string): number[] => [...svg.matchAll(/<circle cx="([-\d.]+)"/g)].map((m) => Number(m[1]));
    const ax = xs(a);
    const bx = xs(b);
    expect(bx.length).toBe(ax.length);
    bx.forEach((x, i) => expect(Math.abs(x - (w - ax[i]))).toBeLessThan(0.11));
  });
});

/** A wedge around an object point: the shadow point, and two points beside the object point, square to the shadow line. */
function wedgeAround(id: string, objectPx: PixelPoint, shadowPx: PixelPoint, halfWidthPx: number, group?: string): Observation {
  const d = [objectPx[0] - shadowPx[0], objectPx[1] - shadowPx[1]];
  const n = Math.hypot(d[0], d[1]);
  const side: PixelPoint = [(-d[1] / n) * halfWidthPx, (d[0] / n) * halfWidthPx];
  return {
    id, kind: 'shadow-wedge', shadowPx, ...(group ? { group } : {}),
    edgesPx: [[objectPx[0] + side[0], objectPx[1] + side[1]], [objectPx[0] - side[0], objectPx[1] - side[1]]],
  };
}

const numbers = (text: string): number[] => [...text.matchAll(/-?\d+(?:\.\d+)?/g)].map((m) => Number(m[0]));
/** The lines of an SVG fragment as [x1, y1, x2, y2]. */
const linesOf = (svg: string): number[][] => [...svg.matchAll(/<line x1="([-\d.]+)" y1="([-\d.]+)" x2="([-\d.]+)" y2="([-\d.]+)"/g)].map((m) => m.slice(1).map(Number));
/** Distance of p from the line through a and b, pixels. */
const offLine = (p: readonly number[], a: readonly number[], b: readonly number[]): number =>
  Math.abs((b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0])) / Math.hypot(b[0] - a[0], b[1] - a[1]);

describe('groups of one pair and shadow wedges on the overlay', () => {
  // the Kornplatz print (examples/kornplatz-figures, invented) with figure-1 (its shadow on the front wall) put in a
  // group of its own and a wedge added around figure-6's head, seen from its shadow
  const read = readSceneFile('examples/kornplatz-figures/kornplatz-figures.yaml');
  const figure6 = read.observations.find((o) => o.id === 'figure-6');
  if (figure6?.kind !== 'object-shadow') throw new Error('figure-6 is an object-shadow pair in the example');
  const wedge = wedgeAround('hat-brim', figure6.objectPx, figure6.shadowPx, 25, 'figures');
  const scene: Scene = {
    ...read,
    observations: [...read.observations.map((o) => (o.id === 'figure-1' ? { ...o, group: 'on the wall' } : o)), wedge],
  };
  const s = resolvePixelObservations(scene).sceneSun!;
  const { svg, key } = cameraOverlayElements(s, scene.image!);
  const group = (cls: string, id: string): string => {
    const m = new RegExp(`<g class="${cls}" data-id="${id}">([\\s\\S]*?)</g>`).exec(svg);
    if (!m) throw new Error(`no ${cls} ${id} in the overlay`);
    return m[1];
  };

  test('a group of one pair is drawn as its object-shadow line, extended past the shadow point across the picture', () => {
    expect(s.singlePairs.map((p) => p.id)).toEqual(['figure-1']);
    const post = read.observations.find((o) => o.id === 'figure-1');
    if (post?.kind !== 'object-shadow') throw new Error('figure-1 is a pair');
    const [clicked, dashed] = linesOf(group('single-pair', 'figure-1'));
    expect(clicked).toEqual([...post.objectPx, ...post.shadowPx]);
    expect(dashed.slice(0, 2)).toEqual([...post.shadowPx]);
    expect(offLine(dashed.slice(2), post.objectPx, post.shadowPx)).toBeLessThan(0.2);
    const reach = Math.hypot(dashed[2] - post.shadowPx[0], dashed[3] - post.shadowPx[1]);
    expect(reach).toBeGreaterThan(Math.hypot(scene.image!.widthPx, scene.image!.heightPx));
    expect(key.some((k) => k.text.startsWith('group "on the wall", one pair (figure-1)') && k.colour === GROUP_COLOURS[2])).toBe(true);
  });

  test('a wedge is drawn as its two sides from the shadow point through its edge points, extended, filled between and labelled', () => {
    if (wedge.kind !== 'shadow-wedge') throw new Error('a wedge');
    const body = group('shadow-wedge', 'hat-brim');
    const lines = linesOf(body);
    expect(lines).toHaveLength(4);
    wedge.edgesPx.forEach((e, k) => {
      const [clicked, dashed] = [lines[2 * k], lines[2 * k + 1]];
      expect(clicked.map((v) => Math.round(v * 10) / 10)).toEqual([...wedge.shadowPx, ...e].map((v) => Math.round(v * 10) / 10));
      expect(offLine(dashed.slice(2), wedge.shadowPx, e)).toBeLessThan(0.2);
      // beyond the edge point, away from the shadow point
      expect(Math.hypot(dashed[2] - wedge.shadowPx[0], dashed[3] - wedge.shadowPx[1])).toBeGreaterThan(Math.hypot(e[0] - wedge.shadowPx[0], e[1] - wedge.shadowPx[1]));
    });
    // the fill: a triangle from the shadow point to the two far ends
    const path = /<path d="([^"]+)" fill="([^"]+)" fill-opacity="0.15" stroke="none" clip-path="url\(#([^)]+)\)"/.exec(body)!;
    expect(numbers(path[1])).toEqual([...wedge.shadowPx, lines[1][2], lines[1][3], lines[3][2], lines[3][3]]);
    // kept to the picture's area (the desk shows the overlay unclipped)
    expect(svg).toContain(`<clipPath id="${path[3]}"><rect x="0" y="0" width="${scene.image!.widthPx}" height="${scene.image!.heightPx}"/></clipPath>`);
    expect(body).toMatch(/<text [^>]*>hat-brim<\/text>/);
    // the colour of its group's pairs (the figures)
    const figures = s.groups.findIndex((g) => g.group === 'figures');
    expect(path[2]).toBe(GROUP_COLOURS[figures]);
    expect(key.some((k) => k.text.startsWith('shadow wedge hat-brim:') && k.colour === GROUP_COLOURS[figures])).toBe(true);
  });

  test('a group of two or more pairs is drawn as before, in its colour, beside the wedge and the single pair', () => {
    const plain = cameraOverlayElements(resolvePixelObservations(read).sceneSun!, read.image!);
    expect(plain.svg).not.toContain('shadow-wedge');
    expect(plain.svg).not.toContain('single-pair');
    // the lamp posts, first group in both: untouched by the wedge and by figure-1 leaving the figures
    const first = (text: string): string => /<g class="light-group">[\s\S]*?<\/g>/.exec(text)?.[0] ?? '';
    expect(first(svg)).toContain(GROUP_COLOURS[0]);
    expect(first(svg)).toBe(first(plain.svg));
    expect(s.groups.map((g) => g.group)).toEqual(['lamp-posts', 'figures']);
  });

  test('a mirrored print: the wedge is drawn where it was clicked', () => {
    const pic = picture();
    const plain = sceneOfPicture(pic, createRandom(2), 0, 1, BASE);
    const pair = plain.observations[0];
    if (pair.kind !== 'object-shadow') throw new Error('a pair');
    const withWedge = { ...plain, observations: [...plain.observations, wedgeAround('w', pair.objectPx, pair.shadowPx, 15)] };
    const w = plain.image!.widthPx;
    const flip = (p: readonly [number, number]): [number, number] => [w - p[0], p[1]];
    const mirrored: Scene = {
      ...withWedge,
      image: { ...plain.image!, mirrored: true },
      camera: { ...plain.camera!, verticalLines: plain.camera!.verticalLines.map((l) => l.map(flip)), wallLines: plain.camera!.wallLines.map((x) => ({ ...x, lines: x.lines.map((l) => l.map(flip)) })) },
      observations: withWedge.observations.map((o) =>
        o.kind === 'object-shadow' ? { ...o, objectPx: flip(o.objectPx), shadowPx: flip(o.shadowPx) }
          : o.kind === 'shadow-wedge' ? { ...o, shadowPx: flip(o.shadowPx), edgesPx: [flip(o.edgesPx[0]), flip(o.edgesPx[1])] as const } : o),
    };
    const wedgeLines = (sc: Scene): number[][] => {
      const svg = cameraOverlayElements(resolvePixelObservations(sc).sceneSun!, sc.image!).svg;
      return linesOf(/<g class="shadow-wedge" data-id="w">([\s\S]*?)<\/g>/.exec(svg)![1]);
    };
    const a = wedgeLines(withWedge);
    const b = wedgeLines(mirrored);
    expect(b).toHaveLength(4);
    b.forEach((l, i) => {
      expect(Math.abs(l[0] - (w - a[i][0]))).toBeLessThan(0.11);
      expect(Math.abs(l[1] - a[i][1])).toBeLessThan(0.11);
    });
  });
});
