/**
 * SVG elements drawing the picture's perspective and the groups' light, in the picture's own
 * pixel frame (mirrored prints drawn as they are): each clicked camera line and its extension
 * towards its family's vanishing point (dotted); each object-shadow line extended through its
 * shadow point towards the point where the group's shadow lines meet (the image of the sun, or of
 * the point opposite it), that point marked with its 95% error ellipse (Delta chi-square 5.991
 * for 2 degrees of freedom, NIST/SEMATECH chi-square table), one colour per group.
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
      out.push(line(pic(o), pic(sh), `stroke="${colour}" stroke-width="3"`));
      out.push(line(pic(sh), pic(vp ?? extend(o, sh, image)), `stroke="${colour}" stroke-width="1.2" stroke-dasharray="10 6"`));
      out.push(`<circle cx="${r1(pic(o)[0])}" cy="${r1(pic(o)[1])}" r="5" fill="${colour}"/>`);
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
  return { svg: out.join('\n'), key };
}
