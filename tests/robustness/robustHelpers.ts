/**
 * Shared helpers of the robustness tests: build a scene from plain data through the real
 * reader, run the CLI through main() with captured output, and find non-finite numbers in
 * a rendered answer. (Invented scenes in the fictional town of Velmar and invented sites.)
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { stringify } from 'yaml';
import { main } from '../../src/cli/main.js';
import { readSceneText } from '../../src/scene/readScene.js';
import type { Scene } from '../../src/scene/types.js';

export type Data = Record<string, unknown>;

/** Read plain scene data through the real reader (so every scene a test uses is one a user could write). */
export function sceneOf(data: Data, fileName = 'robust-scene.yaml'): Scene {
  return readSceneText(stringify(data, { lineWidth: 0 }), fileName);
}

/** A small valid Velmar scene: the Tanners' Hall front and one rod shadow; `extra` replaces top-level keys. */
export function velmar(extra: Data = {}): Data {
  return {
    heliochron: 1,
    title: "Velmar, the Tanners' Hall, robustness scene",
    site: { latitudeDeg: 47.62, longitudeDeg: 9.35, elevationM: 410 },
    calendar: 'gregorian',
    window: { fromYear: 1760, toYear: 1770 },
    walls: [{ id: 'tanners-hall-front', azimuthDeg: 135, azimuthSigmaDeg: 1 }],
    observations: [{ id: 'bracket', kind: 'rod-shadow', wall: 'tanners-hall-front', slopeDeg: 49, side: 'left', sigmaDeg: 1.5 }],
    ...extra,
  };
}

export interface CliRun {
  readonly code: number;
  readonly out: string;
  readonly err: string;
}

/** Run the CLI through main() with captured output; an exception escaping main() is returned as code -1. */
export async function cli(args: readonly string[], cwd: string): Promise<CliRun & { thrown?: unknown }> {
  let out = '';
  let err = '';
  try {
    const code = await main(args, { out: (t) => { out += t; }, err: (t) => { err += t; }, errIsTerminal: false, cwd });
    return { code, out, err };
  } catch (thrown) {
    return { code: -1, out, err, thrown };
  }
}

/** A fresh temporary folder. */
export function tempDir(prefix = 'heliochron-robust-'): string {
  return mkdtempSync(join(tmpdir(), prefix));
}

/** Write scene data as YAML into `dir` and return the file name. */
export function writeScene(dir: string, name: string, data: Data): string {
  writeFileSync(join(dir, name), stringify(data, { lineWidth: 0 }), 'utf8');
  return name;
}

/** Paths of every number that is not finite (NaN, +-Infinity) in a plain object, e.g. ["candidates[0].sun.azimuthDeg"]. */
export function nonFinitePaths(value: unknown, path = '', out: string[] = []): string[] {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) out.push(path || '(root)');
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => nonFinitePaths(v, `${path}[${i}]`, out));
  } else if (value !== null && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) nonFinitePaths(v, path ? `${path}.${k}` : k, out);
  }
  return out;
}

/** A stack-trace line as Node prints it ("    at fn (file:line:col)"). */
export const STACK_LINE = /^\s+at .+(:\d+:\d+\)?|\(native\))$/m;
