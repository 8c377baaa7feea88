/**
 * Reading a scene file from disk for the command line (and Node programs, through src/node.ts):
 * the checks of the file as a file (exists, is a regular file, size, UTF-8), then the text to
 * readSceneText (src/scene/readScene.ts), which holds every check of the content and reads no file.
 */
import { readFileSync, statSync } from 'node:fs';
import { InvalidInputError } from '../errors.js';
import { MAX_SCENE_BYTES, readSceneText } from '../scene/readScene.js';
import type { Scene } from '../scene/types.js';

/**
 * Read a scene file from disk (UTF-8 YAML or JSON).
 * @throws InvalidInputError for a missing file, a folder, a file over MAX_SCENE_BYTES, non-UTF-8 bytes, or any content error
 */
export function readSceneFile(path: string): Scene {
  const allowed = 'a scene file (.yaml, .yml or .json)';
  let size: number;
  try {
    const stat = statSync(path);
    if (stat.isDirectory()) throw new InvalidInputError(path, path, allowed, 'This is a folder, not a file.');
    if (!stat.isFile()) throw new InvalidInputError(path, path, allowed, 'This is not a regular file.');
    size = stat.size;
  } catch (error) {
    if (error instanceof InvalidInputError) throw error;
    throw new InvalidInputError(path, path, allowed, 'There is no file at this path (or it cannot be read).');
  }
  if (size > MAX_SCENE_BYTES) {
    throw new InvalidInputError(path, `${size} bytes`, `a scene file of at most ${MAX_SCENE_BYTES} bytes (1 MiB)`, 'Scene files are small; is this the right file?');
  }
  let bytes: Buffer;
  try {
    bytes = readFileSync(path);
  } catch {
    throw new InvalidInputError(path, path, allowed, 'The file cannot be read.');
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new InvalidInputError(path, `${bytes.length} bytes`, 'a text file in UTF-8 (YAML or JSON)', 'The file holds bytes that are not UTF-8 text; is it a picture or a word-processor file?');
  }
  return readSceneText(text, path);
}
