#!/usr/bin/env node
/**
 * Build the measuring desk's page into dist/desk-page with esbuild: desk.js (the page) and
 * worker.js (the date solver in a Web Worker), each one self-contained bundle of src/desk and
 * the library modules it imports (never a copy), plus index.html and desk.css. Run by
 * `npm run build` and by `npm ci` (the prepare script); nothing is fetched at run time.
 *
 * Modules the page imports for their pure functions also import node:fs, node:path or
 * node:crypto for file handling the page never runs; those are replaced in the bundle by
 * nodeShim.cjs, which also hands over the bundled data/calendar-reforms.json.
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
  alias: { 'node:fs': './src/desk/nodeShim.cjs', 'node:path': './src/desk/nodeShim.cjs', 'node:crypto': './src/desk/nodeShim.cjs' },
  minify: true,
  sourcemap: false,
  legalComments: 'eof',
  logLevel: 'warning',
  define: { HELIOCHRON_VERSION: JSON.stringify(JSON.parse(readFileSync(`${root}package.json`, 'utf8')).version) },
});
for (const file of ['index.html', 'desk.css']) copyFileSync(`${root}src/desk/${file}`, `${out}/${file}`);
