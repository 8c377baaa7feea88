/**
 * Labels that never overprint: each label is tried at a ring of places around its mark, nearest
 * first, and takes the first place inside the plot that meets no label already placed and no
 * obstacle (the marks themselves, other texts). A label set away from its mark gets a thin leader
 * line. When no place is free even at the largest ring, the label goes into a list beside the
 * chart instead (`unplaced`), so that two labels are never drawn over each other.
 *
 * The width of a text is estimated from its length (no font metrics in a pure function): 0.67 em
 * per character, above the advance widths of the characters these labels use (digits, "F", "h")
 * in the charts' sans-serif stack, bold included (Arial Bold: digits 0.556 em, F and h 0.611 em;
 * from memory), so that a label never takes more room than the box reserved for it. Wide capitals
 * (M, W) are not covered: the labels placed here are "F1", "F2", ... and ranks.
 */
import { INK } from './palette.js';
import { el, text } from './svg.js';

/** A box in drawing coordinates (y down). */
export interface Box {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

export interface LabelRequest {
  /** The point the label names (a mark's centre). */
  readonly anchor: readonly [number, number];
  readonly text: string;
  readonly fontSize: number;
  /** Radius of the mark at the anchor: the label keeps clear of it. */
  readonly markRadius?: number;
}

export interface PlacedLabel {
  readonly text: string;
  /** Start of the text's baseline (text-anchor start). */
  readonly x: number;
  readonly y: number;
  /** The box the label occupies. */
  readonly box: Box;
  /** From the mark's edge to the label, when the label is set away from its mark. */
  readonly leader?: readonly [number, number, number, number];
}

export interface LabelPlacement {
  readonly placed: readonly PlacedLabel[];
  /** Labels for which no free place was found: to be listed beside the chart. */
  readonly unplaced: readonly LabelRequest[];
}

/** Width of one character, in em, assumed for every character (an upper bound, see the header). */
const EM_PER_CHARACTER = 0.67;
/** Distances from the mark's edge tried, in drawing units, nearest first. */
const RINGS = [4, 8, 14, 22, 32, 44, 58, 74, 92];
/** Directions tried on each ring, degrees counter-clockwise from "right", upper right first. */
const DIRECTIONS = [45, 315, 135, 225, 0, 180, 90, 270, 22.5, 337.5, 157.5, 202.5, 67.5, 112.5, 247.5, 292.5];
/** Clear space kept around every label, drawing units. */
const GAP = 1.5;
/** A leader line is drawn when the label is set farther than this from its mark. */
const LEADER_FROM = 9;

/**
 * Estimated width of a text in drawing units.
 * @example textWidth('F1', 10) // 13.4
 */
export function textWidth(text: string, fontSize: number): number {
  return text.length * EM_PER_CHARACTER * fontSize;
}

/** Whether two boxes overlap (touching edges do not), each grown by `gap`. */
export function boxesOverlap(a: Box, b: Box, gap = 0): boolean {
  return a.x - gap < b.x + b.width && b.x - gap < a.x + a.width && a.y - gap < b.y + b.height && b.y - gap < a.y + a.height;
}

function inside(box: Box, bounds: Box): boolean {
  return box.x >= bounds.x && box.y >= bounds.y && box.x + box.width <= bounds.x + bounds.width && box.y + box.height <= bounds.y + bounds.height;
}

/** The nearest point of a box to p. */
function nearestPoint(box: Box, p: readonly [number, number]): [number, number] {
  return [Math.min(Math.max(p[0], box.x), box.x + box.width), Math.min(Math.max(p[1], box.y), box.y + box.height)];
}

/**
 * A box of the given size whose side facing the anchor touches the point at `distance` from the
 * anchor in direction `deg` (0 = right, 90 = up).
 */
function boxAt(anchor: readonly [number, number], distance: number, deg: number, width: number, height: number): Box {
  const rad = (deg * Math.PI) / 180;
  const c = Math.cos(rad);
  const s = Math.sin(rad);
  const px = anchor[0] + distance * c;
  const py = anchor[1] - distance * s;
  // Shift the box so that the point lies on its side towards the anchor: a label to the right
  // starts at px, one to the left ends at px, above ends at py, below starts at py.
  const x = px - width * (0.5 - 0.5 * Math.sign(Math.round(c * 1e6)));
  const y = py - height * (0.5 + 0.5 * Math.sign(Math.round(s * 1e6)));
  return { x, y, width, height };
}

/** The label in a box, with a leader line from its mark when set away from it. */
function labelAt(r: LabelRequest, box: Box): PlacedLabel {
  const radius = r.markRadius ?? 0;
  const edge = nearestPoint(box, r.anchor);
  const far = Math.hypot(edge[0] - r.anchor[0], edge[1] - r.anchor[1]) > radius + LEADER_FROM;
  const rad = Math.atan2(edge[1] - r.anchor[1], edge[0] - r.anchor[0]);
  const from: [number, number] = [r.anchor[0] + radius * Math.cos(rad), r.anchor[1] + radius * Math.sin(rad)];
  return { text: r.text, x: box.x, y: box.y + 0.75 * r.fontSize, box, ...(far ? { leader: [from[0], from[1], edge[0], edge[1]] as const } : {}) };
}

/**
 * Places labels, in the order given (put the most important first), inside `bounds`, clear of
 * each other and of `obstacles`.
 * @example placeLabels([{ anchor: [50, 50], text: 'F1', fontSize: 10 }], [], { x: 0, y: 0, width: 100, height: 100 }).placed[0].x // 52.8 (up and to the right of the mark)
 */
export function placeLabels(requests: readonly LabelRequest[], obstacles: readonly Box[], bounds: Box): LabelPlacement {
  const placed: PlacedLabel[] = [];
  const unplaced: LabelRequest[] = [];
  const marks: Box[] = requests.map((r) => {
    const m = r.markRadius ?? 0;
    return { x: r.anchor[0] - m, y: r.anchor[1] - m, width: 2 * m, height: 2 * m };
  });
  for (const r of requests) {
    const width = textWidth(r.text, r.fontSize);
    // Cap height and descent of the sans-serif stack: about 0.75 em above the baseline, 0.2 below.
    const height = 0.95 * r.fontSize;
    const clearOf = (box: Box, avoidObstacles: boolean): boolean =>
      inside(box, bounds) &&
      !placed.some((p) => boxesOverlap(box, p.box, GAP)) &&
      !marks.some((m) => boxesOverlap(box, m, GAP)) &&
      !(avoidObstacles && obstacles.some((o) => boxesOverlap(box, o, GAP)));
    // First clear of everything; failing that, over an obstacle but still clear of every label and mark.
    let found: PlacedLabel | null = null;
    for (const avoidObstacles of [true, false]) {
      for (const ring of RINGS) {
        const distance = (r.markRadius ?? 0) + ring;
        for (const deg of DIRECTIONS) {
          const box = boxAt(r.anchor, distance, deg, width, height);
          if (!clearOf(box, avoidObstacles)) continue;
          found = labelAt(r, box);
          break;
        }
        if (found) break;
      }
      if (found) break;
    }
    if (found) placed.push(found);
    else unplaced.push(r);
  }
  return { placed, unplaced };
}

/** The placed labels as SVG: leader lines first, then the texts (class hc-mark-label, a paper-coloured halo behind each). */
export function placedLabelMarks(placed: readonly PlacedLabel[]): string[] {
  const out: string[] = [];
  for (const p of placed) {
    if (p.leader) out.push(el('line', { x1: p.leader[0], y1: p.leader[1], x2: p.leader[2], y2: p.leader[3], stroke: INK.muted, 'stroke-width': 0.8, class: 'hc-leader' }));
  }
  for (const p of placed) out.push(text(p.x, p.y, p.text, { class: 'hc-mark-label' }));
  return out;
}
