/**
 * What a command may touch of the outside world, passed in (never read from globals),
 * and the one way output files are written.
 *
 * An output file is written whole or not at all:
 * - checked before any work (`checkOutputTarget`): only a regular file, or a symbolic link to
 *   one, may be replaced (never a device, a pipe, a folder); never an input of the run; never an
 *   existing file without `force`; the folder must exist and be writable;
 * - written into a temporary file of the same folder, created exclusively (O_CREAT | O_EXCL,
 *   POSIX.1-2017 open()) under an unpredictable short name, so that a legal long file name
 *   still works and no file the run did not create is ever touched; every byte is checked to
 *   have reached the file, then the file is flushed (fsync) before it is published;
 * - published in one atomic step: without `force` a hard link of the finished file to the
 *   final name (POSIX link() fails with EEXIST when the name exists, so of two writers exactly
 *   one wins), with `force` a rename over the old file (POSIX rename() is atomic);
 * - through a symbolic link, the file it points to is replaced and the link kept;
 * - on SIGINT, SIGTERM or SIGHUP the temporary files of the run are removed before it ends.
 * System errors become OutputError with one plain line naming the file (src/cli/systemErrors.ts).
 */
import { randomBytes } from 'node:crypto';
import {
  accessSync, closeSync, constants, fchmodSync, fstatSync, fsyncSync, linkSync, lstatSync, openSync,
  readlinkSync, realpathSync, renameSync, statSync, unlinkSync, writeSync, type Stats,
} from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { OutputError, quoteValue } from '../errors.js';
import { isSystemError, systemErrorWords } from './systemErrors.js';
import { stderrIsTerminal, writeToProcess } from './processOutput.js';

export interface CliIo {
  readonly out: (text: string) => void;
  readonly err: (text: string) => void;
  /** True when stderr is a terminal: only then is progress shown. */
  readonly errIsTerminal: boolean;
  readonly cwd: string;
}

/** The process's own output (written as src/cli/processOutput.ts says); whether stderr is a terminal is asked on first use only. */
export function processIo(): CliIo {
  let errIsTerminal: boolean | undefined;
  return {
    out: (t) => writeToProcess(1, t),
    err: (t) => writeToProcess(2, t),
    get errIsTerminal() {
      return (errIsTerminal ??= stderrIsTerminal());
    },
    cwd: process.cwd(),
  };
}

/** What a file system entry is, in words, for a refusal. */
function kindWords(stat: Stats): string {
  if (stat.isDirectory()) return 'a folder';
  if (stat.isCharacterDevice()) return 'a character device (such as a terminal or /dev/null)';
  if (stat.isBlockDevice()) return 'a block device (a disk)';
  if (stat.isFIFO()) return 'a named pipe (FIFO)';
  if (stat.isSocket()) return 'a socket';
  if (stat.isSymbolicLink()) return 'a symbolic link';
  return 'not a regular file';
}

/**
 * The first step of a chain of symbolic links that lands in /proc or /dev (a process's open
 * stream such as /proc/self/fd/1, a terminal), or undefined. Such a link may point to a regular
 * file today (stdout redirected to a file) but is never an output file.
 */
function specialLinkTarget(path: string): string | undefined {
  let current = path;
  for (let hop = 0; hop < 40; hop++) {
    let next: string;
    try {
      next = resolve(dirname(current), readlinkSync(current));
    } catch {
      return undefined; // not a link (any more): the end of the chain
    }
    if (/^\/(proc|dev)\//.test(next)) return next;
    current = next;
  }
  return undefined;
}

/** Where an output goes: the file to replace or create, and whether it exists now. */
export interface OutputTarget {
  /** The name as the user gave it, for messages. */
  readonly name: string;
  /** The absolute path written: for a symbolic link, the file it points to. */
  readonly path: string;
  readonly exists: boolean;
}

export interface TargetOptions {
  readonly force: boolean;
  /** Input files of the run: the output may not be any of them. */
  readonly inputs: readonly string[];
  /** Folder a relative name is resolved against (default: the process's). */
  readonly cwd?: string;
}

function realOrResolved(path: string): string {
  try {
    return realpathSync(path);
  } catch {
    return resolve(path);
  }
}

/** An OutputError for a system error met while writing `name`. */
function systemRefusal(name: string, error: unknown): OutputError {
  return new OutputError(`output file ${quoteValue(name)} cannot be written: ${systemErrorWords(error)}`);
}

/**
 * Check an output name before any work: what it is, whether it may be replaced, whether its
 * folder takes a new file. Refusals are OutputError (exit 2), one line naming the file.
 * @example checkOutputTarget('answer.json', { force: false, inputs: ['/s/velmar.yaml'] }).path // '/cwd/answer.json'
 */
export function checkOutputTarget(name: string, options: TargetOptions): OutputTarget {
  const given = resolve(options.cwd ?? process.cwd(), name);
  let path = given;
  let exists = false;
  try {
    const link = lstatSync(given);
    let stat = link;
    if (link.isSymbolicLink()) {
      const special = specialLinkTarget(given);
      if (special !== undefined) {
        throw new OutputError(`output file ${quoteValue(name)} is a symbolic link to ${quoteValue(special)}, a stream or device of the system, not a regular file; heliochron writes only regular files`);
      }
      try {
        stat = statSync(given);
        path = realpathSync(given);
      } catch (error) {
        if (isSystemError(error, 'ENOENT')) throw new OutputError(`output file ${quoteValue(name)} is a symbolic link to a file that does not exist; give the file's own name`);
        throw systemRefusal(name, error);
      }
    }
    if (!stat.isFile()) {
      const through = link.isSymbolicLink() ? ` (the symbolic link points to ${quoteValue(path)})` : '';
      throw new OutputError(`output file ${quoteValue(name)} is ${kindWords(stat)}${through}, not a regular file; heliochron writes only regular files`);
    }
    exists = true;
  } catch (error) {
    if (error instanceof OutputError) throw error;
    if (!isSystemError(error, 'ENOENT')) throw systemRefusal(name, error);
  }
  for (const input of options.inputs) {
    if (realOrResolved(input) === realOrResolved(path)) {
      throw new OutputError(`output file ${quoteValue(name)} is the input file; choose another name`);
    }
  }
  if (exists && !options.force) throw new OutputError(`output file ${quoteValue(name)} exists already; add --force to replace it`);
  const folder = dirname(path);
  try {
    if (!statSync(folder).isDirectory()) throw new OutputError(`output file ${quoteValue(name)} cannot be written: ${quoteValue(dirname(name))} is a file, not a folder`);
    accessSync(folder, constants.W_OK);
  } catch (error) {
    if (error instanceof OutputError) throw error;
    if (isSystemError(error, 'ENOENT')) throw new OutputError(`folder ${quoteValue(dirname(name))} for the output file does not exist`);
    throw systemRefusal(name, error);
  }
  return { name, path, exists };
}

/** How bytes go to a file descriptor; replaced in tests to simulate a short write or a signal. */
export interface WriteSeam {
  /** Write bytes[offset, offset + length) at the current position; returns the number of bytes written (as fs.writeSync). */
  readonly write: (fd: number, bytes: Uint8Array, offset: number, length: number) => number;
}

const FS_WRITE: WriteSeam = { write: (fd, bytes, offset, length) => writeSync(fd, bytes, offset, length) };

export interface WriteOptions extends TargetOptions {
  /** Tests only: how bytes are written. */
  readonly seam?: WriteSeam;
}

/** Temporary files of this process that exist now; removed on SIGINT, SIGTERM and SIGHUP. */
const liveTemporaryFiles = new Set<string>();
let signalsGuarded = false;

/**
 * On the first write, remove the run's temporary files when a signal ends it, then end
 * by the same signal (its default action), so that the caller sees what happened.
 */
function guardSignals(): void {
  if (signalsGuarded) return;
  signalsGuarded = true;
  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) {
    const onSignal = (): void => {
      for (const temp of liveTemporaryFiles) removeQuietly(temp);
      liveTemporaryFiles.clear();
      process.removeListener(signal, onSignal);
      process.kill(process.pid, signal);
    };
    process.on(signal, onSignal);
  }
}

function removeQuietly(path: string): void {
  try {
    unlinkSync(path);
  } catch {
    // already gone
  }
}

/** A new temporary file in `folder`, created exclusively under a short random name (never an existing file). */
function createTemporaryFile(folder: string, mode: number): { fd: number; path: string } {
  for (let attempt = 0; ; attempt++) {
    // 20 characters, whatever the length of the final name (NAME_MAX is 255 bytes on common file systems).
    const path = join(folder, `.hc-${randomBytes(6).toString('hex')}.tmp`);
    try {
      const fd = openSync(path, constants.O_WRONLY | constants.O_CREAT | constants.O_EXCL, mode);
      liveTemporaryFiles.add(path);
      return { fd, path };
    } catch (error) {
      if (!isSystemError(error, 'EEXIST') || attempt >= 8) throw error;
    }
  }
}

/** Write all of `bytes` to `fd`, or throw: a write that makes no progress is a full disk. */
function writeAll(fd: number, bytes: Uint8Array, seam: WriteSeam): void {
  let offset = 0;
  while (offset < bytes.length) {
    const written = seam.write(fd, bytes, offset, bytes.length - offset);
    if (!(written > 0)) throw Object.assign(new Error('no space left on device (a write made no progress)'), { code: 'ENOSPC' });
    offset += written;
  }
  fsyncSync(fd);
  const size = fstatSync(fd).size;
  if (size !== bytes.length) {
    throw Object.assign(new Error(`the file holds ${size} of ${bytes.length} bytes after writing`), { code: 'EIO' });
  }
}

/**
 * Write `content` to the output `name` (see the header): checked again, written into a
 * temporary file, flushed, published atomically. Nothing is left behind on failure and an
 * existing file is untouched unless the new one is complete.
 * @throws OutputError for every refusal and system error, naming the file
 */
export function writeOutputFile(name: string, content: string | Uint8Array, options: WriteOptions): void {
  const target = checkOutputTarget(name, options);
  const bytes = typeof content === 'string' ? Buffer.from(content, 'utf8') : content;
  guardSignals();
  let temp: { fd: number; path: string } | undefined;
  let open = false;
  try {
    const mode = target.exists ? lstatSync(target.path).mode & 0o777 : 0o666;
    temp = createTemporaryFile(dirname(target.path), mode);
    open = true;
    if (target.exists) fchmodSync(temp.fd, mode); // keep the replaced file's permissions (umask applies to new files only)
    writeAll(temp.fd, bytes, options.seam ?? FS_WRITE);
    closeSync(temp.fd);
    open = false;
    publish(temp.path, target, options.force);
  } catch (error) {
    if (temp && open) closeSync(temp.fd);
    if (error instanceof OutputError) throw error;
    throw new OutputError(`output file ${quoteValue(name)} cannot be written: ${systemErrorWords(error)}; nothing was written, and a file of that name, if any, is unchanged`);
  } finally {
    if (temp) {
      removeQuietly(temp.path); // after a link, the temporary name; after a rename, nothing is left there
      liveTemporaryFiles.delete(temp.path);
    }
  }
}

/** Give the finished temporary file its final name in one atomic step. */
function publish(temp: string, target: OutputTarget, force: boolean): void {
  if (force) {
    // What stands at the name now must still be a regular file (or nothing): never rename over a device.
    try {
      const now = lstatSync(target.path);
      if (!now.isFile()) throw new OutputError(`output file ${quoteValue(target.name)} is ${kindWords(now)}, not a regular file; heliochron writes only regular files`);
    } catch (error) {
      if (!isSystemError(error, 'ENOENT')) throw error;
    }
    renameSync(temp, target.path);
    return;
  }
  try {
    linkSync(temp, target.path);
  } catch (error) {
    if (isSystemError(error, 'EEXIST')) throw new OutputError(`output file ${quoteValue(target.name)} exists already; add --force to replace it`);
    // File systems without hard links (FAT, some network shares): a check, then a rename.
    if (!isSystemError(error, 'EPERM') && !isSystemError(error, 'ENOTSUP') && !isSystemError(error, 'EOPNOTSUPP')) throw error;
    try {
      lstatSync(target.path);
      throw new OutputError(`output file ${quoteValue(target.name)} exists already; add --force to replace it`);
    } catch (inner) {
      if (!isSystemError(inner, 'ENOENT')) throw inner;
    }
    renameSync(temp, target.path);
  }
}
