/**
 * Run the heliochron CLI in a test: as a user runs it, through the package's `bin` (dist/bin/heliochron.cjs,
 * the bundle that tests/helpers/buildCli.ts builds before the tests), else through main() imported
 * from src/cli/main.ts.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/** The repository root (the working folder of every run). */
export const ROOT = fileURLToPath(new URL('../../', import.meta.url));
/** The program the package's `bin` names (the bundled command line), absolute. */
export const BIN = `${ROOT}${(JSON.parse(readFileSync(`${ROOT}package.json`, 'utf8')) as { bin: { heliochron: string } }).bin.heliochron}`;

export interface CliRun {
  readonly code: number;
  readonly out: string;
  readonly err: string;
}

/** Run `heliochron <args>` from the repository root and capture its exit code and output. */
export async function runCli(args: readonly string[]): Promise<CliRun> {
  if (existsSync(BIN)) {
    const r = spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', cwd: ROOT });
    return { code: r.status ?? -1, out: r.stdout, err: r.stderr };
  }
  const { main } = await import('../../src/cli/main.js');
  let out = '';
  let err = '';
  const code = await main(args, { out: (t) => { out += t; }, err: (t) => { err += t; }, errIsTerminal: false, cwd: ROOT });
  return { code, out, err };
}
