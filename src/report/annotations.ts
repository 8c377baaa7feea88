/**
 * The points and lines clicked on the picture as a W3C Web Annotation document (JSON-LD), the open
 * standard for sharing marks on images: Web Annotation Data Model, W3C Recommendation 23 February 2017
 * (https://www.w3.org/TR/annotation-model/), sec. 5.1 (AnnotationCollection with an embedded first
 * AnnotationPage), sec. 3.1 (Annotation: @context, id, type, body, target), sec. 3.2.4 (TextualBody),
 * sec. 4.1 (SpecificResource: source and selector), sec. 4.2.1 (FragmentSelector), sec. 4.2.8 (SvgSelector)
 * and sec. 4.2.9 (refinedBy).
 *
 * - A single point (a figure's corner, a shadow point, a caster) is the picture's pixel that holds it, a
 *   FragmentSelector conforming to Media Fragments URI 1.0 (W3C Recommendation 2012, sec. 4.2.2) `xywh=pixel:x,y,1,1`,
 *   whose numbers are whole pixels; the clicked position to a tenth of a pixel is kept by a refining SvgSelector,
 *   a circle of radius 0 in that pixel's own coordinates (sec. 4.2.9: the refinement applies to the selected part).
 * - A line (a shadow from its root to its end, an edge of the camera's lines) is an SvgSelector with one
 *   `<polyline>`; a rectangle of known size or proportion is one `<polygon>`, in picture pixels.
 * - Each annotation's body is two TextualBodies: the item's label (purpose identifying) and its kind (purpose
 *   tagging), with the scholar's note as a third (purpose commenting).
 * Coordinates are the picture's own pixels as clicked (x right, y down from the top-left corner, before a
 * mirror flip: docs/conventions.md). The @context is the model's IRI as a string: nothing is fetched.
 * Ids are relative IRIs into the document itself (`#walls-0-imagePlane`), the picture its file name
 * relative to the scene file. Leaves out: the derived values (those are in `heliochron measure --json`).
 */
import type { PixelPoint, Scene } from '../scene/types.js';

/** The JSON-LD context of the Web Annotation Data Model (sec. 3.1), never fetched. */
export const ANNOTATION_CONTEXT = 'http://www.w3.org/ns/anno.jsonld';

export interface FragmentSelector {
  readonly type: 'FragmentSelector';
  readonly conformsTo: 'http://www.w3.org/TR/media-frags/';
  readonly value: string;
  readonly refinedBy?: SvgSelector;
}

export interface SvgSelector {
  readonly type: 'SvgSelector';
  readonly value: string;
}

export interface AnnotationTarget {
  readonly type: 'SpecificResource';
  readonly source: string;
  readonly selector: FragmentSelector | SvgSelector;
}

export interface TextualBody {
  readonly type: 'TextualBody';
  readonly value: string;
  readonly format: 'text/plain';
  readonly purpose: 'identifying' | 'tagging' | 'commenting';
}

export interface Annotation {
  readonly id: string;
  readonly type: 'Annotation';
  readonly motivation: 'describing';
  readonly body: readonly TextualBody[];
  readonly target: readonly AnnotationTarget[];
}

export interface AnnotationCollection {
  readonly '@context': typeof ANNOTATION_CONTEXT;
  readonly id: string;
  readonly type: 'AnnotationCollection';
  readonly label: string;
  readonly total: number;
  readonly first: {
    readonly id: string;
    readonly type: 'AnnotationPage';
    readonly startIndex: 0;
    readonly items: readonly Annotation[];
  };
}

/** A number as written into SVG: at most 3 decimals, no trailing zeros, no -0. */
function num(v: number): string {
  const r = Math.round(v * 1000) / 1000;
  return String(Object.is(r, -0) ? 0 : r);
}

function pointTarget(source: string, p: PixelPoint): AnnotationTarget {
  const x = Math.floor(p[0]);
  const y = Math.floor(p[1]);
  return {
    type: 'SpecificResource', source,
    selector: {
      type: 'FragmentSelector', conformsTo: 'http://www.w3.org/TR/media-frags/', value: `xywh=pixel:${x},${y},1,1`,
      refinedBy: { type: 'SvgSelector', value: `<svg xmlns="http://www.w3.org/2000/svg"><circle cx="${num(p[0] - x)}" cy="${num(p[1] - y)}" r="0"/></svg>` },
    },
  };
}

function shapeTarget(source: string, shape: 'polyline' | 'polygon', points: readonly PixelPoint[]): AnnotationTarget {
  const list = points.map((p) => `${num(p[0])},${num(p[1])}`).join(' ');
  return { type: 'SpecificResource', source, selector: { type: 'SvgSelector', value: `<svg xmlns="http://www.w3.org/2000/svg"><${shape} points="${list}"/></svg>` } };
}

function annotation(id: string, label: string, kind: string, note: string | undefined, target: readonly AnnotationTarget[]): Annotation {
  const body: TextualBody[] = [
    { type: 'TextualBody', value: label, format: 'text/plain', purpose: 'identifying' },
    { type: 'TextualBody', value: kind, format: 'text/plain', purpose: 'tagging' },
  ];
  if (note !== undefined) body.push({ type: 'TextualBody', value: note, format: 'text/plain', purpose: 'commenting' });
  return { id, type: 'Annotation', motivation: 'describing', body, target };
}

/** A figure: one polygon for a clicked rectangle, else one point target per clicked point. */
function figureTargets(source: string, plane: { readonly pointsPx: readonly PixelPoint[]; readonly planePointsM?: unknown }): AnnotationTarget[] {
  if (plane.pointsPx.length === 4 && plane.planePointsM === undefined) return [shapeTarget(source, 'polygon', plane.pointsPx)];
  return plane.pointsPx.map((p) => pointTarget(source, p));
}

/**
 * The clicked points and lines of a scene as one Web Annotation collection.
 * @param pictureFile the picture's file name as the scene gives it (image.file), the annotations' source
 * @example sceneAnnotations(scene, 'hall.png').first.items[0].target[0].selector.type // 'SvgSelector'
 */
export function sceneAnnotations(scene: Scene, pictureFile: string): AnnotationCollection {
  const items: Annotation[] = [];
  const src = pictureFile;
  if (scene.groundPlane) {
    const g = scene.groundPlane;
    if (g.fromWalls) {
      items.push(annotation('#groundPlane', 'the ground: where the two walls meet it', 'ground from two walls', undefined, [pointTarget(src, g.fromWalls.cornerPx)]));
    } else {
      items.push(annotation('#groundPlane', 'the ground: figure of known shape', 'ground figure', undefined, figureTargets(src, g)));
    }
  }
  scene.walls.forEach((w, i) => {
    if (w.imagePlane) items.push(annotation(`#walls-${i}-imagePlane`, `wall ${w.id}: figure of known shape`, 'wall figure', w.note, figureTargets(src, w.imagePlane)));
  });
  if (scene.camera) {
    scene.camera.verticalLines.forEach((line, k) => items.push(annotation(`#camera-verticalLines-${k}`, `vertical edge ${k + 1}`, 'vertical edge', undefined, [shapeTarget(src, 'polyline', line)])));
    scene.camera.wallLines.forEach((entry, i) => entry.lines.forEach((line, k) => {
      items.push(annotation(`#camera-wallLines-${i}-lines-${k}`, `horizontal edge ${k + 1} on wall ${entry.wallId}`, 'wall course', undefined, [shapeTarget(src, 'polyline', line)]));
    }));
  }
  scene.observations.forEach((o, k) => {
    const id = `#observations-${k}`;
    if (o.kind === 'object-shadow') {
      items.push(annotation(id, `${o.id}: object point to its shadow`, o.kind, o.note, [shapeTarget(src, 'polyline', [o.objectPx, o.shadowPx])]));
      return;
    }
    if (o.kind === 'moon-direction') {
      if (o.pixels !== undefined) items.push(annotation(id, `${o.id}: the middle of the moon's disc`, o.kind, o.note, [pointTarget(src, o.pixels.centrePx)]));
      return;
    }
    if (!('pixels' in o) || o.pixels === undefined) return;
    const px = o.pixels;
    const segment = shapeTarget(src, 'polyline', [px.fromPx, px.toPx]);
    if (o.kind === 'eave-shadow') {
      items.push(annotation(id, `${o.id}: foot line of wall ${o.wallId} and a point of its eave's shadow line`, o.kind, o.note,
        [shapeTarget(src, 'polyline', [o.pixels!.fromPx, o.pixels!.alongPx]), pointTarget(src, o.pixels!.toPx)]));
    } else if (o.kind === 'shadow-points') {
      const caster = o.pixels!.objectPx;
      items.push(annotation(id, `${o.id}: caster's foot to its shadow${caster ? ', and the caster' : ''}`, o.kind, o.note, caster ? [segment, pointTarget(src, caster)] : [segment]));
    } else {
      const words = o.kind === 'pole-shadow' ? 'foot to shadow tip' : o.kind === 'rod-shadow' ? 'root to a point along its shadow' : "the edge's root line to its shadow line";
      items.push(annotation(id, `${o.id}: ${words}`, o.kind, o.note, [segment]));
    }
  });
  return {
    '@context': ANNOTATION_CONTEXT,
    id: '#collection',
    type: 'AnnotationCollection',
    label: `${scene.title}: points and lines clicked on ${pictureFile} for heliochron`,
    total: items.length,
    first: { id: '#page-1', type: 'AnnotationPage', startIndex: 0, items },
  };
}

/** The collection written out: JSON, two spaces, one final newline (the same bytes from the desk and the command line). */
export function annotationsText(scene: Scene, pictureFile: string): string {
  return `${JSON.stringify(sceneAnnotations(scene, pictureFile), null, 2)}\n`;
}
