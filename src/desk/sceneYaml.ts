/**
 * The desk's document written out as a scene file: YAML in the structure of
 * docs/scene-file.md, with pairs of numbers (pixel points, plane coordinates) on one line,
 * keys in the order of that document. Read back by the scene reader like any other file.
 */
import { Document, isMap, isScalar, isSeq, visit } from 'yaml';
import type { Draft } from './draft.js';

/** Top-level keys in the order docs/scene-file.md lists them. */
const TOP_ORDER = ['$schema', 'heliochron', 'title', 'site', 'calendar', 'yearStart', 'window', 'air', 'mapNorthCorrectionDeg', 'image', 'groundPlane', 'walls', 'observations', 'seed'];

/**
 * The YAML text of a document.
 * @example sceneYamlText({ heliochron: 1, title: 'Hall' }) // '# Written by the heliochron measuring desk...\nheliochron: 1\ntitle: Hall\n'
 */
export function sceneYamlText(draft: Draft): string {
  const ordered: Draft = {};
  for (const key of TOP_ORDER) if (draft[key] !== undefined) ordered[key] = draft[key];
  for (const key of Object.keys(draft)) if (!(key in ordered)) ordered[key] = draft[key];
  const doc = new Document(ordered);
  visit(doc, {
    Seq(_, node) {
      // short lists of plain values on one line: [588, 558], [5, 6, 7]
      if (node.items.every((item) => isScalar(item))) node.flow = true;
    },
    Map(_, node) {
      // small maps of plain values on one line: site, air, image, fromPx pairs stay readable
      if (node.items.length <= 4 && node.items.every((pair) => isScalar(pair.value))) node.flow = true;
    },
  });
  // a map holding flow lists stays in block form (readable one point a line)
  visit(doc, {
    Map(_, node) {
      if (node.items.some((pair) => isSeq(pair.value) || isMap(pair.value))) node.flow = false;
    },
  });
  doc.commentBefore = ' Written by the heliochron measuring desk (heliochron desk); the format is described in docs/scene-file.md.';
  return doc.toString({ lineWidth: 0 });
}
