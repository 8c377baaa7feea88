import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../src/errors.js';
import { readSceneText, sceneFromData } from '../../src/scene/readScene.js';
import { BAD_SCENES, GOOD_SCENES } from './sceneSamples.js';

/**
 * The shape every refusal must have: "<path>: <quoted value> is not allowed; expected <what is allowed>",
 * or, when nothing was given, "<path> is missing; expected <what is allowed>".
 */
export const MESSAGE_SHAPE = /^([^\s:][^:]*: .+ is not allowed|[^\s:][^:]* is missing); expected .+/s;

function refusal(data: unknown): InvalidInputError {
  try {
    readSceneText(JSON.stringify(data), 'scene.json');
  } catch (error) {
    if (error instanceof InvalidInputError) return error;
    throw error;
  }
  throw new Error('the scene was accepted');
}

describe('every good sample scene is accepted', () => {
  for (const { name, data } of GOOD_SCENES) {
    it(`accepts: ${name}`, () => {
      const scene = sceneFromData(structuredClone(data));
      expect(scene.observations.length).toBeGreaterThan(0);
    });
  }
});

describe('every bad sample scene is refused with the path, the value and what is allowed', () => {
  for (const bad of BAD_SCENES) {
    it(`refuses: ${bad.name}`, () => {
      // NaN cannot pass through JSON text: hand the data to the reader directly.
      let error: InvalidInputError;
      try {
        sceneFromData(structuredClone(bad.data));
        throw new Error('the scene was accepted');
      } catch (e) {
        if (!(e instanceof InvalidInputError)) throw e;
        error = e;
      }
      expect(error.field).toBe(bad.field);
      expect(error.message).toMatch(MESSAGE_SHAPE);
      expect(error.message).toMatch(bad.says);
    });
  }
});

describe('edge cases of the text', () => {
  it('refuses duplicate keys in YAML and in JSON', () => {
    expect(() => readSceneText('heliochron: 1\nheliochron: 1\n', 'a.yaml')).toThrow(/a\.yaml \(line 2, column 1\).*each key at most once/);
    expect(() => readSceneText('{"heliochron": 1, "heliochron": 1}', 'a.json')).toThrow(/each key at most once/);
  });

  it('refuses YAML tags, directives, several documents and non-text keys', () => {
    expect(() => readSceneText('heliochron: !!js/function "x"\n', 'a.yaml')).toThrow(/a\.yaml \(line 1, column 13\): .*without YAML tags/);
    expect(() => readSceneText('title: !foo x\n', 'a.yaml')).toThrow(/a\.yaml \(line 1, column 8\): .*without YAML tags/);
    expect(() => readSceneText('%YAML 1.1\n---\nheliochron: 1\n', 'a.yaml')).toThrow(/without directives/);
    expect(() => readSceneText('heliochron: 1\n---\ntitle: x\n', 'a.yaml')).toThrow(/one scene per file/);
    expect(() => readSceneText('? [1, 2]\n: 3\n', 'a.yaml')).toThrow(/keys that are plain words/);
  });

  it('refuses an alias bomb without expanding it', () => {
    let bomb = 'a0: &a0 [x, x, x, x, x, x, x, x, x]\n';
    for (let i = 1; i < 9; i++) bomb += `a${i}: &a${i} [${Array(9).fill(`*a${i - 1}`).join(', ')}]\n`;
    expect(() => readSceneText(bomb, 'bomb.yaml')).toThrow(/bomb\.yaml: .* is not allowed; expected at most 100 alias expansions/);
  });

  it('refuses deep nesting before parsing', () => {
    expect(() => readSceneText(`title: ${'['.repeat(100000)}`, 'deep.yaml')).toThrow(/deep\.yaml \(line 1, column \d+\): "nesting \d+ levels deep" is not allowed; expected lists and maps nested at most 32/);
  });

  it('refuses binary content, naming the character', () => {
    expect(() => readSceneText('heliochron: 1\ntitle: a\u0000b\n', 'a.yaml')).toThrow(/a\.yaml \(line 2, column 9\): "U\+0000" is not allowed; expected a text file/);
  });

  it('refuses empty files and files over 1 MiB', () => {
    expect(() => readSceneText('  \n', 'e.yaml')).toThrow(/The file is empty/);
    expect(() => readSceneText(`# ${'x'.repeat(1024 * 1024)}`, 'big.yaml')).toThrow(/at most 1048576 bytes/);
  });

  it('reads NaN and infinity written in YAML as non-finite numbers and refuses them', () => {
    const text = 'heliochron: 1\ntitle: t\nsite: { latitudeDeg: .nan, longitudeDeg: 9 }\n';
    expect(() => readSceneText(text, 'n.yaml')).toThrow(/^site\.latitudeDeg: NaN is not allowed; .*Only finite numbers/);
    const inf = 'heliochron: 1\ntitle: t\nsite: { latitudeDeg: -.inf, longitudeDeg: 9 }\n';
    expect(() => readSceneText(inf, 'n.yaml')).toThrow(/^site\.latitudeDeg: -Infinity is not allowed/);
  });

  it('quotes a refused key value and suggests the key with its unit', () => {
    const e = refusal({ heliochron: 1, title: 't', site: { latitudeDeg: 1, longitudeRad: 0.16 } });
    expect(e.message).toBe(
      'site.longitudeRad: 0.16 is not allowed; expected one of the keys of the site: latitudeDeg, longitudeDeg, elevationM, latitudeSigmaDeg, longitudeSigmaDeg. "longitudeRad" is not a known key. Did you mean "longitudeDeg"? Angles are in degrees. See line 1 of scene.json.',
    );
  });

  it('names the line of the refused value in a YAML file', () => {
    const text = readFileSync(new URL('./scenes/velmar-marktgasse.yaml', import.meta.url), 'utf8');
    const bad = text.replace('sigmaDeg: 2 }', 'sigmaDeg: -2 }');
    expect(() => readSceneText(bad, 'velmar.yaml')).toThrow(/^observations\[0\]\.sigmaDeg: -2 is not allowed; .* See line 36 of velmar\.yaml\.$/);
    const missing = text.replace('  - { id: chapel-lit, kind: wall-lit, wall: chapel-south }\n', '  - { id: chapel-lit, kind: wall-lit }\n');
    expect(() => readSceneText(missing, 'velmar.yaml')).toThrow(/^observations\[5\]\.wall is missing; .* See line 46 of velmar\.yaml\.$/);
  });

  it('refuses a __proto__ key as an unknown key rather than changing any prototype', () => {
    const text = 'heliochron: 1\n__proto__: { polluted: 1 }\n';
    expect(() => readSceneText(text, 'p.yaml')).toThrow(InvalidInputError);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});
