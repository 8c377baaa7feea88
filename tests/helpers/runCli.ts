/**
 * Run the heliochron CLI in a test: through the compiled CLI when dist/ is built
 * (npx tsc -p tsconfig.json), else through main() imported from src/cli/main.ts.
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/** The repository root (the working folder of every run). */
export const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const COMPILED = `${ROOT}dist/cli/main.js`;

export interface CliRun {
  readonly code: number;
  readonly out: string;
  readonly err: string;
}

/** Run `heliochron <args>` from the repository root and capture its exit code and output. */
export async function runCli(args: readonly string[]): Promise<CliRun> {
  if (existsSync(COMPILED)) {
    const r = spawnSync(process.execPath, [COMPILED, ...args], { encoding: 'utf8', cwd: ROOT });
    return { code: r.status ?? -1, out: r.stdout, err: r.stderr };
  }
  const { main } = await import('../../src/cli/main.js');
  let out = '';
  let err = '';
  const code = await main(args, { out: (t) => { out += t; }, err: (t) => { err += t; }, errIsTerminal: false, cwd: ROOT });
  return { code, out, err };
}
