/**
 * The command line as separate processes (the package's bin, dist/bin/heliochron.cjs, bundled before the tests): a full disk,
 * system errors, two writers racing, signals, a reader that closes the pipe. Each run must end
 * with one plain line and exit 2, or succeed whole; never a partial file, a temporary file left
 * behind, or a stack trace. Mounting a small file system and mknod need root (the CI runs as root);
 * without root those cases are skipped and the injected short writes of tests/cli/ioSafety.test.ts
 * stand in for the full disk.
 */
import { spawn, spawnSync } from 'node:child_process';
import { chmodSync, copyFileSync, existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { STACK_LINE, tempDir } from './robustHelpers.js';
import { BIN } from '../helpers/runCli.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const MAIN = BIN;
const IO_MODULE = join(ROOT, 'dist/cli/io.js');
const SCENE = join(ROOT, 'examples/upper-gate-drawing.yaml');
const PICTURE_SCENE = join(ROOT, 'examples/tanners-hall-photo/tanners-hall-photo.yaml');
const isRoot = process.getuid?.() === 0;

interface Run {
  readonly code: number | null;
  readonly signal: NodeJS.Signals | null;
  readonly out: string;
  readonly err: string;
}

function run(args: readonly string[], cwd: string, options: { uid?: number } = {}): Promise<Run> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, [MAIN, ...args], { cwd, ...(options.uid !== undefined ? { uid: options.uid, gid: options.uid } : {}) });
    let out = '';
    let err = '';
    child.stdout.on('data', (d: Buffer) => { out += d.toString('utf8'); });
    child.stderr.on('data', (d: Buffer) => { err += d.toString('utf8'); });
    child.on('error', fail);
    child.on('close', (code, signal) => done({ code, signal, out, err }));
  });
}

/** The one-line refusal contract: exit 2, one line on stderr starting "heliochron: ", nothing on stdout, no stack. */
function expectRefusal(r: Run, pattern: RegExp): void {
  expect(r.code, r.err).toBe(2);
  expect(r.out).toBe('');
  expect(r.err).toMatch(/^heliochron: [^\n]*\n$/);
  expect(r.err).toMatch(pattern);
  expect(r.err).not.toMatch(STACK_LINE);
  expect(r.err).not.toContain('internal error');
}

const temporaryFiles = (dir: string): string[] => readdirSync(dir).filter((n) => n.endsWith('.tmp'));

let work: string;
let reference: string;
beforeAll(async () => {
  expect(existsSync(MAIN), 'dist/ is built by `npm test` before the tests run').toBe(true);
  work = tempDir('heliochron-processes-');
  // The report as written whole, to compare what interrupted and failed runs leave.
  mkdirSync(join(work, 'reference'));
  const r = await run(['report', SCENE, '-o', 'r.html'], join(work, 'reference'));
  expect(r.code, r.err).toBe(0);
  reference = readFileSync(join(work, 'reference', 'r.html'), 'utf8');
});
afterAll(() => {
  rmSync(work, { recursive: true, force: true });
});

/** Mount a tmpfs of `size` at `dir`; false when this machine does not allow it (not root, no mount). */
function mountTmpfs(dir: string, options: string): boolean {
  if (!isRoot) return false;
  mkdirSync(dir, { recursive: true });
  return spawnSync('mount', ['-t', 'tmpfs', '-o', options, 'tmpfs', dir]).status === 0;
}

describe('a full disk', () => {
  it('refuses in plain words, keeps the previous file byte for byte and leaves no temporary file (160 KiB tmpfs)', async (context) => {
    const small = join(work, 'small');
    if (!mountTmpfs(small, 'size=160k')) {
      context.skip(); // no root or no mount here: tests/cli/ioSafety.test.ts injects the short write instead
      return;
    }
    try {
      const first = await run(['report', SCENE, '-o', 'small/r.html'], work);
      expect(first.code, first.err).toBe(0);
      const before = readFileSync(join(small, 'r.html'));
      // The second copy does not fit beside the first one: the write fails part way.
      const second = await run(['report', SCENE, '-o', 'small/r.html', '--force'], work);
      expectRefusal(second, /^heliochron: output file "small\/r\.html" cannot be written: the disk is full \(no space left on the device\) \[ENOSPC\]; nothing was written/);
      expect(readFileSync(join(small, 'r.html')).equals(before)).toBe(true);
      expect(readdirSync(small)).toEqual(['r.html']);
    } finally {
      spawnSync('umount', [small]);
    }
  });
});

describe('system errors on -o: one plain line, exit 2, checked before the work', () => {
  it('EISDIR, ENOTDIR, ENAMETOOLONG, EEXIST, a missing folder, a device', async () => {
    const dir = join(work, 'errors');
    mkdirSync(join(dir, 'folder'), { recursive: true });
    writeFileSync(join(dir, 'file'), 'x');
    writeFileSync(join(dir, 'taken.json'), 'keep');
    expectRefusal(await run(['date', SCENE, '-o', 'folder', '--force'], dir), /output file "folder" is a folder, not a regular file/);
    expectRefusal(await run(['date', SCENE, '-o', 'file/a.json'], dir), /output file "file\/a\.json" cannot be written: a part of the path is a file, not a folder \[ENOTDIR\]/);
    expectRefusal(await run(['date', SCENE, '-o', `${'n'.repeat(300)}.json`], dir), /cannot be written: the name is too long for the file system .*\[ENAMETOOLONG\]/);
    expectRefusal(await run(['date', SCENE, '-o', 'taken.json'], dir), /output file "taken\.json" exists already; add --force to replace it/);
    expectRefusal(await run(['date', SCENE, '-o', 'nowhere/a.json'], dir), /folder "nowhere" for the output file does not exist/);
    expectRefusal(await run(['date', SCENE, '-o', '/dev/null', '--force'], dir), /output file "\/dev\/null" is a character device/);
    expect(readFileSync(join(dir, 'taken.json'), 'utf8')).toBe('keep');
    expect(temporaryFiles(dir)).toEqual([]);
  });

  it('EACCES: a folder the user may not write in (run as an unprivileged user when the tests run as root)', async () => {
    const dir = join(work, 'locked');
    mkdirSync(dir);
    chmodSync(work, 0o755);
    chmodSync(dir, 0o555);
    const r = await run(['date', SCENE, '-o', join(dir, 'a.json')], work, isRoot ? { uid: 65534 } : {});
    expectRefusal(r, /cannot be written: permission denied \(you may not write there\) \[EACCES\]/);
  });

  it('EROFS: a read-only file system (needs root to mount one)', async (context) => {
    const ro = join(work, 'ro');
    if (!mountTmpfs(ro, 'size=64k,ro')) {
      context.skip();
      return;
    }
    try {
      expectRefusal(await run(['date', SCENE, '-o', 'ro/a.json'], work), /output file "ro\/a\.json" cannot be written: the folder is on a read-only file system \[EROFS\]/);
    } finally {
      spawnSync('umount', [ro]);
    }
  });

  it.skipIf(!isRoot)('a device node made with mknod stays a device, also with --force', async () => {
    const dir = join(work, 'device');
    mkdirSync(dir);
    expect(spawnSync('mknod', [join(dir, 'dev'), 'c', '1', '3']).status).toBe(0);
    expectRefusal(await run(['report', SCENE, '-o', 'dev', '--force'], dir), /output file "dev" is a character device/);
    expect(spawnSync('test', ['-c', join(dir, 'dev')]).status).toBe(0);
  });
});

describe('two writers', () => {
  it('of three simultaneous runs writing one new name without --force, exactly one succeeds (5 rounds)', async () => {
    for (let round = 0; round < 5; round++) {
      const dir = join(work, `race-${round}`);
      mkdirSync(dir);
      const runs = await Promise.all([0, 1, 2].map(() => run(['date', SCENE, '--json', '-o', 'same.json'], dir)));
      const winners = runs.filter((r) => r.code === 0);
      expect(winners.length, runs.map((r) => r.err).join('')).toBe(1);
      for (const r of runs.filter((x) => x.code !== 0)) expectRefusal(r, /output file "same\.json" exists already; add --force to replace it/);
      expect(JSON.parse(readFileSync(join(dir, 'same.json'), 'utf8')).heliochronVersion).toBeTypeOf('string');
      expect(readdirSync(dir)).toEqual(['same.json']);
    }
  });
});

describe('signals', () => {
  it('SIGTERM or SIGINT at any moment leaves the whole report or none, and never a temporary file', async () => {
    const delays = [50, 400, 900, 1500, 2200, 3000, 4000];
    let interrupted = 0;
    for (const [k, delay] of delays.entries()) {
      const dir = join(work, `signal-${k}`);
      mkdirSync(dir);
      const child = spawn(process.execPath, [MAIN, 'report', SCENE, '-o', 'r.html'], { cwd: dir, stdio: 'ignore' });
      const ended = new Promise<NodeJS.Signals | null>((done) => child.on('close', (_code, signal) => done(signal)));
      await new Promise((t) => setTimeout(t, delay));
      child.kill(k % 2 === 0 ? 'SIGTERM' : 'SIGINT');
      if ((await ended) !== null) interrupted++;
      expect(temporaryFiles(dir)).toEqual([]);
      const names = readdirSync(dir);
      if (names.includes('r.html')) expect(readFileSync(join(dir, 'r.html'), 'utf8')).toBe(reference);
      else expect(names).toEqual([]);
    }
    expect(interrupted).toBeGreaterThan(0);
  });

  it('a signal that arrives while the temporary file exists ends the run by that signal after the file is dealt with', () => {
    for (const [signal, fail] of [['SIGTERM', false], ['SIGINT', false], ['SIGTERM', true]] as const) {
      const dir = tempDir('heliochron-signal-seam-');
      // The signal is sent from inside the write (through the test seam), the only time a temporary file exists.
      const script = `
        import { writeSync } from 'node:fs';
        import { writeOutputFile } from ${JSON.stringify(IO_MODULE)};
        let calls = 0;
        const seam = { write: (fd, bytes, offset, length) => {
          if (calls++ === 0) process.kill(process.pid, ${JSON.stringify(signal)});
          else if (${fail}) throw Object.assign(new Error('full'), { code: 'ENOSPC' });
          return writeSync(fd, bytes, offset, Math.min(length, 1000));
        } };
        try { writeOutputFile('out.txt', 'y'.repeat(5000), { force: false, inputs: [], seam }); } catch (e) { process.stderr.write(e.message + '\\n'); }
        setTimeout(() => process.stdout.write('signal was not handled\\n'), 2000);
      `;
      const r = spawnSync(process.execPath, ['--input-type=module', '-e', script], { cwd: dir, encoding: 'utf8' });
      expect(r.signal, r.stderr + r.stdout).toBe(signal);
      expect(temporaryFiles(dir)).toEqual([]);
      if (fail) expect(readdirSync(dir)).toEqual([]);
      else expect(readFileSync(join(dir, 'out.txt'), 'utf8')).toBe('y'.repeat(5000));
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('a reader that closes the pipe early (`| head -2`)', () => {
  for (const args of [['report', SCENE], ['date', SCENE, '--json', '--all-years']]) {
    it(`heliochron ${args[0]} ends quietly with exit 0`, () => {
      // A real shell pipeline: head reads two lines and exits, closing the pipe while heliochron still writes.
      const quoted = [process.execPath, MAIN, ...args].map((w) => `'${w.replace(/'/g, `'\\''`)}'`).join(' ');
      const r = spawnSync('bash', ['-c', `${quoted} 2>err.txt | head -2; echo "exit \${PIPESTATUS[0]}"`], { cwd: work, encoding: 'utf8' });
      const lines = r.stdout.split('\n');
      expect(lines.length).toBe(4); // two lines of output, the exit line, and the end
      expect(lines[2]).toBe('exit 0');
      expect(readFileSync(join(work, 'err.txt'), 'utf8')).toBe('');
    });
  }
});

describe('the pixel example through every command', () => {
  const commands: ReadonlyArray<readonly string[]> = [
    ['date'],
    ['check', '--on', '1890-09-02'],
    ['chart', '--kind', 'map'],
    ['chart', '--kind', 'sky'],
    ['chart', '--kind', 'residuals'],
    ['report'],
    ['measure'],
  ];
  for (const command of commands) {
    it(`heliochron ${command.join(' ')} reads the pixel observations of examples/tanners-hall-photo`, async () => {
      const dir = join(work, `pixels-${command.join('-')}`);
      mkdirSync(dir);
      copyFileSync(PICTURE_SCENE, join(dir, 'scene.yaml'));
      const [name, ...rest] = command;
      const r = await run([name, 'scene.yaml', ...rest], dir);
      expect(r.err, r.err).toBe('');
      expect(r.code).toBe(0);
      expect(r.out.length).toBeGreaterThan(100);
    });
  }
});
