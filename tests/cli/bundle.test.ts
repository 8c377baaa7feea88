/**
 * The bundled command line (src/cli/build.mjs) loads only what each command needs: what the start
 * file imports, and what `sun` and `calendar` import when they run, hold no solver, chart, report,
 * scene reader, YAML parser or matrix library; `calendar` needs no ephemeris either. Read from
 * esbuild's own account of the bundle (its metafile: which source files went into which output file
 * and which output files import which, statically or when run).
 */
import { describe, expect, it } from 'vitest';
// @ts-expect-error: a plain ES module script without type declarations
import { buildCli } from '../../src/cli/build.mjs';

interface Output {
  readonly inputs: Record<string, unknown>;
  readonly imports: readonly { readonly path: string; readonly kind: string; readonly external?: boolean }[];
  readonly entryPoint?: string;
}

/** Every source file a set of output files loads before running, following static imports only. */
function loadedSources(outputs: Record<string, Output>, starts: readonly string[]): Set<string> {
  const seen = new Set<string>();
  const sources = new Set<string>();
  const visit = (file: string): void => {
    if (seen.has(file)) return;
    seen.add(file);
    const out = outputs[file];
    for (const input of Object.keys(out.inputs)) sources.add(input);
    for (const i of out.imports) if (!i.external && i.kind === 'import-statement') visit(i.path);
  };
  starts.forEach(visit);
  return sources;
}

const HEAVY = [/^src\/solver\//, /^src\/charts\//, /^src\/report\/html/, /^src\/scene\/readScene/, /node_modules\/yaml\//, /node_modules\/ml-matrix\//];

describe('the bundled command line', () => {
  it('loads no solver, charts, report, scene reader, YAML or matrix code to start, nor to run sun or calendar', async () => {
    const result = (await (buildCli as (o: object) => Promise<{ metafile: { outputs: Record<string, Output> } }>)({ metafile: true, write: false })).metafile;
    const outputs = result.outputs;
    const start = Object.keys(outputs).find((f) => outputs[f].entryPoint === 'src/cli/main.ts');
    expect(start).toBe('dist/bin/heliochron.js');
    const commandFile = (name: string): string => {
      const file = Object.keys(outputs).find((f) => outputs[f].entryPoint === `src/cli/${name}.ts`);
      expect(file, `${name} is a file of its own, loaded when the command runs`).toBeDefined();
      return file!;
    };
    const atStart = loadedSources(outputs, [start!]);
    const sun = loadedSources(outputs, [start!, commandFile('sunCommand')]);
    const calendar = loadedSources(outputs, [start!, commandFile('calendarCommand')]);
    const date = loadedSources(outputs, [start!, commandFile('dateCommand')]);
    for (const [name, sources] of [['start', atStart], ['sun', sun], ['calendar', calendar]] as const) {
      const heavy = [...sources].filter((s) => HEAVY.some((h) => h.test(s)));
      expect(heavy, `${name} loads`).toEqual([]);
    }
    expect([...atStart].filter((s) => /astronomy-engine|luxon|tzHistoryJson/.test(s))).toEqual([]);
    expect([...calendar].filter((s) => /astronomy-engine/.test(s))).toEqual([]);
    // The split is real: sun needs the ephemeris, date the solver and the scene reader.
    expect([...sun].some((s) => s.includes('astronomy-engine'))).toBe(true);
    expect([...date].some((s) => s === 'src/solver/solveDates.ts')).toBe(true);
    expect([...date].some((s) => s.includes('node_modules/yaml/'))).toBe(true);
  });
});
