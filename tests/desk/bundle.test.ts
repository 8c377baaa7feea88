/**
 * The measuring desk's page and its worker bundle for the browser from the library's own modules
 * (src/desk/build.mjs, esbuild, platform browser) with no stand-in for Node's built-ins: nothing in
 * their imports, core or front end, needs one.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { bundleForBrowser, ROOT } from '../helpers/browserBundle.js';

describe('the desk bundle', () => {
  it('builds the page and the worker for the browser with no Node built-in and no shim', async () => {
    const { result, builtins } = await bundleForBrowser({ desk: 'src/desk/main.ts', worker: 'src/desk/worker.ts' });
    expect(result.errors).toEqual([]);
    expect(builtins).toEqual([]);
    // The worker carries the data tables it solves with (the reform table and the zone history).
    const worker = result.outputFiles.find((f) => f.path.endsWith('worker.js'));
    expect(worker?.text).toContain('great-britain');
    expect(worker?.text).toContain('Europe/Amsterdam');
  });

  it('src/desk/build.mjs sets no alias for Node built-ins', () => {
    const script = readFileSync(`${ROOT}src/desk/build.mjs`, 'utf8');
    expect(script).not.toMatch(/alias|nodeShim|inject/);
  });
});
