/**
 * Output files: nothing lost, nothing replaced that is not a regular file, no temporary file
 * left, one winner among writers. Behaviour of POSIX open(O_EXCL), link() and rename() as
 * specified in POSIX.1-2017 (System Interfaces); the rest is this project's contract.
 */
import { spawnSync } from 'node:child_process';
import {
  chmodSync, existsSync, lstatSync, mkdtempSync, readFileSync, readdirSync, readlinkSync, rmSync, statSync, symlinkSync, writeFileSync, writeSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { checkOutputTarget, writeOutputFile, type WriteSeam } from '../../src/cli/io.js';
import { OutputError } from '../../src/errors.js';

const dirs: string[] = [];
function tempDir(): string {
  const dir = mkdtempSync(join(tmpdir(), 'heliochron-io-safety-'));
  dirs.push(dir);
  return dir;
}
afterAll(() => {
  for (const dir of dirs) rmSync(dir, { recursive: true, force: true });
});

const isRoot = process.getuid?.() === 0;
const CONTENT = 'x'.repeat(10_000);

function errno(code: string): Error {
  return Object.assign(new Error(code), { code });
}

/** A seam that writes at most `chunk` bytes per call, and after `failAfter` bytes throws `code` (or returns 0). */
function shortWrites(chunk: number, failAfter = Infinity, code?: string): WriteSeam {
  let written = 0;
  return {
    write: (fd, bytes, offset, length) => {
      if (written >= failAfter) {
        if (code) throw errno(code);
        return 0;
      }
      const n = writeSync(fd, bytes, offset, Math.min(chunk, length, failAfter - written));
      written += n;
      return n;
    },
  };
}

function caught(work: () => void): Error {
  try {
    work();
  } catch (error) {
    return error as Error;
  }
  throw new Error('expected a refusal');
}

describe('writeOutputFile: every byte or nothing', () => {
  it('writes the whole content through many short writes', () => {
    const dir = tempDir();
    writeOutputFile(join(dir, 'a.json'), CONTENT, { force: false, inputs: [], seam: shortWrites(333) });
    expect(readFileSync(join(dir, 'a.json'), 'utf8')).toBe(CONTENT);
    expect(readdirSync(dir)).toEqual(['a.json']);
  });

  it('refuses in plain words when the disk fills up (ENOSPC), keeps the previous file and leaves no temporary file', () => {
    const dir = tempDir();
    const path = join(dir, 'r.html');
    writeFileSync(path, 'previous good file');
    const error = caught(() => writeOutputFile(path, CONTENT, { force: true, inputs: [], seam: shortWrites(4096, 5000, 'ENOSPC') }));
    expect(error).toBeInstanceOf(OutputError);
    expect(error.message).toMatch(/cannot be written: the disk is full \(no space left on the device\) \[ENOSPC\]; nothing was written/);
    expect(readFileSync(path, 'utf8')).toBe('previous good file');
    expect(readdirSync(dir)).toEqual(['r.html']);
  });

  it('treats a write that makes no progress as a full disk', () => {
    const dir = tempDir();
    const error = caught(() => writeOutputFile(join(dir, 'r.html'), CONTENT, { force: false, inputs: [], seam: shortWrites(100, 1000) }));
    expect(error.message).toMatch(/\[ENOSPC\]/);
    expect(readdirSync(dir)).toEqual([]);
  });
});

describe('writeOutputFile: temporary files', () => {
  it('never touches files it did not create, whatever their names', () => {
    const dir = tempDir();
    const strangers = ['.r.html.12345.tmp', `.r.html.${process.pid}.tmp`, '.hc-000000000000.tmp'];
    for (const name of strangers) writeFileSync(join(dir, name), 'not heliochron');
    writeOutputFile(join(dir, 'r.html'), CONTENT, { force: false, inputs: [] });
    for (const name of strangers) expect(readFileSync(join(dir, name), 'utf8')).toBe('not heliochron');
    expect(readdirSync(dir).sort()).toEqual([...strangers, 'r.html'].sort());
  });

  it('writes a legal 250-character file name (the temporary name does not grow with it)', () => {
    const dir = tempDir();
    const name = `${'b'.repeat(245)}.json`;
    expect(name.length).toBe(250);
    writeOutputFile(join(dir, name), CONTENT, { force: false, inputs: [] });
    expect(readdirSync(dir)).toEqual([name]);
  });

  it('keeps the permissions of a replaced file', () => {
    const dir = tempDir();
    const path = join(dir, 'a.csv');
    writeFileSync(path, 'old');
    chmodSync(path, 0o640);
    writeOutputFile(path, 'new', { force: true, inputs: [] });
    expect(statSync(path).mode & 0o777).toBe(0o640);
  });
});

describe('writeOutputFile: one atomic step from check to publication', () => {
  it('refuses without --force when the name appears while the file is being written, and leaves the newcomer alone', () => {
    const dir = tempDir();
    const path = join(dir, 'same.json');
    let once = false;
    const rival: WriteSeam = {
      write: (fd, bytes, offset, length) => {
        if (!once) {
          once = true;
          writeFileSync(path, 'the other writer');
        }
        return writeSync(fd, bytes, offset, length);
      },
    };
    const error = caught(() => writeOutputFile(path, CONTENT, { force: false, inputs: [], seam: rival }));
    expect(error.message).toMatch(/exists already; add --force/);
    expect(readFileSync(path, 'utf8')).toBe('the other writer');
    expect(readdirSync(dir)).toEqual(['same.json']);
  });
});

describe('writeOutputFile and checkOutputTarget: only regular files', () => {
  it('replaces the file a symbolic link points to and keeps the link', () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'real.txt'), 'old');
    symlinkSync('real.txt', join(dir, 'link.txt'));
    writeOutputFile(join(dir, 'link.txt'), 'new', { force: true, inputs: [] });
    expect(lstatSync(join(dir, 'link.txt')).isSymbolicLink()).toBe(true);
    expect(readlinkSync(join(dir, 'link.txt'))).toBe('real.txt');
    expect(readFileSync(join(dir, 'real.txt'), 'utf8')).toBe('new');
    expect(readdirSync(dir).sort()).toEqual(['link.txt', 'real.txt']);
  });

  it('refuses a named pipe, a folder, a link to nothing and a link to a stream of the system, even with --force', () => {
    const dir = tempDir();
    expect(spawnSync('mkfifo', [join(dir, 'fifo')]).status).toBe(0);
    symlinkSync('/proc/self/fd/1', join(dir, 'stdout-link'));
    symlinkSync('missing.txt', join(dir, 'dangling'));
    const refusal = (name: string): string => caught(() => checkOutputTarget(name, { force: true, inputs: [], cwd: dir })).message;
    expect(refusal('fifo')).toBe('output file "fifo" is a named pipe (FIFO), not a regular file; heliochron writes only regular files');
    expect(refusal('.')).toMatch(/^output file "\." is a folder, not a regular file/);
    expect(refusal('dangling')).toBe(`output file "dangling" is a symbolic link to a file that does not exist; give the file's own name`);
    expect(refusal('stdout-link')).toMatch(/^output file "stdout-link" is a symbolic link to "\/proc\/self\/fd\/1", a stream or device of the system/);
    expect(statSync(join(dir, 'fifo')).isFIFO()).toBe(true);
  });

  it.skipIf(!isRoot)('refuses a character device made with mknod and leaves the node in place (needs root)', () => {
    const dir = tempDir();
    const device = join(dir, 'null-device');
    // 1, 3 is the null device on Linux (Documentation/admin-guide/devices.txt).
    expect(spawnSync('mknod', [device, 'c', '1', '3']).status).toBe(0);
    const error = caught(() => writeOutputFile(device, CONTENT, { force: true, inputs: [] }));
    expect(error.message).toBe(`output file "${device}" is a character device (such as a terminal or /dev/null), not a regular file; heliochron writes only regular files`);
    expect(lstatSync(device).isCharacterDevice()).toBe(true);
    expect(readdirSync(dir)).toEqual(['null-device']);
  });

  it('names each system error on the way in plain words', () => {
    const dir = tempDir();
    writeFileSync(join(dir, 'file'), 'x');
    const refusal = (name: string): string => caught(() => checkOutputTarget(name, { force: false, inputs: [], cwd: dir })).message;
    expect(refusal('file/a.json')).toBe('output file "file/a.json" cannot be written: a part of the path is a file, not a folder [ENOTDIR]');
    expect(refusal(`${'a'.repeat(300)}.json`)).toMatch(/cannot be written: the name is too long for the file system \(at most 255 bytes per name\) \[ENAMETOOLONG\]$/);
    expect(refusal('file')).toBe('output file "file" exists already; add --force to replace it');
    expect(refusal('no/a.json')).toBe('folder "no" for the output file does not exist');
    expect(existsSync(join(dir, 'no'))).toBe(false);
  });
});
