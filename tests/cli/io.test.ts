/** Output files: atomic, never over an existing file without force, never over the input. */
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeOutputFile } from '../../src/cli/io.js';
import { OutputError } from '../../src/errors.js';

function tempDir(): string {
  return mkdtempSync(join(tmpdir(), 'heliochron-io-'));
}

describe('writeOutputFile', () => {
  it('writes the content and leaves no temporary file', () => {
    const dir = tempDir();
    writeOutputFile(join(dir, 'a.svg'), '<svg/>', { force: false, inputs: [] });
    expect(readFileSync(join(dir, 'a.svg'), 'utf8')).toBe('<svg/>');
    expect(readdirSync(dir)).toEqual(['a.svg']);
  });

  it('refuses to replace an existing file without force, and replaces it with force', () => {
    const dir = tempDir();
    const path = join(dir, 'a.html');
    writeFileSync(path, 'old');
    expect(() => writeOutputFile(path, 'new', { force: false, inputs: [] })).toThrow(/exists already; add --force/);
    expect(readFileSync(path, 'utf8')).toBe('old');
    writeOutputFile(path, 'new', { force: true, inputs: [] });
    expect(readFileSync(path, 'utf8')).toBe('new');
  });

  it('refuses an output path equal to an input, even with force', () => {
    const dir = tempDir();
    const scene = join(dir, 'scene.yaml');
    writeFileSync(scene, 'heliochron: 1');
    expect(() => writeOutputFile(join(dir, '.', 'scene.yaml'), 'x', { force: true, inputs: [scene] })).toThrow(OutputError);
    expect(readFileSync(scene, 'utf8')).toBe('heliochron: 1');
  });

  it('refuses a missing folder and writes nothing', () => {
    const dir = tempDir();
    expect(() => writeOutputFile(join(dir, 'no', 'a.svg'), 'x', { force: false, inputs: [] })).toThrow(/does not exist/);
    expect(readdirSync(dir)).toEqual([]);
  });
});
