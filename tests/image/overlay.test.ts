/**
 * The SVG overlay: stable rounded numbers, well-formed XML (W3C XML 1.0
 * sec. 2.1: one root element, every start tag closed in order), the expected
 * elements, and points drawn in the picture's own frame for mirrored prints.
 */
import { describe, expect, test } from 'vitest';
import { rectifyPlane } from '../../src/image/planeInImage.js';
import { renderOverlaySvg, OVERLAY_COLOURS } from '../../src/image/overlay.js';
import type { ImageInfo, PlaneInImage } from '../../src/scene/types.js';

/** Minimal well-formedness check: tags balanced and nested, attributes quoted, a single root. */
function checkWellFormed(xml: string): string[] {
  const stack: string[] = [];
  const roots: string[] = [];
  const tag = /<(\/?)([A-Za-z][\w:.-]*)((?:\s+[\w:.-]+="[^"<]*")*)\s*(\/?)>/g;
  let last = 0;
  let m: RegExpExecArray | null;
  while ((m = tag.exec(xml)) !== null) {
    const between = xml.slice(last, m.index);
    expect(between.includes('<'), `stray "<" before ${m[0].slice(0, 40)}`).toBe(false);
    last = tag.lastIndex;
    const [, closing, name, , selfClosing] = m;
    if (stack.length === 0 && !closing) roots.push(name);
    if (closing) expect(stack.pop(), `closing </${name}>`).toBe(name);
    else if (!selfClosing) stack.push(name);
  }
  expect(xml.slice(last).includes('<')).toBe(false);
  expect(stack).toEqual([]);
  expect(roots).toEqual(['svg']);
  return roots;
}

const IMAGE: ImageInfo = { widthPx: 800, heightPx: 600, mirrored: false, pixelSigmaPx: 1 };
// frontal wall, 100 px per metre: (u, v) -> (100 + 100 u, 500 - 100 v), a 3 m x 2 m rectangle
const WALL: PlaneInImage = { pointsPx: [[100, 300], [400, 300], [400, 500], [100, 500]], widthM: 3, heightM: 2 };

describe('overlay SVG', () => {
  const plane = rectifyPlane(WALL, IMAGE, 'wall', 'walls[0].imagePlane');
  const svg = renderOverlaySvg({
    image: IMAGE,
    planes: [{ label: "Tanners' Hall", plane, shadows: [{ label: 'rod', fromPx: [250.04, 350.06], toPx: [200, 400], predictedDirection: [-1, -2] }] }],
    picture: { bytes: new Uint8Array([0x89, 0x50, 0x4e, 0x47]), mimeType: 'image/png' },
  });

  test('is well-formed XML with the picture frame as viewBox', () => {
    checkWellFormed(svg);
    expect(svg).toContain('viewBox="0 0 800 600"');
  });

  test('draws a metre grid: 4 lines of constant u and 3 of constant v over a 3 m x 2 m rectangle', () => {
    const grid = svg.match(/<g class="grid">(.*?)<\/g>/)![1];
    expect(grid.match(/<line /g)!.length).toBe(7);
    expect(grid).toContain('<line x1="200" y1="500" x2="200" y2="300"'); // u = 1 m, by hand from the frontal map
    expect(grid).toContain(`stroke="${OVERLAY_COLOURS.grid}"`);
  });

  test('labels the four corners, draws the measured shadow solid and the predicted one dashed from the root', () => {
    expect(svg.match(/<circle /g)!.length).toBe(5); // 4 corners + the shadow root
    expect(svg).toContain('Tanners&#39; Hall 1'); // the apostrophe escaped as in every chart (src/charts/svg.ts)
    expect(svg).toContain('<line x1="250" y1="350.1" x2="200" y2="400"'); // rounded to 0.1 px
    // predicted: length of the measured shadow (sqrt(0.5^2 + 0.5^2) m) along (-1, -2) from the root, mapped back (by hand)
    const len = Math.SQRT1_2;
    const endX = Math.round((250.04 - (100 * len) / Math.sqrt(5)) * 10) / 10;
    const endY = Math.round((350.06 + (200 * len) / Math.sqrt(5)) * 10) / 10;
    expect(svg).toContain(`x2="${endX}" y2="${endY}" stroke="${OVERLAY_COLOURS.predicted}" stroke-width="2" stroke-dasharray="8 5"`);
  });

  test('embeds the picture as a base64 data URI underneath', () => {
    expect(svg).toContain('href="data:image/png;base64,iVBORw=="');
    expect(svg.indexOf('<image')).toBeLessThan(svg.indexOf('<g class="plane"'));
  });

  test('a mirrored print is drawn in its own (unflipped) pixels', () => {
    const mirroredImage = { ...IMAGE, mirrored: true };
    const flipped = { ...WALL, pointsPx: WALL.pointsPx.map(([x, y]) => [800 - x, y] as const) };
    const out = renderOverlaySvg({ image: mirroredImage, planes: [{ label: 'w', plane: rectifyPlane(flipped, mirroredImage, 'wall', 'w') }] });
    checkWellFormed(out);
    expect(out).toContain('<circle cx="700" cy="300"'); // first corner, as clicked on the reversed print
  });

  test('an aspect-only wall gets a grid every tenth of the rectangle: 11 lines each way', () => {
    const aspectPlane = rectifyPlane({ pointsPx: WALL.pointsPx, aspect: 1.5 }, IMAGE, 'wall', 'w');
    const out = renderOverlaySvg({ image: IMAGE, planes: [{ label: 'w', plane: aspectPlane }] });
    const grid = out.match(/<g class="grid">(.*?)<\/g>/)![1];
    expect(grid.match(/<line /g)!.length).toBe(22);
    expect(grid).toContain('<line x1="130" y1="500" x2="130" y2="300"'); // u = 0.15 of 1.5 -> one tenth of 300 px
  });
});
