/**
 * The file the package's `bin` names (bundled by src/cli/build.mjs into dist/bin/heliochron.cjs, a
 * CommonJS file: Node starts its ES module loader only for an ES module, which costs a start some
 * milliseconds). It runs the command line, bundled into one script beside it (PROGRAM_FILE), through
 * V8's code cache: the script is compiled by node:vm's Script with the cached data that the build
 * made for the command asked for (`program.sun.cache` for `heliochron sun ...`, else
 * `program.start.cache`), produced after running a typical case of that command, so that what the
 * command runs is read back already compiled instead of being parsed and compiled again
 * (Node.js documentation, vm module: `new vm.Script(code, { cachedData })`, `script.createCachedData()`).
 *
 * Nothing is written at run time. Cached data that V8 rejects (made by another Node or V8 version,
 * or with other V8 flags) or a missing cache file only cost the compile the cache would have saved:
 * the program then runs exactly as without a cache. The cache files and the script are made by the
 * same build and removed together by the next one.
 * Only esbuild compiles this file (it is CommonJS once bundled): tsconfig.json leaves it out of tsc's
 * dist/, tsconfig.test.json type-checks it.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { Script } from 'node:vm';

/** The bundled command line (src/cli/main.ts and all it imports), beside this file. */
export const PROGRAM_FILE = 'program.js';
/** The cache file used when no command has one of its own (`--help`, `--version`, a mistyped command). */
export const START_CACHE = 'start';

/** The cache file of a command's runs, beside the program. */
export function cacheFileName(name: string): string {
  return `program.${name}.cache`;
}

/** What the bundled program exports (src/cli/main.ts). */
export interface BundledProgram {
  readonly runAsProgram: (argv: readonly string[]) => Promise<void>;
  /** Ends the process at once when the run's output is all written (src/cli/processOutput.ts). */
  readonly endWhenWritten: () => void;
}

export interface LoadedProgram {
  readonly program: BundledProgram;
  /** The compiled script: `cachedDataRejected` tells whether given cached data was used; the build calls `createCachedData()`. */
  readonly script: Script;
}

/**
 * Compile and run the bundled program in this process. The script holds one function of
 * (exports, require, module, programUrl); programUrl stands for the program's own `import.meta.url`
 * (the bundle is built with `import.meta.url` defined as that name), so that the files it reads
 * relative to itself (../../package.json, ../../dist/desk-page/) are found as from dist/cli/main.js.
 * `command` is the run's command (its first argument): it sets V8's tier-up budget (tierUpFlags).
 */
export function loadProgram(folder: string, cachedData: Buffer | undefined, command: string | undefined): LoadedProgram {
  const flags = tierUpFlags(process.versions.v8, command);
  if (flags !== null) (require('node:v8') as typeof import('node:v8')).setFlagsFromString(flags);
  const file = join(folder, PROGRAM_FILE);
  // ASCII text (src/cli/build.mjs checks it), so Latin-1 reads the same string, and faster than UTF-8.
  const script = new Script(readFileSync(file, 'latin1'), { filename: file, cachedData });
  const wrapper = script.runInThisContext() as (exports: object, req: NodeRequire, module: { exports: object }, programUrl: string) => void;
  const programModule = { exports: {} };
  wrapper(programModule.exports, require, programModule, pathToFileURL(file).href);
  return { program: programModule.exports as BundledProgram, script };
}

/**
 * V8's tier-up budget for the commands that solve. V8 sends a function to its optimising compiler
 * (TurboFan) once the function has run some amount of bytecode, its interrupt budget (`--interrupt-budget`,
 * 67,584 in V8 11.3, Node 20's). A command line process lives a fraction of a second: with that default,
 * `date` on the Marktgasse example sends over a hundred functions to the optimising compiler, whose work
 * on V8's helper threads (measured with Linux perf on a 2-core machine: about 100 ms of CPU for `date`,
 * 500 ms for `report`, more than the main thread's own) takes the machine's cores from the main thread,
 * mostly for code that the run then hardly uses. With the budget about 4.4 times larger, only what runs
 * long is optimised (the helper threads' CPU: about 10 ms for `date`, 100 ms for `report`): `date` and
 * `report` end about a third sooner on a 2-core machine, and long solves no later
 * (bench/cli-startup.mjs, bench/solver-growth.mjs; docs/architecture.md). Every number is the same: V8
 * computes the same floating-point results in every tier (ECMAScript fixes each operation's result).
 */
export const TIER_UP_BUDGET = 300_000;

/** The commands that read a scene and fit it (the solver's work): they run with TIER_UP_BUDGET. */
export const SCENE_COMMANDS: readonly string[] = ['date', 'check', 'measure', 'chart', 'report'];

/**
 * The V8 flags the program sets for itself before compiling (`v8.setFlagsFromString`) for a run of
 * `command`, or null for V8's defaults: only for SCENE_COMMANDS (the others run too briefly to gain,
 * and loading node:v8 costs a start about 2 ms) and only under V8 11 (Node 20), where the budget was
 * measured; another V8 may weigh its budget otherwise. The code cache of a command is made by the build
 * with the same flags (V8 refuses a cache made under other flags).
 */
export function tierUpFlags(v8Version: string, command: string | undefined): string | null {
  if (command === undefined || !SCENE_COMMANDS.includes(command)) return null;
  return /^11\./.test(v8Version) ? `--interrupt-budget=${TIER_UP_BUDGET}` : null;
}

/** The cached data for a run with these arguments, or undefined when there is none. */
export function cachedDataFor(folder: string, argv: readonly string[]): Buffer | undefined {
  const command = argv[0];
  const names = command !== undefined && /^[a-z]+$/.test(command) ? [command, START_CACHE] : [START_CACHE];
  for (const name of names) {
    try {
      return readFileSync(join(folder, cacheFileName(name)));
    } catch {
      // no cache for this command: try the next, else compile without one
    }
  }
  return undefined;
}

if (require.main === module) {
  const argv = process.argv.slice(2);
  const { program } = loadProgram(__dirname, cachedDataFor(__dirname, argv), argv[0]);
  void program.runAsProgram(argv).then(program.endWhenWritten);
}
