/**
 * SVG elements drawing the picture's perspective and the groups' light, in the picture's own
 * pixel frame (mirrored prints drawn as they are): each clicked camera line and its extension
 * towards its family's vanishing point (dotted); each object-shadow line extended through its
 * shadow point towards the point where the group's shadow lines meet (the image of the sun, or of
 * the point opposite it), that point marked with its 95% error ellipse (Delta chi-square 5.991
 * for 2 degrees of freedom, NIST/SEMATECH chi-square table), one colour per group. A group of a
 * single pair has no meeting point: its object-shadow line is drawn extended the same way, across
 * the picture. A shadow wedge is drawn as the two lines from its shadow point through its edge
 * points, extended across the picture, lightly filled between them (the object point lies in that
 * angle) and labelled with its id; it takes the colour of its group's pairs when they have one.
 *
 * Colours (the Okabe-Ito set, Okabe and Ito 2008, Fig. 16): vanishing lines bluish green
 * #009E73; groups blue #0072B2, vermillion #D55E00, reddish purple #CC79A7, orange #E69F00, sky
 * blue #56B4E9, in group order. Coordinates rounded to 0.1 px; plain strings, no DOM.
 */
import type { ImageInfo } from '../scene/types.js';
import type { Point2 } from './homography.js';
import { toPictureFrame } from './planeInImage.js';
import type { SceneSun } from './sceneSun.js';
import { symmetricEigen } from '../math/symmetricEigen.js';
import { escapeXml } from './overlay.js';

export const PERSPECTIVE_COLOUR = '#009E73';
export const GROUP_COLOURS = ['#0072B2', '#D55E00', '#CC79A7', '#E69F00', '#56B4E9'] as const;
/** Delta chi-square of the 95% ellipse for 2 degrees of freedom, -2 ln(0.05). */
const ELLIPSE_95 = 5.991464547107979;

const r1 = (v: number): string => {
  const r = Math.round(v * 10) / 10;
  return (Object.is(r, -0) ? 0 : r).toString();
};

/** A key line for the overlay's legend. */
export interface OverlayKeyLine {
  readonly text: string;
  readonly colour: string;
  readonly dash: string;
}

/** Far end of a ray from a through b, long enough to leave the picture (or reach `to` when given). */
function extend(a: Point2, b: Point2, image: ImageInfo): Point2 {
  const d = Math.hypot(b[0] - a[0], b[1] - a[1]);
  const k = (2 * Math.hypot(image.widthPx, image.heightPx)) / Math.max(d, 1e-9);
  return [a[0] + (b[0] - a[0]) * k, a[1] + (b[1] - a[1]) * k];
}

function line(a: Point2, b: Point2, attrs: string): string {
  return `<line x1="${r1(a[0])}" y1="${r1(a[1])}" x2="${r1(b[0])}" y2="${r1(b[1])}" ${attrs}/>`;
}

/** Id of the clip path of the picture's area, written once before the first wedge. */
const PICTURE_CLIP = 'heliochron-picture-area';

/** A group's name in the key: `group "x"`, or the pairs without one. */
const groupWords = (group: string, none: string): string => (group ? `group "${group}"` : none);

/** An object-shadow pair in picture pixels: object to shadow, dashed on from the shadow to `end`, the object point marked. */
function pairElements(objectPx: Point2, shadowPx: Point2, end: Point2, colour: string): string[] {
  return [
    line(objectPx, shadowPx, `stroke="${colour}" stroke-width="3"`),
    line(shadowPx, end, `stroke="${colour}" stroke-width="1.2" stroke-dasharray="10 6"`),
    `<circle cx="${r1(objectPx[0])}" cy="${r1(objectPx[1])}" r="5" fill="${colour}"/>`,
  ];
}

/**
 * A shadow wedge in picture pixels: the clicked lines from the shadow point to each edge point, their
 * extensions across the picture, the light fill between them and the label. Points as clicked.
 */
function wedgeElements(id: string, shadowPx: Point2, edgesPx: readonly [Point2, Point2], colour: string, image: ImageInfo): string[] {
  const far = edgesPx.map((e) => extend(shadowPx, e, image));
  const out = [
    // the fill kept to the picture (the desk shows the overlay unclipped, for vanishing points outside it)
    `<path d="M${r1(shadowPx[0])} ${r1(shadowPx[1])} L${r1(far[0][0])} ${r1(far[0][1])} L${r1(far[1][0])} ${r1(far[1][1])} Z" fill="${colour}" fill-opacity="0.15" stroke="none" clip-path="url(#${PICTURE_CLIP})"/>`,
  ];
  edgesPx.forEach((e, k) => {
    out.push(line(shadowPx, e, `stroke="${colour}" stroke-width="2.5"`));
    out.push(line(e, far[k], `stroke="${colour}" stroke-width="1.2" stroke-dasharray="10 6"`));
  });
  out.push(`<circle cx="${r1(shadowPx[0])}" cy="${r1(shadowPx[1])}" r="5" fill="${colour}"/>`);
  out.push(
    `<text x="${r1(shadowPx[0] + 8)}" y="${r1(shadowPx[1] + 18)}" font-family="sans-serif" font-size="14" fill="${colour}" ` +
      `stroke="#ffffff" stroke-width="3" paint-order="stroke">${escapeXml(id)}</text>`,
  );
  return out;
}

/** The 95% ellipse of a point with covariance (px^2), as an SVG ellipse element. */
function ellipse(centre: Point2, cov: readonly (readonly number[])[], attrs: string): string {
  const eig = symmetricEigen(cov);
  const [minor, major] = eig.values.map((v) => Math.sqrt(Math.max(0, v) * ELLIPSE_95));
  const v = eig.vectors[1];
  const angle = (Math.atan2(v[1], v[0]) * 180) / Math.PI;
  return `<ellipse cx="${r1(centre[0])}" cy="${r1(centre[1])}" rx="${r1(major)}" ry="${r1(minor)}" transform="rotate(${r1(angle)} ${r1(centre[0])} ${r1(centre[1])})" ${attrs}/>`;
}

/**
 * The perspective and light elements of the overlay, with their key lines.
 * Points of the camera and the pairs are in the working frame; they are flipped back for a mirrored print.
 */
export function cameraOverlayElements(s: SceneSun, image: ImageInfo): { svg: string; key: OverlayKeyLine[] } {
  const out: string[] = ['<g class="perspective">'];
  const pic = (p: Point2): Point2 => toPictureFrame(p, image);
  const c = s.camera;
  c.input.families.forEach((fam, k) => {
    const vp = c.vanishingPoints[k].pointPx;
    for (const l of fam.lines) {
      const a = l.pointsPx[0];
      const b = l.pointsPx[l.pointsPx.length - 1];
      out.push(line(pic(a), pic(b), `stroke="${PERSPECTIVE_COLOUR}" stroke-width="2.5"`));
      // towards the vanishing point from the nearer end, or across the picture when it is at infinity
      const near = vp && Math.hypot(a[0] - vp[0], a[1] - vp[1]) < Math.hypot(b[0] - vp[0], b[1] - vp[1]) ? a : b;
      const far = near === a ? b : a;
      const end = vp ?? extend(far, near, image);
      out.push(line(pic(near), pic(end), `stroke="${PERSPECTIVE_COLOUR}" stroke-width="1.2" stroke-dasharray="2 6"`));
    }
  });
  out.push('</g>');
  const key: OverlayKeyLine[] = [{ text: 'green: lines along vertical edges and walls, dotted towards their vanishing points (camera)', colour: PERSPECTIVE_COLOUR, dash: ' stroke-dasharray="2 6"' }];
  s.groups.forEach((g, k) => {
    const colour = GROUP_COLOURS[k % GROUP_COLOURS.length];
    out.push(`<g class="light-group">`);
    const vp = g.sun.vanishingPointPx;
    for (const field of g.fields) {
      const pair = s.pairsByField.get(field);
      if (!pair) continue;
      const [o, sh] = pair;
      out.push(...pairElements(pic(o), pic(sh), pic(vp ?? extend(o, sh, image)), colour));
    }
    if (vp) {
      out.push(`<circle cx="${r1(pic(vp)[0])}" cy="${r1(pic(vp)[1])}" r="6" fill="none" stroke="${colour}" stroke-width="2.5"/>`);
      if (g.sun.vanishingPointCovariancePx) {
        const cov = g.sun.vanishingPointCovariancePx;
        const flipped = image.mirrored ? [[cov[0][0], -cov[0][1]], [-cov[1][0], cov[1][1]]] : cov;
        out.push(ellipse(pic(vp), flipped, `fill="none" stroke="${colour}" stroke-width="2"`));
      }
    }
    out.push('</g>');
    key.push({
      text: `${g.group ? `group "${g.group}"` : 'pairs without a group'}: object to shadow, dashed on to where the shadow lines meet (the ${g.sun.vanishingPointIsSun ? 'sun' : 'point opposite the sun'}), with its 95% ellipse`,
      colour, dash: ' stroke-dasharray="10 6"',
    });
  });
  // groups of one pair and shadow wedges: a wedge takes the colour of its group's pairs, other groups the next colours
  const colours = new Map(s.groups.map((g, k) => [g.group, GROUP_COLOURS[k % GROUP_COLOURS.length]] as const));
  const colourOf = (group: string): string => {
    if (!colours.has(group)) colours.set(group, GROUP_COLOURS[colours.size % GROUP_COLOURS.length]);
    return colours.get(group)!;
  };
  for (const single of s.singlePairs) {
    const pair = s.pairsByField.get(single.field);
    if (!pair) continue;
    const colour = colourOf(single.group);
    const [o, sh] = pair;
    out.push(`<g class="single-pair" data-id="${escapeXml(single.id)}">`, ...pairElements(pic(o), pic(sh), pic(extend(o, sh, image)), colour), '</g>');
    key.push({
      text: `${groupWords(single.group, 'a pair without a group')}, one pair (${single.id}): object to shadow, dashed on across the picture (one pair meets no other)`,
      colour, dash: ' stroke-dasharray="10 6"',
    });
  }
  const wedgesByColour = new Map<string, string[]>();
  for (const o of s.observations) {
    if (o.kind !== 'shadow-wedge') continue;
    if (wedgesByColour.size === 0) out.push(`<clipPath id="${PICTURE_CLIP}"><rect x="0" y="0" width="${r1(image.widthPx)}" height="${r1(image.heightPx)}"/></clipPath>`);
    const colour = colourOf(o.group ?? '');
    out.push(`<g class="shadow-wedge" data-id="${escapeXml(o.id)}">`);
    out.push(...wedgeElements(o.id, o.shadowPx, o.edgesPx, colour, image));
    out.push('</g>');
    wedgesByColour.set(colour, [...(wedgesByColour.get(colour) ?? []), o.id]);
  }
  for (const [colour, ids] of wedgesByColour) {
    key.push({
      text: `shadow wedge${ids.length > 1 ? 's' : ''} ${ids.join(', ')}: from the shadow point through the sides of the wedge that holds the casting point (shaded)`,
      colour, dash: '',
    });
  }
  return { svg: out.join('\n'), key };
}
