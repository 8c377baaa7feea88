/**
 * The process's output written straight to file descriptors 1 and 2 (src/cli/processOutput.ts),
 * through the package's bin: the whole text in order into a pipe and a file, a reader that
 * closes the pipe early as a finished run, a full disk in one line with exit code 2.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { BIN, ROOT } from '../helpers/runCli.js';

// A long answer (a whole day, one row a minute, as JSON: some hundreds of kilobytes, more than a pipe holds).
const DAY = ['sun', '--lat', '47.62', '--lon', '9.35', '--date', '1700-06-18', '--day', '--step', '1', '--json'];
const folder = mkdtempSync(join(tmpdir(), 'heliochron-output-'));
afterAll(() => rmSync(folder, { recursive: true, force: true }));

/** Run a line of bash (for a redirection or a pipe). */
function shell(line: string) {
  return spawnSync('bash', ['-c', line], { encoding: 'utf8', cwd: ROOT, maxBuffer: 64 * 1024 * 1024 });
}
const bin = `"${process.execPath}" "${BIN}"`;

describe.runIf(process.platform !== 'win32')('the output of the command line', () => {
  it('reaches a pipe and a file whole and alike, the JSON complete', () => {
    const piped = spawnSync(process.execPath, [BIN, ...DAY], { encoding: 'utf8', cwd: ROOT, maxBuffer: 64 * 1024 * 1024 });
    expect(piped.status).toBe(0);
    expect(piped.stderr).toBe('');
    expect(piped.stdout.length).toBeGreaterThan(128 * 1024);
    expect(() => JSON.parse(piped.stdout) as unknown).not.toThrow();
    const file = join(folder, 'day.json');
    const written = shell(`${bin} ${DAY.join(' ')} > "${file}"`);
    expect(written.status).toBe(0);
    expect(readFileSync(file, 'utf8')).toBe(piped.stdout);
  });

  it('ends quietly with exit code 0 when the reader closes the pipe early (common practice of Unix filters such as head)', () => {
    // bash's PIPESTATUS: the exit code of the bin, not of head.
    const r = shell(`${bin} ${DAY.join(' ')} | head -c 100 > /dev/null; exit \${PIPESTATUS[0]}`);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
  });

  it.runIf(process.platform === 'linux')('says in one line that the disk is full, with exit code 2 (Linux /dev/full answers every write with ENOSPC)', () => {
    const r = shell(`${bin} ${DAY.join(' ')} > /dev/full`);
    expect(r.status).toBe(2);
    expect(r.stderr).toBe('heliochron: cannot write the output: the disk is full (no space left on the device) [ENOSPC]\n');
  });
});
