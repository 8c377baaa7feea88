/** The Node entry (`heliochron/node`) is the public API plus the readers of files on disk. */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import * as browserSafe from '../src/index.js';
import * as forNode from '../src/node.js';

const EXAMPLE = fileURLToPath(new URL('../examples/marktgasse-print.yaml', import.meta.url));

describe('the Node entry', () => {
  it('re-exports every name of the browser-safe entry and adds readSceneFile, which the other lacks', () => {
    for (const name of Object.keys(browserSafe)) expect((forNode as Record<string, unknown>)[name], name).toBe((browserSafe as Record<string, unknown>)[name]);
    expect('readSceneFile' in browserSafe).toBe(false);
    expect(forNode.readSceneFile(EXAMPLE).site.latitudeDeg).toBeTypeOf('number');
  });
});
