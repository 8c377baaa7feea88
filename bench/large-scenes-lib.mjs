/**
 * The large-scene bench's scenes: the Salt House scene (examples/salt-house-sketch.yaml) with its
 * observations copied until there are n (ids made unique). Shared by bench/large-scenes.mjs.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parse } from 'yaml';
import { sceneFromData } from '../dist/scene/readScene.js';

const root = fileURLToPath(new URL('../', import.meta.url));
const base = parse(readFileSync(`${root}examples/salt-house-sketch.yaml`, 'utf8'));

/**
 * The Salt House scene with its observations copied until there are n (ids made unique); with
 * `consistent`, the figure lit from the other side is left out of the copies (a scene that fits).
 */
export function largeScene(n, consistent = false) {
  const pool = base.observations.filter((o) => !consistent || o.id !== 'figure-shadow');
  const observations = [];
  for (let i = 0; observations.length < n; i += 1) {
    const o = pool[i % pool.length];
    observations.push({ ...o, id: `${o.id}-${Math.floor(i / pool.length) + 1}` });
  }
  return sceneFromData({ ...base, observations });
}

