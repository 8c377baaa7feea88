/**
 * Malformed, truncated and mutated scene files for the fuzz test of the
 * reader, and a runner that passes each through readSceneText and checks the
 * outcome. The scenes the reader accepts are returned, so that other tests can
 * pass them on (for example to the solver) in one line:
 *   for (const scene of runSceneFuzz({ numRuns: 2000 }).accepted) solveDates(scene);
 */
import fc from 'fast-check';
import { stringify } from 'yaml';
import { InvalidInputError, refusalHead } from '../../src/errors.js';
import { readSceneText } from '../../src/scene/readScene.js';
import type { Scene } from '../../src/scene/types.js';
import { GOOD_SCENES } from './sceneSamples.js';

type Json = unknown;

/** Values that break things: non-finite and extreme numbers, numbers as text, long strings, deep nesting. */
const weirdValue: fc.Arbitrary<Json> = fc.oneof(
  fc.constantFrom(Number.NaN, Infinity, -Infinity, 1e308, -1e308, 5e-324, -0, 0, 1, -1, 360, 90, 2 ** 53, 1e-12),
  fc.double(),
  fc.integer(),
  fc.constantFrom('NaN', 'Infinity', '-Infinity', '.inf', '.nan', '1e999', '38', '', ' ', '7:40', '1652-03-01', 'left', 'gregorian', 'tanners-hall-front'),
  fc.string({ maxLength: 30 }),
  fc.constantFrom('x'.repeat(600), 'y'.repeat(70_000), '\u00e9\u{1F600}'.repeat(100)),
  fc.boolean(),
  fc.constant(null),
  fc.array(fc.oneof(fc.integer(), fc.double()), { maxLength: 6 }),
  fc.dictionary(fc.string({ maxLength: 8 }), fc.integer(), { maxKeys: 3 }),
  fc.integer({ min: 1, max: 60 }).map((depth) => {
    let v: Json = 1;
    for (let i = 0; i < depth; i++) v = i % 2 ? [v] : { a: v };
    return v;
  }),
);

type PathPart = string | number;

function allPaths(value: Json, prefix: PathPart[] = [], out: PathPart[][] = []): PathPart[][] {
  out.push(prefix);
  if (Array.isArray(value)) value.forEach((v, i) => allPaths(v, [...prefix, i], out));
  else if (value !== null && typeof value === 'object') for (const [k, v] of Object.entries(value)) allPaths(v, [...prefix, k], out);
  return out;
}

const mutation = fc.record({
  target: fc.nat(),
  op: fc.constantFrom('replace', 'delete', 'typo-key', 'unit-key', 'add-key', 'wrap', 'duplicate-item'),
  value: weirdValue,
  key: fc.oneof(fc.string({ maxLength: 12 }), fc.constantFrom('sigma', 'slope', 'azimuthRad', 'lat', '__proto__', 'constructor', 'kind', 'id')),
  position: fc.nat(),
});
type Mutation = typeof mutation extends fc.Arbitrary<infer T> ? T : never;

function mutate(data: Json, m: Mutation): Json {
  const paths = allPaths(data).filter((p) => p.length > 0);
  if (paths.length === 0) return m.value;
  const path = paths[m.target % paths.length];
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  let parent: any = data;
  for (const p of path.slice(0, -1)) parent = parent[p];
  const last = path[path.length - 1];
  switch (m.op) {
    case 'replace':
      parent[last] = m.value;
      break;
    case 'delete':
      if (Array.isArray(parent)) parent.splice(last as number, 1);
      else delete parent[last];
      break;
    case 'wrap':
      parent[last] = [parent[last]];
      break;
    case 'duplicate-item':
      if (Array.isArray(parent)) parent.push(structuredClone(parent[last as number]));
      else parent[last] = { [String(last)]: parent[last] };
      break;
    case 'typo-key':
    case 'unit-key':
      if (!Array.isArray(parent) && typeof last === 'string' && last.length > 0) {
        const i = m.position % last.length;
        const unitSwap: Readonly<Record<string, string>> = { Deg: 'Rad', M: 'Cm', Px: '', Minutes: 'Min', HPa: 'Pa', C: 'F' };
        const newKey = m.op === 'unit-key'
          ? last.replace(/(Deg|M|Px|Minutes|HPa|C)$/, (u) => unitSwap[u] ?? '')
          : last.slice(0, i) + last.slice(i + 1);
        const v = parent[last];
        delete parent[last];
        Object.defineProperty(parent, newKey, { value: v, enumerable: true, writable: true, configurable: true });
      }
      break;
    case 'add-key': {
      const target = Array.isArray(parent) ? parent : (parent[last] ?? parent);
      if (target !== null && typeof target === 'object' && !Array.isArray(target)) {
        Object.defineProperty(target, m.key, { value: m.value, enumerable: true, writable: true, configurable: true });
      }
      break;
    }
  }
  return data;
}

function serialise(data: Json, form: 'json' | 'yaml' | 'yaml-flow'): string {
  if (form === 'json') return JSON.stringify(data, null, 1) ?? 'null';
  return stringify(data, { collectionStyle: form === 'yaml-flow' ? 'flow' : 'any', lineWidth: 0 });
}

/** Structured mutations of the good sample scenes, written out as JSON or YAML. */
const mutatedScene: fc.Arbitrary<string> = fc
  .record({
    base: fc.nat({ max: GOOD_SCENES.length - 1 }),
    mutations: fc.array(mutation, { minLength: 1, maxLength: 3 }),
    form: fc.constantFrom('json' as const, 'yaml' as const, 'yaml-flow' as const),
  })
  .map(({ base, mutations, form }) => {
    let data: Json = structuredClone(GOOD_SCENES[base].data);
    for (const m of mutations) data = mutate(data, m);
    return serialise(data, form);
  });

const NASTY_CHARS = ['\u0000', '\u0007', '\u001b', '\ufffd', '\ufeff', '\t', '\r', ':', '{', '}', '[', ']', ',', '-', '#', '&', '*', '!', '|', '>', "'", '"', '%', '@', '`', '\n', ' ', '? ', '<<: '];

/** Text-level damage: truncation, inserted bytes and characters, deleted and repeated spans. */
const damagedText: fc.Arbitrary<string> = fc
  .record({
    base: fc.nat({ max: GOOD_SCENES.length - 1 }),
    form: fc.constantFrom('json' as const, 'yaml' as const),
    edits: fc.array(
      fc.record({
        op: fc.constantFrom('truncate', 'insert', 'delete', 'repeat', 'bytes'),
        at: fc.nat(),
        length: fc.nat({ max: 40 }),
        char: fc.constantFrom(...NASTY_CHARS),
        bytes: fc.uint8Array({ minLength: 1, maxLength: 16 }),
      }),
      { minLength: 1, maxLength: 4 },
    ),
  })
  .map(({ base, form, edits }) => {
    let text = serialise(structuredClone(GOOD_SCENES[base].data), form);
    for (const e of edits) {
      const at = text.length === 0 ? 0 : e.at % (text.length + 1);
      if (e.op === 'truncate') text = text.slice(0, at);
      else if (e.op === 'insert') text = text.slice(0, at) + e.char + text.slice(at);
      else if (e.op === 'delete') text = text.slice(0, at) + text.slice(at + e.length);
      else if (e.op === 'repeat') text = text.slice(0, at + e.length) + text.slice(at, at + e.length) + text.slice(at + e.length);
      else text = text.slice(0, at) + Buffer.from(e.bytes).toString('latin1') + text.slice(at);
    }
    return text;
  });

/** Attacks on the parser: alias bombs, deep nesting, huge texts, binary, random unicode. */
const attackText: fc.Arbitrary<string> = fc.oneof(
  fc.record({ width: fc.integer({ min: 2, max: 12 }), depth: fc.integer({ min: 2, max: 12 }) }).map(({ width, depth }) => {
    let t = `heliochron: 1\na0: &a0 [${Array(width).fill('"lol"').join(', ')}]\n`;
    for (let i = 1; i < depth; i++) t += `a${i}: &a${i} [${Array(width).fill(`*a${i - 1}`).join(', ')}]\n`;
    return t;
  }),
  fc.record({ depth: fc.integer({ min: 10, max: 200_000 }), open: fc.constantFrom('[', '{a: ', '- ', '{"a":', '[{"b": ') }).map(({ depth, open }) => `title: x\nsite: ${open.repeat(depth)}`),
  fc.integer({ min: 1, max: 60 }).map((depth) => Array.from({ length: depth }, (_, i) => `${' '.repeat(i * 2)}k${i}:`).join('\n') + ' 1\n'),
  fc.constantFrom(`heliochron: 1\ntitle: "${'x'.repeat(1_100_000)}"\n`, `# ${'z'.repeat(900_000)}\nheliochron: 1\n`),
  fc.uint8Array({ minLength: 0, maxLength: 300 }).map((b) => Buffer.from(b).toString('latin1')),
  fc.string({ unit: 'binary', maxLength: 200 }),
  fc.string({ maxLength: 200 }),
  fc.constantFrom('', 'null', '[]', '{}', '1', '"text"', '~', '---', '...', 'heliochron: 1', '{"heliochron": 1}', '!!binary aGVsbG8=', '%YAML 1.1\n---\na: 1', 'a: !!python/object:os.system x'),
);

/** Every kind of case, weighted towards the structured mutations that reach the validation. */
export const sceneFuzzText: fc.Arbitrary<string> = fc.oneof(
  { arbitrary: mutatedScene, weight: 6 },
  { arbitrary: damagedText, weight: 3 },
  { arbitrary: attackText, weight: 1 },
);

/** The result of running the fuzz cases. */
export interface SceneFuzzResult {
  readonly tried: number;
  readonly rejected: number;
  readonly accepted: readonly Scene[];
  readonly acceptedTexts: readonly string[];
  readonly slowestMs: number;
  readonly totalMs: number;
}

/**
 * Check that a refusal has the promised shape: "<field>: <quoted value> is not allowed; expected <allowed>"
 * (or "<field> is missing; expected <allowed>"), with the field a path of the file or the file itself.
 */
export function checkRefusal(error: unknown, fileName: string): void {
  if (!(error instanceof InvalidInputError)) {
    throw new Error(`not an InvalidInputError: ${String(error)}${error instanceof Error ? `\n${error.stack}` : ''}`);
  }
  const head = refusalHead(error.field, error.value, error.allowed);
  if (!error.message.startsWith(head) || error.allowed.trim().length < 3) {
    throw new Error(`message out of shape: ${error.message}`);
  }
  // A path starts with a plain key or a quoted one (`["odd key"]`) and goes on by `.key`, `[n]` or `["key"]`.
  const pathLike = error.field === 'the scene' || /^([A-Za-z_$][\w$-]*|\["(?:[^"\\]|\\.)*"\])(\.[A-Za-z_$][\w$-]*|\[\d+\]|\["(?:[^"\\]|\\.)*"\])*$/.test(error.field);
  if (!(error.field.startsWith(fileName) || pathLike)) throw new Error(`field is neither the file nor a path: ${error.field}`);
}

/**
 * A hang guard for one case, ms: far above any case seen (a few ms; 226 ms on a loaded 2-core machine),
 * so that only a runaway (an alias bomb, a parser loop) fails. Speed is measured in bench/scene-reader.mjs.
 */
export const CASE_WATCHDOG_MS = 30_000;

/**
 * Run `numRuns` fuzz cases through readSceneText; throws (through fast-check, with a shrunk case) on any
 * exception other than a well-shaped InvalidInputError, or on a case that runs past the hang guard.
 * @param check an extra check for each accepted scene (the schema test uses it)
 */
export function runSceneFuzz(options: {
  numRuns: number;
  seed?: number;
  check?: (scene: Scene, text: string) => void;
}): SceneFuzzResult {
  const fileName = 'fuzz-scene.yaml';
  let tried = 0;
  let rejected = 0;
  let slowestMs = 0;
  const accepted: Scene[] = [];
  const acceptedTexts: string[] = [];
  const start = performance.now();
  // Counted inside the property: when every case passes, fast-check runs each case exactly once.
  fc.assert(
    fc.property(sceneFuzzText, (text) => {
      tried++;
      const t0 = performance.now();
      let scene: Scene | undefined;
      try {
        scene = readSceneText(text, fileName);
      } catch (error) {
        checkRefusal(error, fileName);
        rejected++;
      }
      const ms = performance.now() - t0;
      slowestMs = Math.max(slowestMs, ms);
      if (ms > CASE_WATCHDOG_MS) throw new Error(`case ran past the hang guard (${ms.toFixed(0)} ms): ${text.slice(0, 200)}`);
      if (scene !== undefined) {
        options.check?.(scene, text);
        accepted.push(scene);
        acceptedTexts.push(text);
      }
    }),
    { numRuns: options.numRuns, seed: options.seed ?? 20261202, endOnFailure: true },
  );
  return { tried, rejected, accepted, acceptedTexts, slowestMs, totalMs: performance.now() - start };
}
