#!/usr/bin/env node
/**
 * Build the command line into dist/bin with esbuild (the bundler of the desk's page,
 * src/desk/build.mjs), for a fast start:
 * - program.js: src/cli/main.ts and everything it imports in one script (CommonJS form, wrapped in
 *   one function that src/cli/bin.ts calls). What a command imports with `import()` (its work, in
 *   `*Command.ts`) is only initialised when the command runs, so `sun` or `calendar` never runs
 *   the solver's, the charts' or the YAML reader's module code; Node's built-ins that the start
 *   does not need (LAZY_BUILTINS), luxon (LAZY_PACKAGES) and the large data modules
 *   (LAZY_DATA_MODULES) are loaded or initialised at their first use.
 * - heliochron.cjs, the file the package's `bin` names (src/cli/bin.ts): it compiles program.js
 *   with V8's code cache.
 * - program.NAME.cache: the code cache of each case of WARM_UPS, made after running that case
 *   once in a fresh process (so that the functions it ran are in the cache, not only the top
 *   level): `heliochron sun ...` then reads back compiled code instead of parsing and compiling.
 *   A cache that fails to build is left out with a warning (the program runs without it).
 * Run by `npm run build`, `npm ci` (the prepare script) and the tests' global set-up
 * (tests/helpers/buildCli.ts, without the caches), after tsc; the library itself stays tsc's
 * dist/ (index.js, node.js).
 *
 * The files sit one folder below dist/ like dist/cli/main.js, so that the paths the program reads
 * relative to itself (../../package.json, ../../dist/desk-page/) hold for both.
 * Usage: node src/cli/build.mjs [--metafile]   (--metafile: print what the program holds, largest first)
 */
import { build } from 'esbuild';
import { execFile } from 'node:child_process';
import { createRequire } from 'node:module';
import { chmodSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, dirname, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';

const root = fileURLToPath(new URL('../../', import.meta.url));
/** Where the program lands; `bin` in package.json names BIN_FILE. */
export const BIN_DIR = 'dist/bin';
export const BIN_FILE = `${BIN_DIR}/heliochron.cjs`;
/** The bundled program beside BIN_FILE (PROGRAM_FILE of src/cli/bin.ts). */
export const PROGRAM_FILE = 'program.js';

/**
 * Node built-ins that the program loads at their first use instead of at the start: commander
 * requires node:child_process (for sub-commands kept in other files, which heliochron has none of)
 * and the output writer node:crypto (for temporary names), src/cli/processOutput.ts node:tty (only
 * when stderr is a character device); loading them takes some milliseconds of every start.
 */
export const LAZY_BUILTINS = ['node:child_process', 'node:crypto', 'node:tty'];

/**
 * The runs whose compiled code is cached: NAME (the command, or `start` for every other run) and
 * the arguments of one typical case, run from the repository root; `{out}` is a temporary folder.
 * Each cache is some hundreds of kilobytes to 1.4 MB (about 40% of that in the packed package):
 * the commands with a speed target and `calendar`; the others (moon, check, chart, measure, desk)
 * use the cache of `start` and compile the rest of what they run.
 */
export const WARM_UPS = [
  { name: 'start', args: ['--help'] },
  { name: 'sun', args: ['sun', '--lat', '47.62', '--lon', '9.35', '--elevation', '410', '--date', '1650-03-10', '--time', '10:30', '--clock', 'apparent'] },
  { name: 'calendar', args: ['calendar', '1752-09-14', '--calendar', 'great-britain'] },
  { name: 'date', args: ['date', 'examples/marktgasse-print.yaml'] },
  { name: 'report', args: ['report', 'examples/marktgasse-print.yaml', '-o', '{out}/report.html', '--force'] },
];

/**
 * Packages that the program initialises at their first use instead of with the module that imports
 * them: luxon (time zones) serves only a clock given as a zone (src/time/clock.ts), yet clock.ts
 * is loaded by every command that reads a clock; its initialisation and its code in the code
 * cache cost every such run some tenths of a millisecond.
 */
export const LAZY_PACKAGES = ['luxon'];

/**
 * Data modules of the library (made by scripts/build-data-modules.mjs: one exported string, the
 * text of a data/ file) that the program initialises at their first use: the table of time zones
 * before 1970 (220 KB, read only for a clock given as a zone) and the calendar reforms (40 KB,
 * read only for a region's calendar). Initialised with the modules that import them, their text
 * would sit in the code cache of every command that loads those modules.
 */
export const LAZY_DATA_MODULES = ['src/time/tzHistoryJson.generated.ts', 'src/calendar/calendarReformsJson.generated.ts'];

/**
 * An esbuild plugin: each of LAZY_BUILTINS and LAZY_PACKAGES becomes a module whose properties
 * load the real one when first read (the bundle reads an imported name at each use,
 * `(0, import_x.name)(...)`). A built-in is then required from Node; a package is bundled as
 * its ES module file (the one an `import` resolves to), initialised by that first read.
 */
const lazyModules = {
  name: 'lazy-modules',
  setup(b) {
    const escaped = [...LAZY_BUILTINS, ...LAZY_PACKAGES].map((name) => name.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&'));
    const filter = new RegExp(`^(${escaped.join('|')})$`);
    const real = {}; // marks esbuild's own resolution of a package, asked for below
    b.onResolve({ filter }, async (args) => {
      if (args.pluginData === real) return undefined;
      if (args.namespace !== 'lazy') return { path: args.path, namespace: 'lazy' };
      if (LAZY_BUILTINS.includes(args.path)) return { path: args.path, external: true };
      // The file an `import` of the package resolves to (its ES module build), not the one of `require`.
      const resolved = await b.resolve(args.path, { kind: 'import-statement', resolveDir: root, pluginData: real });
      if (resolved.errors.length > 0) return { errors: resolved.errors };
      return { path: resolved.path };
    });
    // A data module, imported as './NAME.generated.js', is itself in the 'lazy' namespace (its text read here, once).
    // (named by its path in the repository, so that no folder of the build machine enters the program).
    b.onResolve({ filter: /\.generated\.js$/ }, (args) => {
      const file = join(args.resolveDir, args.path.replace(/\.js$/, '.ts'));
      const name = relative(root, file);
      if (!LAZY_DATA_MODULES.includes(name)) return undefined;
      return args.namespace === 'lazy' ? { path: file } : { path: name, namespace: 'lazy' };
    });
    b.onLoad({ filter: /.*/, namespace: 'lazy' }, (args) => {
      if (LAZY_DATA_MODULES.includes(args.path)) {
        const file = join(root, args.path);
        const names = [...readFileSync(file, 'utf8').matchAll(/^export const (\w+)/gm)].map((m) => m[1]);
        return {
          loader: 'js',
          resolveDir: dirname(file),
          contents:
            `let loaded; const load = () => (loaded ??= require(${JSON.stringify(`./${basename(args.path).replace(/\.ts$/, '.js')}`)}));\n` +
            `for (const name of ${JSON.stringify(names)}) Object.defineProperty(module.exports, name, { enumerable: true, get: () => load()[name] });\n`,
        };
      }
      const names = Object.keys(createRequire(import.meta.url)(args.path));
      return {
        loader: 'js',
        resolveDir: root,
        contents:
          `let loaded; const load = () => (loaded ??= require(${JSON.stringify(args.path)}));\n` +
          `for (const name of ${JSON.stringify(names)}) Object.defineProperty(module.exports, name, { enumerable: true, get: () => load()[name] });\n`,
      };
    });
  },
};

const common = {
  absWorkingDir: root,
  bundle: true,
  format: 'cjs',
  platform: 'node',
  target: 'node20',
  // Less text to read; names stay as written, so an internal error reads the same.
  minifyWhitespace: true,
  minifySyntax: true,
  sourcemap: false,
  legalComments: 'eof',
  logLevel: 'warning',
};

/**
 * Bundle the command line into dist/bin (or `outDir`, a folder one below the repository's, as
 * dist/bin is) and build the code caches of `warmUps` (names of WARM_UPS; none when `codeCache`
 * is false). Returns esbuild's result for the program (its metafile when asked).
 * With `write: false` nothing is written or removed (the program's text is in the result).
 */
export async function buildCli({ metafile = false, write = true, codeCache = write, outDir = BIN_DIR, warmUps = WARM_UPS.map((w) => w.name) } = {}) {
  const result = await build({
    ...common,
    write: false,
    entryPoints: ['src/cli/main.ts'],
    outfile: `${outDir}/${PROGRAM_FILE}`,
    metafile,
    // The program is one function of (exports, require, module, programUrl): see src/cli/bin.ts.
    // The version is written in (src/cli/main.ts), so that a start reads no package.json.
    define: { 'import.meta.url': 'programUrl', BUNDLED_VERSION: JSON.stringify(packageVersion()) },
    banner: { js: '(function (exports, require, module, programUrl) {' },
    footer: { js: '})' },
    plugins: [lazyModules],
  });
  if (!write) return result;
  const folder = join(root, outDir);
  rmSync(folder, { recursive: true, force: true });
  mkdirSync(folder, { recursive: true });
  writeFileSync(join(folder, PROGRAM_FILE), programText(result));
  await build({
    ...common,
    entryPoints: ['src/cli/bin.ts'],
    outfile: `${outDir}/heliochron.cjs`,
    banner: { js: '#!/usr/bin/env node' },
  });
  chmodSync(join(folder, 'heliochron.cjs'), 0o755);
  if (codeCache) await buildCodeCaches(folder, WARM_UPS.filter((w) => warmUps.includes(w.name)));
  return result;
}

/** The version in package.json, written into the program. */
function packageVersion() {
  return JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')).version;
}

/**
 * The program's text as written to PROGRAM_FILE. It must be ASCII: the bin reads it as Latin-1,
 * which for ASCII text is the same string and is read about twice as fast as UTF-8 (esbuild
 * escapes every other character in strings, but not inside a regular expression literal or a
 * String.raw template: write those with \u escapes).
 */
export function programText(result) {
  // main.ts's '#!' line, which esbuild keeps first, has no place in a script run inside the bin.
  const text = result.outputFiles[0].text.replace(/^#!.*\n/, '');
  const at = text.search(/[^\x00-\x7f]/);
  if (at >= 0) {
    throw new Error(`src/cli/build.mjs: the bundled program must be ASCII text, but has ${JSON.stringify(text.slice(Math.max(0, at - 60), at + 10))}: write that character as a \\u escape in its source`);
  }
  return text;
}

/** Run each warm-up in a fresh process (two at a time) that writes the code cache of its run. */
async function buildCodeCaches(folder, warmUps) {
  const run = promisify(execFile);
  const out = mkdtempSync(join(tmpdir(), 'heliochron-warm-up-'));
  const queue = [...warmUps];
  const worker = async () => {
    for (let w = queue.shift(); w !== undefined; w = queue.shift()) {
      const args = w.args.map((a) => a.replace('{out}', out));
      try {
        await run(process.execPath, [fileURLToPath(new URL('./warmCodeCache.cjs', import.meta.url)), folder, w.name, ...args], { cwd: root, maxBuffer: 64 * 1024 * 1024 });
      } catch (error) {
        console.warn(`src/cli/build.mjs: no code cache for ${w.name} (the program runs without it): ${String(error.stderr || error.message).trim()}`);
      }
    }
  };
  try {
    await Promise.all([worker(), worker()]);
  } finally {
    rmSync(out, { recursive: true, force: true });
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const result = await buildCli({ metafile: process.argv.includes('--metafile') });
  if (result.metafile) {
    for (const [file, out] of Object.entries(result.metafile.outputs)) {
      console.log(`${file}  ${(out.bytes / 1024).toFixed(0)} KB`);
      const inputs = Object.entries(out.inputs).sort((a, b) => b[1].bytesInOutput - a[1].bytesInOutput);
      for (const [input, { bytesInOutput }] of inputs) if (bytesInOutput > 0) console.log(`  ${(bytesInOutput / 1024).toFixed(1).padStart(7)} KB  ${input}`);
    }
  }
}
