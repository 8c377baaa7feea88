/**
 * The desk's document: the scene file's own data (the structure of docs/scene-file.md), the
 * very object that Save writes out as YAML and that the scene reader (sceneFromData) turns into
 * the validated Scene of src/scene/types.ts. No second format: what the page holds is what the
 * file says. Incomplete work (a rod with one end clicked) lives in the tool, not here.
 *
 * Paths into the draft are arrays of keys and indices (['observations', 2, 'pixels', 'fromPx']);
 * their printed form is the scene reader's own (`observations[2].pixels.fromPx`), so that a
 * reader's message can be put beside the field it names.
 */
import type { PixelPoint } from '../scene/types.js';

export type DraftValue = string | number | boolean | null | DraftValue[] | { [key: string]: DraftValue };
export type Draft = { [key: string]: DraftValue };
export type DraftPath = readonly (string | number)[];

/** The printed form of a path, as the scene reader names fields: `walls[0].imagePlane.pointsPx[2]`. */
export function pathText(path: DraftPath): string {
  return path.reduce<string>((text, key) => (typeof key === 'number' ? `${text}[${key}]` : text ? `${text}.${key}` : key), '');
}

/** The value at a path, or undefined. */
export function getAt(draft: DraftValue | undefined, path: DraftPath): DraftValue | undefined {
  let node: DraftValue | undefined = draft;
  for (const key of path) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<string | number, DraftValue>)[key];
  }
  return node;
}

/** Set the value at a path in place (on a copy made by the history), creating objects on the way. */
export function setAt(draft: Draft, path: DraftPath, value: DraftValue | undefined): void {
  let node: Record<string | number, DraftValue> = draft;
  for (let i = 0; i < path.length - 1; i += 1) {
    const key = path[i];
    if (node[key] === undefined || node[key] === null || typeof node[key] !== 'object') node[key] = typeof path[i + 1] === 'number' ? [] : {};
    node = node[key] as Record<string | number, DraftValue>;
  }
  const last = path[path.length - 1];
  if (value === undefined) {
    if (Array.isArray(node) && typeof last === 'number') node.splice(last, 1);
    else delete node[last];
  } else node[last] = value;
}

/** A fresh draft for a picture of known size: the format version, a title and the picture. */
export function emptyDraft(pictureName: string | null, widthPx: number | null, heightPx: number | null): Draft {
  const draft: Draft = { heliochron: 1, title: pictureName ? `Scene of ${pictureName}` : 'New scene' };
  if (pictureName && widthPx && heightPx) draft.image = { widthPx, heightPx, file: pictureName, pixelSigmaPx: 1 };
  draft.walls = [];
  draft.observations = [];
  return draft;
}

/** One clicked point of the draft, where it is and what it belongs to. */
export interface DraftPoint {
  readonly path: DraftPath;
  readonly xy: PixelPoint;
  /** Short label drawn beside it: `G 1`, `W1 3`, `lamp-post foot`. */
  readonly label: string;
  /** The item it belongs to (a plane or an observation), for deleting and for warnings. */
  readonly owner: DraftPath;
}

function isPoint(v: DraftValue | undefined): v is [number, number] {
  return Array.isArray(v) && v.length === 2 && typeof v[0] === 'number' && typeof v[1] === 'number';
}

/** The clicked points of each pixel form, by key under `pixels`, with the word drawn beside each. */
const PIXEL_POINT_WORDS: Readonly<Record<string, readonly (readonly [key: string, word: string])[]>> = {
  'rod-shadow': [['fromPx', 'root'], ['toPx', 'shadow']],
  'overhang-shadow': [['fromPx', 'edge'], ['toPx', 'shadow'], ['tipPx', 'tip']],
  'fin-shadow': [['fromPx', 'edge'], ['toPx', 'shadow'], ['tipPx', 'tip']],
  'pole-shadow': [['fromPx', 'foot'], ['toPx', 'tip']],
  'eave-shadow': [['fromPx', 'foot'], ['alongPx', 'foot 2'], ['toPx', 'shadow line']],
  'shadow-points': [['fromPx', 'foot'], ['toPx', 'shadow'], ['objectPx', 'caster']],
  'moon-direction': [['centrePx', 'moon centre']],
};

function planePoints(plane: DraftValue | undefined, owner: DraftPath, short: string, out: DraftPoint[]): void {
  const pts = getAt(plane, ['pointsPx']);
  if (Array.isArray(pts)) pts.forEach((p, i) => isPoint(p) && out.push({ path: [...owner, 'pointsPx', i], xy: p, label: `${short} ${i + 1}`, owner }));
  const corner = getAt(plane, ['fromWalls', 'cornerPx']);
  if (isPoint(corner)) out.push({ path: [...owner, 'fromWalls', 'cornerPx'], xy: corner, label: `${short} corner`, owner });
}

/** Points of one clicked line: each labelled with the line's short name, owned by the line. */
function linePoints(line: DraftValue | undefined, owner: DraftPath, short: string, out: DraftPoint[]): void {
  if (Array.isArray(line)) line.forEach((p, j) => isPoint(p) && out.push({ path: [...owner, j], xy: p, label: short, owner }));
}

/** The camera's lines: V1, V2 ... along vertical edges; H1.1, H1.2 ... along the courses of the first wall listed. */
function cameraPoints(draft: Draft, out: DraftPoint[]): void {
  const vertical = getAt(draft, ['camera', 'verticalLines']);
  if (Array.isArray(vertical)) vertical.forEach((line, k) => linePoints(line, ['camera', 'verticalLines', k], `V${k + 1}`, out));
  const walls = getAt(draft, ['camera', 'wallLines']);
  if (!Array.isArray(walls)) return;
  walls.forEach((entry, i) => {
    const lines = getAt(entry, ['lines']);
    if (Array.isArray(lines)) lines.forEach((line, k) => linePoints(line, ['camera', 'wallLines', i, 'lines', k], `H${i + 1}.${k + 1}`, out));
  });
}

/** Every clicked point of the draft, in file order. */
export function draftPoints(draft: Draft): DraftPoint[] {
  const out: DraftPoint[] = [];
  planePoints(draft.groundPlane, ['groundPlane'], 'G', out);
  const walls = Array.isArray(draft.walls) ? draft.walls : [];
  walls.forEach((w, i) => planePoints(getAt(w, ['imagePlane']), ['walls', i, 'imagePlane'], `W${i + 1}`, out));
  cameraPoints(draft, out);
  const observations = Array.isArray(draft.observations) ? draft.observations : [];
  observations.forEach((o, k) => {
    const words = PIXEL_POINT_WORDS[String(getAt(o, ['kind']))];
    const id = String(getAt(o, ['id']) ?? `#${k + 1}`);
    if (getAt(o, ['kind']) === 'object-shadow') {
      for (const [key, word] of [['objectPx', 'object'], ['shadowPx', 'shadow']] as const) {
        const p = getAt(o, [key]);
        if (isPoint(p)) out.push({ path: ['observations', k, key], xy: p, label: `${id} ${word}`, owner: ['observations', k] });
      }
      return;
    }
    if (getAt(o, ['kind']) === 'shadow-wedge') {
      const owner = ['observations', k];
      const shadow = getAt(o, ['shadowPx']);
      if (isPoint(shadow)) out.push({ path: [...owner, 'shadowPx'], xy: shadow, label: `${id} shadow`, owner });
      [0, 1].forEach((j) => {
        const p = getAt(o, ['edgesPx', j]);
        if (isPoint(p)) out.push({ path: [...owner, 'edgesPx', j], xy: p, label: `${id} edge ${j + 1}`, owner });
      });
      return;
    }
    if (!words) return;
    for (const [key, word] of words) {
      const p = getAt(o, ['pixels', key]);
      if (isPoint(p)) out.push({ path: ['observations', k, 'pixels', key], xy: p, label: `${id} ${word}`, owner: ['observations', k] });
    }
  });
  return out;
}

/** Ids of the draft's walls, in order. */
export function wallIds(draft: Draft): string[] {
  return (Array.isArray(draft.walls) ? draft.walls : []).map((w) => String(getAt(w, ['id']) ?? ''));
}

/** A new id not yet used by an observation: `base`, `base-2`, ... */
export function freshObservationId(draft: Draft, base: string): string {
  const used = new Set((Array.isArray(draft.observations) ? draft.observations : []).map((o) => String(getAt(o, ['id']))));
  if (!used.has(base)) return base;
  for (let n = 2; ; n += 1) if (!used.has(`${base}-${n}`)) return `${base}-${n}`;
}

/** Round a clicked coordinate to what a careful click means: a tenth of a pixel. */
export function roundPx(v: number): number {
  return Math.round(v * 10) / 10;
}
