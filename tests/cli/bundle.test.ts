/**
 * The bundled command line (src/cli/build.mjs): one script, program.js, run by the package's bin
 * (dist/bin/heliochron.cjs, src/cli/bin.ts) through V8's code cache.
 * - It initialises only what each command needs: what main.ts imports (followed through static
 *   imports in esbuild's own account of the bundle, its metafile) holds no solver, chart, report,
 *   scene reader, YAML parser or matrix library, nor does what `sun` or `calendar` adds; and in the
 *   program's text, what a command imports when it runs sits inside esbuild's wrapper of a module
 *   initialised on first use (`"src/solver/solveDates.ts"(){...}`), so that its code runs only then.
 * - The code cache made at build time is accepted by this Node and changes no output; cached data
 *   that V8 rejects is passed over silently.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
// @ts-expect-error: a plain ES module script without type declarations
import { buildCli, BIN_FILE } from '../../src/cli/build.mjs';
import { BIN, ROOT } from '../helpers/runCli.js';

interface Input {
  readonly imports: readonly { readonly path: string; readonly kind: string; readonly external?: boolean }[];
}
interface BuildResult {
  readonly metafile: { readonly inputs: Record<string, Input> };
  readonly outputFiles: readonly { readonly text: string }[];
}
const build = buildCli as (o: object) => Promise<BuildResult>;

/** Every source file initialised with these, following static imports and requires (not `import()`). */
function initialisedWith(inputs: Record<string, Input>, starts: readonly string[]): Set<string> {
  const seen = new Set<string>();
  const visit = (file: string): void => {
    if (seen.has(file)) return;
    seen.add(file);
    for (const i of inputs[file].imports) if (!i.external && i.kind !== 'dynamic-import') visit(i.path);
  };
  starts.forEach(visit);
  return seen;
}

const HEAVY = [/^src\/solver\//, /^src\/charts\//, /^src\/report\/html/, /^src\/scene\/readScene/, /node_modules\/yaml\//, /node_modules\/ml-matrix\//];

describe('the bundled command line', () => {
  it('initialises no solver, charts, report, scene reader, YAML or matrix code to start, nor to run sun or calendar', async () => {
    const result = await build({ metafile: true, write: false });
    const inputs = result.metafile.inputs;
    const start = initialisedWith(inputs, ['src/cli/main.ts']);
    const sun = initialisedWith(inputs, ['src/cli/main.ts', 'src/cli/sunCommand.ts']);
    const calendar = initialisedWith(inputs, ['src/cli/main.ts', 'src/cli/calendarCommand.ts']);
    const date = initialisedWith(inputs, ['src/cli/main.ts', 'src/cli/dateCommand.ts']);
    for (const [name, sources] of [['start', start], ['sun', sun], ['calendar', calendar]] as const) {
      expect([...sources].filter((s) => HEAVY.some((h) => h.test(s))), `${name} initialises`).toEqual([]);
    }
    expect([...start].filter((s) => /astronomy-engine|luxon|tzHistoryJson/.test(s))).toEqual([]);
    expect([...calendar].filter((s) => /astronomy-engine/.test(s))).toEqual([]);
    // The split is real: sun needs the ephemeris, date the solver and the scene reader.
    expect([...sun].some((s) => s.includes('astronomy-engine'))).toBe(true);
    expect([...date].some((s) => s === 'src/solver/solveDates.ts')).toBe(true);
    expect([...date].some((s) => s.includes('node_modules/yaml/'))).toBe(true);
    // In the one script, what the start does not initialise waits in its module's wrapper.
    const text = result.outputFiles[0].text;
    for (const source of ['src/solver/solveDates.ts', 'src/cli/sunCommand.ts', 'src/report/html.ts', 'src/scene/readScene.ts', 'src/time/tzHistoryJson.generated.ts']) {
      expect(start.has(source), source).toBe(false);
      expect(text.includes(`"${source}"(){`), `${source} is initialised on first use`).toBe(true);
    }
    expect(text.includes('"src/cli/main.ts"(){'), 'main.ts runs at once').toBe(false);
  });

  it('the program is ASCII text (the bin reads it as Latin-1, the same string for ASCII)', async () => {
    const text = (await build({ write: false })).outputFiles[0].text;
    expect(text.search(/[^\x00-\x7f]/)).toBe(-1);
  });
});

describe('the code cache of the bundled command line', () => {
  // Built apart from dist/bin (which the tests' global set-up builds without caches), one folder
  // below dist/ as dist/bin is, with the cache of `sun` only.
  const folder = join(ROOT, 'dist/bin-cache-test');
  const bin = join(folder, 'heliochron.cjs');
  afterAll(() => rmSync(folder, { recursive: true, force: true }));
  const SUN = ['sun', '--lat', '47.62', '--lon', '9.35', '--elevation', '410', '--date', '1650-03-10', '--time', '10:30', '--clock', 'apparent'];
  /** Whether V8 took the cached data that the bin would give to these arguments: true, false, or 'none' without a file. */
  const cacheTaken = (args: readonly string[]): string => {
    const script =
      `const b = require(${JSON.stringify(bin)}); const d = b.cachedDataFor(${JSON.stringify(folder)}, ${JSON.stringify(args)});` +
      `console.log(d === undefined ? 'none' : String(!b.loadProgram(${JSON.stringify(folder)}, d, ${JSON.stringify(args[0])}).script.cachedDataRejected));`;
    const r = spawnSync(process.execPath, ['-e', script], { encoding: 'utf8', cwd: ROOT });
    expect(r.stderr).toBe('');
    return r.stdout.trim();
  };
  const run = (file: string, args: readonly string[]) => spawnSync(process.execPath, [file, ...args], { encoding: 'utf8', cwd: ROOT });

  it('is made at build time, taken by this Node, and changes no output', async () => {
    await build({ outDir: 'dist/bin-cache-test', warmUps: ['sun'] });
    expect(existsSync(join(folder, 'program.sun.cache'))).toBe(true);
    expect(existsSync(join(folder, 'program.date.cache'))).toBe(false);
    expect(cacheTaken(SUN)).toBe('true');
    expect(cacheTaken(['date', 'examples/marktgasse-print.yaml'])).toBe('none');
    expect(BIN.endsWith(BIN_FILE as string)).toBe(true);
    const withCache = run(bin, SUN);
    const without = run(BIN, SUN); // dist/bin, built by the global set-up without caches
    expect(withCache.status).toBe(0);
    expect(withCache.stderr).toBe('');
    // The sun at Velmar on 10 March 1650 at 10:30 local apparent time: south-east (before noon) and well up.
    expect(withCache.stdout).toMatch(/azimuth\s+15\d\.\d{4} deg/);
    expect(withCache.stdout).toBe(without.stdout);
    // The data modules the sun at a local apparent time does not read wait for their first use
    // (LAZY_DATA_MODULES of src/cli/build.mjs): their text is not in its cache.
    // V8 keeps a string of Latin-1 characters one byte a character, any other in UTF-16 (the reforms name places with umlauts).
    const cache = readFileSync(join(folder, 'program.sun.cache'));
    const holds = (text: string): boolean => cache.includes(Buffer.from(text, 'latin1')) || cache.includes(Buffer.from(text, 'utf16le'));
    expect(holds('Africa/Abidjan'), 'the table of time zones before 1970').toBe(false);
    expect(holds('Civil calendar in force by region'), 'the table of calendar reforms').toBe(false);
  });

  it('cached data that V8 rejects is passed over silently: the same output', () => {
    writeFileSync(join(folder, 'program.sun.cache'), Buffer.alloc(4096, 7));
    expect(cacheTaken(SUN)).toBe('false');
    const r = run(bin, SUN);
    expect(r.status).toBe(0);
    expect(r.stderr).toBe('');
    expect(r.stdout).toBe(run(BIN, SUN).stdout);
  });
});

describe("V8's tier-up budget of the commands that solve (src/cli/bin.ts, tierUpFlags)", () => {
  // The bin's own export, as built (dist/bin, by the tests' global set-up).
  const flagsFor = (v8Version: string, command: string | null): string => {
    const script = `console.log(String(require(${JSON.stringify(BIN)}).tierUpFlags(${JSON.stringify(v8Version)}, ${command === null ? 'undefined' : JSON.stringify(command)})))`;
    const r = spawnSync(process.execPath, ['-e', script], { encoding: 'utf8', cwd: ROOT });
    expect(r.stderr).toBe('');
    return r.stdout.trim();
  };

  it('is raised for the commands that read a scene, under the V8 of Node 20 only', () => {
    // Node 20.20's V8 is 11.3.244 (process.versions.v8); the default budget there is 67,584 (`node --v8-options`).
    for (const command of ['date', 'check', 'measure', 'chart', 'report']) expect(flagsFor('11.3.244.8-node.33', command)).toBe('--interrupt-budget=300000');
    for (const command of ['sun', 'moon', 'calendar', 'desk', '--help', 'dates']) expect(flagsFor('11.3.244.8-node.33', command)).toBe('null');
    expect(flagsFor('11.3.244.8-node.33', null)).toBe('null');
    // Another V8 keeps its defaults (its budget may be weighed otherwise).
    expect(flagsFor('12.4.254.21-node.33', 'date')).toBe('null');
    expect(flagsFor('10.2.154.26-node.36', 'report')).toBe('null');
  });

  it('is taken by this Node: the bin prints nothing more, and its answer is the one of the same program run here with V8 defaults', async () => {
    const args = ['date', 'examples/marktgasse-print.yaml', '--json'];
    expect(process.versions.v8.startsWith('11.')).toBe(true); // the Node of this project (README: Node 20): the budget applies
    const r = spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', cwd: ROOT });
    expect(r.status).toBe(0);
    expect(r.stderr).toBe('');
    const { main } = await import('../../src/cli/main.js');
    let out = '';
    const code = await main(args, { out: (t: string) => { out += t; }, err: () => undefined, errIsTerminal: false, cwd: ROOT });
    expect(code).toBe(0);
    expect(JSON.parse(r.stdout).candidates.length).toBeGreaterThan(0);
    expect(r.stdout).toBe(out);
  });
});
