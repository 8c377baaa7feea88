#!/usr/bin/env node
/**
 * Build the command line into dist/bin with esbuild (the bundler of the desk's page,
 * src/desk/build.mjs): heliochron.js, the program the package's `bin` names, plus one file per
 * part that a command loads when it runs (the `import()` in each `*Spec.ts` becomes a split
 * point). A start then reads a handful of files instead of some 150 modules, and `sun` or
 * `calendar` never parses the solver, the charts, the report or the YAML reader.
 * Run by `npm run build`, `npm ci` (the prepare script) and the tests' global set-up
 * (tests/helpers/buildCli.ts), after tsc; the library itself stays tsc's dist/ (index.js, node.js).
 *
 * The files sit one folder below dist/ like dist/cli/main.js, so that the paths the program reads
 * relative to itself (../../package.json, ../../dist/desk-page/) hold for both.
 * Usage: node src/cli/build.mjs [--metafile]   (--metafile: print what each file holds)
 */
import { build } from 'esbuild';
import { rmSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../../', import.meta.url));
/** Where the program lands; `bin` in package.json names BIN_FILE. */
export const BIN_DIR = 'dist/bin';
export const BIN_FILE = `${BIN_DIR}/heliochron.js`;

/**
 * Bundle the command line into dist/bin; returns esbuild's result (its metafile when asked).
 * With `write: false` nothing is written or removed (the files are in the result).
 */
export async function buildCli({ metafile = false, write = true } = {}) {
  if (write) rmSync(`${root}${BIN_DIR}`, { recursive: true, force: true });
  return build({
    write,
    absWorkingDir: root,
    entryPoints: { heliochron: 'src/cli/main.ts' },
    outdir: BIN_DIR,
    chunkNames: '[name]-[hash]',
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    // Parsing less text is most of a faster start; names stay as written, so an internal error reads the same.
    minifyWhitespace: true,
    minifySyntax: true,
    sourcemap: false,
    legalComments: 'eof',
    logLevel: 'warning',
    metafile,
    // commander and yaml are CommonJS and require Node's built-ins: give them Node's own require.
    banner: { js: "import { createRequire as __heliochronRequire } from 'node:module'; const require = __heliochronRequire(import.meta.url);" },
  });
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const result = await buildCli({ metafile: process.argv.includes('--metafile') });
  if (result.metafile) {
    for (const [file, out] of Object.entries(result.metafile.outputs)) {
      console.log(`${file}  ${(out.bytes / 1024).toFixed(0)} KB  imports: ${out.imports.filter((i) => !i.external).map((i) => `${i.path}${i.kind === 'dynamic-import' ? ' (when run)' : ''}`).join(', ')}`);
    }
  }
}
