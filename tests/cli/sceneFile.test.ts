import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { InvalidInputError } from '../../src/errors.js';
import { MAX_SCENE_BYTES } from '../../src/scene/readScene.js';
import { readSceneFile } from '../../src/cli/sceneFile.js';
import { minimalScene } from '../scene/sceneSamples.js';

const dir = mkdtempSync(join(tmpdir(), 'heliochron-scene-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('readSceneFile', () => {
  it('reads a YAML file and a JSON file', () => {
    const json = join(dir, 'velmar.json');
    writeFileSync(json, JSON.stringify(minimalScene()));
    expect(readSceneFile(json).title).toBe("Velmar, the Tanners' Hall, a drawing");
    const yaml = join(dir, 'velmar.yaml');
    writeFileSync(yaml, '\ufeffheliochron: 1\ntitle: Velmar\nsite: { latitudeDeg: 47.62, longitudeDeg: 9.35 }\ncalendar: gregorian\nwindow: { fromYear: 1800, toYear: 1801 }\nobservations: [{ id: s, kind: sun-up }]\n');
    expect(readSceneFile(yaml).observations).toEqual([{ id: 's', kind: 'sun-up' }]);
  });

  it('refuses a missing file, a folder and an over-size file with the path in the message', () => {
    const nothing = join(dir, 'nothing.yaml');
    expect(() => readSceneFile(nothing)).toThrow(InvalidInputError);
    expect(() => readSceneFile(nothing)).toThrow(/nothing\.yaml: ".*nothing\.yaml" is not allowed; expected a scene file .*There is no file at this path/);
    expect(() => readSceneFile(dir)).toThrow(/This is a folder, not a file/);
    const big = join(dir, 'big.yaml');
    writeFileSync(big, Buffer.alloc(MAX_SCENE_BYTES + 1, 0x20));
    expect(() => readSceneFile(big)).toThrow(/"1048577 bytes" is not allowed; expected a scene file of at most 1048576 bytes/);
  });

  it('refuses bytes that are not UTF-8 (a picture saved under a scene name)', () => {
    const png = join(dir, 'picture.yaml');
    writeFileSync(png, Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0xff, 0xfe]));
    expect(() => readSceneFile(png)).toThrow(/expected a text file in UTF-8/);
  });
});
