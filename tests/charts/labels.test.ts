import { describe, expect, it } from 'vitest';
import { boxesOverlap, placeLabels, textWidth, type Box, type LabelRequest } from '../../src/charts/labels.js';
import { createRandom } from '../../src/math/random.js';

const BOUNDS: Box = { x: 0, y: 0, width: 300, height: 200 };

function inside(b: Box, bounds: Box): boolean {
  return b.x >= bounds.x && b.y >= bounds.y && b.x + b.width <= bounds.x + bounds.width && b.y + b.height <= bounds.y + bounds.height;
}

describe('placeLabels', () => {
  it('sets a lone label just beside its mark, without a leader line', () => {
    const { placed, unplaced } = placeLabels([{ anchor: [150, 100], text: 'F1', fontSize: 10, markRadius: 4 }], [], BOUNDS);
    expect(unplaced).toEqual([]);
    expect(placed).toHaveLength(1);
    const p = placed[0];
    expect(p.leader).toBeUndefined();
    expect(p.box.width).toBeCloseTo(textWidth('F1', 10), 9);
    // up and to the right, clear of the mark of radius 4
    expect(p.box.x).toBeGreaterThan(150);
    expect(p.box.y + p.box.height).toBeLessThan(100);
    expect(boxesOverlap(p.box, { x: 146, y: 96, width: 8, height: 8 })).toBe(false);
  });

  it('gives four labels on one point four places that do not overlap (the four-family pile-up)', () => {
    const requests: LabelRequest[] = ['F1', 'F2', 'F3', 'F4'].map((text) => ({ anchor: [150, 100], text, fontSize: 10.5, markRadius: 4 }));
    const { placed, unplaced } = placeLabels(requests, [], BOUNDS);
    expect(unplaced).toEqual([]);
    expect(placed.map((p) => p.text)).toEqual(['F1', 'F2', 'F3', 'F4']);
    for (let i = 0; i < placed.length; i += 1) for (let j = i + 1; j < placed.length; j += 1) expect(boxesOverlap(placed[i].box, placed[j].box)).toBe(false);
  });

  it('keeps labels off an obstacle when there is room, with a leader line back to the mark', () => {
    const ellipse: Box = { x: 120, y: 60, width: 60, height: 80 }; // a 95% ellipse around the mark
    const { placed } = placeLabels([{ anchor: [150, 100], text: 'F1', fontSize: 10, markRadius: 4 }], [ellipse], BOUNDS);
    expect(boxesOverlap(placed[0].box, ellipse)).toBe(false);
    expect(placed[0].leader).toBeDefined();
    const [x1, y1] = placed[0].leader!;
    expect(Math.hypot(x1 - 150, y1 - 100)).toBeCloseTo(4, 6); // starts at the mark's edge
  });

  describe('edge cases', () => {
    it('lists a label it cannot place instead of overprinting: more labels than the plot holds', () => {
      const tiny: Box = { x: 0, y: 0, width: 40, height: 24 };
      const requests = Array.from({ length: 12 }, (_, k): LabelRequest => ({ anchor: [20, 12], text: `F${k + 1}`, fontSize: 10 }));
      const { placed, unplaced } = placeLabels(requests, [], tiny);
      expect(placed.length + unplaced.length).toBe(12);
      expect(unplaced.length).toBeGreaterThan(0);
      for (const p of placed) expect(inside(p.box, tiny)).toBe(true);
      for (let i = 0; i < placed.length; i += 1) for (let j = i + 1; j < placed.length; j += 1) expect(boxesOverlap(placed[i].box, placed[j].box)).toBe(false);
    });
    it('never overlaps and never leaves the plot, for random crowds of marks (seeded)', () => {
      const rng = createRandom(2026);
      for (let trial = 0; trial < 200; trial += 1) {
        const n = 1 + Math.floor(rng.uniform() * 9);
        const cx = 20 + rng.uniform() * 260;
        const cy = 20 + rng.uniform() * 160;
        const spread = rng.uniform() * 30;
        const requests = Array.from({ length: n }, (_, k): LabelRequest => ({
          anchor: [cx + (rng.uniform() - 0.5) * spread, cy + (rng.uniform() - 0.5) * spread],
          text: `F${k + 1}`,
          fontSize: 10.5,
          markRadius: 3.6,
        }));
        const { placed, unplaced } = placeLabels(requests, [], BOUNDS);
        expect(placed.length + unplaced.length).toBe(n);
        for (const p of placed) expect(inside(p.box, BOUNDS), `trial ${trial}`).toBe(true);
        for (let i = 0; i < placed.length; i += 1) {
          for (let j = i + 1; j < placed.length; j += 1) expect(boxesOverlap(placed[i].box, placed[j].box), `trial ${trial}`).toBe(false);
          for (const r of requests) {
            const m = r.markRadius!;
            expect(boxesOverlap(placed[i].box, { x: r.anchor[0] - m, y: r.anchor[1] - m, width: 2 * m, height: 2 * m }), `trial ${trial}: label on a mark`).toBe(false);
          }
        }
      }
    });
  });
});
