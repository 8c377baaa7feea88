/**
 * The clicked points and lines as a W3C Web Annotation document. Checked against the Web Annotation Data
 * Model (W3C Recommendation 23 February 2017): sec. 3.1 (an Annotation MUST have an id, a type "Annotation"
 * and one or more targets; the document MUST have the @context http://www.w3.org/ns/anno.jsonld),
 * sec. 3.2.4 (TextualBody with value), sec. 4.1 (SpecificResource with source and selector), sec. 4.2.1
 * (FragmentSelector with conformsTo), sec. 4.2.8 (SvgSelector), sec. 5.1-5.2 (AnnotationCollection and
 * AnnotationPage: id, type, items); and against Media Fragments URI 1.0 (W3C Recommendation 2012,
 * sec. 4.2.2): xywh=pixel:x,y,w,h with whole numbers. The round trip reads the coordinates back from the
 * document alone (its own small parser here) and finds every clicked point of the scene file.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync, existsSync, copyFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { annotationsText, sceneAnnotations, ANNOTATION_CONTEXT } from '../../src/report/annotations.js';
import { readSceneText } from '../../src/scene/readScene.js';
import type { PixelPoint, Scene } from '../../src/scene/types.js';
import { ROOT, runCli } from '../helpers/runCli.js';

const TANNERS = join(ROOT, 'examples', 'tanners-hall-photo', 'tanners-hall-photo.yaml');
const KORNPLATZ = join(ROOT, 'examples', 'kornplatz-figures', 'kornplatz-figures.yaml');

/** The Tanners' Hall example with an eave line and two point pairs added, at tenth-of-a-pixel clicks. */
const TANNERS_PLUS = readFileSync(TANNERS, 'utf8').replace('\nseed: 1890', `
  - { id: arcade-eave, kind: eave-shadow, wall: tanners-hall-west, pixels: { fromPx: [500.3, 870.7], alongPx: [1000, 872.1], toPx: [700.5, 930.9], heightM: 5, heightSigmaM: 0.05 } }
  - { id: bollard, kind: shadow-points, note: "the <b>bollard</b> & its shadow", pixels: { fromPx: [300.2, 950], toPx: [200, 930.4], heightM: 0.9, heightSigmaM: 0.02 } }
seed: 1890`);

/** Every pixel point the scene file holds, as clicked. */
function scenePoints(scene: Scene): PixelPoint[] {
  const out: PixelPoint[] = [];
  if (scene.groundPlane?.fromWalls) out.push(scene.groundPlane.fromWalls.cornerPx);
  else if (scene.groundPlane) out.push(...scene.groundPlane.pointsPx);
  for (const w of scene.walls) if (w.imagePlane) out.push(...w.imagePlane.pointsPx);
  if (scene.camera) {
    for (const l of scene.camera.verticalLines) out.push(...l);
    for (const e of scene.camera.wallLines) for (const l of e.lines) out.push(...l);
  }
  for (const o of scene.observations) {
    if (o.kind === 'object-shadow') out.push(o.objectPx, o.shadowPx);
    else if (o.kind === 'moon-direction') {
      if (o.pixels) out.push(o.pixels.centrePx);
    } else if ('pixels' in o && o.pixels) {
      out.push(o.pixels.fromPx, o.pixels.toPx);
      if ('alongPx' in o.pixels) out.push(o.pixels.alongPx);
      if ('objectPx' in o.pixels && o.pixels.objectPx) out.push(o.pixels.objectPx);
    }
  }
  return out;
}

/** The points a document holds, read back from its selectors alone. */
function documentPoints(doc: ReturnType<typeof sceneAnnotations>): PixelPoint[] {
  const out: PixelPoint[] = [];
  for (const item of doc.first.items) {
    for (const t of item.target) {
      const s = t.selector;
      if (s.type === 'FragmentSelector') {
        const m = /^xywh=pixel:(\d+),(\d+),1,1$/.exec(s.value)!;
        const c = /<circle cx="([\d.]+)" cy="([\d.]+)" r="0"\/>/.exec(s.refinedBy!.value)!;
        out.push([Number((Number(m[1]) + Number(c[1])).toFixed(3)), Number((Number(m[2]) + Number(c[2])).toFixed(3))]);
      } else {
        const m = /^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"><(polyline|polygon) points="([^"]+)"\/><\/svg>$/.exec(s.value)!;
        for (const pair of m[2].split(' ')) out.push(pair.split(',').map(Number) as unknown as PixelPoint);
      }
    }
  }
  return out;
}

const key = (p: PixelPoint): string => `${p[0]},${p[1]}`;

describe('the Web Annotation document of a scene', () => {
  const scenes = [
    { name: "Tanners' Hall with an eave line and point pairs", scene: readSceneText(TANNERS_PLUS, 'tanners.yaml'), picture: 'tanners-hall-photo.png' },
    { name: 'Kornplatz figures (camera lines and object-shadow pairs)', scene: readSceneText(readFileSync(KORNPLATZ, 'utf8'), 'kornplatz.yaml'), picture: 'kornplatz-figures.png' },
  ];
  for (const { name, scene, picture } of scenes) {
    test(`${name}: has the model's required fields (sec. 3.1, 4.1, 4.2, 5.1, 5.2)`, () => {
      const doc = sceneAnnotations(scene, picture);
      expect(doc['@context']).toBe('http://www.w3.org/ns/anno.jsonld');
      expect(ANNOTATION_CONTEXT).toBe('http://www.w3.org/ns/anno.jsonld');
      expect(doc.type).toBe('AnnotationCollection');
      expect(typeof doc.id).toBe('string');
      expect(doc.first.type).toBe('AnnotationPage');
      expect(doc.total).toBe(doc.first.items.length);
      expect(doc.first.items.length).toBeGreaterThan(3);
      const ids = doc.first.items.map((a) => a.id);
      expect(new Set(ids).size).toBe(ids.length);
      for (const a of doc.first.items) {
        expect(a.type).toBe('Annotation');
        expect(a.id).toMatch(/^#[A-Za-z0-9-]+$/);
        expect(a.body.length).toBeGreaterThanOrEqual(2);
        for (const b of a.body) {
          expect(b.type).toBe('TextualBody');
          expect(b.value.length).toBeGreaterThan(0);
        }
        expect(a.body.map((b) => b.purpose)).toContain('tagging');
        expect(a.target.length).toBeGreaterThan(0);
        for (const t of a.target) {
          expect(t.type).toBe('SpecificResource');
          expect(t.source).toBe(picture);
          if (t.selector.type === 'FragmentSelector') {
            expect(t.selector.conformsTo).toBe('http://www.w3.org/TR/media-frags/');
            expect(t.selector.value).toMatch(/^xywh=pixel:\d+,\d+,\d+,\d+$/); // Media Fragments 1.0 sec. 4.2.2: whole pixels
            expect(t.selector.refinedBy?.type).toBe('SvgSelector');
          } else {
            expect(t.selector.type).toBe('SvgSelector');
            expect(t.selector.value).toMatch(/^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"><(polyline|polygon|circle) [^<>]*\/><\/svg>$/);
          }
        }
      }
      // the text is JSON that parses back to the same document
      expect(JSON.parse(annotationsText(scene, picture))).toEqual(JSON.parse(JSON.stringify(doc)));
    });

    test(`${name}: every clicked point comes back from the document alone, to the tenth of a pixel`, () => {
      const doc = sceneAnnotations(scene, picture);
      const back = documentPoints(doc).map(key).sort();
      const clicked = scenePoints(scene).map(key).sort();
      expect(back).toEqual(clicked);
    });
  }

  test('a note with markup stays text in a TextualBody', () => {
    const doc = sceneAnnotations(scenes[0].scene, 'tanners-hall-photo.png');
    const bollard = doc.first.items.find((a) => a.body.some((b) => b.value.startsWith('bollard')))!;
    expect(bollard.body.find((b) => b.purpose === 'commenting')?.value).toBe('the <b>bollard</b> & its shadow');
    expect(bollard.body.find((b) => b.purpose === 'tagging')?.value).toBe('shadow-points');
  });
});

describe('heliochron measure --annotations', () => {
  test('writes the document the core builds, byte for byte, and refuses a wrong name with exit 2 writing nothing', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'heliochron-annotations-'));
    try {
      writeFileSync(join(dir, 'tanners.yaml'), TANNERS_PLUS);
      copyFileSync(join(ROOT, 'examples', 'tanners-hall-photo', 'tanners-hall-photo.png'), join(dir, 'tanners-hall-photo.png'));
      const ok = await runCli(['measure', join(dir, 'tanners.yaml'), '--annotations', join(dir, 'marks.jsonld')]);
      expect(ok.code, ok.err).toBe(0);
      expect(ok.out).toContain('Annotations (W3C Web Annotation, JSON-LD) of 7 clicked items written to');
      expect(readFileSync(join(dir, 'marks.jsonld'), 'utf8')).toBe(annotationsText(readSceneText(TANNERS_PLUS, 'tanners.yaml'), 'tanners-hall-photo.png'));
      const bad = await runCli(['measure', join(dir, 'tanners.yaml'), '--annotations', join(dir, 'marks.txt')]);
      expect(bad.code).toBe(2);
      expect(bad.err).toMatch(/--annotations: ".*marks\.txt" is not allowed; expected a file name ending \.jsonld or \.json/);
      expect(existsSync(join(dir, 'marks.txt'))).toBe(false);
      const again = await runCli(['measure', join(dir, 'tanners.yaml'), '--annotations', join(dir, 'marks.jsonld')]);
      expect(again.code).toBe(2);
      expect(again.err).toContain('exists already');
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
