#!/usr/bin/env node
/**
 * Build the measuring desk's page into dist/desk-page with esbuild: desk.js (the page) and
 * worker.js (the date solver in a Web Worker), each one self-contained bundle of src/desk and
 * the library modules it imports (never a copy), plus index.html and desk.css. Run by
 * `npm run build` and by `npm ci` (the prepare script); nothing is fetched at run time.
 *
 * No shim: the library's core and the front-end modules the page imports hold no Node
 * built-in (the data tables come as generated modules, scripts/build-data-modules.mjs), so a
 * `node:` import that creeps in fails this build (platform browser) and tests/desk/bundle.test.ts.
 */
import { build } from 'esbuild';
import { copyFileSync, mkdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../../', import.meta.url));
const out = `${root}dist/desk-page`;
mkdirSync(out, { recursive: true });
await build({
  absWorkingDir: root,
  entryPoints: { desk: 'src/desk/main.ts', worker: 'src/desk/worker.ts' },
  outdir: out,
  bundle: true,
  format: 'esm',
  platform: 'browser',
  target: 'es2022',
  minify: true,
  sourcemap: false,
  legalComments: 'eof',
  logLevel: 'warning',
  define: { HELIOCHRON_VERSION: JSON.stringify(JSON.parse(readFileSync(`${root}package.json`, 'utf8')).version) },
});
for (const file of ['index.html', 'desk.css']) copyFileSync(`${root}src/desk/${file}`, `${out}/${file}`);
