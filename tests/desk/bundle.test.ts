/**
 * The measuring desk's page and its worker bundle for the browser from the library's own modules
 * (src/desk/build.mjs, esbuild, platform browser) with no stand-in for Node's built-ins: nothing in
 * their imports, core or front end, needs one.
 */
import { fileURLToPath } from 'node:url';
import { builtinModules } from 'node:module';
import { build } from 'esbuild';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

describe('the desk bundle', () => {
  it('builds the page and the worker for the browser with no Node built-in and no shim', async () => {
    const result = await build({
      absWorkingDir: ROOT,
      entryPoints: { desk: 'src/desk/main.ts', worker: 'src/desk/worker.ts' },
      outdir: 'dist/desk-page-test',
      bundle: true,
      format: 'esm',
      platform: 'browser',
      target: 'es2022',
      write: false,
      metafile: true,
      logLevel: 'silent',
      define: { HELIOCHRON_VERSION: '"test"' },
    });
    expect(result.errors).toEqual([]);
    const builtins = Object.entries(result.metafile.inputs).flatMap(([file, input]) =>
      input.imports.filter((i) => i.path.startsWith('node:') || builtinModules.includes(i.path)).map((i) => `${file} -> ${i.path}`),
    );
    expect(builtins).toEqual([]);
    // The worker carries the data tables it solves with (the reform table and the zone history).
    const worker = result.outputFiles.find((f) => f.path.endsWith('worker.js'));
    expect(worker?.text).toContain('great-britain');
    expect(worker?.text).toContain('Europe/Amsterdam');
  });

  it('src/desk/build.mjs sets no alias for Node built-ins', async () => {
    const { readFileSync } = await import('node:fs');
    const script = readFileSync(`${ROOT}src/desk/build.mjs`, 'utf8');
    expect(script).not.toMatch(/alias|nodeShim|inject/);
  });
});
