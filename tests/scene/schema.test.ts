/**
 * The JSON Schema docs/scene.schema.json and the reader agree: every scene the
 * reader accepts the schema accepts, and every scene the schema refuses the
 * reader refuses. Faults that need the whole scene (an unknown wall id, a point
 * outside the image, a date in a reform gap) are seen by the reader only.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { sceneFromData, readSceneText } from '../../src/scene/readScene.js';
import { observationKeys, OBSERVATION_KINDS } from '../../src/scene/readObservation.js';
import { schemaViolation } from './miniSchema.js';
import { BAD_SCENES, GOOD_SCENES } from './sceneSamples.js';

export const SCENE_SCHEMA = JSON.parse(readFileSync(new URL('../../docs/scene.schema.json', import.meta.url), 'utf8'));

const examplesDir = new URL('../../examples/', import.meta.url);
function exampleScenes(): { name: string; text: string }[] {
  let names: string[] = [];
  try {
    names = readdirSync(examplesDir).filter((n) => /\.(ya?ml|json)$/i.test(n));
  } catch {
    return [];
  }
  return names.map((name) => ({ name, text: readFileSync(new URL(name, examplesDir), 'utf8') }));
}

describe('the scene schema', () => {
  it('is a draft 2020-12 schema', () => {
    expect(SCENE_SCHEMA.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
  });

  it('lists the same observation kinds and keys as the reader', () => {
    const obs = SCENE_SCHEMA.$defs.observation;
    expect(obs.properties.kind.enum).toEqual(OBSERVATION_KINDS);
    for (const branch of obs.allOf) {
      const kind = branch.if.properties.kind.const;
      expect(Object.keys(branch.then.properties).sort(), kind).toEqual([...observationKeys(kind)].sort());
    }
  });

  for (const { name, data } of GOOD_SCENES) {
    it(`accepts the good sample "${name}", as the reader does`, () => {
      expect(schemaViolation(SCENE_SCHEMA, data)).toBeNull();
      expect(() => sceneFromData(structuredClone(data))).not.toThrow();
    });
  }

  it('accepts the Velmar example of the tests, as the reader does', () => {
    const text = readFileSync(new URL('./scenes/velmar-marktgasse.yaml', import.meta.url), 'utf8');
    expect(schemaViolation(SCENE_SCHEMA, parse(text))).toBeNull();
    expect(() => readSceneText(text, 'velmar-marktgasse.yaml')).not.toThrow();
  });

  for (const bad of BAD_SCENES) {
    it(`${bad.schemaSees ? 'refuses' : 'leaves to the reader'} the bad sample "${bad.name}"`, () => {
      const violation = schemaViolation(SCENE_SCHEMA, bad.data);
      if (bad.schemaSees) expect(violation, 'the schema should refuse it').not.toBeNull();
      else expect(violation, 'the schema cannot see this fault').toBeNull();
      expect(() => sceneFromData(structuredClone(bad.data))).toThrow();
    });
  }

  const examples = exampleScenes();
  it(`agrees with the reader on every scene file under examples/ (${examples.length} found)`, () => {
    for (const { name, text } of examples) {
      let readerOk = true;
      try {
        readSceneText(text, name);
      } catch {
        readerOk = false;
      }
      expect(readerOk, `${name} should be a valid scene`).toBe(true);
      expect(schemaViolation(SCENE_SCHEMA, parse(text)), name).toBeNull();
    }
  });
});

describe('the small schema checker used above', () => {
  // Expected outcomes from the keyword definitions of JSON Schema Validation 2020-12, sec. 6, and Core 2020-12, sec. 10.
  it('applies type, ranges, enum and const as the specification defines them', () => {
    expect(schemaViolation({ type: 'number' }, 'x')).not.toBeNull();
    expect(schemaViolation({ type: 'number' }, Number.NaN)).not.toBeNull();
    expect(schemaViolation({ type: 'integer' }, 2.0)).toBeNull();
    expect(schemaViolation({ type: 'integer' }, 2.5)).not.toBeNull();
    expect(schemaViolation({ exclusiveMaximum: 360 }, 360)).not.toBeNull();
    expect(schemaViolation({ minimum: 0 }, 0)).toBeNull();
    expect(schemaViolation({ enum: ['left', 'right'] }, 'Left')).not.toBeNull();
    expect(schemaViolation({ const: 1 }, 1)).toBeNull();
  });
  it('applies the object, array and combining keywords', () => {
    const s = { type: 'object', properties: { a: { type: 'number' } }, additionalProperties: false, required: ['a'] };
    expect(schemaViolation(s, { a: 1 })).toBeNull();
    expect(schemaViolation(s, { a: 1, b: 2 })).not.toBeNull();
    expect(schemaViolation(s, {})).not.toBeNull();
    expect(schemaViolation({ oneOf: [{ required: ['a'] }, { required: ['b'] }] }, { a: 1, b: 1 })).not.toBeNull();
    expect(schemaViolation({ oneOf: [{ required: ['a'] }, { required: ['b'] }] }, { b: 1 })).toBeNull();
    expect(schemaViolation({ if: { required: ['a'] }, then: { required: ['b'] } }, { a: 1 })).not.toBeNull();
    expect(schemaViolation({ if: { required: ['a'] }, then: { required: ['b'] } }, { c: 1 })).toBeNull();
    expect(schemaViolation({ dependentRequired: { a: ['b'] } }, { a: 1 })).not.toBeNull();
    expect(schemaViolation({ prefixItems: [{ type: 'number' }], minItems: 2 }, [1])).not.toBeNull();
    expect(schemaViolation({ uniqueItems: true }, [1, 1])).not.toBeNull();
    expect(schemaViolation({ pattern: '^[\\p{L}]+$' }, 'Zürich')).toBeNull();
  });
  it('refuses a keyword outside its subset rather than ignoring it', () => {
    expect(() => schemaViolation({ multipleOf: 2 }, 4)).toThrow(/outside the checked subset/);
  });
});
