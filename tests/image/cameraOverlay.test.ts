/**
 * The overlay of the picture's perspective and light: every clicked line drawn and extended to its
 * vanishing point, every object-shadow line extended to where its group's lines meet, that point with
 * its 95% ellipse (Delta chi-square 5.991, NIST/SEMATECH chi-square table); mirrored prints drawn as
 * they are (x flipped back, docs/conventions.md).
 */
import { describe, expect, test } from 'vitest';
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
